// `standoff evaluate`, `standoff demo` and `standoff field`: evaluate a whole station on its site
// (issue 5). The CLI reads the file, calls the core, builds the record and hands it to the writers.
#include <unistd.h>

#include <algorithm>
#include <cctype>
#include <cerrno>
#include <cmath>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <memory>
#include <sstream>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "cli/command.hpp"
#include "cli/place_command.hpp"
#include "report/place_report.hpp"
#include "core/bounds.hpp"
#include "core/parallel.hpp"
#include "core/number_text.hpp"
#include "core/quantity_parse.hpp"
#include "exposure/evaluate.hpp"
#include "exposure/remedies.hpp"
#include "exposure/work_estimate.hpp"
#include "report/finite_check.hpp"
#include "io/limits_toml.hpp"
#include "report/format.hpp"
#include "report/record.hpp"
#include "report/sha256.hpp"
#include "report/writers.hpp"
#include "siting/checks.hpp"
#include "io/clearances_toml.hpp"
#include "assemble/installation.hpp"
#include "assemble/sources.hpp"
#include "io/station_toml.hpp"

namespace standoff::cli {

namespace {

struct EvalOptions {
  std::string station_file;
  std::string out_dir;
  const CLI::Option* out_option = nullptr;  // given as bare `--out`: write to reports/<station-name>/
  bool json = false;
  bool verbose = false;
  std::string units;  // metric | imperial | both (default: both for fcc, metric otherwise)
  std::string standard;
  const CLI::Option* standard_option = nullptr;
  std::string tables;  // --tables DIR: user feed-line / duty tables beside the built-in ones
  unsigned threads = 0;
  bool place = false;  // evaluate --place: add the placement search to the report (issue 10)
  std::size_t max_unknowns = em::kMaxUnknowns;
  double max_grid_cells = exposure::kDefaultMaxGridCells;
};

report::UnitSystem units_option(const std::string& s, limits::Standard standard) {
  std::string l;
  for (char c : s) l += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  if (l.empty()) return standard == limits::Standard::fcc ? report::UnitSystem::both : report::UnitSystem::metric;
  if (l == "metric") return report::UnitSystem::metric;
  if (l == "imperial") return report::UnitSystem::imperial;
  if (l == "both") return report::UnitSystem::both;
  throw InputError(option_where("--units"), "unknown unit system \"" + s + "\": expected metric, imperial or both");
}

// `--out DIR` is checked before the evaluation starts (issue 14): not empty, not a file, and in a
// directory that can be written (the nearest existing ancestor when DIR does not exist yet).
void check_out_dir(const std::string& dir) {
  namespace fs = std::filesystem;
  const Where w = option_where("--out");
  if (dir.empty()) throw InputError(w, "must not be empty (give a directory, or `--out` alone for reports/<station-name>/)");
  std::error_code ec;
  fs::path p(dir);
  if (fs::exists(p, ec) && !fs::is_directory(p, ec)) throw InputError(w, "\"" + dir + "\" exists and is not a directory");
  fs::path probe = p;
  while (!probe.empty() && !fs::exists(probe, ec)) probe = probe.parent_path();
  if (probe.empty()) probe = ".";
  if (!fs::is_directory(probe, ec)) throw InputError(w, "\"" + probe.string() + "\" is not a directory");
  if (::access(probe.c_str(), W_OK | X_OK) != 0)
    throw InputError(w, "cannot write into \"" + probe.string() + "\": " + std::strerror(errno));
}

// Applies --tables DIR to the build options; the tables live as long as `holder`.
void use_tables(const std::string& dir, assemble::UserTables& holder, assemble::BuildOptions& bo) {
  if (dir.empty()) return;
  holder = assemble::load_user_tables(dir);
  if (holder.feedlines) bo.user_feedlines = &*holder.feedlines;
  if (holder.duties) bo.user_duties = &*holder.duties;
}

std::string read_file(const std::string& path) { return station::read_station_text(path); }

std::optional<limits::Standard> standard_option(const std::string& s) {
  if (s.empty()) return std::nullopt;
  auto id = limits::standard_from_string(s);
  if (!id)
    throw InputError(option_where("--standard"), "unknown standard \"" + s + "\": expected fcc, icnirp2020, icnirp1998 or sc6");
  return id;
}

report::StandardUsed standard_used(const limits::LimitTable& t) {
  return {limits::to_string(t.standard), t.document, t.table, t.year, limits::to_string(t.confidence), t.file, t.note};
}

report::PlanPoint rp(exposure::PlanPoint p) { return {p.x_m, p.y_m}; }
std::vector<report::PlanPoint> rpoly(const exposure::Polygon& poly) {
  std::vector<report::PlanPoint> out;
  for (const auto& p : poly) out.push_back(rp(p));
  return out;
}

std::string metres(double v) { return fmt::format("{:.4g} m", v); }

// The site map: geometry of the station for the report's drawing.
report::SiteMap site_map(const station::Station& st, const assemble::Built& built) {
  report::SiteMap m;
  m.boundary = rpoly(st.site.boundary);
  for (const auto& b : st.site.buildings) {
    std::string floors;
    for (double f : b.floors_m) floors += (floors.empty() ? "" : ", ") + metres(f);
    m.buildings.push_back({b.name, rpoly(b.footprint), "floors at " + floors + "; height " + metres(b.height_m)});
  }
  for (const auto& z : st.site.zones)
    if (z.kind == station::ZoneKind::people) m.zones.push_back({z.name, z.tier, rpoly(z.polygon)});
  std::set<std::string> drawn;
  for (std::size_t i = 0; i < built.input.sources.size(); ++i) {
    const auto& src = built.input.sources[i];
    if (!drawn.insert(src.antenna).second) continue;
    const station::Antenna* a = st.antenna(src.antenna);
    report::MapAntenna ma;
    ma.name = src.antenna;
    for (const auto& [p, q] : built.wires[i])
      ma.wires.push_back({report::Point3{p.x(), p.y(), p.z()}, report::Point3{q.x(), q.y(), q.z()}});
    if (a) ma.position = report::Point3{a->position.x_m, a->position.y_m, a->height_m};
    m.antennas.push_back(std::move(ma));
  }
  const auto& tables = siting::builtin_clearance_tables();
  for (const auto& s : st.installation.supports) {
    report::MapSupport ms;
    ms.name = s.name;
    ms.kind = siting::to_string(s.kind);
    ms.base = {s.base.x.value(), s.base.y.value()};
    ms.height_m = s.height.value();
    ms.fall_radius_m = siting::fall_zone_radius(s, tables).value();
    m.supports.push_back(ms);
  }
  for (const auto& l : st.installation.power_lines) {
    report::MapPowerLine ml;
    ml.name = l.name;
    for (const auto& p : l.path) ml.path.push_back({p.x.value(), p.y.value()});
    std::string v = l.voltage ? report::fmtx::voltage(l.voltage->value.value()) : std::string("voltage unknown");
    std::string h = l.height ? "conductor at " + metres(l.height->value()) : std::string("height unknown");
    ml.detail = v + ", " + h;
    m.power_lines.push_back(ml);
  }
  for (const auto& sp : st.installation.spans) {
    m.spans.push_back({sp.name, siting::to_string(sp.kind),
                       report::Point3{sp.from.x.value(), sp.from.y.value(), sp.from.z.value()},
                       report::Point3{sp.to.x.value(), sp.to.y.value(), sp.to.z.value()}});
  }
  for (const auto& p : st.site.points) m.points.push_back({p.name, {p.at.x_m, p.at.y_m, p.at.z_m}, p.tier});
  return m;
}

report::LinesSection lines_section(const siting::LinesReport& lr) {
  report::LinesSection s;
  for (const auto& c : lr.checks) {
    report::LineCheck lc;
    lc.rule = c.rule;
    lc.source = c.source;
    lc.subject = c.subject;
    lc.line = c.line;
    if (c.required) lc.required_m = c.required->value();
    if (c.actual) lc.actual_m = c.actual->value();
    lc.pass = c.pass();
    lc.note = c.note;
    lc.diameter = c.diameter;
    lc.remedies = c.remedies;
    s.checks.push_back(lc);
  }
  s.assumptions = lr.assumptions;
  s.cautions = lr.cautions;
  return s;
}

// Progress on a terminal only: \r-updated percentage on stderr.
std::function<void(double)> progress_for(std::ostream& err, bool json) {
  return terminal_progress(err, json, [](int pct) { return "evaluating " + std::to_string(pct) + " %"; });
}

// `evaluate --place`: the default placement search (first wire antenna, 1 m, every 15°).
report::Record::Placement placement_for_report(const station::Station& st, std::optional<limits::Standard> standard,
                                               unsigned threads, std::ostream& err, bool json) {
  assemble::PlaceOptions po;
  po.standard = standard;
  po.threads = threads;
  for (int k = 0; k < 24; ++k) po.azimuths_rad.push_back(k * 3.14159265358979323846 / 12.0);
  assemble::PlaceInput in = assemble::place_input(st, po);
  in.setup.progress = place_progress(err, json);
  siting::PlaceResult res = siting::place(in.setup);
  assemble::apply_current_installation(st, in, res);
  return {report::place_html_section(st, in, res), report::place_heatmap_svg(st, in, res, true)};
}

int run_evaluation(const EvalOptions& o, std::string_view text, const std::string& input_name,
                   const std::string& file_for_messages, std::ostream& out, std::ostream& err) {
  (void)units_option(o.units, limits::Standard::fcc);  // a bad --units is refused before any work
  if (o.standard_option != nullptr && o.standard_option->count() > 0 && o.standard.empty())
    throw InputError(option_where("--standard"), "must not be empty: expected fcc, icnirp2020, icnirp1998 or sc6");
  const auto standard = standard_option(o.standard);
  const bool out_given = o.out_option != nullptr && o.out_option->count() > 0;
  // `--out` alone: CLI11 records an empty value (an explicit `--out ""` is refused by run()).
  const bool out_bare = out_given && o.out_dir.empty();
  if (out_given && !out_bare) check_out_dir(o.out_dir);
  parallel::set_default_threads(o.threads);  // also the MoM set-up (0: all cores)
  const station::Station st = station::load_station(text, file_for_messages);
  if (out_bare) check_out_dir("reports/" + report::slug(st.name));
  assemble::BuildOptions bo;
  bo.standard = standard;
  bo.max_unknowns = o.max_unknowns;
  assemble::UserTables user_tables;
  use_tables(o.tables, user_tables, bo);
  const assemble::Built built = assemble::build(st, bo);
  const report::UnitSystem units = units_option(o.units, built.standard);  // checked before the long run

  exposure::EvaluationOptions eo;
  eo.threads = o.threads;
  eo.progress = progress_for(err, o.json);
  // Work estimated before any grid is allocated (issue 14).
  const double cells = exposure::estimated_grid_cells(built.input, eo.grid_spacing_m);
  if (cells > o.max_grid_cells) {
    // Named by the largest zone (zones are built in the station's order).
    const auto per_zone = exposure::estimated_grid_cells_per_zone(built.input, eo.grid_spacing_m);
    const std::size_t big = static_cast<std::size_t>(std::max_element(per_zone.begin(), per_zone.end()) - per_zone.begin());
    const Where w = big < st.site.zones.size()
                        ? Where{file_for_messages, st.site.zones[big].line, "zone[" + std::to_string(big) + "]"}
                        : Where{file_for_messages, 0, "zone"};
    throw InputError(w, fmt::format("the zones need about {} grid cells at {} m spacing ({} in this one), "
                                    "more than the cap of {} (raise it with --max-grid-cells, or split the zones)",
                                    significant(cells, 3), significant(eo.grid_spacing_m, 3),
                                    significant(per_zone[big], 3), significant(o.max_grid_cells, 3)));
  }
  exposure::StationEvaluation ev = exposure::evaluate(built.input, eo);

  report::Record rec;
  rec.meta.station_name = st.name;
  rec.meta.date = report::utc_now_iso8601();
  rec.meta.tool_version = STANDOFF_VERSION;
  rec.meta.input_file = input_name;
  rec.meta.input_sha256 = report::sha256_hex(text);
  rec.meta.standards.push_back(standard_used(*built.table));
  rec.meta.evaluated_by = st.evaluator;
  rec.units = units;
  rec.map = site_map(st, built);
  if (!st.installation.empty())
    rec.lines = lines_section(assemble::check_installation(st));
  for (const auto& z : st.site.zones)
    if (z.kind == station::ZoneKind::keep_out)
      rec.cautions.push_back("Keep-out area \"" + z.name + "\"" + (z.barrier.empty() ? "" : " (" + z.barrier + ")") +
                                ": not evaluated for " +
                                (z.keeps_out == station::KeepsOut::everyone ? "anyone" : "the uncontrolled tier") +
                                " — the barrier must stay in place and closed while transmitting.");
  for (std::string u : built.unzoned) {
    u[0] = static_cast<char>(std::toupper(static_cast<unsigned char>(u[0])));
    (u.rfind("Not evaluated", 0) == 0 ? rec.cautions : rec.assumptions).push_back(u + ".");
  }
  {
    const em::Ground g = assemble::em_ground(st.site.ground);
    rec.assumptions.push_back(g.kind == em::GroundKind::real
                                  ? fmt::format("Ground: {} (εr {:g}, σ {:g} S/m, tables/grounds.toml).", st.site.ground,
                                                g.eps_r, g.sigma_s_per_m)
                                  : "Ground: " + st.site.ground + ".");
  }
  rec.assumptions.push_back("Body line: " + ev.body_rule + ".");
  rec.assumptions.push_back(fmt::format("Zone grids at {:.3g} m spacing, 2×2 sub-points within 2 m of an antenna.",
                                        ev.grid_spacing_m));
  rec.references = report::default_references();
  rec.evaluation = std::move(ev);
  // Computed remedies (issue 12) for the record's finding sentences (issue 13): the duty or on-air
  // share that would comply (the keep-away distances and the PEP are in the sentence already) and
  // the geometry change of each failed installation check.
  for (const auto& op : rec.evaluation.operations)
    for (const auto& rm : exposure::operation_remedies(op))
      if (rm.kind == "max_duty" || rm.kind == "max_on_air_share") rec.remedies.push_back({op.name, rm.text});
  if (rec.lines)
    for (const auto& c : rec.lines->checks)
      for (const auto& rm : c.remedies) rec.remedies.push_back({c.subject + " / " + c.rule, rm.text});
  rec.cautions = report::all_cautions(rec);
  // Every number of the record is finite, or the run fails as an internal error (exit 3).
  report::check_finite(report::to_json(rec), "evaluation record");
  if (o.place) rec.placement = placement_for_report(st, bo.standard, o.threads, err, o.json);

  // Write the report files first (all or nothing), then print. A bare `--out` writes to the
  // default directory reports/<station-name>/ (issue 7).
  std::string out_dir = o.out_dir;
  if (out_bare) out_dir = "reports/" + report::slug(st.name);
  if (!out_dir.empty()) report::write_report(rec, out_dir);
  if (o.json) {
    out << report::to_json(rec).dump(2) << "\n";
  } else {
    report::TextOptions to;
    to.colour = (&out == &std::cout) && report::use_colour_for_fd(STDOUT_FILENO);
    to.verbose = o.verbose;
    to.width = report::text_width(std::getenv("COLUMNS"));
    report::write_text(rec, out, to);
    if (!out_dir.empty()) out << "\nReport written to " << out_dir << "\n";
  }
  const std::string verdict = report::overall_verdict(rec);
  return verdict == "within" ? kOk : kExceeds;
}

void common_options(CLI::App* sub, const std::shared_ptr<EvalOptions>& o) {
  o->out_option = sub->add_option("--out", o->out_dir,
                                  "Write the report (HTML, Markdown, JSON, SVG) into this directory; "
                                  "`--out` alone writes to reports/<station-name>/")
                       ->expected(0, 1);
  sub->add_flag("--json", o->json, "Print the evaluation record as JSON");
  sub->add_flag("--verbose", o->verbose, "Print every table and power-chain step (default: a summary of at most 100 columns)");
  sub->add_option("--units", o->units, "Lengths in metric, imperial or both (default: both for fcc, metric otherwise)");
  o->standard_option = sub->add_option("--standard", o->standard, "Exposure standard: fcc, icnirp2020, icnirp1998, sc6 (default: the station file's, else fcc)");
  sub->add_option("--tables", o->tables,
                  "Directory with user tables (feedlines.toml, duty.toml) used beside the built-in ones");
  sub->add_option("--threads", o->threads, "Worker threads for the grid (default: all cores)")
      ->check(CLI::Range(1u, 256u));
  sub->add_option("--max-unknowns", o->max_unknowns, "Cap on moment-method unknowns per antenna (default 4000; 16 N² bytes)")
      ->check(CLI::Range(std::size_t{1}, std::size_t{20000}));
  sub->add_option("--max-grid-cells", o->max_grid_cells, "Cap on zone grid cells over all zones and floors (default 10000000)")
      ->check(CLI::Range(1.0, 1e9));
}

struct FieldOptions {
  std::string station_file;
  std::string at;
  std::string operation;
  std::string standard;
  std::string tables;
  bool json = false;
  unsigned threads = 0;
};

exposure::SitePoint parse_at(const std::string& text) {
  const std::vector<std::string> parts = split_commas(text);
  if (parts.size() != 3)
    throw InputError(option_where("--at"), "expected X,Y,Z with units, e.g. \"12m,-4m,1.5m\", got \"" + text + "\"");
  double v[3];
  for (int i = 0; i < 3; ++i) v[i] = parse_length(parts[static_cast<std::size_t>(i)], option_where("--at"), Sign::any).value();
  if (v[2] < 0.0) throw InputError(option_where("--at"), "the point is below ground");
  for (double c : v) bounds::length(c, option_where("--at"), true);
  return {v[0], v[1], v[2]};
}

int run_field(const FieldOptions& o, std::ostream& out) {
  parallel::set_default_threads(o.threads);
  const exposure::SitePoint at = parse_at(o.at);
  const std::string text = read_file(o.station_file);
  const station::Station st = station::load_station(text, o.station_file);
  assemble::BuildOptions bo;
  bo.standard = standard_option(o.standard);
  if (!o.operation.empty()) bo.only_operation = o.operation;
  assemble::UserTables user_tables;
  use_tables(o.tables, user_tables, bo);
  const assemble::Built built = assemble::build(st, bo);

  nlohmann::json j;
  j["at"] = {{"x_m", at.x_m}, {"y_m", at.y_m}, {"z_m", at.z_m}};
  j["standard"] = limits::to_string(built.standard);
  nlohmann::json ops = nlohmann::json::array();
  bool exceeds = false, unevaluated = false;
  std::ostringstream text_out;
  text_out << fmt::format("Fields at x = {:.2f} m, y = {:.2f} m, z = {:.2f} m ({})\n", at.x_m, at.y_m, at.z_m,
                          limits::to_string(built.standard));
  text_out << fmt::format("{:<32} {:>10} {:>10} {:>12} {:>12}\n", "operation", "E (V/m)", "H (A/m)", "controlled",
                          "uncontrolled");
  for (std::size_t i = 0; i < built.input.sources.size(); ++i) {
    const auto& src = built.input.sources[i];
    const exposure::PointFields pf = exposure::fields_at(src, built.input.limits[i], at);
    nlohmann::json oj{{"name", src.name}, {"frequency_hz", src.frequency_hz}, {"average_power_w", src.average_power_w},
                      {"method", src.method}, {"evaluated", pf.valid}};
    if (pf.valid) {
      oj["e_v_per_m"] = pf.e_v_per_m;
      oj["h_a_per_m"] = pf.h_a_per_m;
      oj["ratio"] = {{"controlled", pf.controlled.value}, {"uncontrolled", pf.uncontrolled.value}};
      oj["quantity"] = {{"controlled", pf.controlled.quantity}, {"uncontrolled", pf.uncontrolled.quantity}};
      exceeds |= pf.controlled.value > 1.0 || pf.uncontrolled.value > 1.0;
      text_out << fmt::format("{:<32} {:>10.4g} {:>10.4g} {:>11.1f}% {:>11.1f}%\n", src.name, pf.e_v_per_m,
                              pf.h_a_per_m, std::ceil(pf.controlled.value * 1000.0) / 10.0,
                              std::ceil(pf.uncontrolled.value * 1000.0) / 10.0);
    } else {
      unevaluated = true;
      oj["e_v_per_m"] = nullptr;
      oj["h_a_per_m"] = nullptr;
      oj["ratio"] = {{"controlled", nullptr}, {"uncontrolled", nullptr}};
      oj["note"] = "not evaluated — inside the model's validity limit; measure or use another method";
      text_out << fmt::format("{:<32} not evaluated — inside the model's validity limit; measure or use another method\n",
                              src.name);
    }
    ops.push_back(oj);
  }
  j["operations"] = ops;
  const std::string verdict = exceeds ? "exceeds" : unevaluated ? "not evaluated" : "within";
  j["verdict"] = verdict;
  j["note"] = "ratios are the power ratio to the limit of each tier (100 % = at the limit), at this point only "
              "(no body averaging), each tier at its own averaging time";
  if (o.json) {
    report::check_finite(j, "field result");
    out << j.dump(2) << "\n";
  } else {
    out << text_out.str();
    out << "Percentages are of each tier's limit at this single point (no body averaging). Local codes, the utility "
           "and licensed practice govern.\n";
  }
  return verdict == "within" ? kOk : kExceeds;
}

}  // namespace

void add_evaluate(CLI::App& root, Commands& commands) {
  {
    auto o = std::make_shared<EvalOptions>();
    CLI::App* sub = root.add_subcommand("evaluate", "Evaluate a whole station on its site (exposure and installation)");
    sub->add_option("station", o->station_file, "Station file (TOML)")->required();
    common_options(sub, o);
    sub->add_flag("--place", o->place, "Also search the site for the first wire antenna's best position (heat map "
                                       "and ranking in the HTML report)");
    commands.push_back({sub, [o](std::ostream& out, std::ostream& err) {
                          const std::string text = read_file(o->station_file);
                          return run_evaluation(*o, text, o->station_file, o->station_file, out, err);
                        }});
  }
  {
    auto o = std::make_shared<EvalOptions>();
    CLI::App* sub = root.add_subcommand("demo", "Evaluate the bundled demo station (an invented site)");
    common_options(sub, o);
    commands.push_back({sub, [o](std::ostream& out, std::ostream& err) {
                          const std::string_view text = station::demo_station_text();
                          if (text.empty()) throw std::logic_error("the demo station is not embedded");
                          const int rc = run_evaluation(*o, text, station::kDemoStationPath,
                                                        station::kDemoStationPath, out, err);
                          // The demo is built to show a finding, so a finding is its expected
                          // outcome: it exits 0 once evaluated. `evaluate` on the same file exits 1.
                          if (rc != kExceeds) return rc;
                          if (!o->json)
                            out << report::fmtx::wrap(std::string("Demo: these findings are intended, so it exits 0; "
                                                                  "`standoff evaluate` on its file exits 1."),
                                                      report::text_width(std::getenv("COLUMNS")), "", "");
                          return static_cast<int>(kOk);
                        }});
  }
  {
    auto o = std::make_shared<FieldOptions>();
    CLI::App* sub = root.add_subcommand("field", "E, H and exposure ratios at one point of a station's site");
    sub->add_option("station", o->station_file, "Station file (TOML)")->required();
    sub->add_option("--at", o->at, "Point X,Y,Z in the site frame with units, e.g. 12m,-4m,1.5m")->required();
    sub->add_option("--operation", o->operation, "Only this operation (default: every operation)");
    sub->add_option("--standard", o->standard, "Exposure standard: fcc, icnirp2020, icnirp1998, sc6");
    sub->add_option("--tables", o->tables, "Directory with user tables (feedlines.toml, duty.toml)");
    sub->add_flag("--json", o->json, "Print JSON");
    sub->add_option("--threads", o->threads, "Worker threads for the antenna models (default: all cores)")
        ->check(CLI::Range(1u, 256u));
    commands.push_back({sub, [o](std::ostream& out, std::ostream&) { return run_field(*o, out); }});
  }
}

}  // namespace standoff::cli
