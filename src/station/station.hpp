// The station model: site (boundary, buildings, zones, points of interest, ground), transmitters,
// feed lines, antennas and operations, as read from a station file (schema: docs/user-guide.md).
#pragma once

// Plain data; every quantity in SI (unit in the member name) or a Boost.Units quantity. Each item
// keeps the line it came from so that later checks can still name file:line:field.

#include <map>
#include <optional>
#include <string>
#include <vector>

#include "core/units.hpp"
#include "exposure/geometry.hpp"
#include "limits/limits.hpp"
#include "power/feedline.hpp"
#include "siting/site.hpp"

namespace standoff::station {

using exposure::PlanPoint;
using exposure::Polygon;  // closed implicitly (last vertex joins the first)
struct Point3 {
  double x_m = 0.0;
  double y_m = 0.0;
  double z_m = 0.0;
};

struct Building {
  std::string name;
  Polygon footprint;
  std::vector<double> floors_m;  // floor heights above ground where people stand
  double height_m = 0.0;         // roof height
  int line = 0;
};

// A zone where people can be, or a keep-out area (fenced or no access) that the other zones
// exclude: everyone, or only the uncontrolled tier (the operator and informed household may enter).
enum class ZoneKind { people, keep_out };
enum class KeepsOut { everyone, uncontrolled };

struct Zone {
  std::string name;
  ZoneKind kind = ZoneKind::people;
  KeepsOut keeps_out = KeepsOut::everyone;  // keep_out only
  std::string barrier;                      // keep_out only: the fence or barrier, as described
  Polygon polygon;               // from `polygon` or the building's footprint
  std::vector<Polygon> holes;    // parts of the polygon that are not part of the zone
  std::string building;          // empty unless the zone is a building's interior
  limits::Tier tier = limits::Tier::uncontrolled;
  std::vector<double> floors_m;  // body line from each floor to floor + 2 m (default: ground only)
  int line = 0;
};

struct PointOfInterest {
  std::string name;
  Point3 at;
  limits::Tier tier = limits::Tier::uncontrolled;
  int line = 0;
};

struct Site {
  // Ground class, the same names as `standoff wire --ground` (tables/grounds.toml, ITU-R P.527:
  // sea-water, fresh-water, wet-ground, medium-dry-ground, very-dry-ground; the literature's
  // average; perfect; free-space).
  std::string ground = "average";
  Polygon boundary;
  std::optional<limits::Tier> default_tier;  // tier of the parts of the property no zone covers
  std::vector<Building> buildings;
  std::vector<Zone> zones;
  std::vector<PointOfInterest> points;
};

struct Transmitter {
  std::string name;
  units::Power pep;
  int line = 0;
};

struct FeedLine {
  std::string name;
  std::string line_class;           // a class from tables/feedlines.toml, e.g. "rg-213", "ladder-450"
  // A line defined in the station file itself (Z0 + matched-loss points, or parallel-wire
  // geometry) instead of a class; empty line_class then.
  std::optional<power::FeedLine> inline_line;
  units::Length length;
  std::optional<double> swr;        // stated SWR at the antenna; otherwise from the antenna model
  std::vector<Point3> route;        // where the line runs (3-D points), if given: checked like a span
  int line = 0;
};

// Wire antennas are modelled by the method of moments; the others by screening models.
enum class AntennaKind {
  dipole, inverted_v, vertical, yagi, gain_only, collinear, aperture,
  folded_dipole,       // two conductors `spacing` apart joined at the ends (em::folded_dipole)
  loop,                // horizontal regular polygon loop of perimeter `length` (em::horizontal_loop)
  end_fed_half_wave,   // wire fed at one end through a matching unit, against a short counterpoise
  ocf_dipole,          // off-centre-fed dipole: fed at `feed_position` along the wire
  wires                // free-form list of straight wires with one feed
};
std::string to_string(AntennaKind k);
bool is_wire(AntennaKind k);

// One straight wire of a free-form antenna (kind = "wires"), site frame.
struct FreeWire {
  Point3 from;
  Point3 to;
  std::optional<double> diameter_m;  // default: the antenna's wire_diameter
};

struct Antenna {
  std::string name;
  AntennaKind kind = AntennaKind::dipole;
  PlanPoint position;               // plan position of the feed point / centre / base
  double height_m = 0.0;            // feed point (or centre) height above ground
  double azimuth_rad = 0.0;         // wire direction or boresight, clockwise from north
  std::optional<double> length_m;       // dipole/inverted-V total length, vertical height, collinear length
  std::optional<double> wire_diameter_m;
  std::optional<double> apex_angle_rad;  // inverted V: included angle between the legs
  std::optional<int> elements;           // yagi
  int radials = 0;                       // elevated vertical: number of radials
  std::optional<double> radial_length_m;  // elevated vertical: length of each radial
  std::optional<double> band_centre_hz;  // yagi design frequency
  std::optional<units::Gain> gain;       // gain-only, collinear, aperture (if not from area)
  std::optional<double> diameter_m;      // aperture
  std::optional<double> efficiency;      // aperture (0..1)
  std::optional<double> beamwidth_rad;   // collinear/panel horizontal beamwidth (omni if absent)
  std::optional<siting::WireClass> wire;  // `wire`: class from tables/clearances.toml (NFPA 810.52 check)
  std::optional<double> spacing_m;              // folded dipole: conductor spacing, axis to axis
  std::optional<double> second_wire_diameter_m;  // folded dipole: the unfed conductor (default: the same)
  int sides = 4;                                 // loop
  std::optional<double> feed_fraction;           // ocf_dipole, wires: feed along the (feed) wire from its start
  std::optional<std::pair<double, double>> end_heights_m;  // dipole/ocf: heights of the two ends (sloping)
  std::optional<double> end_height_m;            // end-fed: height of the far end (default: the feed height)
  std::optional<double> counterpoise_m;          // end-fed: counterpoise length (default 5 % of the wire)
  std::optional<double> matching_ratio;          // end-fed: impedance ratio n of the n:1 matching unit
  std::vector<FreeWire> free_wires;              // kind = "wires"
  int feed_wire = 0;                             // kind = "wires": index of the fed wire (0-based)
  std::string inside_building;                   // attic/indoor antenna: the building it is in
  int line = 0;
};

struct Operation {
  std::string name;
  std::string transmitter;
  std::string feed_line;            // may be empty: antenna connected directly
  std::string antenna;
  units::Frequency frequency;
  std::string mode;                 // a mode from tables/duty.toml ("ssb", "cw", "fm", ...), or empty
  std::optional<double> duty;       // explicit duty factor instead of a mode
  std::optional<units::Time> on;    // operating pattern: transmit `on`, then listen `off`, repeating
  std::optional<units::Time> off;
  std::string group;                // sources transmitting at the same time
  int line = 0;
};

struct Station {
  std::string file;                 // where it was read from (for messages)
  std::string name;
  std::optional<limits::Standard> standard;
  std::string evaluator;
  // [station] operating_position: where the transmitter stands (feed-line routing for placement).
  std::optional<Point3> operating_position;
  int operating_position_line = 0;
  Site site;
  std::vector<Transmitter> transmitters;
  std::vector<FeedLine> feed_lines;
  std::vector<Antenna> antennas;
  std::vector<Operation> operations;
  // [[power_line]], [[support]], [[span]] as written, plus the wires, routes and supports implied
  // by the antennas and feed lines themselves (station/installation.hpp).
  siting::SiteElements installation;
  std::vector<std::string> installation_assumptions;  // what was assumed for the implied elements

  const Transmitter* transmitter(const std::string& name) const;
  const FeedLine* feed_line(const std::string& name) const;
  const Antenna* antenna(const std::string& name) const;
  const Operation* operation(const std::string& name) const;
};

}  // namespace standoff::station
