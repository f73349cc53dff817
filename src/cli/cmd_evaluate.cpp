#include "cli/command.hpp"

namespace standoff::cli {

// Not built yet: registers nothing, so `standoff evaluate` is not offered.
void add_evaluate(CLI::App& /*root*/, Commands& /*commands*/) {}

}  // namespace standoff::cli
