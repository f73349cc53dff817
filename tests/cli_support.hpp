// Runs the CLI in-process through standoff::cli::run() and captures its exit code and streams.
#pragma once

#include <sstream>
#include <string>
#include <vector>

#include "cli/run.hpp"

namespace standoff::test {

struct CliResult {
  int code;
  std::string out, err;
};

inline CliResult run_cli(const std::vector<std::string>& args) {
  std::ostringstream out, err;
  const int code = standoff::cli::run(args, out, err);
  return {code, out.str(), err.str()};
}

}  // namespace standoff::test
