// Feed lines defined in the station file (issue 12): parallel-wire geometry and Z0 + matched-loss
// points, and user tables given with --tables DIR beside the built-in ones.
#include <catch2/catch.hpp>

#include "lot_station.hpp"

#include <cmath>
#include <filesystem>
#include <fstream>
#include <string>

#include "../cli_support.hpp"
#include "core/constants.hpp"
#include "io/power_tables_toml.hpp"
#include "assemble/sources.hpp"
#include "io/station_toml.hpp"

using namespace standoff;
using Catch::Matchers::Contains;

namespace {

std::string station_with_line(const std::string& line_body) {
  return standoff::test::lot_station_preamble("lines") + R"([[feed_line]]
name = "line"
length = "30 m"
)" + line_body + R"(
[[antenna]]
name = "gp"
kind = "gain"
position = ["0 m", "0 m"]
height = "10 m"
gain = "2.15 dBi"
[[operation]]
name = "op"
transmitter = "rig"
feed_line = "line"
antenna = "gp"
frequency = "14.2 MHz"
mode = "cw"
)";
}

double loss_db(const station::Station& st, const assemble::BuildOptions& bo = {}) {
  const auto built = assemble::build(st, bo);
  const auto& chain = built.input.sources.at(0).chain;
  REQUIRE(chain.size() >= 2);
  // The power after the line over the power into it.
  double in = 0.0, out = 0.0;
  for (std::size_t i = 0; i < chain.size(); ++i)
    if (chain[i].label == "feed line") {
      out = chain[i].power_w;
      in = chain[i - 1].power_w;
      break;
    }
  REQUIRE(in > 0.0);
  return 10.0 * std::log10(in / out);
}

}  // namespace

TEST_CASE("inline feed line: parallel-wire geometry gives Z0 = (η0/(π√εr))·acosh(D/d)", "[station]") {
  // Source: the two-wire line formula (e.g. Pozar, Microwave Engineering, Table 2.1; closed form).
  const auto st = station::load_station(station_with_line(R"(conductor_diameter = "1.024 mm"
spacing = "9.7 mm"
velocity_factor = 0.85
material = "copper"
)"), "l.toml");
  REQUIRE(st.feed_lines.at(0).inline_line);
  const auto c = power::characteristics(*st.feed_lines[0].inline_line, units::hertz(14.2e6));
  const double expected = constants::eta0 / (constants::pi / 0.85) * std::acosh(9.7 / 1.024);
  CHECK(c.z0.value() == Approx(expected).epsilon(1e-9));
  CHECK(c.z0.value() == Approx(300.0).epsilon(0.02));
  // The same geometry as the built-in ladder-450 class gives the same chain loss as that class.
  const auto inline_ladder = station::load_station(station_with_line(R"(conductor_diameter = "1.024 mm"
spacing = "25 mm"
velocity_factor = 0.91
material = "copper-clad-steel"
)"), "l.toml");
  const auto table_ladder = station::load_station(station_with_line("class = \"ladder-450\"\n"), "l.toml");
  CHECK(loss_db(inline_ladder) == Approx(loss_db(table_ladder)).epsilon(1e-9));
}

TEST_CASE("inline feed line: Z0 and matched-loss points, with units on the loss", "[station]") {
  // 0.6 dB/100 ft is 0.6 × 100/30.48 = 1.9685 dB/100 m (unit conversion, closed form); a single
  // point is used as the user line's reference (power/feedline.hpp).
  const auto st = station::load_station(station_with_line(R"(z0 = "50 ohm"
velocity_factor = 0.66
matched_loss = [["14.2 MHz", "0.6 dB/100 ft"]]
)"), "l.toml");
  const auto c = power::characteristics(*st.feed_lines.at(0).inline_line, units::hertz(14.2e6));
  CHECK(c.loss_db_per_100m == Approx(0.6 * 100.0 / 30.48).epsilon(1e-9));
  // Matched 50 Ω line into the 50 Ω-matched load assumed: loss = 30 m × 1.9685 dB/100 m.
  CHECK(loss_db(st) == Approx(0.30 * 0.6 * 100.0 / 30.48).epsilon(1e-6));
  CHECK_THROWS_WITH(station::load_station(station_with_line("z0 = \"50 ohm\"\nvelocity_factor = 0.66\n"
                                                            "matched_loss = [[\"14 MHz\", \"0.6 dB\"]]\n"),
                                          "l.toml"),
                    Contains("feed_line[0].matched_loss") && Contains("dB/100 ft"));
  CHECK_THROWS_WITH(station::load_station(station_with_line("class = \"rg-213\"\nz0 = \"50 ohm\"\n"), "l.toml"),
                    Contains("feed_line[0].class") && Contains("not both"));
}

TEST_CASE("user tables given with --tables DIR: a user line class beside the built-in ones", "[cli]") {
  namespace fs = std::filesystem;
  const fs::path dir = fs::temp_directory_path() / "standoff-test12-tables";
  fs::create_directories(dir);
  std::ofstream(dir / "feedlines.toml") << R"([[parallel_wire]]
name = "my-300"
description = "home-made 300 ohm line"
conductor_diameter = "1.024 mm"
spacing = "9.7 mm"
velocity_factor = 0.85
material = "copper"
)";
  const auto st = station::load_station(station_with_line("class = \"my-300\"\n"), "l.toml");
  CHECK_THROWS_WITH(assemble::build(st), Contains("unknown feed-line class \"my-300\""));
  const auto user = assemble::load_user_tables(dir.string());
  assemble::BuildOptions bo;
  bo.user_feedlines = &*user.feedlines;
  const auto inline_same = station::load_station(station_with_line(R"(conductor_diameter = "1.024 mm"
spacing = "9.7 mm"
velocity_factor = 0.85
material = "copper"
)"), "l.toml");
  CHECK(loss_db(st, bo) == Approx(loss_db(inline_same)).epsilon(1e-9));
  // Through the CLI, and a user class may not reuse a built-in name.
  const fs::path file = dir / "station.toml";
  std::ofstream(file) << station_with_line("class = \"my-300\"\n");
  CHECK(standoff::test::run_cli({"field", file.string(), "--at", "5m,0m,2m", "--tables", dir.string()}).code != 2);
  CHECK(standoff::test::run_cli({"field", file.string(), "--at", "5m,0m,2m"}).code == 2);
  std::ofstream(dir / "feedlines.toml") << "[[parallel_wire]]\nname = \"ladder-450\"\nconductor_diameter = \"1 mm\"\n"
                                           "spacing = \"25 mm\"\nvelocity_factor = 0.9\nmaterial = \"copper\"\n";
  CHECK_THROWS_WITH(assemble::load_user_tables(dir.string()), Contains("built in"));
  CHECK_THROWS_WITH(assemble::load_user_tables((dir / "nothing-here").string()), Contains("not a directory"));
  fs::remove_all(dir);
}
