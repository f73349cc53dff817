// The result of evaluating a whole station on its site: per operation the power chain, the model
// used, the worst exposure ratio and where, permitted PEP and compliance distances; zone grids for
// contour maps; ratio-versus-distance samples for charts; group sums (47 CFR 1.1307(b)(5)); verdicts.
#pragma once

// Plain data only (SI doubles, unit in the member name) so that report writers can build their
// record from it without depending on the evaluation code. Exposure ratios are POWER ratios:
// (E/E_lim)², (H/H_lim)² or S/S_lim, so they scale linearly with power and sum over sources as
// 47 CFR 1.1307(b)(5) prescribes (Σ ratios ≤ 1). A ratio ≤ 1 is within the limit.

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "limits/limits.hpp"

namespace standoff::exposure {

// A point in the site frame (metres, x east, y north, z up from ground at the origin).
struct SitePoint {
  double x_m = 0.0;
  double y_m = 0.0;
  double z_m = 0.0;
};

// Verdict of one operation, one group, or the whole station.
enum class Verdict {
  within,         // evaluated everywhere people can be, every ratio ≤ 1
  exceeds,        // some evaluated place has a ratio > 1
  not_evaluated,  // nothing exceeds where evaluated, but some places could not be evaluated
};
inline std::string to_string(Verdict v) {
  switch (v) {
    case Verdict::within: return "within";
    case Verdict::exceeds: return "exceeds";
    case Verdict::not_evaluated: return "not evaluated";
  }
  return "not evaluated";
}

// One step of the power chain, from transmitter PEP to average power at the antenna.
struct PowerStep {
  std::string label;    // e.g. "transmitter PEP", "duty factor (SSB, 20 %)", "feed-line loss"
  double power_w = 0.0; // power after this step
  std::string detail;   // e.g. "1.2 dB matched loss + 0.4 dB mismatch, SWR 2.1"
};

// A distance for each tier. Absent means "not evaluated" (never a number then).
struct TierDistances {
  std::optional<double> controlled_m;
  std::optional<double> uncontrolled_m;
  // Detailed distances only: nothing exceeds the tier's limit at body height anywhere searched,
  // so there is no compliance distance ("none"; the value is then empty, never 0.0 m).
  bool controlled_none = false;
  bool uncontrolled_none = false;
};

// Exposure at one place, for one operation (or the sum over a group).
struct PlaceExposure {
  SitePoint at;                 // for a body line: the sample with the highest ratio
  std::string zone;             // zone or point-of-interest name
  limits::Tier tier = limits::Tier::uncontrolled;
  double ratio = 0.0;           // ratio used for the verdict (body-line spatial average or point value)
  double peak_ratio = 0.0;      // highest single-sample ratio on the body line (== ratio at a point)
  std::string quantity;         // which limit binds: "E", "H", "S" (plane-wave equivalent) or "sum"
  double e_v_per_m = 0.0;       // RMS field magnitudes at `at` (0 for group sums)
  double h_a_per_m = 0.0;
};

// A place the model could not evaluate (e.g. within the thin-wire model's validity radius of a
// wire, or in the reactive near field of a screening model). Reported, never given a number.
struct NotEvaluated {
  SitePoint at;
  std::string zone;
  std::string reason;
};

// A point of interest (e.g. the neighbour's window at 4 m) evaluated for one operation.
struct PointResult {
  std::string name;
  limits::Tier tier = limits::Tier::uncontrolled;
  SitePoint at;
  bool evaluated = false;       // false → `reason` says why; `ratio` is meaningless
  double ratio = 0.0;
  std::string quantity;
  double e_v_per_m = 0.0;
  double h_a_per_m = 0.0;
  std::string reason;
};

// Worst ratio versus horizontal distance from the antenna (over all directions) at body height
// over open ground, for a chart. Ratio is absent where a sample could not be evaluated.
struct DistanceSample {
  double distance_m = 0.0;
  std::optional<double> ratio_controlled;
  std::optional<double> ratio_uncontrolled;
};

// Everything evaluated for one operation (transmitter + feed line + antenna + frequency + mode).
struct OperationResult {
  std::string name;
  std::string transmitter;
  std::string feed_line;
  std::string antenna;
  std::string group;                // empty if not in a group
  double frequency_hz = 0.0;
  double pep_w = 0.0;
  std::vector<PowerStep> chain;     // PEP → ... → average power at the antenna
  double average_power_w = 0.0;     // at the antenna, worst-case window of the averaging time
  std::string method;               // "detailed (MoM)" or "screening (<model>)"
  limits::Standard standard = limits::Standard::fcc;
  std::string limits_source;        // e.g. "47 CFR § 1.1310(e)(1), Table 1 (1996)"

  bool evaluated_anywhere = false;  // false → no place could be evaluated; max_ratio meaningless
  PlaceExposure worst;              // worst ratio over every zone and point of interest
  std::optional<double> permitted_pep_w;  // PEP / worst ratio, rounded DOWN; absent if not evaluated
  TierDistances screening_distance;  // far-field screening model, rounded UP
  TierDistances detailed_distance;   // from the detailed model in the worst direction, rounded UP
  Verdict verdict = Verdict::not_evaluated;
  std::vector<std::string> notes;    // assumptions, validity limits, "not evaluated" summaries
  std::vector<NotEvaluated> not_evaluated;  // a sample of the places not evaluated (capped)
  std::size_t not_evaluated_count = 0;      // how many grid/body-line places were not evaluated
  std::vector<PointResult> points;          // points of interest
  std::vector<DistanceSample> ratio_vs_distance;
};

// Cell state of a zone grid.
enum class CellState : std::uint8_t {
  outside = 0,        // cell centre outside the zone polygon
  evaluated = 1,
  not_evaluated = 2,  // inside the zone but the model is not valid there
};

// A regular grid over one zone at one floor, usable for contour maps. Cell (i, j) has its centre at
// (origin_x_m + i·spacing_m, origin_y_m + j·spacing_m); arrays are row-major: index = j·nx + i.
struct ZoneGrid {
  std::string zone;
  limits::Tier tier = limits::Tier::uncontrolled;  // the zone's tier (the verdict uses this one)
  double floor_z_m = 0.0;           // the body line runs from floor_z_m to floor_z_m + 2 m
  double origin_x_m = 0.0;
  double origin_y_m = 0.0;
  double spacing_m = 0.5;
  int nx = 0;
  int ny = 0;
  std::vector<CellState> state;     // nx·ny; not_evaluated if any operation could not evaluate the cell

  // Body-line ratios per operation, against each tier's limit (for 100 % / 50 % contours per tier).
  struct OperationLayer {
    std::string operation;
    std::vector<CellState> state;            // nx·ny; per operation (validity depends on the antenna)
    std::vector<double> ratio_controlled;    // nx·ny; 0 where state != evaluated
    std::vector<double> ratio_uncontrolled;  // nx·ny
  };
  std::vector<OperationLayer> layers;
};

// Sources that transmit at the same time: Σ ratios ≤ 1 at every place (47 CFR 1.1307(b)(5)).
struct GroupResult {
  std::string name;
  std::vector<std::string> operations;
  bool evaluated_anywhere = false;
  PlaceExposure worst;              // quantity "sum"
  Verdict verdict = Verdict::not_evaluated;
  std::vector<std::string> notes;
};

// The whole evaluation.
struct StationEvaluation {
  std::string station;
  limits::Standard standard = limits::Standard::fcc;
  std::string body_rule;            // how the body line is averaged, with its source
  double grid_spacing_m = 0.5;
  std::vector<OperationResult> operations;
  std::vector<ZoneGrid> grids;
  std::vector<GroupResult> groups;
  Verdict verdict = Verdict::not_evaluated;
  std::vector<std::string> cautions;  // printed with every output
};

}  // namespace standoff::exposure
