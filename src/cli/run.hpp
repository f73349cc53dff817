// The command-line front end: parses arguments with CLI11, calls the core, writes to the given
// streams and returns the exit code (0 within limits, 1 exceeds/fails, 2 bad input, 3 internal).
#pragma once

#include <iosfwd>
#include <string>
#include <vector>

namespace standoff::cli {

// `args` excludes the program name. Tests call this in-process.
int run(const std::vector<std::string>& args, std::ostream& out, std::ostream& err);

}  // namespace standoff::cli
