// Sets up the placement search (siting/place.hpp) for one wire antenna of a loaded station: its
// operations' MoM solutions, antenna-frame field maps, zones, lines, supports and the routing rule.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "siting/place.hpp"
#include "station/station.hpp"

namespace standoff::station {

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
  std::string operating_position_source;  // "station file (line N)" or the default used
  std::string line_class;                 // the class searched ("" = no feed line)
  std::vector<std::string> notes;
  std::vector<std::pair<Eigen::Vector3d, Eigen::Vector3d>> wires;  // as solved, for the map
};

// Throws InputError (file:line:field or the command-line option) for an unknown or non-wire
// antenna, an antenna without operations, an unknown line class, or a line without data at an
// operation's frequency.
PlaceInput place_input(const Station& station, const PlaceOptions& options);

}  // namespace standoff::station
