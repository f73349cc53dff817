// Work estimates (issue 14): a realistic 1 km² zone beside the demo station is evaluated (not
// refused by the default cap), a zone far beyond it is refused before anything is allocated.
#include <catch2/catch.hpp>

#include <string>

#include "exposure/work_estimate.hpp"
#include "assemble/sources.hpp"
#include "io/station_toml.hpp"

namespace {
std::string demo_with_zone(const std::string& side) {
  std::string s(standoff::station::demo_station_text());
  const std::string anchor = "[[zone]]\nname = \"street\"";
  REQUIRE(s.find(anchor) != std::string::npos);
  s.replace(s.find(anchor), 0,
            "[[zone]]\nname = \"big field\"\npolygon = [[\"100 m\", \"0 m\"], [\"" + side + "\", \"0 m\"], [\"" + side +
                "\", \"" + side + "\"], [\"100 m\", \"" + side + "\"]]\ntier = \"uncontrolled\"\n\n");
  return s;
}
double cells_for(const std::string& text) {
  const auto st = standoff::station::load_station(text, "estimate.toml");
  const auto built = standoff::assemble::build(st, {});
  return standoff::exposure::estimated_grid_cells(built.input, 0.5);
}
}  // namespace

TEST_CASE("a 1 km² zone fits the default grid-cell cap; a 4 km² one does not", "[closed_form]") {
  // Bounding box at 0.5 m: (1000 m / 0.5 m)² = 4e6 cells for the big zone alone (closed form).
  const double one_km2 = cells_for(demo_with_zone("1100 m"));
  CHECK(one_km2 >= 4e6);
  CHECK(one_km2 < standoff::exposure::kDefaultMaxGridCells);
  const double four_km2 = cells_for(demo_with_zone("2100 m"));
  CHECK(four_km2 >= 16e6);
  CHECK(four_km2 > standoff::exposure::kDefaultMaxGridCells);
}
