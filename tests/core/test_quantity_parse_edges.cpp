// Edge cases of the quantity parser found in review: exponents inside complex impedances
// ("1e-3+j2 ohm"), the "(R,X) ohm" form its header promises, pure reactances, overflow to infinity
// ("4000 dBm"), and the two Unicode spellings of µ (U+00B5, U+03BC) and Ω (U+03A9, U+2126).
// Conversions: dBm = 10·log10(P / 1 mW), 1 µW/cm² = 0.01 W/m² (SI definitions).
#include <catch2/catch.hpp>

#include <complex>

#include "core/quantity_parse.hpp"

using namespace standoff;
using Catch::Matchers::Contains;

TEST_CASE("complex impedances with exponents, signs and the (R,X) form", "[units]") {
  struct Case { const char* text; double r, x; };
  auto c = GENERATE(Case{"1e-3+j2 ohm", 1e-3, 2.0},        // exponent sign is not the separator
                    Case{"1E+3-j2 ohm", 1e3, -2.0},
                    Case{"1e-3-j2e-3 ohm", 1e-3, -2e-3},
                    Case{"73+j4.25e1 ohm", 73.0, 42.5},
                    Case{"73 + j 42.5 ohm", 73.0, 42.5},
                    Case{"12.5-j300ohm", 12.5, -300.0},
                    Case{"(73,42.5) ohm", 73.0, 42.5},     // promised by quantity_parse.hpp
                    Case{"(50, -25) ohm", 50.0, -25.0},
                    Case{"-j5 ohm", 0.0, -5.0},            // pure reactance
                    Case{"+j5 ohm", 0.0, 5.0},
                    Case{"j5 ohm", 0.0, 5.0},
                    Case{"50 \u03a9", 50.0, 0.0},          // Greek capital omega
                    Case{"36.5+j21.3 \u2126", 36.5, 21.3});  // ohm sign
  CAPTURE(c.text);
  const auto z = parse_complex_impedance(c.text);
  CHECK(z.real() == Approx(c.r).epsilon(1e-15));
  CHECK(z.imag() == Approx(c.x).epsilon(1e-15));
}

TEST_CASE("malformed complex impedances are refused", "[units]") {
  const Where where{"station.toml", 3, "antenna.load"};
  auto text = GENERATE("73j42 ohm", "73+j-5 ohm", "73+j ohm", "(73,42.5 ohm", "(73) ohm", "(,) ohm",
                       "73+j42.5 kohm", "nan+j1 ohm", "1+jinf ohm", "1e-3+2 ohm", "(-5,1) ohm");
  CAPTURE(text);
  CHECK_THROWS_WITH(parse_complex_impedance(text, where), Contains("station.toml:3: antenna.load"));
}

TEST_CASE("values that overflow to infinity are refused", "[units]") {
  CHECK_THROWS_WITH(parse_power("4000 dBm"), Contains("out of range"));  // 10^397 W
  CHECK_THROWS_WITH(parse_length("1e308 km"), Contains("out of range"));
  CHECK_THROWS_WITH(parse_frequency("1e300 GHz"), Contains("out of range"));
  CHECK(parse_power("-30 dBm").value() == Approx(1e-6).epsilon(1e-12));  // negative dB is a small power
}

TEST_CASE("both Unicode spellings of micro, and ^2", "[units]") {
  CHECK(parse_power_density("100 \u00b5W/cm²").value() == Approx(1.0));  // micro sign
  CHECK(parse_power_density("100 \u03bcW/cm²").value() == Approx(1.0));  // Greek mu
  CHECK(parse_power_density("0.2 mW/cm^2").value() == Approx(2.0));
  CHECK(parse_power_density("10 W/m^2").value() == Approx(10.0));
  CHECK(parse_impedance("1.5 k\u2126").value() == Approx(1500.0));
}
