// `standoff lines STATION.toml [--json]`: installation-safety checks near overhead power lines
// (issue 6). Reads the file through the station loader, like evaluate/field: the antennas' own
// wires, feed-line routes and supports are checked with the [[power_line]]/[[support]]/[[span]].
#include <memory>
#include <ostream>

#include <string>

#include "report/finite_check.hpp"
#include "cli/command.hpp"
#include "siting/checks.hpp"
#include "io/siting_toml.hpp"
#include "assemble/installation.hpp"
#include "io/station_toml.hpp"

namespace standoff::cli {

void add_lines(CLI::App& root, Commands& commands) {
  struct Options {
    std::string station;
    bool json = false;
  };
  auto o = std::make_shared<Options>();
  auto* sub = root.add_subcommand("lines", "Installation safety near overhead power lines: fall zones, raising, "
                                           "wire sag and swing, crossings (exit 1 if any check fails)");
  sub->add_option("STATION", o->station, "Station file (TOML), the same file `evaluate` reads")
      ->required();
  sub->add_flag("--json", o->json, "Print the checks as JSON");
  commands.push_back(Command{sub, [o](std::ostream& out, std::ostream&) {
    const station::Station st = station::load_station_file(o->station);
    const auto report = assemble::check_installation(st);
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
