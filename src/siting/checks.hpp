// The installation-safety checks of issue 6 for supports and wire spans near overhead power lines:
// fall zone (US CPSC 1.5 × height; height + 10 ft) and 3-D fall reach vs the OSHA approach
// distance (29 CFR 1910.333(c)(3)(i), 1926.1408 Table A); raising (tilt-up arc, hand-held
// object); standing clearance of sagging, swinging wires (NFPA 70 810.18(A) and the approach
// distance); the reach of a wire whose support fails; no crossing in plan (NFPA 70 810.13);
// antenna conductor size (NFPA 70 Table 810.52); lowest point of radiating wires (≥ 3 m).
// Required distances are rounded up and measured distances down (to 1 cm), so that rounding
// never turns a failure into a pass. Sampled sweeps subtract their worst sampling error.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "core/remedy.hpp"
#include "core/units.hpp"
#include "siting/catenary.hpp"
#include "siting/clearances.hpp"
#include "siting/geometry.hpp"
#include "siting/site.hpp"

namespace standoff::siting {

enum class CheckStatus { pass, fail, not_evaluated };

struct Check {
  std::string rule;     // e.g. "fall zone", "standing clearance"
  std::string source;   // the published rule (or "common practice (no source)")
  std::string subject;  // the support or span checked
  std::string line;     // the power line it is checked against ("" for checks without one)
  std::optional<units::Length> required;  // nullopt when not evaluated
  std::optional<units::Length> actual;
  CheckStatus status = CheckStatus::fail;
  std::string note;
  bool diameter = false;  // required/actual are wire diameters (shown in mm), not clearances
  double size_m = 0.0;    // the support's reach, the handled length or the wire's free length (remedies)
  std::vector<Remedy> remedies{};  // computed for a failed or unevaluated check: the change that would pass
  bool pass() const { return status == CheckStatus::pass; }
};

struct LinesReport {
  std::vector<Check> checks;
  std::vector<std::string> assumptions;  // what was assumed for unknown inputs
  std::vector<std::string> cautions;     // printed with every output
  std::size_t power_lines = 0;           // how many power lines the checks were made against
  bool all_pass() const;
  // "pass" when every check passes, otherwise "fail" (a check that could not be evaluated fails).
  std::string verdict() const;
};

// The cautions printed with every installation-safety output.
std::vector<std::string> line_cautions();

// Runs every check on the site. `tables` is normally builtin_clearance_tables().
LinesReport run_checks(const SiteElements& site, const ClearanceTables& tables);

// ---- Pieces the checks are built from (exposed for tests and for the site map) ----

// Radius of the plan fall zone drawn around a support: max(1.5 × (H + overhang),
// H + overhang + 10 ft), rounded up to 1 cm.
units::Length fall_zone_radius(const Support& s, const ClearanceTables& tables);

// The conductor of a power line as used by the checks (assumed height when unknown).
ConductorGeometry conductor_geometry(const PowerLine& line, const ClearanceTables& tables);

// A wire span's shape in still air and the wind swing allowed.
struct SpanShape {
  Vec3 from;
  Vec3 to;
  std::optional<Catenary> catenary;  // nullopt: straight (taut, or the ends one above the other)
  double swing_rad = 0.0;            // largest swing of the sag plane from vertical, either side

  // A point of the wire at horizontal fraction t in [0, 1] of the span, with the sag plane swung
  // by psi (radians) about the chord.
  Vec3 point(double t, double psi) const;
  double length_m() const;      // wire length
  double lowest_z_m() const;    // lowest point in still air
  double max_sag_m() const;     // largest vertical distance below the chord
};

// Builds the shape from the span's tension and weight or measured sag; InputError-free: the
// parser has already checked that one of them is present. Throws std::invalid_argument if not.
SpanShape span_shape(const Span& span);

// Conservative shortest distance between the swinging wire and the conductor: the sampled
// minimum less the largest sampling error (so never more than the true distance).
double swept_wire_distance(const SpanShape& shape, const ConductorGeometry& line);
// The same in plan (0 if the swinging wire crosses the line's route in plan).
double swept_wire_plan_distance(const SpanShape& shape, const ConductorGeometry& line);

// Conservative shortest distance from the arc swept by a tilt-up support to the conductor.
double tilt_sweep_distance(const Support& s, const ConductorGeometry& line);

}  // namespace standoff::siting
