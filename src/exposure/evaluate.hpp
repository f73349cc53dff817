// Detailed evaluation of a station on its site: fields of each source on zone grids along the
// vertical body line (0–2 m above each floor), exposure ratios against the zone's tier, worst ratio,
// permitted PEP, compliance distances, group sums Σ ratios ≤ 1 (47 CFR 1.1307(b)(5)) and verdicts.
#pragma once

// Inputs are resolved sources: each carries a field function returning RMS E and H phasors at its
// average power at the antenna (a MoM solution or a screening model) — see docs/methods.md
// "Station evaluation" for the body-line rule, the ratio rule and the distance search.

#include <cstddef>
#include <functional>
#include <span>
#include <string>
#include <vector>

#include <Eigen/Core>

#include "em/fields.hpp"
#include "exposure/evaluation.hpp"
#include "exposure/geometry.hpp"
#include "limits/limits.hpp"

namespace standoff::exposure {

// RMS E (V/m) and H (A/m) phasors at each point, at the source's average power at the antenna.
// `valid == false` marks a point where the model does not hold (never given a number). Must be
// thread-safe: the evaluation calls it concurrently on disjoint blocks of points.
using FieldFunction = std::function<std::vector<em::FieldPoint>(std::span<const Eigen::Vector3d>)>;

// A plan segment of the antenna (a wire projected on the ground, or a single point), used to
// refine the grid near the antenna. `centre` is where distances are measured from.
struct PlanSegment {
  PlanPoint a;
  PlanPoint b;
};

struct SourceInput {
  std::string name;
  std::string transmitter;
  std::string feed_line;
  std::string antenna;
  std::string group;
  double frequency_hz = 0.0;
  double pep_w = 0.0;
  double average_power_w = 0.0;     // at the antenna; `field` is scaled to it
  std::vector<PowerStep> chain;
  std::string method;               // "detailed (MoM)" or "screening (...)"
  FieldFunction field;
  PlanPoint centre;                 // feed point / base / phase centre in plan
  std::vector<PlanSegment> footprint;
  TierDistances screening_distance; // already rounded up
  double max_search_distance_m = 100.0;  // the detailed-distance search stops here
  std::vector<std::string> notes;
};

struct ZoneInput {
  std::string name;
  limits::Tier tier = limits::Tier::uncontrolled;
  Polygon polygon;
  std::vector<double> floors_m{0.0};
  std::vector<Polygon> holes{};  // parts not evaluated: the zone's own holes and keep-out areas
};

// Whether the plan point lies in the zone (its polygon, not in a hole).
inline bool in_zone(const ZoneInput& z, PlanPoint p) { return geometry::inside(geometry::Area{z.polygon, z.holes}, p); }

struct PointInput {
  std::string name;
  limits::Tier tier = limits::Tier::uncontrolled;
  SitePoint at;
};

// Limit values of one source's frequency for both tiers.
// `scale` is each tier's average power (its own averaging window) over the power the field
// function is computed at: ratios are linear in power, so they are multiplied by it.
struct SourceLimits {
  limits::LimitValues controlled;
  limits::LimitValues uncontrolled;
  double scale_controlled = 1.0;
  double scale_uncontrolled = 1.0;
  double scale(limits::Tier t) const { return t == limits::Tier::controlled ? scale_controlled : scale_uncontrolled; }
  const limits::LimitValues& operator[](limits::Tier t) const {
    return t == limits::Tier::controlled ? controlled : uncontrolled;
  }
};

struct EvaluationOptions {
  double grid_spacing_m = 0.5;
  double refine_radius_m = 2.0;   // cells within this plan distance of an antenna get 2×2 sub-points
  unsigned threads = 0;           // 0 = all cores (std::thread::hardware_concurrency)
  // Below 75 MHz, compute a 1 m sub-grid first and estimate cells far from the antenna whose
  // neighbours are all below 5 % of the limits (docs/methods.md). false = compute every cell.
  bool coarse_first = true;
  // Called with the fraction done (0..1) from the calling thread; may be empty.
  std::function<void(double)> progress;
};

struct EvaluationInput {
  std::string station;
  limits::Standard standard = limits::Standard::fcc;
  std::vector<ZoneInput> zones;
  std::vector<PointInput> points;
  std::vector<SourceInput> sources;
  std::vector<SourceLimits> limits;  // one per source, same order
  std::string limits_source;         // e.g. "47 CFR § 1.1310(e)(1), Table 1 (1996)"
};

// ---- The ratio rule (docs/methods.md) ----
// Power ratios at one place from the mean squared RMS field magnitudes there:
// E and H limits each bind where the table gives them ((E/E_lim)², (H/H_lim)²); a power-density
// limit that is not a plane-wave equivalent binds on S_eq = max(E²/η0, η0·H²).
struct Ratio {
  double value = 0.0;
  const char* quantity = "E";  // "E", "H" or "S"
};
Ratio exposure_ratio(double e2_v2_per_m2, double h2_a2_per_m2, const limits::LimitValues& limit);

// Body line: samples at these heights above the floor (centres of five equal slices of 0–2 m);
// the spatial average is their mean (midpoint rule).
inline constexpr double kBodyHeight_m = 2.0;
inline constexpr int kBodySamples = 5;
double body_sample_height_m(int k);

// Evaluates every source over every zone grid and point of interest. Results are identical for
// any thread count.
StationEvaluation evaluate(const EvaluationInput& input, const EvaluationOptions& options = {});

// Fields and ratios of one source at one point (for `standoff field`).
struct PointFields {
  bool valid = false;
  double e_v_per_m = 0.0;  // RMS magnitude |E|
  double h_a_per_m = 0.0;
  Ratio controlled;
  Ratio uncontrolled;
};
PointFields fields_at(const SourceInput& source, const SourceLimits& limits, SitePoint at);

// Round a distance UP to 0.1 m and a power DOWN to three significant figures.
double round_up_distance(double metres);
double round_down_power(double watts);

}  // namespace standoff::exposure
