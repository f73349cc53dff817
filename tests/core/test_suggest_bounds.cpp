// "Did you mean" (Damerau–Levenshtein optimal string alignment) and the input bounds (issue 14).
#include <cmath>
#include <limits>

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include "core/bounds.hpp"
#include "core/suggest.hpp"
#include "report/finite_check.hpp"

using namespace standoff;

TEST_CASE("edit distance counts insertions, deletions, substitutions and adjacent swaps", "[closed_form]") {
  // Counted by hand (closed form): kitten → sitting is the textbook 3 (Levenshtein 1966 example).
  CHECK(edit_distance("kitten", "sitting") == 3);
  CHECK(edit_distance("teir", "tier") == 1);  // one transposition (Damerau 1964)
  CHECK(edit_distance("", "abc") == 3);
  CHECK(edit_distance("RG213", "rg213") == 0);  // case-insensitive
}

TEST_CASE("did you mean offers the closest name within a third of the word", "[closed_form]") {
  const std::vector<std::string> modes{"ssb", "cw", "fm", "fsk"};
  CHECK(did_you_mean("sbb", modes) == " (did you mean \"ssb\"?)");
  CHECK(did_you_mean("wire_diamter", {"wire_diameter", "length"}) == " (did you mean \"wire_diameter\"?)");
  CHECK(did_you_mean("xyzzy", modes).empty());
  CHECK(split_names("rg-58, rg-8x, rg-213") == std::vector<std::string>{"rg-58", "rg-8x", "rg-213"});
}

TEST_CASE("bounds refuse NaN, infinities and values beyond the documented ranges", "[closed_form]") {
  const Where w{"f.toml", 3, "antenna[0].length"};
  const double nan = std::numeric_limits<double>::quiet_NaN(), inf = INFINITY;
  CHECK_NOTHROW(bounds::length(100e3, w));
  CHECK_THROWS_AS(bounds::length(100.001e3, w), InputError);
  CHECK_THROWS_AS(bounds::length(nan, w), InputError);
  CHECK_THROWS_AS(bounds::length(-1.0, w), InputError);
  CHECK_NOTHROW(bounds::length(-1.0, w, true));
  CHECK_THROWS_AS(bounds::power_pep(0.0, w), InputError);
  CHECK_NOTHROW(bounds::power_pep(10e6, w));
  CHECK_THROWS_AS(bounds::power_pep(inf, w), InputError);
  CHECK_THROWS_AS(bounds::gain_dbi(60.5, w), InputError);
  CHECK_THROWS_AS(bounds::duty(0.0, w), InputError);
  CHECK_THROWS_AS(bounds::swr(inf, w), InputError);
  CHECK_THROWS_AS(bounds::swr(0.99, w), InputError);
  CHECK_THROWS_AS(bounds::tension(1e300, w), InputError);
  CHECK(bounds::integer(8, 2, 8, w) == 8);
  CHECK_THROWS_AS(bounds::integer(4294967299LL, 2, 8, w), InputError);  // would wrap to 3 as int
  try {
    bounds::power_pep(1e300, w);
  } catch (const InputError& e) {
    CHECK(std::string(e.what()).rfind("f.toml:3: antenna[0].length: must be at most 10 MW", 0) == 0);
  }
}

TEST_CASE("names are printed with control characters escaped", "[closed_form]") {
  CHECK(printable("Demo\nverdict: within") == "Demo\\nverdict: within");
  CHECK(printable(std::string("a\x1b[2Jb")) == "a\\x1B[2Jb");
  CHECK(printable("plain name") == "plain name");
}

TEST_CASE("the finite-number guard names the path of a NaN or infinity", "[closed_form]") {
  nlohmann::json j = {{"a", {1.0, std::numeric_limits<double>::quiet_NaN()}}, {"b", 2}};
  try {
    report::check_finite(j, "record");
    FAIL("a NaN passed");
  } catch (const std::logic_error& e) {
    CHECK(std::string(e.what()).find("/a/1") != std::string::npos);
  }
  CHECK_NOTHROW(report::check_finite(nlohmann::json{{"x", 1.5}, {"y", nullptr}}, "record"));
}
