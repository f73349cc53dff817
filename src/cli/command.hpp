// How a subcommand plugs into `run()`: each src/cli/cmd_*.cpp defines one `add_*` function that
// adds its CLI11 subcommand and a handler. The handler runs only when that subcommand was parsed.
#pragma once

#include <functional>
#include <iosfwd>
#include <string>
#include <vector>

#include <CLI/CLI.hpp>

#include "core/error.hpp"

namespace standoff::cli {

enum ExitCode : int { kOk = 0, kExceeds = 1, kBadInput = 2, kInternal = 3 };

struct Command {
  CLI::App* app = nullptr;
  std::function<int(std::ostream& out, std::ostream& err)> handler;
};

using Commands = std::vector<Command>;

// Where a command-line option's text came from, for InputError messages.
inline Where option_where(const std::string& option) { return Where{"command line", 0, option}; }

// A progress reporter for long runs: one line on stderr, only when stderr is a terminal and the
// output is not JSON (else empty); `line(pct)` gives the text for a whole percentage.
std::function<void(double)> terminal_progress(std::ostream& err, bool json, std::function<std::string(int)> line);

// An option's comma-separated parts, empty parts kept ("a,,b" → "a", "", "b").
std::vector<std::string> split_commas(const std::string& text);

void add_limits(CLI::App& root, Commands& commands);
void add_distance(CLI::App& root, Commands& commands);
void add_wire(CLI::App& root, Commands& commands);
void add_evaluate(CLI::App& root, Commands& commands);  // also `demo` and `field`
void add_lines(CLI::App& root, Commands& commands);
void add_place(CLI::App& root, Commands& commands);

}  // namespace standoff::cli
