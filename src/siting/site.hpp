// Site elements for installation safety near overhead power lines: power lines, supports (mast,
// tower, tree, pole) and wire spans between them, as stated in the station file (issue 6).
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "core/units.hpp"

namespace standoff::siting {

namespace bu = boost::units;
namespace si = boost::units::si;

using Voltage = bu::quantity<si::electric_potential>;
using Force = bu::quantity<si::force>;
// Mass per unit length of a wire (kg/m); its weight per length is this times g_n.
using LinearDensity = bu::quantity<bu::divide_typeof_helper<si::mass, si::length>::type>;

inline Voltage volts(double v) { return v * si::volts; }
inline Force newtons(double v) { return v * si::newtons; }
inline LinearDensity kilograms_per_metre(double v) { return v * si::kilograms / si::meters; }

// Positions in the site frame (x east, y north, z up from the ground at the origin).
struct PlanPoint {
  units::Length x = units::metres(0.0);
  units::Length y = units::metres(0.0);
};

struct Point3 {
  units::Length x = units::metres(0.0);
  units::Length y = units::metres(0.0);
  units::Length z = units::metres(0.0);
};

// What kind of line: decides the typical legal height assumed when the height is unknown.
enum class LineKind { service, distribution, transmission };

// Whether the stated voltage is measured phase to ground or phase to phase (nominal).
enum class VoltageReference { phase_to_ground, phase_to_phase };

struct LineVoltage {
  Voltage value = volts(0.0);
  VoltageReference reference = VoltageReference::phase_to_phase;
};

struct PowerLine {
  std::string name;
  LineKind kind = LineKind::distribution;
  std::vector<PlanPoint> path;          // plan route, at least two points
  std::optional<units::Length> height;  // lowest conductor above ground; nullopt = unknown
  std::optional<LineVoltage> voltage;   // nullopt = unknown
};

enum class SupportKind { mast, tower, tree, pole };

// A tilt-up (hinged) mast or tower: it lies along `direction` (azimuth, clockwise from north,
// from the pivot towards the top when lowered) and is swung up about a pivot at `pivot_height`.
struct TiltUp {
  units::Length pivot_height = units::metres(0.0);
  units::Angle direction = units::radians(0.0);
};

struct Support {
  std::string name;
  SupportKind kind = SupportKind::mast;
  PlanPoint base;
  units::Length height = units::metres(0.0);    // top of the structure (with any antenna on it)
  units::Length overhang = units::metres(0.0);  // antenna or boom reaching beyond the top, sideways
  std::optional<TiltUp> tilt;
  // Longest conductive piece a person handles while raising it; nullopt = the whole support.
  std::optional<units::Length> handled_length;
  std::string origin;  // empty for a [[support]] written by the user; else why it is implied
  int line = 0;        // line of the [[support]] in the station file (0 when implied)
};

// One wire class from tables/clearances.toml.
struct WireClass {
  std::string name;
  std::string material;  // "hard-drawn copper", "copper", "copper-clad steel", ...
  int awg = 0;           // 0 when not an AWG size
  units::Length diameter = units::metres(0.0);
  std::optional<LinearDensity> mass_per_length;  // nullopt when the table has no weight for it
  std::string source;
};

enum class SpanKind { antenna, feed_line, halyard };

// A wire hanging between two attachment points. The sag is set by a horizontal tension (with
// the wire's mass per length) or by a measured mid-span sag below the chord.
struct Span {
  std::string name;
  SpanKind kind = SpanKind::antenna;
  Point3 from;
  Point3 to;
  std::optional<std::string> from_support;  // name of the support at each end, if any
  std::optional<std::string> to_support;
  std::optional<WireClass> wire;
  std::optional<LinearDensity> mass_per_length;  // resolved: stated, or from the wire class
  std::optional<Force> tension;                  // horizontal component H
  std::optional<units::Length> sag;              // measured mid-span sag below the chord
  // Largest wind swing of the sag plane from vertical, either side; nullopt = not stated, in
  // which case any swing up to horizontal (90°) is assumed.
  std::optional<units::Angle> swing;
  // Where the span comes from: empty for a [[span]] written by the user, else e.g. "antenna
  // \"doublet\", wire 1" for a wire taken from the antenna's own model (station/installation.hpp).
  std::string origin;
  std::optional<std::string> antenna;    // the [[antenna]] whose wire this is, if any
  std::optional<std::string> feed_line;  // the [[feed_line]] this span is part of, if any
  // A rigid element (tube, Yagi element, vertical radiator): it does not sag, swing free about
  // one end, or fall under NFPA 70 Table 810.52 wire sizes; it falls with its support.
  bool rigid = false;
  int line = 0;  // line of the [[span]] in the station file (0 when taken from an antenna or route)
};

struct SiteElements {
  std::vector<PowerLine> power_lines;
  std::vector<Support> supports;
  std::vector<Span> spans;
  bool empty() const { return power_lines.empty() && supports.empty() && spans.empty(); }
};

std::string to_string(LineKind k);
std::string to_string(SupportKind k);
std::string to_string(SpanKind k);

}  // namespace standoff::siting
