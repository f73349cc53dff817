// Unit parsing: conversions use exact definitions (1 ft = 0.3048 m, 1 in = 0.0254 m,
// 1 mi = 1609.344 m — international yard and pound agreement, 1959; 1 mW/cm² = 10 W/m²,
// dBm = 10·log10(P / 1 mW) — SI definitions). Refusals follow the foundation issue's rules.
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>

#include "core/quantity_parse.hpp"

using namespace standoff;
using Catch::Matchers::Contains;

TEST_CASE("lengths convert by the exact international definitions", "[units]") {
  struct Case { const char* text; double metres; };
  auto c = GENERATE(Case{"12 m", 12.0}, Case{"40 ft", 12.192}, Case{"6 in", 0.1524}, Case{"1 mi", 1609.344},
                    Case{"2.5km", 2500.0}, Case{"35 cm", 0.35}, Case{"1.6 mm", 0.0016}, Case{"1e2 m", 100.0});
  CAPTURE(c.text);
  CHECK(parse_length(c.text).value() == Approx(c.metres).epsilon(1e-15));
}

TEST_CASE("frequency, power, time, angle and field units", "[units]") {
  CHECK(parse_frequency("7.1 MHz").value() == Approx(7.1e6));
  CHECK(parse_frequency("2.4 GHz").value() == Approx(2.4e9));
  CHECK(parse_frequency("475 kHz").value() == Approx(475e3));
  CHECK(parse_power("1.5 kW").value() == Approx(1500.0));
  CHECK(parse_power("30 dBm").value() == Approx(1.0).epsilon(1e-12));   // 10^(30/10) mW = 1 W
  CHECK(parse_power("57 dBm").value() == Approx(501.187).epsilon(1e-5));
  CHECK(parse_power("10 dBW").value() == Approx(10.0).epsilon(1e-12));
  CHECK(parse_power("250 mW").value() == Approx(0.25));
  CHECK(parse_time("6 min").value() == Approx(360.0));
  CHECK(parse_time("0.5 h").value() == Approx(1800.0));
  CHECK(parse_angle("90 deg").value() == Approx(std::acos(0.0)));
  CHECK(parse_angle("-1 rad").value() == Approx(-1.0));
  CHECK(parse_efield("58.03 V/m").value() == Approx(58.03));
  CHECK(parse_hfield("154 mA/m").value() == Approx(0.154));
  CHECK(parse_power_density("1 mW/cm²").value() == Approx(10.0));
  CHECK(parse_power_density("0.2 mW/cm2").value() == Approx(2.0));
  CHECK(parse_power_density("100 µW/cm²").value() == Approx(1.0));
  CHECK(parse_impedance("50 ohm").value() == Approx(50.0));
  CHECK(parse_conductivity("5 mS/m").value() == Approx(0.005));
}

TEST_CASE("gain in dBi, dBd and plain ratio", "[units]") {
  // 0 dBd = 2.15 dBi = ratio 1.64 (FCC OET Bulletin 65, Eq. 5)
  CHECK(parse_gain("0 dBd").ratio == Approx(1.64));
  CHECK(parse_gain("2.15 dBi").ratio == Approx(1.6406).epsilon(1e-4));
  CHECK(parse_gain("24 dBi").ratio == Approx(251.189).epsilon(1e-5));
  CHECK(parse_gain("1.64 x").ratio == Approx(1.64));
  CHECK(parse_gain("-3 dBi").dbi() == Approx(-3.0));
}

TEST_CASE("percentages and complex impedances", "[units]") {
  CHECK(parse_fraction("40 %").value == Approx(0.4));
  CHECK(parse_fraction("100%").value == Approx(1.0));
  const auto z = parse_complex_impedance("73+j42.5 ohm");
  CHECK(z.real() == Approx(73.0));
  CHECK(z.imag() == Approx(42.5));
  const auto z2 = parse_complex_impedance("12.5 - j300 ohm");
  CHECK(z2.real() == Approx(12.5));
  CHECK(z2.imag() == Approx(-300.0));
  CHECK(parse_complex_impedance("50 ohm") == std::complex<double>(50.0, 0.0));
}

TEST_CASE("bad quantities are refused with a message quoting the text", "[units]") {
  const Where where{"station.toml", 12, "antenna.height"};
  CHECK_THROWS_WITH(parse_length("14", where), Contains("station.toml:12: antenna.height") && Contains("\"14\"") &&
                                                   Contains("no unit"));
  CHECK_THROWS_WITH(parse_length("14 furlong", where), Contains("unknown unit \"furlong\""));
  CHECK_THROWS_WITH(parse_length("-3 m", where), Contains("negative"));
  CHECK(parse_length("-3 m", where, Sign::any).value() == Approx(-3.0));
  CHECK_THROWS_AS(parse_length("nan m"), InputError);
  CHECK_THROWS_AS(parse_length("inf m"), InputError);
  CHECK_THROWS_AS(parse_length("1e999 m"), InputError);
  CHECK_THROWS_AS(parse_length(""), InputError);
  CHECK_THROWS_AS(parse_frequency("0 MHz"), InputError);
  CHECK_THROWS_AS(parse_frequency("14"), InputError);
  CHECK_THROWS_AS(parse_power("-5 W"), InputError);
  CHECK_THROWS_AS(parse_fraction("120 %"), InputError);
  CHECK_THROWS_AS(parse_fraction("0.4"), InputError);
  CHECK_THROWS_AS(parse_gain("3"), InputError);
  CHECK_THROWS_AS(parse_gain("0 x"), InputError);
  CHECK_THROWS_AS(parse_complex_impedance("73+42 ohm"), InputError);
  CHECK_THROWS_AS(parse_complex_impedance("-5 ohm"), InputError);
  CHECK_THROWS_AS(parse_complex_impedance("73+j42"), InputError);
}

TEST_CASE("round trip: SI value printed and parsed again is unchanged", "[units]") {
  for (double v : {0.001, 1.0, 3.14159, 12345.678}) {
    const std::string text = std::to_string(v) + " m";
    CHECK(parse_length(text).value() == Approx(v).epsilon(1e-6));
  }
}
