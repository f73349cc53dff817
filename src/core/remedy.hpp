// A remedy computed for a finding: what change would make it comply (a keep-away distance, a
// power or duty that complies, a geometry change of a support or wire). Distances round up,
// powers, duties and allowed lengths round down (the project's safety rule).
#pragma once

#include <optional>
#include <string>

namespace standoff {

struct Remedy {
  std::string kind;             // e.g. "keep_away", "max_pep", "max_duty", "move_away", "max_height"
  std::optional<double> value;  // in `unit`; absent for a remedy that is only words
  std::string unit;             // "m", "W", "%", "AWG" or ""
  std::string text;             // one plain sentence
};

}  // namespace standoff
