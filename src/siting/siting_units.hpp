// Parsing of the quantities only the siting module needs — voltage ("7.2 kV"), force ("200 N",
// "45 lbf") and mass per length ("12.43 lb/1000 ft", "18.5 g/m") — with the same rules as
// core/quantity_parse.hpp: a unit is required, NaN/infinity/negatives are refused with an InputError.
#pragma once

#include <string_view>

#include "core/error.hpp"
#include "siting/site.hpp"

namespace standoff::siting {

Voltage parse_voltage(std::string_view text, const Where& where = {});
Force parse_force(std::string_view text, const Where& where = {});
LinearDensity parse_linear_density(std::string_view text, const Where& where = {});

}  // namespace standoff::siting
