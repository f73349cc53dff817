// `standoff wire KIND --freq F ...`: models one wire antenna with the thin-wire method of moments
// (src/em): feed impedance, SWR on a reference impedance or a feed line (src/power/feedline.hpp),
// peak gain, efficiency, and with --resonate the length that gives zero feed reactance.
#include <complex>
#include <cstring>
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <memory>
#include <optional>
#include <ostream>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "cli/command.hpp"
#include "core/bounds.hpp"
#include "core/constants.hpp"
#include "core/suggest.hpp"
#include "core/quantity_parse.hpp"
#include "em/builders.hpp"
#include "em/fields.hpp"
#include "io/grounds_toml.hpp"
#include "em/solve.hpp"
#include "power/feedline.hpp"
#include "io/power_tables_toml.hpp"
#include "report/finite_check.hpp"

namespace standoff::cli {
namespace {

using nlohmann::json;
constexpr double pi = constants::pi;

struct WireOptions {
  std::string kind, freq, length, radius, radius2, gauge, spacing, height, ground = "free";
  std::string z0, line, line_length, sweep, radials, radial_length, sides, droop;
  bool resonate = false;
  bool json = false;
  std::size_t max_unknowns = em::kMaxUnknowns;
};

// The option behind an antenna-model error (issue 14): the model names its own fields.
std::string option_for(const InputError& e) {
  const std::string& f = e.where().field;
  const std::string& m = e.message();
  auto has = [&](const char* s) { return m.find(s) != std::string::npos; };
  if (f == "radials") return "--radials";
  if (f == "radial length" || f.rfind("radial ", 0) == 0) return has("radius") ? "--radius" : "--radial-length";
  if (f == "spacing") return "--spacing";
  if (f == "droop") return "--droop";
  if (f == "sides") return "--sides";
  if (f == "gauge") return "--gauge";
  if (f == "frequency") return "--freq";
  if (f == "ground") return "--ground";
  if (f == "--resonate") return "--resonate";
  if (f == "second conductor" && has("radius")) return "--radius2";
  if (has("radius") || has("radii") || has("thin-wire")) return "--radius";
  if (has("ground")) return "--height";
  if (has("parallel wires")) return "--spacing";
  return "--length";
}

// The CLI segments more finely than the engine's default lambda/20 rule (the delta-gap feed
// impedance needs about lambda/80 near resonance; see docs/methods.md, thin-wire section).
constexpr double kCliSegmentWavelengths = 1.0 / 80.0;
// Peak-gain search grid (then refined), rad.
constexpr double kGainStep = 2.0 * pi / 180.0;

// `digits` significant figures, never in exponent notation (text is read by people).
std::string sig(double v, int digits = 4) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", digits, v);
  if (std::strchr(buf, 'e') == nullptr || !std::isfinite(v)) return buf;
  const int mag = static_cast<int>(std::floor(std::log10(std::abs(v))));
  const int decimals = std::clamp(digits - 1 - mag, 0, 15);
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  return buf;
}

// "73.1 + j42.5 ohm"; a reactance below 0.01 ohm is shown as 0 (numerical noise at resonance).
std::string impedance_text(std::complex<double> z) {
  const double x = std::abs(z.imag()) < 0.01 ? 0.0 : z.imag();
  return sig(z.real(), 4) + (x < 0 ? " - j" : " + j") + sig(std::abs(x), 4) + " ohm";
}

int parse_count(const std::string& text, const std::string& option, int lo, int hi) {
  char* end = nullptr;
  const long v = std::strtol(text.c_str(), &end, 10);
  if (text.empty() || end != text.c_str() + text.size() || v < lo || v > hi)
    throw InputError(option_where(option), "expected a whole number from " + std::to_string(lo) + " to " +
                                               std::to_string(hi) + ", got \"" + text + "\"");
  return static_cast<int>(v);
}

// Default length for each kind as a fraction of the wavelength (common practice (no source):
// starting points to be trimmed with --resonate).
double default_length(const std::string& kind, double lambda) {
  if (kind == "monopole") return 0.24 * lambda;
  if (kind == "loop") return 1.02 * lambda;
  if (kind == "yagi2" || kind == "yagi3") return 0.47 * lambda;
  return 0.475 * lambda;
}

struct Setup {
  std::string kind;
  em::Placement at;
  em::Conductor wire, wire2;
  em::Ground ground;
  double spacing = 0.0;
  double droop = 30.0 * pi / 180.0;
  int radials = 4;
  double radial_length = 0.0;
  int sides = 4;
  bool height_given = false;
};

em::Model build(const Setup& s, double f, double length) {
  if (s.kind == "dipole") return em::dipole(f, length, s.at, s.wire, s.ground);
  if (s.kind == "folded-dipole") {
    const double spacing = s.spacing > 0.0 ? s.spacing : 0.005 * constants::c0 / f;  // common practice (no source)
    return em::folded_dipole(f, length, spacing, s.at, s.wire, s.wire2, s.ground);
  }
  if (s.kind == "inverted-v") return em::inverted_v(f, length, s.droop, s.at, s.wire, s.ground);
  if (s.kind == "monopole") {
    em::Placement at = s.at;
    if (!s.height_given) at.height_m = 0.0;
    return em::monopole(f, length, at, s.wire, s.ground, s.radials, s.radial_length > 0.0 ? s.radial_length : length, 0.0);
  }
  if (s.kind == "loop") return em::horizontal_loop(f, length, s.sides, s.at, s.wire, s.ground);
  em::YagiSpec spec;
  spec.driven_length_m = length;
  return em::yagi(f, s.kind == "yagi2" ? 2 : 3, spec, s.at, s.wire, s.ground);
}

struct LineResult {
  std::string name;
  double z0 = 50.0;
  double matched_loss_db = 0.0, total_loss_db = 0.0, swr_input = 1.0;
  bool evaluated = true;
  std::string note;
};

struct Result {
  double f = 0.0;
  double length = 0.0;
  std::complex<double> z;
  double swr = 1.0;
  double z0 = 50.0;
  double gain_dbi = 0.0;
  double efficiency = 0.0;
  std::size_t segments = 0;
  std::vector<std::string> warnings;
  std::optional<double> resonant_length;
  std::optional<LineResult> line;
  std::optional<std::complex<double>> perfect_ground_z;  // beside a real-ground result for low wires
};

double swr_of(std::complex<double> z, double z0) {
  const double g = std::abs((z - z0) / (z + z0));
  return g >= 1.0 ? INFINITY : (1.0 + g) / (1.0 - g);
}

Result evaluate_at(const WireOptions& o, const Setup& s, double f, double length, const power::FeedLine* line,
                   double line_length) {
  em::SolveOptions so;
  so.max_segment_wavelengths = kCliSegmentWavelengths;
  so.max_unknowns = o.max_unknowns;
  Result r;
  r.f = f;
  em::Solution sol;
  if (o.resonate) {
    const auto res = em::resonate([&](double len) { return build(s, f, len); }, length, so);
    sol = res.solution;
    r.length = res.length_m;
    r.resonant_length = res.length_m;
  } else {
    sol = em::solve(build(s, f, length), so);
    r.length = length;
  }
  r.z = sol.impedance();
  r.gain_dbi = em::peak_gain(sol, kGainStep).gain_dbi;
  r.efficiency = sol.efficiency;
  r.segments = sol.segments;
  r.warnings = sol.warnings;
  if (const em::GroundClass* gc = em::ground_class_of(s.ground); gc && gc->confidence == "convention")
    r.warnings.push_back("ground \"" + gc->name + "\" is a literature convention, not an ITU-R P.527 class");
  if (s.ground.kind == em::GroundKind::real) {
    bool low = false;
    for (const auto& w : sol.warnings) low = low || w.find("0.1 lambda") != std::string::npos;
    if (low) {
      // MOM-NOTES §4: below about 0.1 λ report the perfect-ground result beside the real-ground one.
      Setup sp = s;
      sp.ground = em::perfect_ground();
      em::SolveOptions po = so;
      po.integrate_pattern = false;
      em::Model pm = build(sp, f, r.length);
      r.perfect_ground_z = em::solve(pm, po).impedance();
    }
  }
  if (s.ground.kind == em::GroundKind::real)
    r.warnings.push_back("real ground by the reflection-coefficient approximation: efficiency includes ground loss; "
                         "surface waves are not modelled");
  if (line != nullptr) {
    const auto run = power::run_line(*line, units::metres(line_length), units::hertz(f),
                                     power::LoadSpec::from_impedance(r.z), units::watts(1.0));
    LineResult lr;
    lr.name = line->name;
    lr.z0 = run.z0.value();
    lr.matched_loss_db = run.matched_loss_db;
    lr.total_loss_db = run.total_loss_db;
    lr.swr_input = run.swr_input;
    lr.evaluated = run.evaluated;
    lr.note = run.note;
    r.z0 = lr.z0;
    r.swr = run.swr_load;
    if (!line->confidence.empty() && line->confidence != "confirmed")
      r.warnings.push_back("feed-line data for \"" + line->name + "\" have confidence \"" + line->confidence + "\"");
    r.line = lr;
  } else {
    r.z0 = o.z0.empty() ? 50.0 : parse_impedance(o.z0, option_where("--z0")).value();
    if (!(r.z0 > 0.0)) throw InputError(option_where("--z0"), "reference impedance must be positive");
    r.swr = swr_of(r.z, r.z0);
  }
  return r;
}

json to_json(const Result& r) {
  json j;
  j["frequency_hz"] = r.f;
  j["length_m"] = r.length;
  j["impedance_ohm"] = {{"re", r.z.real()}, {"im", r.z.imag()}};
  j["z0_ohm"] = r.z0;
  j["swr"] = std::isfinite(r.swr) ? json(r.swr) : json(nullptr);
  j["gain_dbi"] = r.gain_dbi;
  j["efficiency"] = r.efficiency;
  j["segments"] = r.segments;
  j["warnings"] = r.warnings;
  if (r.resonant_length) j["resonant_length_m"] = *r.resonant_length;
  if (r.perfect_ground_z)
    j["perfect_ground_impedance_ohm"] = {{"re", r.perfect_ground_z->real()}, {"im", r.perfect_ground_z->imag()}};
  if (r.line) {
    json l;
    l["name"] = r.line->name;
    l["z0_ohm"] = r.line->z0;
    l["matched_loss_db"] = r.line->evaluated ? json(r.line->matched_loss_db) : json(nullptr);
    l["total_loss_db"] = r.line->evaluated ? json(r.line->total_loss_db) : json(nullptr);
    l["swr_input"] = r.line->evaluated ? json(r.line->swr_input) : json(nullptr);
    if (!r.line->note.empty()) l["note"] = r.line->note;
    j["line"] = l;
  }
  return j;
}

void print_text(std::ostream& out, const Result& r) {
  out << "frequency " << sig(r.f / 1e6, 6) << " MHz, length " << sig(r.length, 5) << " m"
      << (r.resonant_length ? " (trimmed to resonance)" : "") << "\n";
  out << "  feed impedance " << impedance_text(r.z) << "\n";
  out << "  SWR " << (std::isfinite(r.swr) ? sig(r.swr, 3) : std::string("not evaluated (the load reflects all power)")) << " on " << sig(r.z0, 4) << " ohm";
  if (r.line) {
    out << " (" << r.line->name << ")";
    if (r.line->evaluated)
      out << "; line loss " << sig(r.line->total_loss_db, 3) << " dB (matched " << sig(r.line->matched_loss_db, 3)
          << " dB), SWR at the transmitter " << sig(r.line->swr_input, 3);
    else
      out << "; line loss not evaluated — " << r.line->note;
  }
  out << "\n  peak gain " << sig(r.gain_dbi, 3) << " dBi, efficiency " << sig(100.0 * r.efficiency, 4) << " %, "
      << r.segments << " segments\n";
  if (r.perfect_ground_z)
    out << "  over perfect ground instead: " << impedance_text(*r.perfect_ground_z) << "\n";
  for (const auto& w : r.warnings) out << "  warning: " << w << "\n";
}

int run_wire(const WireOptions& o, std::ostream& out) {
  static const std::vector<std::string> kinds{"dipole", "folded-dipole", "inverted-v", "monopole", "loop", "yagi2", "yagi3"};
  if (std::find(kinds.begin(), kinds.end(), o.kind) == kinds.end())
    throw InputError(option_where("KIND"), "unknown antenna \"" + o.kind + "\"" + did_you_mean(o.kind, kinds) +
                                               "; expected dipole, folded-dipole, inverted-v, monopole, loop, yagi2 or yagi3");
  const double f = parse_frequency(o.freq, option_where("--freq")).value();
  bounds::frequency(f, option_where("--freq"));
  // Every length option within the plausibility bounds (core/bounds.hpp).
  for (const auto& [text, option] : {std::pair{&o.length, "--length"}, {&o.radius, "--radius"}, {&o.radius2, "--radius2"},
                                     {&o.spacing, "--spacing"}, {&o.height, "--height"},
                                     {&o.radial_length, "--radial-length"}, {&o.line_length, "--line-length"}})
    if (!text->empty()) bounds::length(parse_length(*text, option_where(option)).value(), option_where(option));
  Setup s;
  s.kind = o.kind;
  if (!o.radius.empty() && !o.gauge.empty()) throw InputError(option_where("--gauge"), "give --radius or --gauge, not both");
  s.wire.radius_m = !o.gauge.empty() ? em::awg_radius_m(parse_count(o.gauge, "--gauge", -3, 40))
                                     : parse_length(o.radius.empty() ? "1 mm" : o.radius, option_where("--radius")).value();
  if (!(s.wire.radius_m > 0.0)) throw InputError(option_where("--radius"), "wire radius must be above zero");
  s.wire2 = s.wire;
  if (!o.radius2.empty()) {
    if (o.kind != "folded-dipole") throw InputError(option_where("--radius2"), "only for folded-dipole");
    s.wire2.radius_m = parse_length(o.radius2, option_where("--radius2")).value();
    if (!(s.wire2.radius_m > 0.0)) throw InputError(option_where("--radius2"), "wire radius must be above zero");
  }
  if (!o.spacing.empty()) {
    if (o.kind != "folded-dipole") throw InputError(option_where("--spacing"), "only for folded-dipole");
    s.spacing = parse_length(o.spacing, option_where("--spacing")).value();
    if (!(s.spacing > 0.0)) throw InputError(option_where("--spacing"), "spacing must be above zero");
  }
  s.height_given = !o.height.empty();
  s.at.height_m = s.height_given ? parse_length(o.height, option_where("--height")).value() : 10.0;
  s.ground = em::ground_by_name(o.ground, option_where("--ground"));
  if (!o.radials.empty()) s.radials = parse_count(o.radials, "--radials", 1, 64);
  if (!o.radial_length.empty()) s.radial_length = parse_length(o.radial_length, option_where("--radial-length")).value();
  if (!o.sides.empty()) s.sides = parse_count(o.sides, "--sides", 3, 64);
  if (!o.droop.empty()) s.droop = parse_angle(o.droop, option_where("--droop")).value();
  if (o.kind == "monopole" && !s.height_given && s.ground.kind == em::GroundKind::free_space)
    throw InputError(option_where("--ground"), "a ground-mounted monopole needs --ground perfect or a soil class "
                                               "(or give --height for an elevated monopole with radials)");

  if (!o.z0.empty() && !o.line.empty()) throw InputError(option_where("--z0"), "give --z0 or --line, not both");
  const power::FeedLine* line = nullptr;
  double line_length = 0.0;
  if (!o.line.empty()) {
    const auto& table = power::builtin_feedline_table();
    line = table.find(o.line);
    if (line == nullptr)
      throw InputError(option_where("--line"), "unknown feed-line class \"" + o.line + "\"" +
                                                   did_you_mean(o.line, split_names(table.names())) +
                                                   "; expected one of: " + table.names());
    if (o.line_length.empty()) throw InputError(option_where("--line-length"), "--line needs --line-length");
    line_length = parse_length(o.line_length, option_where("--line-length")).value();
  } else if (!o.line_length.empty()) {
    throw InputError(option_where("--line-length"), "--line-length needs --line CLASS");
  }

  std::vector<double> freqs{f};
  if (!o.sweep.empty()) {
    if (o.resonate) throw InputError(option_where("--sweep"), "--sweep and --resonate cannot be combined");
    const auto c1 = o.sweep.find(':'), c2 = o.sweep.rfind(':');
    if (c1 == std::string::npos || c1 == c2)
      throw InputError(option_where("--sweep"), "expected F1:F2:N such as 14MHz:14.35MHz:8, got \"" + o.sweep + "\"");
    const double f1 = parse_frequency(o.sweep.substr(0, c1), option_where("--sweep")).value();
    const double f2 = parse_frequency(o.sweep.substr(c1 + 1, c2 - c1 - 1), option_where("--sweep")).value();
    const int n = parse_count(o.sweep.substr(c2 + 1), "--sweep", 2, 201);
    if (!(f1 > 0.0 && f2 > f1)) throw InputError(option_where("--sweep"), "F2 must be above F1 and both above zero");
    bounds::frequency(f2, option_where("--sweep"));
    freqs.clear();
    for (int i = 0; i < n; ++i) freqs.push_back(f1 + (f2 - f1) * i / (n - 1));
  }
  // The antenna is built for --freq (its length); a sweep evaluates that antenna at each frequency.
  const double length = o.length.empty() ? default_length(o.kind, constants::c0 / f)
                                         : parse_length(o.length, option_where("--length")).value();
  if (!(length > 0.0)) throw InputError(option_where("--length"), "length must be above zero");

  std::vector<Result> results;
  try {
    for (double fi : freqs) results.push_back(evaluate_at(o, s, fi, length, line, line_length));
  } catch (const InputError& e) {
    if (e.where().file != "antenna model") throw;
    throw InputError(option_where(option_for(e)), "the antenna cannot be modelled: " + e.where().field + ": " + e.message());
  }

  const std::string caution =
      "Model results for an isolated antenna: supports, nearby conductors, the feed line and the real ground change "
      "them. Confirm with measurement before relying on them; follow local codes and licensed practice.";
  if (o.json) {
    json j;
    if (o.sweep.empty()) {
      j = to_json(results.front());
    } else {
      j["sweep"] = json::array();
      for (const auto& r : results) j["sweep"].push_back(to_json(r));
    }
    j["kind"] = o.kind;
    j["ground"] = s.ground.name;
    j["caution"] = caution;
    report::check_finite(j, "wire result");
    out << j.dump(2) << "\n";
  } else {
    out << o.kind << " over " << s.ground.name << "\n";
    for (const auto& r : results) print_text(out, r);
    out << "caution: " << caution << "\n";
  }
  return kOk;
}

}  // namespace

void add_wire(CLI::App& root, Commands& commands) {
  auto opts = std::make_shared<WireOptions>();
  CLI::App* sub = root.add_subcommand("wire", "Model one wire antenna: feed impedance, SWR, gain, resonant length");
  sub->add_option("KIND", opts->kind, "dipole, folded-dipole, inverted-v, monopole, loop, yagi2 or yagi3")->required();
  sub->add_option("--freq", opts->freq, "Frequency with its unit, e.g. 14.2MHz")->required();
  sub->add_option("--length", opts->length,
                  "Total wire length (dipoles), height (monopole), circumference (loop) or driven element (Yagi)");
  sub->add_option("--radius", opts->radius, "Wire radius with its unit (default 1 mm)");
  sub->add_option("--gauge", opts->gauge, "Wire size as an AWG gauge number instead of --radius");
  sub->add_option("--radius2", opts->radius2, "Folded dipole: radius of the second conductor");
  sub->add_option("--spacing", opts->spacing, "Folded dipole: conductor spacing, axis to axis (default 0.005 lambda)");
  sub->add_option("--height", opts->height, "Height of the feed point (monopole: of the base; default 10 m, monopole 0)");
  sub->add_option("--ground", opts->ground, "free, perfect, or a ground class from tables/grounds.toml (default free)");
  sub->add_option("--droop", opts->droop, "Inverted-V: leg angle below horizontal (default 30 deg)");
  sub->add_option("--radials", opts->radials, "Elevated monopole: number of radials (default 4)");
  sub->add_option("--radial-length", opts->radial_length, "Elevated monopole: radial length (default = monopole length)");
  sub->add_option("--sides", opts->sides, "Loop: number of sides (default 4)");
  sub->add_flag("--resonate", opts->resonate, "Trim the length to zero feed reactance and print it");
  sub->add_option("--z0", opts->z0, "Reference impedance for the SWR (default 50 ohm)");
  sub->add_option("--line", opts->line, "Feed-line class from tables/feedlines.toml for SWR and loss");
  sub->add_option("--line-length", opts->line_length, "Length of the feed line");
  sub->add_option("--sweep", opts->sweep, "Frequency sweep F1:F2:N of the antenna built for --freq");
  sub->add_flag("--json", opts->json, "Write JSON instead of text");
  sub->add_option("--max-unknowns", opts->max_unknowns, "Cap on moment-method unknowns (default 4000; 16 N² bytes)")
      ->check(CLI::Range(std::size_t{1}, std::size_t{20000}));
  commands.push_back(Command{sub, [opts](std::ostream& out, std::ostream&) { return run_wire(*opts, out); }});
}

}  // namespace standoff::cli
