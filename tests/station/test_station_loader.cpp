// The station-file loader: a complete valid file loads with every quantity in SI; each validation
// rule (unknown key, missing unit, duplicate name, unknown reference, self-intersecting polygon,
// antenna below ground or inside a building, bad tier/standard/kind) is refused with an InputError
// naming file:line:field. Expected values are the inputs themselves converted by the exact unit
// definitions (1 ft = 0.3048 m, international foot 1959), so the checks are closed-form.
#include <catch2/catch.hpp>

#include <fstream>
#include <regex>
#include <sstream>
#include <string>

#include "core/error.hpp"
#include "io/station_toml.hpp"
#include "guide_example.hpp"

using standoff::InputError;
using standoff::station::load_station;

namespace {

// A small valid station; tests replace one line (a unique marker) to break one rule at a time.
const std::string kBase = R"([station]
name = "Test station"
standard = "fcc"

[site]
ground = "average"
boundary = [["0 m", "0 m"], ["30 m", "0 m"], ["30 m", "30 m"], ["0 m", "30 m"]]

[[building]]
name = "house"
footprint = [["2 m", "2 m"], ["10 m", "2 m"], ["10 m", "8 m"], ["2 m", "8 m"]]
floors = ["0 m", "3 m"]
height = "6 m"

[[zone]]
name = "garden"
polygon = [["0 m", "0 m"], ["30 m", "0 m"], ["30 m", "30 m"], ["0 m", "30 m"]]
tier = "controlled"

[[zone]]
name = "house"
building = "house"
tier = "controlled"

[[point]]
name = "window"
at = ["31 m", "5 m", "4 m"]

[[transmitter]]
name = "tx"
pep = "100 W"

[[feed_line]]
name = "coax"
class = "rg-213"
length = "20 m"

[[antenna]]
name = "dipole"
kind = "dipole"
position = ["20 m", "20 m"]
height = "10 m"
azimuth = "90 deg"
length = "10 m"

[[operation]]
name = "20 m SSB"
transmitter = "tx"
feed_line = "coax"
antenna = "dipole"
frequency = "14.2 MHz"
mode = "ssb"
on = "5 min"
off = "5 min"
)";

std::string replace(std::string text, const std::string& from, const std::string& to) {
  const auto pos = text.find(from);
  REQUIRE(pos != std::string::npos);
  text.replace(pos, from.size(), to);
  return text;
}

// Line number (1-based) of the first occurrence of `needle` in `text`.
int line_of(const std::string& text, const std::string& needle) {
  const auto pos = text.find(needle);
  REQUIRE(pos != std::string::npos);
  return 1 + static_cast<int>(std::count(text.begin(), text.begin() + static_cast<std::ptrdiff_t>(pos), '\n'));
}

}  // namespace

TEST_CASE("a valid station loads with every quantity in SI", "[station]") {
  const auto st = load_station(kBase, "test.toml");
  CHECK(st.name == "Test station");
  REQUIRE(st.site.zones.size() == 2);
  CHECK(st.site.zones[1].floors_m == std::vector<double>{0.0, 3.0});  // inherited from the building
  CHECK(st.site.zones[1].polygon.size() == 4);
  CHECK(st.site.points[0].tier == standoff::limits::Tier::uncontrolled);  // default tier: uncontrolled
  REQUIRE(st.antennas.size() == 1);
  CHECK(st.antennas[0].azimuth_rad == Approx(M_PI / 2));  // 90 deg, exact conversion
  CHECK(st.operations[0].frequency.value() == Approx(14.2e6));
  CHECK(st.operations[0].on->value() == Approx(300.0));  // 5 min = 300 s
  CHECK(st.transmitters[0].pep.value() == Approx(100.0));
}

TEST_CASE("feet are converted exactly (international foot, 1959)", "[station]") {
  const auto st = load_station(replace(kBase, "height = \"10 m\"", "height = \"40 ft\""), "test.toml");
  CHECK(st.antennas[0].height_m == Approx(12.192).epsilon(1e-12));
}

struct BadCase {
  const char* name;
  const char* from;
  const char* to;
  const char* field;    // expected in the message
  const char* message;  // expected in the message
  const char* at_line;  // the text whose line the error must name (after replacement)
};

TEST_CASE("each validation rule names file:line:field", "[station][errors]") {
  const BadCase c = GENERATE(values<BadCase>({
      {"unknown key (typo)", "azimuth = \"90 deg\"", "azimuth = \"90 deg\"\nheigth = \"3 m\"", "antenna[0].heigth",
       "unknown key", "heigth"},
      {"missing unit", "length = \"10 m\"", "length = \"10\"", "antenna[0].length", "no unit", "length = \"10\""},
      {"same name in two kinds (legal)", "name = \"window\"", "name = \"tx\"", "", "", ""},
      {"duplicate zone", "name = \"garden\"", "name = \"house\"", "zone.name", "duplicate name",
       "[[zone]]\nname = \"house\"\nbuilding"},
      {"unknown transmitter", "transmitter = \"tx\"", "transmitter = \"amp\"", "operation[0].transmitter",
       "unknown transmitter", "transmitter = \"amp\""},
      {"unknown antenna", "antenna = \"dipole\"", "antenna = \"yagi\"", "operation[0].antenna", "unknown antenna",
       "antenna = \"yagi\""},
      {"unknown feed line", "feed_line = \"coax\"", "feed_line = \"ladder\"", "operation[0].feed_line",
       "unknown feed line", "feed_line = \"ladder\""},
      {"unknown building", "building = \"house\"", "building = \"shed\"", "zone[1].building", "unknown building",
       "building = \"shed\""},
      {"self-intersecting polygon",
       "polygon = [[\"0 m\", \"0 m\"], [\"30 m\", \"0 m\"], [\"30 m\", \"30 m\"], [\"0 m\", \"30 m\"]]",
       "polygon = [[\"0 m\", \"0 m\"], [\"30 m\", \"30 m\"], [\"30 m\", \"0 m\"], [\"0 m\", \"30 m\"]]",
       "zone[0].polygon", "self-intersecting", "polygon = [[\"0 m\", \"0 m\"], [\"30 m\", \"30 m\"]"},
      {"antenna below ground", "height = \"10 m\"", "height = \"-1 m\"", "antenna[0].height", "below ground",
       "height = \"-1 m\""},
      // An antenna inside a building (attic/indoor) is accepted since issue 12: test_antenna_kinds.cpp.
      {"bad tier", "tier = \"controlled\"", "tier = \"household\"", "zone[0].tier", "unknown tier",
       "tier = \"household\""},
      {"bad standard", "standard = \"fcc\"", "standard = \"osha\"", "station.standard", "unknown standard",
       "standard = \"osha\""},
      {"bad antenna kind", "kind = \"dipole\"", "kind = \"rhombic\"", "antenna[0].kind", "unknown antenna kind",
       "kind = \"rhombic\""},
      {"mode and duty both", "mode = \"ssb\"", "mode = \"ssb\"\nduty = \"40 %\"", "operation[0].mode", "exactly one",
       "[[operation]]"},
      {"on without off", "off = \"5 min\"", "", "operation[0].off", "both on and off", "[[operation]]"},
      {"point below ground", "at = [\"31 m\", \"5 m\", \"4 m\"]", "at = [\"31 m\", \"5 m\", \"-4 m\"]", "point[0].at",
       "below ground", "at = [\"31 m\", \"5 m\", \"-4 m\"]"},
      {"frequency without unit", "frequency = \"14.2 MHz\"", "frequency = 14.2", "operation[0].frequency",
       "quantity with its unit", "frequency = 14.2"},
      {"unknown top-level table", "[[transmitter]]", "[[transmiter]]", "transmiter", "unknown key", "[[transmiter]]"},
  }));
  CAPTURE(c.name);
  const std::string text = replace(kBase, c.from, c.to);
  if (std::string(c.field).empty()) {  // the control case: a legal change
    CHECK_NOTHROW(load_station(text, "test.toml"));
    return;
  }
  try {
    load_station(text, "test.toml");
    FAIL("accepted: " << c.name);
  } catch (const InputError& e) {
    const std::string what = e.what();
    CAPTURE(what);
    CHECK(e.where().file == "test.toml");
    CHECK(e.where().field == c.field);
    CHECK(e.where().line == line_of(text, c.at_line));
    CHECK(what.find(c.message) != std::string::npos);
    CHECK(what.rfind("test.toml:" + std::to_string(e.where().line) + ": " + c.field, 0) == 0);
  }
}

TEST_CASE("TOML syntax errors name the line", "[station][errors]") {
  const std::string text = replace(kBase, "pep = \"100 W\"", "pep = \"100 W");
  try {
    load_station(text, "t.toml");
    FAIL("accepted broken TOML");
  } catch (const InputError& e) {
    CHECK(e.where().line == line_of(text, "pep = \"100 W"));
  }
}

TEST_CASE("the demo station and the user guide's complete example load", "[station]") {
  const auto demo = load_station(standoff::station::demo_station_text(), "demo-station.toml");
  CHECK(demo.operations.size() >= 5);
  // The user guide's complete example (between the markers) must load too.
  const std::string example = user_guide_example();
  const auto st = load_station(example, "user-guide example");
  CHECK(!st.operations.empty());
}
