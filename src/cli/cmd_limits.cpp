#include "cli/command.hpp"

namespace standoff::cli {

// Not built yet: registers nothing, so `standoff limits` is not offered.
void add_limits(CLI::App& /*root*/, Commands& /*commands*/) {}

}  // namespace standoff::cli
