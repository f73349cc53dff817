// The limits-table loader refuses malformed tables, naming the file, the line and the field:
// gaps, overlaps, bands out of order, negative or zero values, discontinuities at breakpoints,
// missing fields, unknown keys, bad TOML, and inconsistent declarations (docs/adding-a-limits-table.md).
#include <catch2/catch.hpp>

#include <string>

#include "io/limits_toml.hpp"

using namespace standoff;
using namespace standoff::limits;
using Catch::Matchers::Contains;

namespace {

// A small valid table: three bands of a made-up tier, continuous at 10 and 100 MHz (values are
// test fixtures, not limits). Markers in comments let the tests find the line they edit.
const std::string kGood = R"(schema = 1
standard = "fcc"
name = "Test table"
document = "test document"
table = "Table 0"
year = 2000
confidence = "confirmed"

[[tier]]
tier = "uncontrolled"
document_tier = "general public"
averaging = "30 min"

[[tier.band]]
f_min_mhz = 1.0
f_max_mhz = 10.0
e_v_per_m = { a = 100.0, b = -1.0 }
s_w_per_m2 = { a = 265.0, b = -2.0 }
s_is_equivalent = true

[[tier.band]]
f_min_mhz = 10.0   # band2 f_min
f_max_mhz = 100.0
e_v_per_m = { a = 10.0, b = 0.0 }   # band2 E
s_w_per_m2 = { a = 2.65, b = 0.0 }
s_is_equivalent = false

[[tier.band]]
f_min_mhz = 100.0  # band3 f_min
f_max_mhz = 1000.0
s_mw_per_cm2 = { a = 1.0, b = 1.0, div = 377.358 }  # band3 S
s_is_equivalent = false
)";

int line_of(const std::string& text, const std::string& marker) {
  const auto pos = text.find(marker);
  REQUIRE(pos != std::string::npos);
  return 1 + static_cast<int>(std::count(text.begin(), text.begin() + static_cast<long>(pos), '\n'));
}

std::string replace(std::string text, const std::string& from, const std::string& to) {
  const auto pos = text.find(from);
  REQUIRE(pos != std::string::npos);
  return text.replace(pos, from.size(), to);
}

}  // namespace

TEST_CASE("the fixture table loads and evaluates its power laws", "[limits][loader]") {
  const LimitTable t = load_limit_table(kGood, "good.toml");
  REQUIRE(t.tiers.size() == 1);
  CHECK(t.tiers[0].bands.size() == 3);
  CHECK(t.tiers[0].averaging.value() == 1800.0);  // 30 min
  CHECK(t.source() == "test document, Table 0 (2000)");
  // s_mw_per_cm2 is converted to W/m² (1 mW/cm² = 10 W/m², exact) and div applied: at 377.358 MHz
  // the law f/377.358 mW/cm² is 1 mW/cm² = 10 W/m².
  const auto v = lookup(t, Tier::uncontrolled, units::hertz(377.358e6));
  CHECK(v.s->value() == Approx(10.0).epsilon(1e-12));
  CHECK(t.tiers[0].bands[2].source_line == line_of(kGood, "f_min_mhz = 100.0") - 1);
}

TEST_CASE("malformed tables are refused naming file, line and field", "[limits][loader]") {
  struct Bad {
    const char* what;
    std::string text;
    std::string marker;   // the line the error must name
    std::string message;  // part of the message
  };
  const std::string g = kGood;
  auto bad = GENERATE_COPY(
      Bad{"gap", replace(g, "f_min_mhz = 10.0   # band2 f_min", "f_min_mhz = 12.0   # band2 f_min"),
          "band2 f_min", "gap"},
      Bad{"overlap", replace(g, "f_min_mhz = 10.0   # band2 f_min", "f_min_mhz = 8.0   # band2 f_min"),
          "band2 f_min", "overlap"},
      Bad{"out of order", replace(g, "f_min_mhz = 100.0  # band3 f_min", "f_min_mhz = 0.5  # band3 f_min"),
          "band3 f_min", "out of order"},
      Bad{"negative coefficient", replace(g, "{ a = 10.0, b = 0.0 }   # band2 E", "{ a = -10.0, b = 0.0 }   # band2 E"),
          "band2 E", "must be above zero"},
      Bad{"zero frequency", replace(g, "f_min_mhz = 1.0", "f_min_mhz = 0.0"), "f_min_mhz = 0.0", "above zero"},
      Bad{"discontinuity", replace(g, "{ a = 10.0, b = 0.0 }   # band2 E", "{ a = 10.5, b = 0.0 }   # band2 E"),
          "band2 E", "discontinuous: e_v_per_m at 10 MHz is 10 below and 10.5 above (4.76 %)"},
      Bad{"discontinuity in S given in mW/cm²",
          replace(g, "{ a = 1.0, b = 1.0, div = 377.358 }  # band3 S", "{ a = 1.0, b = 1.0, div = 300.0 }  # band3 S"),
          "band3 S", "s_w_per_m2 at 100 MHz"},
      Bad{"missing field", replace(g, "averaging = \"30 min\"\n", ""), "tier = \"uncontrolled\"", "averaging"},
      Bad{"missing band field", replace(g, "f_max_mhz = 100.0\n", ""), "[[tier.band]]\nf_min_mhz = 10.0",
          "f_max_mhz: required"},  // a missing key: the line of its table's header
      Bad{"unknown key", replace(g, "s_is_equivalent = false\n", "s_is_equivalnet = false\n"),
          "s_is_equivalnet", "unknown key"},
      Bad{"S without its flag", replace(g, "s_is_equivalent = true\n", ""), "[[tier.band]]\nf_min_mhz = 1.0",
          "s_is_equivalent"},
      Bad{"both S keys",
          replace(g, "s_w_per_m2 = { a = 2.65, b = 0.0 }", "s_w_per_m2 = { a = 2.65, b = 0.0 }\ns_mw_per_cm2 = { a = 0.265, b = 0.0 }"),
          "s_mw_per_cm2 = { a = 0.265", "once"},
      Bad{"unknown tier", replace(g, "tier = \"uncontrolled\"", "tier = \"public\""), "tier = \"public\"", "controlled or uncontrolled"},
      Bad{"unknown confidence", replace(g, "confidence = \"confirmed\"", "confidence = \"sure\""), "confidence = \"sure\"",
          "confirmed, partly or verify"},
      Bad{"unitless averaging", replace(g, "averaging = \"30 min\"", "averaging = \"30\""), "averaging = \"30\"", "no unit"},
      Bad{"declared step that is continuous",
          replace(g, "e_v_per_m = { a = 10.0, b = 0.0 }   # band2 E",
                  "e_v_per_m = { a = 10.0, b = 0.0 }   # band2 E\nstep_at_f_min = [\"e_v_per_m\"]"),
          "step_at_f_min", "remove the declaration"},
      Bad{"declared step too large",
          replace(replace(g, "{ a = 10.0, b = 0.0 }   # band2 E", "{ a = 12.0, b = 0.0 }   # band2 E"),
                  "s_w_per_m2 = { a = 2.65, b = 0.0 }", "s_w_per_m2 = { a = 2.65, b = 0.0 }\nstep_at_f_min = [\"e_v_per_m\"]"),
          "band2 E", "step too large"},
      Bad{"file flag stronger than a tier's",
          replace(g, "averaging = \"30 min\"", "averaging = \"30 min\"\nconfidence = \"verify\""),
          "confidence = \"confirmed\"", "weakest"},
      Bad{"not TOML", replace(g, "table = \"Table 0\"", "table = \"Table 0"), "table = \"Table 0", "not valid TOML"});
  INFO(bad.what);
  const int line = line_of(bad.text, bad.marker);
  CHECK_THROWS_WITH(load_limit_table(bad.text, "bad.toml"),
                    Contains("bad.toml:" + std::to_string(line) + ":") && Contains(bad.message));
}

TEST_CASE("a published step is accepted when declared", "[limits][loader]") {
  // A 2 % step, as the ICNIRP tables have at some breakpoints (rounded coefficients).
  const std::string text =
      replace(replace(kGood, "{ a = 10.0, b = 0.0 }   # band2 E", "{ a = 10.2, b = 0.0 }   # band2 E"),
              "s_w_per_m2 = { a = 2.65, b = 0.0 }", "s_w_per_m2 = { a = 2.65, b = 0.0 }\nstep_at_f_min = [\"e_v_per_m\"]");
  const LimitTable t = load_limit_table(text, "step.toml");
  // At the breakpoint the lower band's value applies (band edges (f_min, f_max]).
  CHECK(lookup(t, Tier::uncontrolled, units::hertz(10e6)).e->value() == Approx(10.0).epsilon(1e-12));
  CHECK(lookup(t, Tier::uncontrolled, units::hertz(10.001e6)).e->value() == 10.2);
}

TEST_CASE("lookup is refused outside the table and for a missing tier", "[limits][loader]") {
  const LimitTable t = load_limit_table(kGood, "good.toml");
  CHECK(lookup(t, Tier::uncontrolled, units::hertz(1e6)).e->value() == Approx(100.0));  // f_min is included
  CHECK(lookup(t, Tier::uncontrolled, units::hertz(1e9)).s.has_value());                 // f_max is included
  CHECK_THROWS_WITH(lookup(t, Tier::uncontrolled, units::hertz(0.999e6)), Contains("good.toml") && Contains("1–1000 MHz"));
  CHECK_THROWS_WITH(lookup(t, Tier::uncontrolled, units::hertz(1.001e9)), Contains("1–1000 MHz"));
  CHECK_THROWS_WITH(lookup(t, Tier::controlled, units::hertz(50e6)), Contains("no controlled tier"));
}
