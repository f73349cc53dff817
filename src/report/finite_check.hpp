// The last guard before output (issue 14): every number of a JSON document is finite. A NaN or
// infinity that reached a writer is a program fault, reported as an internal error (exit 3).
#pragma once

#include <string>

#include <nlohmann/json.hpp>

namespace standoff::report {

// Throws std::logic_error naming the JSON path of the first non-finite number ("what": e.g.
// "evaluation record") instead of letting it print as NaN, inf or a silent null.
void check_finite(const nlohmann::json& j, const std::string& what);

}  // namespace standoff::report
