// Loading exposure-limit tables (tables/limits/*.toml) into LimitTable, with validation: required
// fields, band order, gaps, overlaps, positivity and continuity at breakpoints (1 %). Schema and
// checks: docs/adding-a-limits-table.md. Values come from the published tables named in each file.
#pragma once

#include <string>
#include <string_view>

#include "limits/limits.hpp"

namespace standoff::limits {

// Largest relative difference between the two sides of a breakpoint accepted without declaration
// (the tables are continuous to their printed precision), and the largest accepted when the file
// declares a published step there with `step_at_f_min`.
inline constexpr double kContinuityTolerance = 0.01;
inline constexpr double kDeclaredStepLimit = 0.05;

// Parses and validates one table file. `file_name` is used in error messages and stored in
// LimitTable::file. Throws InputError naming the file, the line and the field on any problem.
LimitTable load_limit_table(std::string_view toml_text, const std::string& file_name);

// The table compiled into the binary from tables/limits/<id>.toml (id = to_string(s)).
// Parsed once per process; throws std::logic_error if the embedded file is missing.
const LimitTable& builtin_limit_table_ref(Standard s);
LimitTable builtin_limit_table(Standard s);

}  // namespace standoff::limits
