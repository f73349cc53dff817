// `standoff place STATION.toml [--antenna NAME] [--step L] [--azimuths LIST|--azimuth-step A]
// [--top N] [--line CLASS] [--json] [--out DIR] [--threads N]`: where on the site one wire antenna
// permits the most transmitter power (issue 10). Exit 0 when the best candidate passes every
// power-line check, 1 when none does.
#include <algorithm>
#include <unistd.h>

#include <cmath>
#include <iostream>
#include <memory>

#include "cli/command.hpp"
#include "cli/place_command.hpp"
#include "core/constants.hpp"
#include "core/quantity_parse.hpp"
#include "report/place_report.hpp"
#include "report/writers.hpp"
#include "io/station_toml.hpp"

namespace standoff::cli {


assemble::PlaceOptions place_options(const PlaceCliOptions& c) {
  assemble::PlaceOptions o;
  if (!c.antenna.empty()) o.antenna = c.antenna;
  if (!c.step.empty()) {
    o.step_m = parse_length(c.step, option_where("--step")).value();
    if (!(o.step_m >= 0.1 && o.step_m <= 100.0))
      throw InputError(option_where("--step"), "the step must be between 0.1 m and 100 m");
  }
  if (!c.azimuths.empty() && !c.azimuth_step.empty())
    throw InputError(option_where("--azimuths"), "give either --azimuths or --azimuth-step, not both");
  if (!c.azimuths.empty()) {
    for (const auto& p : split_commas(c.azimuths)) o.azimuths_rad.push_back(parse_angle(p, option_where("--azimuths")).value());
    if (o.azimuths_rad.size() > 360) throw InputError(option_where("--azimuths"), "at most 360 azimuths");
  } else {
    const double step = c.azimuth_step.empty() ? constants::pi / 12.0
                                               : parse_angle(c.azimuth_step, option_where("--azimuth-step")).value();
    if (!(step >= constants::pi / 180.0 - 1e-12 && step <= 2.0 * constants::pi + 1e-12))
      throw InputError(option_where("--azimuth-step"), "the azimuth step must be between 1° and 360°");
    for (double a = 0.0; a < 2.0 * constants::pi - 1e-9; a += step) o.azimuths_rad.push_back(a);
  }
  if (!c.line.empty()) o.line_class = c.line;
  o.top = c.top;
  o.threads = c.threads;
  return o;
}

// Progress on a terminal only: a bar on stderr (not with --json, not when piped).
std::function<void(double)> place_progress(std::ostream& err, bool json) {
  return terminal_progress(err, json, [](int pct) {
    const auto n = static_cast<std::size_t>(pct / 5);
    return "placing [" + std::string(n, '#') + std::string(20 - n, ' ') + "] " + std::to_string(pct) + " %";
  });
}

// One progress line on a terminal's stderr, redrawn with \r when the whole percentage changes.
std::function<void(double)> terminal_progress(std::ostream& err, bool json, std::function<std::string(int)> line) {
  if (json || &err != &std::cerr || !isatty(STDERR_FILENO)) return {};
  auto last = std::make_shared<int>(-1);
  return [&err, last, line = std::move(line)](double f) {
    const int pct = std::clamp(static_cast<int>(std::floor(f * 100.0)), 0, 100);
    if (pct == *last) return;
    *last = pct;
    err << "\rstandoff: " << line(pct) << (pct >= 100 ? "\n" : "") << std::flush;
  };
}

void add_place(CLI::App& root, Commands& commands) {
  auto o = std::make_shared<PlaceCliOptions>();
  auto* sub = root.add_subcommand("place", "Search the site for the antenna position and azimuth that permit the most "
                                           "power (exposure, feed-line loss, power-line checks)");
  sub->add_option("STATION", o->station, "Station file (TOML)")->required();
  sub->add_option("--antenna", o->antenna, "Wire antenna to place (default: the first wire antenna with an operation)");
  sub->add_option("--step", o->step, "Grid step of the candidate positions, e.g. \"1 m\" (default 1 m)");
  auto* az = sub->add_option("--azimuths", o->azimuths, "Azimuths to try, e.g. \"0 deg,45 deg,90 deg\"");
  auto* azs = sub->add_option("--azimuth-step", o->azimuth_step, "Try every A from 0°, e.g. \"15 deg\" (default)");
  az->excludes(azs);
  sub->add_option("--top", o->top, "Candidates to list (default 10)")->check(CLI::Range(1, 1000));
  sub->add_option("--line", o->line, "Feed-line class to use instead of the station's, e.g. twinlead-300");
  sub->add_flag("--json", o->json, "Print the ranking as JSON");
  sub->add_option("--out", o->out, "Write place.json and place-heatmap.svg into this directory");
  sub->add_option("--threads", o->threads, "Worker threads (default: all cores)")->check(CLI::Range(1u, 256u));
  commands.push_back(Command{sub, [o](std::ostream& out, std::ostream& err) {
    const auto opts = place_options(*o);
    const station::Station st = station::load_station_file(o->station);
    assemble::PlaceInput in = assemble::place_input(st, opts);
    in.setup.progress = place_progress(err, o->json);
    siting::PlaceResult res = siting::place(in.setup);
    assemble::apply_current_installation(st, in, res);
    const nlohmann::json j = report::place_json(st, in, res);
    if (!o->out.empty())
      report::write_files_atomically(o->out, {{report::kPlaceJsonFile, j.dump(2) + "\n"},
                                              {report::kPlaceHeatmapFile, report::place_heatmap_svg(st, in, res, true)}});
    if (o->json) out << j.dump(2) << "\n";
    else {
      out << report::place_text(st, in, res);
      if (!o->out.empty()) out << "Written to " << o->out << "\n";
    }
    return !res.candidates.empty() && res.candidates.front().clearance_ok ? kOk : kExceeds;
  }});
}

}  // namespace standoff::cli
