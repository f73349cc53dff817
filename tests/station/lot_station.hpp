// Test stations on one 80 m × 80 m lot (one uncontrolled zone, one 100 W transmitter "rig"): the
// preamble shared by the station-file tests, which add their own antenna, line and operation tables.
#pragma once

#include <string>

namespace standoff::test {

inline std::string lot_station_preamble(const std::string& name) {
  return R"([station]
name = ")" + name + R"("
[site]
boundary = [["-40 m", "-40 m"], ["40 m", "-40 m"], ["40 m", "40 m"], ["-40 m", "40 m"]]
[[zone]]
name = "lot"
polygon = [["-40 m", "-40 m"], ["40 m", "-40 m"], ["40 m", "40 m"], ["-40 m", "40 m"]]
tier = "uncontrolled"
[[transmitter]]
name = "rig"
pep = "100 W"
)";
}

}  // namespace standoff::test
