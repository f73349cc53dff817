#include "cli/command.hpp"

namespace standoff::cli {

// Not built yet: registers nothing, so `standoff lines` is not offered.
void add_lines(CLI::App& /*root*/, Commands& /*commands*/) {}

}  // namespace standoff::cli
