// Placement search: where on the site one wire antenna permits the most transmitter power, from its
// field maps moved and turned over the lot (docs/methods.md, "Placement search"), the feed-line loss
// (matched + mismatch, Pozar §2.7) and the power-line checks of `standoff lines` for its supports.
#pragma once

// For every candidate position and azimuth: the worst exposure ratio in every zone against its
// tier at body height (the rules of `evaluate`: body-line mean of E² and H², E and H limits
// separately where the table gives them, 2×2 sub-points within 2 m of the antenna), per operation
// of the antenna; the feed line from the operating position (slack × plan distance + drop); the
// permitted PEP at the transmitter per operation; score = the least of them. A candidate failing a
// power-line check gets a permitted PEP of 0 W (it is never ranked as clear).

#include <cstddef>
#include <functional>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include <Eigen/Core>

#include "exposure/evaluate.hpp"
#include "exposure/geometry.hpp"
#include "limits/limits.hpp"
#include "power/feedline.hpp"
#include "siting/clearances.hpp"
#include "siting/place_map.hpp"
#include "siting/site.hpp"

namespace standoff::siting {

// One operation of the antenna.
struct PlaceOperation {
  std::string name;
  double frequency_hz = 0.0;
  double pep_w = 0.0;
  limits::LimitValues limit[2];   // [0] controlled, [1] uncontrolled
  double tx_fraction[2] = {1, 1};  // average power at the transmitter per W of PEP, per tier window
  std::optional<power::FeedLine> line;  // none: the antenna is fed without a line (lossless)
  power::LoadSpec load;                 // at the antenna: MoM feed impedance, or a stated SWR
  std::optional<double> current_length_m;  // the station file's line length (for `current`)
  std::shared_ptr<const PlaceMap> map;     // shared by operations at the same frequency
  SiteFieldFunction direct;                // the solved antenna's fields at 1 W (site frame, as solved)
};

struct PlaceZone {
  std::string name;
  limits::Tier tier = limits::Tier::uncontrolled;
  std::size_t layer = 0;                     // map layer (its floor)
  double spacing_m = 0.5;
  std::vector<exposure::PlanPoint> cells;    // cell centres (the grid of `evaluate`)
};

struct PlacePoint {
  std::string name;
  limits::Tier tier = limits::Tier::uncontrolled;
  exposure::PlanPoint at;
  std::size_t layer = 0;  // a single-point layer at the point's height
};

struct PlaceSetup {
  std::string antenna;
  Eigen::Vector2d origin{0, 0};   // plan position of the feed point as solved (station file)
  double azimuth0_rad = 0.0;      // azimuth as solved
  double feed_height_m = 0.0;
  std::vector<std::pair<Eigen::Vector2d, Eigen::Vector2d>> footprint;  // wires in plan, site frame, as solved
  bool half_turn_symmetric = false;  // the antenna is unchanged by a 180° turn about its feed
  std::vector<PlaceOperation> operations;
  std::vector<PlaceZone> zones;
  std::vector<PlacePoint> points;

  // Candidate region.
  exposure::Polygon region;                   // the property
  std::vector<exposure::Polygon> keep_out;    // buildings
  double margin_m = 1.0;                      // feed point at least this far from the edge and buildings
  double step_m = 1.0;
  std::vector<double> azimuths_rad;

  // Feed-line routing.
  Eigen::Vector3d operating_position{0, 0, 0};
  double slack = 1.2;

  // Power-line checks: the lines, and the antenna's supports and spans as they stand now.
  SiteElements installation;  // power lines only are used from here
  std::vector<Support> supports;
  std::vector<Span> spans;
  const ClearanceTables* tables = nullptr;

  double refine_radius_m = 2.0;  // as `evaluate`
  unsigned threads = 0;
  std::size_t top = 10;
  std::function<void(double)> progress;
};

struct Binding {
  std::string kind;       // "exposure", "line check" or "none"
  std::string operation;  // exposure: the operation whose permitted PEP is least
  std::string zone;       // zone or point of interest
  std::string tier;       // "controlled" / "uncontrolled"
  std::string quantity;   // "E", "H" or "S"
  std::string rule;       // line check: the rule, the support or span, the power line
  std::string subject;
  std::string line;
  std::string text;       // one line for people
};

struct OperationScore {
  std::string name;
  double frequency_hz = 0.0;
  double feedline_loss_db = 0.0;   // matched + mismatch (0 when not evaluated: more power, more exposure)
  double mismatch_loss_db = 0.0;
  double swr = 1.0;                // at the antenna
  bool line_evaluated = true;
  std::string line_note;
  std::optional<double> permitted_pep_w;  // rounded down; absent if nothing could be evaluated
  double worst_ratio_per_w = 0.0;  // worst ratio per W of PEP
  Binding binding;
};

struct Candidate {
  double x_m = 0.0;
  double y_m = 0.0;
  double azimuth_rad = 0.0;
  double feedline_length_m = 0.0;
  double feedline_loss_db = 0.0;   // of the binding operation
  double permitted_pep_w = 0.0;    // least over the operations; 0 when a power-line check fails
  double exposure_permitted_pep_w = 0.0;  // least over the operations, exposure alone
  bool clearance_ok = true;
  Binding binding;
  std::vector<OperationScore> operations;
  std::size_t not_evaluated_places = 0;
  std::size_t direct_points = 0;   // body lines or points evaluated directly (routed)
  std::size_t map_points = 0;      // body lines or points read from the map
  std::vector<std::string> failed_checks;  // "rule: subject vs line"
  bool lines_checked = false;  // the power-line checks have been run (clearance_ok means nothing before)
  bool lines_inferred = false; // … or inferred from a neighbouring checked placement (docs/methods.md)
  Binding exposure_binding;    // the binding reason of the exposure alone
};

// Best permitted PEP over the azimuths at each candidate position, for the heat map.
struct HeatCell {
  double x_m = 0.0;
  double y_m = 0.0;
  bool candidate = false;     // a candidate position (inside the region) at all
  bool any_clear = false;     // some azimuth passes every power-line check
  double best_pep_w = 0.0;    // best permitted PEP over the azimuths that pass (0 if none)
  double best_azimuth_rad = 0.0;
};

struct PlaceResult {
  std::vector<Candidate> candidates;   // top N, permitted_pep_w descending
  Candidate current;                   // the antenna where the station file puts it
  std::size_t positions = 0;           // candidate positions
  std::size_t placements = 0;          // positions × azimuths evaluated
  std::vector<double> azimuths_rad;    // as searched (reduced to [0°, 180°) for symmetric antennas)
  double heat_origin_x_m = 0.0, heat_origin_y_m = 0.0, heat_step_m = 1.0;
  int heat_nx = 0, heat_ny = 0;
  std::vector<HeatCell> heat;          // row-major j·nx + i
  // Map statistics (docs/methods.md).
  std::size_t map_levels = 0;
  double map_spacing_m = 0.0;          // level 0
  double map_reach_m = 0.0;
  std::size_t map_points = 0;          // field points computed for the maps
  double map_max_error = 0.0;          // largest error estimate of a cell that is read
  std::size_t direct_points = 0;       // body lines/points routed to direct evaluation, all placements
  std::size_t read_points = 0;         // read from the maps
  std::vector<std::string> notes;
};

enum class PlaceMode { map, direct };

// Plan extent the maps must cover: the largest plan distance from any candidate position (plus
// the antenna's turning radius) to any zone cell or point of interest.
double required_map_extent(const PlaceSetup& setup);

// Candidate positions of the region: a grid of `step_m` (cell centres of the region's bounds),
// feed point inside the property, at least `margin_m` from its edge and from every building.
std::vector<exposure::PlanPoint> candidate_positions(const PlaceSetup& setup, int* nx = nullptr, int* ny = nullptr,
                                                     exposure::PlanPoint* origin = nullptr);

// The search's precomputed state (zone blocks for pruning, map envelopes); `setup` must outlive it.
class PlaceEngine {
 public:
  explicit PlaceEngine(const PlaceSetup& setup);
  ~PlaceEngine();
  PlaceEngine(const PlaceEngine&) = delete;
  PlaceEngine& operator=(const PlaceEngine&) = delete;
  Candidate evaluate(double x_m, double y_m, double azimuth_rad, double feed_length_m, PlaceMode mode = PlaceMode::map,
                     bool check_lines = true) const;
  std::vector<Candidate> evaluate_position(double x_m, double y_m, const std::vector<double>& azimuths_rad,
                                           const std::vector<double>& feed_lengths_m, PlaceMode mode,
                                           bool check_lines) const;
  // Runs the power-line checks of `standoff lines` for the candidate's supports and spans.
  void apply_line_checks(Candidate& candidate) const;

  struct Impl;

 private:
  friend PlaceResult place(const PlaceSetup& setup);
  std::unique_ptr<Impl> impl_;
};

// One placement (feed point at (x, y), wire azimuth az). `feed_length_m` is the line length;
// `mode` reads the maps (routing to direct evaluation where needed) or evaluates every place
// directly (the reference for the map).
Candidate evaluate_placement(const PlaceSetup& setup, double x_m, double y_m, double azimuth_rad,
                             double feed_length_m, PlaceMode mode = PlaceMode::map, bool check_lines = true);

// Feed-line length by the routing rule: slack × plan distance to the operating position + drop.
double routed_feed_length_m(const PlaceSetup& setup, double x_m, double y_m);

// The whole search.
PlaceResult place(const PlaceSetup& setup);

}  // namespace standoff::siting
