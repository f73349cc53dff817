// Reads a station file (TOML, schema of our own: docs/user-guide.md) into a station::Station and
// validates it: units on every quantity, unknown keys, duplicate names, unknown references,
// self-intersecting polygons, antennas below ground or inside buildings (InputError file:line:field).
#pragma once

#include <string>
#include <string_view>

#include "station/station.hpp"

namespace standoff::station {

// Throws InputError naming `file`, the line and the field on any problem. Accepts the top-level
// installation arrays [[power_line]], [[support]] and [[span]] and hands them to the siting parser.
Station load_station(std::string_view toml_text, const std::string& file);

// The text of the station file at `path`: InputError if it cannot be read, is a directory or is
// empty (every command reads station files through this and load_station).
std::string read_station_text(const std::string& path);

// Reads the file at `path` (InputError if it cannot be read) and loads it.
Station load_station_file(const std::string& path);

// The text of the bundled demo station (docs/examples/demo-station.toml, embedded in the binary).
std::string_view demo_station_text();
inline constexpr const char* kDemoStationPath = "docs/examples/demo-station.toml";

}  // namespace standoff::station
