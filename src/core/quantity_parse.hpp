// Parsing of quantities written with their unit ("12 m", "40 ft", "7.1 MHz", "1.5 kW", "57 dBm",
// "2.15 dBi", "20 %", "0.2 mW/cm²", "50-j25 ohm"). Every input quantity must carry its unit: a bare
// number, an unknown unit, NaN, infinity, or a negative value where none is possible is refused with
// an InputError that quotes the text, names where it came from and lists the units accepted.
#pragma once

#include <complex>
#include <string_view>

#include "core/error.hpp"
#include "core/units.hpp"

namespace standoff {

enum class Sign { non_negative, any };

units::Length parse_length(std::string_view text, const Where& where = {}, Sign sign = Sign::non_negative);
units::Frequency parse_frequency(std::string_view text, const Where& where = {});
units::Power parse_power(std::string_view text, const Where& where = {});
units::Gain parse_gain(std::string_view text, const Where& where = {});
units::Fraction parse_fraction(std::string_view text, const Where& where = {});  // "20 %" → 0.2; at most 100 %
units::Angle parse_angle(std::string_view text, const Where& where = {});
units::Time parse_time(std::string_view text, const Where& where = {});
units::EField parse_efield(std::string_view text, const Where& where = {});
units::HField parse_hfield(std::string_view text, const Where& where = {});
units::PowerDensity parse_power_density(std::string_view text, const Where& where = {});
units::Impedance parse_impedance(std::string_view text, const Where& where = {});
units::Conductivity parse_conductivity(std::string_view text, const Where& where = {});
// Complex impedance in ohms: "50 ohm", "73+j42.5 ohm", "12.5 - j300 ohm", "(73,42.5) ohm".
std::complex<double> parse_complex_impedance(std::string_view text, const Where& where = {});

}  // namespace standoff
