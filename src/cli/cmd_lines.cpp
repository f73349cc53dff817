// `standoff lines STATION.toml [--json]`: installation-safety checks near overhead power lines
// (issue 6). Reads the station file itself (only [[power_line]], [[support]], [[span]]).
#include <fstream>
#include <memory>
#include <ostream>
#include <sstream>

#include <toml++/toml.h>

#include <string>

#include "report/finite_check.hpp"
#include "cli/command.hpp"
#include "siting/checks.hpp"
#include "siting/clearances_toml.hpp"
#include "siting/siting_toml.hpp"

namespace standoff::cli {

namespace {

toml::table read_toml_file(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(Where{path, 0, ""}, "cannot open the station file");
  std::ostringstream text;
  text << in.rdbuf();
  try {
    return toml::parse(text.str(), path);
  } catch (const toml::parse_error& e) {
    throw InputError(Where{path, static_cast<int>(e.source().begin.line), ""}, std::string(e.description()));
  }
}

}  // namespace

void add_lines(CLI::App& root, Commands& commands) {
  struct Options {
    std::string station;
    bool json = false;
  };
  auto o = std::make_shared<Options>();
  auto* sub = root.add_subcommand("lines", "Installation safety near overhead power lines: fall zones, raising, "
                                           "wire sag and swing, crossings (exit 1 if any check fails)");
  sub->add_option("STATION", o->station, "Station file (TOML) with [[power_line]], [[support]] and [[span]]")
      ->required();
  sub->add_flag("--json", o->json, "Print the checks as JSON");
  commands.push_back(Command{sub, [o](std::ostream& out, std::ostream&) {
    const toml::table root = read_toml_file(o->station);
    const auto site = siting::parse_site_elements(root, o->station);
    const auto report = siting::run_checks(site, siting::builtin_clearance_tables());
    if (o->json) {
      const auto j = siting::lines_report_json(report);
      standoff::report::check_finite(j, "lines result");  // no NaN or inf reaches the output (issue 14)
      out << j.dump(2) << "\n";
    } else {
      out << siting::lines_report_text(report);
      // The installation verdict in the record's words (issue 13).
      std::size_t failed = 0;
      for (const auto& c : report.checks) failed += c.pass() ? 0 : 1;
      const std::size_t n = report.checks.size();
      out << (failed > 0 ? "Installation: FAIL (" + std::to_string(failed) + " of " + std::to_string(n) + " checks)"
                         : "Installation: PASS (" + std::to_string(n) + (n == 1 ? " check)" : " checks)"))
          << "\n";
    }
    return report.all_pass() ? kOk : kExceeds;
  }});
}

}  // namespace standoff::cli
