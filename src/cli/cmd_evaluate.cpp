// `standoff evaluate`, `standoff demo` and `standoff field`: evaluate a whole station on its site
// (issue 5). The CLI reads the file, calls the core, builds the record and hands it to the writers.
#include <unistd.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <memory>
#include <sstream>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "cli/command.hpp"
#include "core/parallel.hpp"
#include "core/quantity_parse.hpp"
#include "exposure/evaluate.hpp"
#include "limits/limits_toml.hpp"
#include "report/record.hpp"
#include "report/sha256.hpp"
#include "report/writers.hpp"
#include "siting/checks.hpp"
#include "siting/clearances_toml.hpp"
#include "station/sources.hpp"
#include "station/station_toml.hpp"

namespace standoff::cli {

namespace {

struct EvalOptions {
  std::string station_file;
  std::string out_dir;
  const CLI::Option* out_option = nullptr;  // given as bare `--out`: write to reports/<station-name>/
  bool json = false;
  std::string standard;
  unsigned threads = 0;
};

std::string read_file(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(Where{path, 0, ""}, "cannot read the station file");
  std::ostringstream ss;
  ss << in.rdbuf();
  return ss.str();
}

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
report::SiteMap site_map(const station::Station& st, const station::Built& built) {
  report::SiteMap m;
  m.boundary = rpoly(st.site.boundary);
  for (const auto& b : st.site.buildings) {
    std::string floors;
    for (double f : b.floors_m) floors += (floors.empty() ? "" : ", ") + metres(f);
    m.buildings.push_back({b.name, rpoly(b.footprint), "floors at " + floors + "; height " + metres(b.height_m)});
  }
  for (const auto& z : st.site.zones) m.zones.push_back({z.name, z.tier, rpoly(z.polygon)});
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
    std::string v = l.voltage ? fmt::format("{:.4g} kV", l.voltage->value.value() / 1000.0) : std::string("voltage unknown");
    std::string h = l.height ? "conductor at " + metres(l.height->value()) : std::string("height unknown");
    ml.detail = v + ", " + h;
    m.power_lines.push_back(ml);
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
    s.checks.push_back(lc);
  }
  s.assumptions = lr.assumptions;
  s.cautions = lr.cautions;
  return s;
}

// Progress on a terminal only: \r-updated percentage on stderr.
std::function<void(double)> progress_for(std::ostream& err, bool json) {
  if (json || &err != &std::cerr || !isatty(STDERR_FILENO)) return {};
  auto last = std::make_shared<int>(-1);
  return [&err, last](double f) {
    const int pct = static_cast<int>(std::floor(f * 100.0));
    if (pct == *last) return;
    *last = pct;
    err << "\rstandoff: evaluating " << pct << " %" << (pct >= 100 ? "\n" : "") << std::flush;
  };
}

int run_evaluation(const EvalOptions& o, std::string_view text, const std::string& input_name,
                   const std::string& file_for_messages, std::ostream& out, std::ostream& err) {
  parallel::set_default_threads(o.threads);  // also the MoM set-up (0: all cores)
  const station::Station st = station::load_station(text, file_for_messages);
  station::BuildOptions bo;
  bo.standard = standard_option(o.standard);
  const station::Built built = station::build(st, bo);

  exposure::EvaluationOptions eo;
  eo.threads = o.threads;
  eo.progress = progress_for(err, o.json);
  exposure::StationEvaluation ev = exposure::evaluate(built.input, eo);

  report::Record rec;
  rec.meta.station_name = st.name;
  rec.meta.date = report::utc_now_iso8601();
  rec.meta.tool_version = STANDOFF_VERSION;
  rec.meta.input_file = input_name;
  rec.meta.input_sha256 = report::sha256_hex(text);
  rec.meta.standards.push_back(standard_used(*built.table));
  rec.meta.evaluated_by = st.evaluator;
  rec.map = site_map(st, built);
  if (!st.installation.empty())
    rec.lines = lines_section(siting::run_checks(st.installation, siting::builtin_clearance_tables()));
  rec.assumptions.push_back("Ground: " + station::to_string(st.site.ground) + ".");
  rec.assumptions.push_back("Body line: " + ev.body_rule + ".");
  rec.assumptions.push_back(fmt::format("Zone grids at {:.3g} m spacing, 2×2 sub-points within 2 m of an antenna.",
                                        ev.grid_spacing_m));
  rec.references = report::default_references();
  rec.evaluation = std::move(ev);
  rec.cautions = report::all_cautions(rec);

  // Write the report files first (all or nothing), then print. A bare `--out` writes to the
  // default directory reports/<station-name>/ (issue 7).
  std::string out_dir = o.out_dir;
  if (out_dir.empty() && o.out_option != nullptr && o.out_option->count() > 0)
    out_dir = "reports/" + report::slug(st.name);
  if (!out_dir.empty()) report::write_report(rec, out_dir);
  if (o.json) {
    out << report::to_json(rec).dump(2) << "\n";
  } else {
    report::TextOptions to;
    to.colour = (&out == &std::cout) && report::use_colour_for_fd(STDOUT_FILENO);
    report::write_text(rec, out, to);
    if (!out_dir.empty()) out << "Report written to " << out_dir << "\n";
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
  sub->add_option("--standard", o->standard, "Exposure standard: fcc, icnirp2020, icnirp1998, sc6 (default: the station file's, else fcc)");
  sub->add_option("--threads", o->threads, "Worker threads for the grid (default: all cores)")
      ->check(CLI::Range(1u, 256u));
}

struct FieldOptions {
  std::string station_file;
  std::string at;
  std::string operation;
  std::string standard;
  bool json = false;
  unsigned threads = 0;
};

exposure::SitePoint parse_at(const std::string& text) {
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
  if (parts.size() != 3)
    throw InputError(option_where("--at"), "expected X,Y,Z with units, e.g. \"12m,-4m,1.5m\", got \"" + text + "\"");
  double v[3];
  for (int i = 0; i < 3; ++i) v[i] = parse_length(parts[static_cast<std::size_t>(i)], option_where("--at"), Sign::any).value();
  if (v[2] < 0.0) throw InputError(option_where("--at"), "the point is below ground");
  return {v[0], v[1], v[2]};
}

int run_field(const FieldOptions& o, std::ostream& out) {
  parallel::set_default_threads(o.threads);
  const exposure::SitePoint at = parse_at(o.at);
  const std::string text = read_file(o.station_file);
  const station::Station st = station::load_station(text, o.station_file);
  station::BuildOptions bo;
  bo.standard = standard_option(o.standard);
  if (!o.operation.empty()) bo.only_operation = o.operation;
  const station::Built built = station::build(st, bo);

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
                            out << "Demo: the findings above are intended (exit status 0); `standoff evaluate "
                                << station::kDemoStationPath << "` exits 1 on the same result.\n";
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
    sub->add_flag("--json", o->json, "Print JSON");
    sub->add_option("--threads", o->threads, "Worker threads for the antenna models (default: all cores)")
        ->check(CLI::Range(1u, 256u));
    commands.push_back({sub, [o](std::ostream& out, std::ostream&) { return run_field(*o, out); }});
  }
}

}  // namespace standoff::cli
