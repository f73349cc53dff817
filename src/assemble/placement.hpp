// Sets up the placement search (siting/place.hpp) for one wire antenna of a loaded station: its
// operations' MoM solutions, antenna-frame field maps, zones, lines, supports and the routing rule.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "siting/place.hpp"
#include "station/station.hpp"

namespace standoff::assemble {

struct PlaceOptions {
  std::optional<std::string> antenna;       // default: the first wire antenna with an operation
  double step_m = 1.0;
  std::vector<double> azimuths_rad;         // default: every 15°
  std::optional<std::string> line_class;    // compare another feed-line class (--line)
  double slack = 1.2;
  double margin_m = 1.0;
  std::size_t top = 10;
  unsigned threads = 0;
  std::optional<limits::Standard> standard;
  int map_nodes_per_half_width = 40;
};

// Everything `place` needs, kept alive together (the setup refers to the maps).
struct PlaceInput {
  siting::PlaceSetup setup;
  std::string antenna;                    // the antenna placed
  std::vector<std::string> feed_lines;    // the feed lines of its operations
  std::string operating_position_source;  // "station file (line N)" or the default used
  std::string line_class;                 // the class searched ("" = no feed line)
  std::vector<std::string> notes;
  std::vector<std::pair<Eigen::Vector3d, Eigen::Vector3d>> wires;  // as solved, for the map
};

// Throws InputError (file:line:field or the command-line option) for an unknown or non-wire
// antenna, an antenna without operations, an unknown line class, or a line without data at an
// operation's frequency.
PlaceInput place_input(const station::Station& station, const PlaceOptions& options);

// The search moves the antenna's wires and supports, not its feed-line route: so that `current`
// never reads clear where `standoff lines` fails, the station's own installation checks (as it
// stands) that concern this antenna, its supports or its feed lines are applied to `current` —
// a failure there sets its clearance to failed and its permitted PEP to 0.
void apply_current_installation(const station::Station& station, const PlaceInput& in, siting::PlaceResult& result);

}  // namespace standoff::assemble
