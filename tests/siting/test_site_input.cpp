// Station-file schema for [[power_line]], [[support]] and [[span]]: a good fixture parses to the
// stated values; each validation rule refuses bad input with file, line and field.
#include <catch2/catch.hpp>

#include <string>

#include <toml++/toml.h>

#include "core/constants.hpp"
#include "core/error.hpp"
#include "io/siting_toml.hpp"

using namespace standoff;
using namespace standoff::siting;

namespace {
SiteElements parse(const std::string& text) { return parse_site_elements(toml::parse(text), "site.toml"); }
}  // namespace

TEST_CASE("site elements: the clear-site fixture", "[cli]") {
  const auto root = toml::parse_file(STANDOFF_TEST_DATA_DIR "/siting/clear-site.toml");
  const auto site = parse_site_elements(root, "clear-site.toml");
  REQUIRE(site.power_lines.size() == 1);
  CHECK(site.power_lines[0].height->value() == Approx(8.0));
  CHECK(site.power_lines[0].voltage->value.value() == Approx(7200.0));
  REQUIRE(site.supports.size() == 2);
  CHECK(site.supports[1].tilt->pivot_height.value() == Approx(1.5));
  REQUIRE(site.spans.size() == 1);
  // The span attaches at the tops of both masts (12 m) and takes the wire class's weight.
  CHECK(site.spans[0].from.z.value() == Approx(12.0));
  CHECK(site.spans[0].to_support.value() == "east mast");
  CHECK(site.spans[0].mass_per_length->value() == Approx(12.43 * 0.45359237 / 304.8));
  CHECK(site.spans[0].swing->value() == Approx(constants::pi / 6.0));
}

TEST_CASE("site elements: unknown height and voltage are accepted as \"unknown\"", "[cli]") {
  const auto site = parse(R"(
[[power_line]]
name = "drop"
kind = "service"
path = [["0 m", "0 m"], ["10 ft", "20 ft"]]
height = "unknown"
voltage = "unknown"
)");
  REQUIRE(site.power_lines.size() == 1);
  CHECK_FALSE(site.power_lines[0].height);
  CHECK_FALSE(site.power_lines[0].voltage);
  CHECK(site.power_lines[0].path[1].y.value() == Approx(6.096));
}

TEST_CASE("site elements: bad input names file, line and field", "[cli]") {
  const std::string line = R"([[power_line]]
name = "l"
kind = "distribution"
path = [["0 m", "0 m"], ["10 m", "0 m"]]
)";
  const std::string mast = R"([[support]]
name = "m"
kind = "mast"
base = ["0 m", "5 m"]
)";
  struct Case { std::string text; int line; std::string field; std::string message; };
  auto c = GENERATE_COPY(
      Case{line + "height = \"8\"\nvoltage = \"unknown\"\n", 5, "power_line[0].height", "no unit"},
      Case{line + "height = \"8 m\"\nvoltage = \"7.2 kV\"\n", 6, "power_line[0].voltage", "voltage_reference"},
      Case{line + "height = \"8 m\"\nvoltage = \"unknown\"\nvoltage_reference = \"phase-to-ground\"\n", 7,
           "power_line[0].voltage_reference", "only allowed"},
      Case{line + "height = \"8 m\"\nvoltage = \"unknown\"\nhieght = \"3 m\"\n", 7, "power_line[0].hieght", "unknown field"},
      Case{std::string("[[power_line]]\nname = \"l\"\nkind = \"distribution\"\npath = [[\"0 m\", \"0 m\"]]\n"
                       "height = \"8 m\"\nvoltage = \"unknown\"\n"),
           4, "power_line[0].path", "at least two"},
      Case{line + "height = \"8 m\"\nvoltage = \"7.2 kV\"\nvoltage_reference = \"line\"\n", 7,
           "power_line[0].voltage_reference", "phase-to-ground"},
      Case{mast + "height = \"-3 m\"\n", 5, "support[0].height", "negative"},
      Case{mast + "height = \"10 m\"\ntilt_pivot_height = \"1 m\"\n", 6, "support[0].tilt_pivot_height", "both"},
      Case{mast + "height = \"10 m\"\nkind2 = \"x\"\n", 6, "support[0].kind2", "unknown field"},
      Case{mast + "height = \"10 m\"\n[[span]]\nname = \"w\"\nkind = \"antenna\"\nfrom = \"m\"\nto = \"oak\"\nsag = \"1 m\"\n",
           10, "span[0].to", "no [[support]] named \"oak\""},
      Case{mast + "height = \"10 m\"\n[[span]]\nname = \"w\"\nkind = \"antenna\"\nfrom = \"m\"\n"
                  "to = [\"20 m\", \"5 m\", \"10 m\"]\ntension = \"50 N\"\n",
           11, "span[0].tension", "weight"},
      Case{mast + "height = \"10 m\"\n[[span]]\nname = \"w\"\nkind = \"antenna\"\nfrom = \"m\"\n"
                  "to = [\"20 m\", \"5 m\", \"10 m\"]\nwire = \"14-awg-gold\"\nsag = \"1 m\"\n",
           11, "span[0].wire", "unknown wire class"},
      Case{mast + "height = \"10 m\"\n[[span]]\nname = \"w\"\nkind = \"antenna\"\nfrom = \"m\"\nfrom_height = \"12 m\"\n"
                  "to = [\"20 m\", \"5 m\", \"10 m\"]\nsag = \"1 m\"\n",
           10, "span[0].from_height", "above the top"},
      Case{mast + "height = \"10 m\"\n[[span]]\nname = \"w\"\nkind = \"antenna\"\nfrom = \"m\"\n"
                  "to = [\"20 m\", \"5 m\", \"10 m\"]\nsag = \"1 m\"\nswing = \"120 deg\"\n",
           12, "span[0].swing", "0 deg to 90 deg"},
      Case{mast + "height = \"10 m\"\n[[support]]\nname = \"m\"\nkind = \"tree\"\nbase = [\"9 m\", \"0 m\"]\nheight = \"9 m\"\n",
           7, "support[1].name", "duplicate"});
  CAPTURE(c.text);
  try {
    parse(c.text);
    FAIL("expected an InputError");
  } catch (const InputError& e) {
    CHECK(e.where().file == "site.toml");
    CHECK(e.where().line == c.line);
    CHECK(e.where().field == c.field);
    CHECK_THAT(e.message(), Catch::Matchers::Contains(c.message));
  }
}
