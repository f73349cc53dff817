// Installation geometry from the antennas themselves (issue 12): a station with a power line is
// always checked against every antenna wire, feed-line route and support, whether or not the user
// writes [[span]]/[[support]]; spans that describe an antenna wire must agree with it; `lines`
// reads the file through the same loader as `evaluate`.
#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>
#include <string>

#include <nlohmann/json.hpp>

#include "../cli_support.hpp"
#include "core/error.hpp"
#include "assemble/installation.hpp"
#include "io/station_toml.hpp"

using namespace standoff;
using standoff::test::run_cli;
using Catch::Matchers::Contains;

namespace {

// A 40 m band dipole whose centre is `height` above ground at y = `y`; a 7.2 kV (phase to
// ground) distribution line at 9 m along y = 0. No [[span]] and no [[support]].
std::string station_text(const std::string& height, const std::string& y, const std::string& extra = "") {
  return R"([station]
name = "line test"

[site]
boundary = [["-30 m", "-10 m"], ["30 m", "-10 m"], ["30 m", "40 m"], ["-30 m", "40 m"]]

[[zone]]
name = "lot"
polygon = [["-30 m", "-10 m"], ["30 m", "-10 m"], ["30 m", "40 m"], ["-30 m", "40 m"]]
tier = "uncontrolled"

[[transmitter]]
name = "rig"
pep = "100 W"

[[antenna]]
name = "dipole"
kind = "dipole"
position = ["0 m", ")" + y + R"("]
height = ")" + height + R"("
azimuth = "90 deg"
length = "20 m"
wire_diameter = "2 mm"

[[operation]]
name = "40 m SSB"
transmitter = "rig"
antenna = "dipole"
frequency = "7.1 MHz"
mode = "ssb"

[[power_line]]
name = "street line"
kind = "distribution"
path = [["-40 m", "0 m"], ["40 m", "0 m"]]
height = "9 m"
voltage = "7.2 kV"
voltage_reference = "phase-to-ground"
)" + extra;
}

std::string write_temp(const std::string& name, const std::string& text) {
  const auto path = std::filesystem::temp_directory_path() / ("standoff-test12-" + name);
  std::ofstream(path) << text;
  return path.string();
}

const siting::Check* find(const siting::LinesReport& r, const std::string& rule, const std::string& subject_part) {
  for (const auto& c : r.checks)
    if (c.rule == rule && c.subject.find(subject_part) != std::string::npos) return &c;
  return nullptr;
}

}  // namespace

TEST_CASE("installation: an antenna 1 m above a 7.2 kV line fails standing clearance with no span written", "[cli]") {
  // The wire runs along the line, 1 m above the 9 m conductor: the OSHA approach distance for
  // 7.2 kV phase to ground is 10 ft = 3.05 m (29 CFR 1910.333(c)(3)(i)), so the wire (even before
  // its assumed sag swings) is 1 m away and must fail.
  const station::Station st = station::load_station(station_text("10 m", "0 m"), "t.toml");
  const auto r = assemble::check_installation(st);
  const siting::Check* c = find(r, "standing clearance", "dipole");
  REQUIRE(c != nullptr);
  CHECK(c->status == siting::CheckStatus::fail);
  REQUIRE(c->actual);
  CHECK(c->actual->value() <= 1.0);
  CHECK(c->required->value() >= 3.04);
  CHECK_FALSE(r.all_pass());
  // The wire lies over the line in plan: the crossing rule fails too (NFPA 70 810.13).
  const siting::Check* x = find(r, "no crossing", "dipole");
  REQUIRE(x != nullptr);
  CHECK(x->status == siting::CheckStatus::fail);

  // The same through the CLI: `lines` and `evaluate` both exit 1 and never say "no power lines".
  const std::string path = write_temp("above-line.toml", station_text("10 m", "0 m"));
  const auto lines = run_cli({"lines", path});
  CHECK(lines.code == 1);
  CHECK_THAT(lines.out, !Contains("no power lines") && !Contains("no overhead power line"));
  CHECK_THAT(lines.out, Contains("FAIL] standing clearance: dipole"));
  const auto ev = run_cli({"evaluate", path, "--json"});
  CHECK(ev.code == 1);
  const auto j = nlohmann::json::parse(ev.out);
  REQUIRE(j.at("power_lines").is_object());
  CHECK(j.at("power_lines").at("verdict") == "fail");
  std::filesystem::remove(path);
}

TEST_CASE("installation: the same antenna 30 m from the line passes its clearances", "[cli]") {
  const station::Station st = station::load_station(station_text("10 m", "30 m"), "t.toml");
  const auto r = assemble::check_installation(st);
  const siting::Check* c = find(r, "standing clearance", "dipole");
  REQUIRE(c != nullptr);
  CHECK(c->status == siting::CheckStatus::pass);
  // Implied end supports (10 m masts 30 m from the line) pass the US CPSC fall zone (1.5 × 10 m).
  const siting::Check* f = find(r, "fall zone", "end support (implied)");
  REQUIRE(f != nullptr);
  CHECK(f->status == siting::CheckStatus::pass);
  CHECK(f->required->value() == Approx(15.0));
  // The conductor size cannot be checked without a wire class: not evaluated, never a silent pass.
  const siting::Check* w = find(r, "antenna conductor size", "dipole");
  REQUIRE(w != nullptr);
  CHECK(w->status == siting::CheckStatus::not_evaluated);
  CHECK(w->diameter);
}

TEST_CASE("installation: a span naming an antenna must agree with its wire", "[cli]") {
  const std::string agree = R"(
[[span]]
name = "dipole wire"
kind = "antenna"
antenna = "dipole"
from = ["-10 m", "30 m", "10 m"]
to = ["10 m", "30 m", "10 m"]
sag = "0.3 m"
)";
  const station::Station st = station::load_station(station_text("10 m", "30 m", agree), "t.toml");
  int wires = 0;
  for (const auto& s : st.installation.spans)
    if (s.antenna && *s.antenna == "dipole") ++wires;
  CHECK(wires == 1);  // the span replaced the antenna's own wire
  const std::string wrong_end = R"(
[[span]]
name = "dipole wire"
kind = "antenna"
antenna = "dipole"
from = ["-10 m", "30 m", "10 m"]
to = ["14 m", "30 m", "10 m"]
sag = "0.3 m"
)";
  CHECK_THROWS_WITH(station::load_station(station_text("10 m", "30 m", wrong_end), "t.toml"),
                    Contains("span[0].from") && Contains("do not meet the ends"));
  const std::string too_long = R"(
[[span]]
name = "dipole wire"
kind = "antenna"
antenna = "dipole"
from = ["-10 m", "30 m", "10 m"]
to = ["10 m", "30 m", "10 m"]
sag = "4 m"
)";
  CHECK_THROWS_WITH(station::load_station(station_text("10 m", "30 m", too_long), "t.toml"),
                    Contains("span[0].sag") && Contains("long but the wire of antenna"));
}

TEST_CASE("installation: a feed line's span or route may not be longer than the line", "[cli]") {
  const std::string route = R"(
[[feed_line]]
name = "coax"
class = "rg-213"
length = "10 m"
route = [["0 m", "30 m", "10 m"], ["0 m", "10 m", "1 m"]]
)";
  CHECK_THROWS_WITH(station::load_station(station_text("10 m", "30 m", route), "t.toml"),
                    Contains("feed_line[0].route") && Contains("route is"));
  const std::string ok = R"(
[[feed_line]]
name = "coax"
class = "rg-213"
length = "30 m"
route = [["0 m", "30 m", "10 m"], ["0 m", "10 m", "1 m"]]
)";
  const station::Station st = station::load_station(station_text("10 m", "30 m", ok), "t.toml");
  const auto r = assemble::check_installation(st);
  const siting::Check* c = find(r, "standing clearance", "coax: route leg 1");
  REQUIRE(c != nullptr);
  CHECK(c->status == siting::CheckStatus::pass);
}

TEST_CASE("lines: reads the file through the station loader (refuses what evaluate refuses)", "[cli]") {
  // Unknown top-level table, an installation-only file (no [station]), an empty file, a directory.
  const std::string unknown = write_temp("unknown.toml", station_text("10 m", "30 m", "\n[[antena]]\nname = \"x\"\n"));
  const std::string bare = write_temp("bare.toml", "[[power_line]]\nname = \"l\"\nkind = \"service\"\n"
                                                   "path = [[\"0 m\", \"0 m\"], [\"1 m\", \"0 m\"]]\n"
                                                   "height = \"unknown\"\nvoltage = \"unknown\"\n");
  const std::string empty = write_temp("empty.toml", "\n");
  const std::string dir = std::filesystem::temp_directory_path().string();
  for (const auto& path : {unknown, bare, empty, dir}) {
    const auto l = run_cli({"lines", path});
    const auto e = run_cli({"evaluate", path});
    CHECK(l.code == 2);
    CHECK(e.code == 2);
    CHECK(l.err == e.err);
    CHECK(l.out.empty());
  }
  CHECK_THAT(run_cli({"lines", empty}).err, Contains("empty"));
  CHECK_THAT(run_cli({"lines", dir}).err, Contains("directory"));
  for (const auto& path : {unknown, bare, empty}) std::filesystem::remove(path);
}

TEST_CASE("second example: the folded dipole on 300 ohm line evaluates; moved over the line it fails", "[cli]") {
  const std::string path = STANDOFF_SOURCE_DIR "/docs/examples/folded-dipole-station.toml";
  const auto ok = run_cli({"evaluate", path, "--json", "--threads", "2"});
  INFO(ok.err);
  REQUIRE(ok.code == 0);
  const auto j = nlohmann::json::parse(ok.out);
  std::set<std::string> subjects;
  for (const auto& c : j.at("power_lines").at("checks"))
    if (c.at("rule") == "standing clearance") subjects.insert(c.at("subject").get<std::string>());
  CHECK(subjects.count("folded dipole: fed conductor"));
  CHECK(subjects.count("folded dipole: second conductor"));
  CHECK(subjects.count("300 ohm line: route leg 1"));

  // The issue's reproduction: the antenna moved to 1 m above the 9 m, 7.2 kV conductor, with no
  // [[span]] written. The exposure stays tiny, but the installation must fail, and loudly.
  std::ifstream in(path);
  std::stringstream ss;
  ss << in.rdbuf();
  std::string text = ss.str();
  const std::string pos = "position = [\"11 m\", \"45 m\"]\nheight = \"10 m\"";
  REQUIRE(text.find(pos) != std::string::npos);
  text.replace(text.find(pos), pos.size(), "position = [\"11 m\", \"-4 m\"]\nheight = \"10 m\"");
  const std::string moved = write_temp("moved.toml", text);
  const auto bad = run_cli({"evaluate", moved, "--threads", "2"});
  CHECK(bad.code == 1);
  CHECK_THAT(bad.out, !Contains("no power lines") && !Contains("no overhead power line"));
  CHECK_THAT(bad.out, Contains("standing clearance") && Contains("folded dipole: fed conductor"));
  const auto lines = run_cli({"lines", moved, "--json"});
  CHECK(lines.code == 1);
  const auto lj = nlohmann::json::parse(lines.out);
  CHECK(lj.at("power_lines") == 1);
  bool failed = false;
  for (const auto& c : lj.at("checks"))
    failed |= c.at("rule") == "standing clearance" && c.at("subject") == "folded dipole: fed conductor" &&
              c.at("pass") == false && !c.at("remedies").empty();
  CHECK(failed);
  std::filesystem::remove(moved);
}

TEST_CASE("installation: the conductor-size row shows millimetre diameters, not 0.0 m", "[cli]") {
  // 14 AWG is 1.628 mm (ASTM B258); the row used to go through the metre formatter ("0.0 m").
  // --verbose: the terminal summary folds passed checks into a count per rule (issue 13).
  const auto r = run_cli({"evaluate", STANDOFF_TEST_DATA_DIR "/siting/clear-site.toml", "--threads", "2", "--verbose"});
  INFO(r.err);
  REQUIRE((r.code == 0 || r.code == 1));
  std::istringstream lines(r.out);
  std::string row;
  bool found = false;
  while (std::getline(lines, row))
    if (row.find("antenna conductor size") != std::string::npos) {
      found = true;
      CHECK_THAT(row, Contains("1.62 mm") || Contains("1.63 mm"));
      CHECK_THAT(row, !Contains("0.0 m"));
    }
  CHECK(found);
}
