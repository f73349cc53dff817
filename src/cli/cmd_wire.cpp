#include "cli/command.hpp"

namespace standoff::cli {

// Not built yet: registers nothing, so `standoff wire` is not offered.
void add_wire(CLI::App& /*root*/, Commands& /*commands*/) {}

}  // namespace standoff::cli
