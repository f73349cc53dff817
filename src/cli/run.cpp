#include "cli/run.hpp"

#include <algorithm>
#include <ostream>

#include "cli/command.hpp"
#include "core/error_list.hpp"

namespace standoff::cli {

int run(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  CLI::App app{"standoff — RF exposure and installation-safety evaluation for radio stations"};
  app.name("standoff");
  app.require_subcommand(1);
  app.set_version_flag("--version", std::string("standoff ") + STANDOFF_VERSION, "Print the version and exit");
  Commands commands;
  add_limits(app, commands);
  add_distance(app, commands);
  add_wire(app, commands);
  add_evaluate(app, commands);
  add_lines(app, commands);
  add_place(app, commands);

  // An empty argument is never meaningful (`--out ""`, `--standard ""`, `--out=`): refused up
  // front, naming the option it was given to (issue 14).
  for (std::size_t i = 0; i < args.size(); ++i) {
    const std::string& a = args[i];
    const bool empty_eq = a.rfind("--", 0) == 0 && !a.empty() && a.back() == '=';
    if (!a.empty() && !empty_eq) continue;
    const std::string opt = empty_eq ? a.substr(0, a.size() - 1)
                            : (i > 0 && args[i - 1].rfind("--", 0) == 0) ? args[i - 1] : std::string("argument " + std::to_string(i + 1));
    err << "standoff: error: command line: " << opt << ": must not be empty\n";
    return kBadInput;
  }
  std::vector<std::string> reversed(args.rbegin(), args.rend());
  try {
    app.parse(reversed);
  } catch (const CLI::ParseError& e) {
    if (e.get_exit_code() == 0) {
      app.exit(e, out, err);  // --help
      return kOk;
    }
    // One error style across commands: "standoff: error: command line: ...".
    err << "standoff: error: command line: " << e.what() << "\nRun with --help for more information.\n";
    return kBadInput;
  }
  for (const auto& c : commands) {
    if (!c.app->parsed()) continue;
    try {
      return c.handler(out, err);
    } catch (const InputErrors& e) {
      // One error style across commands: "standoff: error: file:line: field: message", one a line.
      for (const auto& x : e.all()) err << "standoff: error: " << x.what() << "\n";
      err << "standoff: " << e.all().size() << " errors"
          << (e.all().size() >= kMaxErrors ? " (stopped at " + std::to_string(kMaxErrors) + ")" : std::string()) << "\n";
      return kBadInput;
    } catch (const InputError& e) {
      err << "standoff: error: " << e.what() << "\n";
      return kBadInput;
    } catch (const std::exception& e) {
      err << "standoff: internal error: " << e.what() << "\n";
      return kInternal;
    }
  }
  err << "standoff: no command given; try --help\n";
  return kBadInput;
}

std::vector<std::string> split_commas(const std::string& text) {
  std::vector<std::string> parts;
  std::string cur;
  for (char c : text) {
    if (c == ',') {
      parts.push_back(cur);
      cur.clear();
    } else {
      cur += c;
    }
  }
  parts.push_back(cur);
  return parts;
}

}  // namespace standoff::cli
