#include "cli/command.hpp"

namespace standoff::cli {

// Not built yet: registers nothing, so `standoff distance` is not offered.
void add_distance(CLI::App& /*root*/, Commands& /*commands*/) {}

}  // namespace standoff::cli
