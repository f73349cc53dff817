#include "core/quantity_parse.hpp"

#include <algorithm>
#include <array>
#include <cctype>
#include <charconv>
#include <cmath>
#include <string>

#include "core/constants.hpp"

namespace standoff {
namespace {

// One accepted unit spelling and how to turn a number in it into SI.
struct UnitSpec {
  std::string_view name;
  double factor;       // SI value = number * factor (+ for log units, see `log_offset`)
  bool log10 = false;  // value is in decibels: SI = factor * 10^(number/10)
};

std::string_view trim(std::string_view s) {
  while (!s.empty() && std::isspace(static_cast<unsigned char>(s.front()))) s.remove_prefix(1);
  while (!s.empty() && std::isspace(static_cast<unsigned char>(s.back()))) s.remove_suffix(1);
  return s;
}

[[noreturn]] void refuse(const Where& where, std::string_view text, std::string_view expected) {
  throw InputError(where, "expected " + std::string(expected) + ", got \"" + std::string(text) + "\"");
}

// Splits "12.5 MHz" into 12.5 and "MHz". Refuses NaN, infinity and text that is not a number.
std::pair<double, std::string_view> split_number(std::string_view text, const Where& where,
                                                 std::string_view expected) {
  const std::string_view t = trim(text);
  std::size_t i = 0;
  if (i < t.size() && (t[i] == '+' || t[i] == '-')) ++i;
  while (i < t.size() && (std::isdigit(static_cast<unsigned char>(t[i])) || t[i] == '.')) ++i;
  if (i < t.size() && (t[i] == 'e' || t[i] == 'E')) {
    std::size_t j = i + 1;
    if (j < t.size() && (t[j] == '+' || t[j] == '-')) ++j;
    if (j < t.size() && std::isdigit(static_cast<unsigned char>(t[j]))) {
      i = j;
      while (i < t.size() && std::isdigit(static_cast<unsigned char>(t[i]))) ++i;
    }
  }
  std::string_view number = t.substr(0, i);
  if (!number.empty() && number.front() == '+') number.remove_prefix(1);
  double v = 0.0;
  const auto [ptr, ec] = std::from_chars(number.data(), number.data() + number.size(), v);
  if (number.empty() || ec != std::errc() || ptr != number.data() + number.size() || !std::isfinite(v))
    refuse(where, text, expected);
  return {v, trim(t.substr(i))};
}

template <std::size_t N>
double parse_with(std::string_view text, const Where& where, const std::array<UnitSpec, N>& units,
                  std::string_view expected, Sign sign) {
  const auto [number, unit] = split_number(text, where, expected);
  if (unit.empty())
    throw InputError(where, "\"" + std::string(text) + "\" has no unit: expected " + std::string(expected));
  // Exact spelling first; then without regard to letter case where that is unambiguous: exactly
  // one unit matches and the first letter keeps its case when it is m or M (milli or mega:
  // "mHz", "MW" and "MM" stay refused).
  const UnitSpec* match = nullptr;
  for (const auto& u : units) {
    if (u.name == unit) match = &u;
  }
  if (!match) {
    auto lower = [](std::string_view a) {
      std::string o;
      for (const char c : a) o += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
      return o;
    };
    std::size_t n = 0;
    for (const auto& u : units) {
      if (lower(u.name) != lower(unit)) continue;
      const char a = u.name.front(), b = unit.front();
      if ((a == 'm' || a == 'M' || b == 'm' || b == 'M') && a != b) continue;
      match = &u;
      ++n;
    }
    if (n > 1) match = nullptr;
  }
  for (const auto& u : units) {
    if (&u != match) continue;
    if (!u.log10 && sign == Sign::non_negative && number < 0.0)
      throw InputError(where, "\"" + std::string(text) + "\" is negative: expected " + std::string(expected) +
                                  " of zero or more");
    const double si = u.log10 ? u.factor * std::pow(10.0, number / 10.0) : number * u.factor;
    // "4000 dBm" or "1e308 km" overflow to infinity: refused like "inf m".
    if (!std::isfinite(si))
      throw InputError(where, "\"" + std::string(text) + "\" is out of range: expected " + std::string(expected));
    return si;
  }
  throw InputError(where, "unknown unit \"" + std::string(unit) + "\" in \"" + std::string(text) +
                              "\": expected " + std::string(expected));
}

constexpr std::array kLength{UnitSpec{"m", 1.0}, UnitSpec{"cm", 0.01}, UnitSpec{"mm", 0.001},
                             UnitSpec{"km", 1000.0}, UnitSpec{"ft", constants::metres_per_foot},
                             UnitSpec{"feet", constants::metres_per_foot}, UnitSpec{"foot", constants::metres_per_foot},
                             UnitSpec{"'", constants::metres_per_foot}, UnitSpec{"in", constants::metres_per_inch},
                             UnitSpec{"inch", constants::metres_per_inch}, UnitSpec{"inches", constants::metres_per_inch},
                             UnitSpec{"mi", constants::metres_per_mile}};
constexpr std::array kFrequency{UnitSpec{"Hz", 1.0}, UnitSpec{"kHz", 1e3}, UnitSpec{"MHz", 1e6},
                                UnitSpec{"GHz", 1e9}};
constexpr std::array kPower{UnitSpec{"W", 1.0}, UnitSpec{"kW", 1e3}, UnitSpec{"mW", 1e-3},
                            UnitSpec{"dBm", 1e-3, true}, UnitSpec{"dBW", 1.0, true}};
constexpr std::array kAngle{UnitSpec{"deg", constants::pi / 180.0}, UnitSpec{"°", constants::pi / 180.0},
                            UnitSpec{"rad", 1.0}};
constexpr std::array kTime{UnitSpec{"s", 1.0}, UnitSpec{"min", 60.0}, UnitSpec{"h", 3600.0}};
constexpr std::array kEField{UnitSpec{"V/m", 1.0}, UnitSpec{"mV/m", 1e-3}, UnitSpec{"kV/m", 1e3}};
constexpr std::array kHField{UnitSpec{"A/m", 1.0}, UnitSpec{"mA/m", 1e-3}};
// "µ" is written both as the micro sign U+00B5 and as the Greek small mu U+03BC (keyboards differ).
constexpr std::array kDensity{UnitSpec{"W/m2", 1.0},          UnitSpec{"W/m²", 1.0},
                              UnitSpec{"W/m^2", 1.0},         UnitSpec{"mW/cm2", 10.0},
                              UnitSpec{"mW/cm²", 10.0},       UnitSpec{"mW/cm^2", 10.0},
                              UnitSpec{"\u00b5W/cm2", 1e-2},  UnitSpec{"\u00b5W/cm²", 1e-2},
                              UnitSpec{"\u03bcW/cm2", 1e-2},  UnitSpec{"\u03bcW/cm²", 1e-2},
                              UnitSpec{"uW/cm2", 1e-2},       UnitSpec{"uW/cm²", 1e-2},
                              UnitSpec{"uW/cm^2", 1e-2}};
// "Ω" is written both as the Greek capital omega U+03A9 and as the ohm sign U+2126.
constexpr std::array kImpedance{UnitSpec{"ohm", 1.0}, UnitSpec{"\u03a9", 1.0}, UnitSpec{"\u2126", 1.0},
                                UnitSpec{"kohm", 1e3}, UnitSpec{"k\u03a9", 1e3}, UnitSpec{"k\u2126", 1e3}};
constexpr std::array kConductivity{UnitSpec{"S/m", 1.0}, UnitSpec{"mS/m", 1e-3}};

}  // namespace

units::Length parse_length(std::string_view text, const Where& where, Sign sign) {
  return units::metres(parse_with(text, where, kLength, "a length in m, cm, mm, km, ft (feet, '), in or mi", sign));
}

units::Frequency parse_frequency(std::string_view text, const Where& where) {
  const double f = parse_with(text, where, kFrequency, "a frequency in Hz, kHz, MHz or GHz", Sign::non_negative);
  if (f <= 0.0) throw InputError(where, "frequency \"" + std::string(text) + "\" must be above zero");
  return units::hertz(f);
}

units::Power parse_power(std::string_view text, const Where& where) {
  return units::watts(parse_with(text, where, kPower, "a power in W, kW, mW, dBm or dBW", Sign::non_negative));
}

units::Gain parse_gain(std::string_view text, const Where& where) {
  constexpr std::string_view expected = "a gain in dBi, dBd or as a plain ratio (e.g. \"1.64 x\")";
  const auto [number, unit] = split_number(text, where, expected);
  // "4444 dBi" overflows the ratio to infinity and "-4444 dBi" underflows it to zero (found by
  // fuzzing, issue 14): refused like "inf dBi".
  auto finite = [&](units::Gain g) {
    if (!(std::isfinite(g.ratio) && g.ratio > 0.0 && std::isfinite(g.dbi())))
      throw InputError(where, "gain \"" + std::string(text) + "\" is out of range");
    return g;
  };
  if (unit == "dBi") return finite(units::Gain::from_dbi(number));
  if (unit == "dBd") return finite(units::Gain::from_dbd(number));
  if (unit == "x" || unit == "ratio") {
    if (number <= 0.0) throw InputError(where, "gain ratio \"" + std::string(text) + "\" must be above zero");
    return finite(units::Gain{number});
  }
  if (unit.empty()) throw InputError(where, "\"" + std::string(text) + "\" has no unit: expected " + std::string(expected));
  throw InputError(where, "unknown unit \"" + std::string(unit) + "\" in \"" + std::string(text) +
                              "\": expected " + std::string(expected));
}

units::Fraction parse_fraction(std::string_view text, const Where& where) {
  constexpr std::array kPercent{UnitSpec{"%", 0.01}};
  const double v = parse_with(text, where, kPercent, "a percentage such as \"40 %\"", Sign::non_negative);
  if (v > 1.0 + 1e-12) throw InputError(where, "\"" + std::string(text) + "\" is above 100 %");
  return units::Fraction{std::min(v, 1.0)};
}

units::Angle parse_angle(std::string_view text, const Where& where) {
  return units::radians(parse_with(text, where, kAngle, "an angle in deg or rad", Sign::any));
}

units::Time parse_time(std::string_view text, const Where& where) {
  return units::seconds(parse_with(text, where, kTime, "a time in s, min or h", Sign::non_negative));
}

units::EField parse_efield(std::string_view text, const Where& where) {
  return units::volts_per_metre(parse_with(text, where, kEField, "an electric field in V/m", Sign::non_negative));
}

units::HField parse_hfield(std::string_view text, const Where& where) {
  return units::amperes_per_metre(parse_with(text, where, kHField, "a magnetic field in A/m", Sign::non_negative));
}

units::PowerDensity parse_power_density(std::string_view text, const Where& where) {
  return units::watts_per_square_metre(
      parse_with(text, where, kDensity, "a power density in W/m², mW/cm² or µW/cm²", Sign::non_negative));
}

units::Impedance parse_impedance(std::string_view text, const Where& where) {
  return units::ohms(parse_with(text, where, kImpedance, "an impedance in ohm", Sign::non_negative));
}

units::Conductivity parse_conductivity(std::string_view text, const Where& where) {
  return units::siemens_per_metre(parse_with(text, where, kConductivity, "a conductivity in S/m", Sign::non_negative));
}

std::complex<double> parse_complex_impedance(std::string_view text, const Where& where) {
  constexpr std::string_view expected =
      "a complex impedance such as \"73+j42.5 ohm\", \"12.5-j300 ohm\", \"(73,42.5) ohm\" or \"50 ohm\"";
  std::string_view t = trim(text);
  std::string_view unit;
  for (std::string_view u : {std::string_view("ohm"), std::string_view("\u03a9"), std::string_view("\u2126")}) {
    if (t.size() >= u.size() && t.substr(t.size() - u.size()) == u) {
      unit = u;
      t = trim(t.substr(0, t.size() - u.size()));
      break;
    }
  }
  if (unit.empty()) throw InputError(where, "\"" + std::string(text) + "\" has no unit: expected " + std::string(expected));
  // One number with nothing after it (split_number refuses NaN, infinity and non-numbers).
  auto number = [&](std::string_view part) {
    const auto [v, tail] = split_number(part, where, expected);
    if (!tail.empty()) refuse(where, text, expected);
    return v;
  };
  double re = 0.0;
  double im = 0.0;
  if (!t.empty() && t.front() == '(') {
    // "(R,X)": resistance and reactance, the reactance with its own sign.
    const std::size_t comma = t.find(',');
    if (t.back() != ')' || comma == std::string_view::npos) refuse(where, text, expected);
    re = number(t.substr(1, comma - 1));
    im = number(t.substr(comma + 1, t.size() - comma - 2));
  } else if (const std::size_t j = t.find('j'); j == std::string_view::npos) {
    re = number(t);  // resistance only
  } else {
    // "R+jX", "R - jX", "+jX", "-jX", "jX": the sign is the last + or - before the 'j' (so that an
    // exponent in R, as in "1e-3+j2", is not taken for it).
    std::size_t k = j;
    while (k > 0 && std::isspace(static_cast<unsigned char>(t[k - 1]))) --k;
    double sgn = 1.0;
    std::string_view real_part = t.substr(0, k);
    if (k > 0 && (t[k - 1] == '+' || t[k - 1] == '-')) {
      sgn = t[k - 1] == '-' ? -1.0 : 1.0;
      real_part = trim(t.substr(0, k - 1));
    } else if (k > 0) {
      refuse(where, text, expected);  // "73j42": no sign between the parts
    }
    const std::string_view imag = trim(t.substr(j + 1));
    if (imag.empty() || imag.front() == '+' || imag.front() == '-') refuse(where, text, expected);
    im = sgn * number(imag);
    if (!real_part.empty()) re = number(real_part);
  }
  if (re < 0.0) throw InputError(where, "\"" + std::string(text) + "\" has a negative resistance");
  return {re, im};
}

}  // namespace standoff
