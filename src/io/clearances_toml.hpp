// Loader for tables/clearances.toml (the published clearance rules with their sources), and the
// copy built into the binary.
#pragma once

#include <string>
#include <string_view>

#include "siting/clearances.hpp"

namespace standoff::siting {

// Parses the clearance tables; InputError with file:line:field on any bad or missing entry.
ClearanceTables load_clearance_tables(std::string_view toml_text, const std::string& file);

// The embedded tables/clearances.toml, loaded once.
const ClearanceTables& builtin_clearance_tables();

}  // namespace standoff::siting
