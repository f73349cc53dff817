#include "siting/siting_units.hpp"

#include <array>
#include <cctype>
#include <charconv>
#include <cmath>
#include <string>
#include <utility>

#include "core/constants.hpp"

namespace standoff::siting {
namespace {

struct UnitSpec {
  std::string_view name;
  double factor;  // SI value = number * factor
};

std::string_view trim(std::string_view s) {
  while (!s.empty() && std::isspace(static_cast<unsigned char>(s.front()))) s.remove_prefix(1);
  while (!s.empty() && std::isspace(static_cast<unsigned char>(s.back()))) s.remove_suffix(1);
  return s;
}

template <std::size_t N>
double parse_with(std::string_view text, const Where& where, const std::array<UnitSpec, N>& units,
                  std::string_view expected) {
  const std::string_view t = trim(text);
  std::size_t i = 0;
  while (i < t.size() && (std::isdigit(static_cast<unsigned char>(t[i])) || t[i] == '.' || t[i] == '+')) ++i;
  if (i < t.size() && (t[i] == 'e' || t[i] == 'E') && i + 1 < t.size() &&
      (std::isdigit(static_cast<unsigned char>(t[i + 1])) || t[i + 1] == '-' || t[i + 1] == '+')) {
    i += 2;
    while (i < t.size() && std::isdigit(static_cast<unsigned char>(t[i]))) ++i;
  }
  std::string_view number = t.substr(0, i);
  if (!number.empty() && number.front() == '+') number.remove_prefix(1);
  double v = 0.0;
  const auto [ptr, ec] = std::from_chars(number.data(), number.data() + number.size(), v);
  std::string quoted(1, '"');
  quoted.append(text).push_back('"');
  if (!t.empty() && t.front() == '-')
    throw InputError(where, quoted + " is negative: expected " + std::string(expected) + " of zero or more");
  if (number.empty() || ec != std::errc() || ptr != number.data() + number.size() || !std::isfinite(v))
    throw InputError(where, "expected " + std::string(expected) + ", got " + quoted);
  const std::string_view unit = trim(t.substr(i));
  if (unit.empty()) throw InputError(where, quoted + " has no unit: expected " + std::string(expected));
  for (const auto& u : units)
    if (u.name == unit) return v * u.factor;
  throw InputError(where, "unknown unit \"" + std::string(unit) + "\" in " + quoted + ": expected " +
                              std::string(expected));
}

constexpr double kLbPer1000Ft = constants::kilograms_per_pound / (1000.0 * constants::metres_per_foot);

constexpr std::array kVoltage{UnitSpec{"V", 1.0}, UnitSpec{"kV", 1e3}, UnitSpec{"MV", 1e6}};
constexpr std::array kForce{UnitSpec{"N", 1.0}, UnitSpec{"kN", 1e3}, UnitSpec{"lbf", constants::newtons_per_pound_force},
                            UnitSpec{"kgf", constants::standard_gravity}};
constexpr std::array kLinearDensity{UnitSpec{"kg/m", 1.0}, UnitSpec{"g/m", 1e-3}, UnitSpec{"kg/km", 1e-3},
                                    UnitSpec{"lb/1000 ft", kLbPer1000Ft}, UnitSpec{"lb/1000ft", kLbPer1000Ft},
                                    UnitSpec{"lb/ft", constants::kilograms_per_pound / constants::metres_per_foot}};

}  // namespace

Voltage parse_voltage(std::string_view text, const Where& where) {
  return volts(parse_with(text, where, kVoltage, "a voltage in V, kV or MV"));
}

Force parse_force(std::string_view text, const Where& where) {
  return newtons(parse_with(text, where, kForce, "a force in N, kN, lbf or kgf"));
}

LinearDensity parse_linear_density(std::string_view text, const Where& where) {
  return kilograms_per_metre(
      parse_with(text, where, kLinearDensity, "a mass per length in kg/m, g/m, kg/km, lb/1000 ft or lb/ft"));
}

std::string to_string(LineKind k) {
  switch (k) {
    case LineKind::service: return "service";
    case LineKind::distribution: return "distribution";
    case LineKind::transmission: return "transmission";
  }
  return "?";
}

std::string to_string(SupportKind k) {
  switch (k) {
    case SupportKind::mast: return "mast";
    case SupportKind::tower: return "tower";
    case SupportKind::tree: return "tree";
    case SupportKind::pole: return "pole";
  }
  return "?";
}

std::string to_string(SpanKind k) {
  switch (k) {
    case SpanKind::antenna: return "antenna";
    case SpanKind::feed_line: return "feed line";
    case SpanKind::halyard: return "halyard";
  }
  return "?";
}

}  // namespace standoff::siting
