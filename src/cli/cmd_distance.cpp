// `standoff distance`: one-off far-field screening. Power chain (PEP → duty → worst-case on-air
// share of the averaging window → feed-line loss with mismatch → average power at the antenna →
// EIRP/ERP), then the compliance distance per tier by FCC OET Bulletin 65 Eq. 3/6/7 (or the
// aperture model for a dish), and the FCC § 1.1307(b)(3)(i) exemption at a given distance.
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
#include "exposure/aperture.hpp"
#include "exposure/exemption.hpp"
#include "exposure/screening.hpp"
#include "limits/limits.hpp"
#include "io/limits_toml.hpp"
#include "power/chain.hpp"
#include "io/power_tables_toml.hpp"
#include "report/finite_check.hpp"

namespace standoff::cli {
namespace {

using nlohmann::json;

struct DistanceOptions {
  std::string freq, power, gain, mode, duty, on_air, pattern;
  std::string line, line_length, swr, load;
  std::string line_z0, line_loss, line_loss_freq;                      // --line user
  std::string wire_diameter, wire_spacing, velocity_factor, conductor;  // --line parallel
  std::string ground = "epa";  // --reflection, the same default as evaluate (OET 65 Eq. 7)
  std::string old_ground;      // --ground: renamed, refused with a pointer to --reflection
  std::string standard = "fcc";
  std::string distance, size, dish, dish_efficiency;
  bool json = false;
};

// Largest gain magnitude accepted, dBi (issue 3: beyond ±60 dBi is refused as a typing error).
constexpr double kMaxGainDbi = 60.0;
// Distances round UP to 0.1 m and 0.1 ft for display.
constexpr double kStepM = 0.1;
constexpr double kStepFt = 0.1;

std::string fixed(double v, int decimals) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  return buf;
}

std::string sig(double v, int digits = 4) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", digits, v);
  return buf;
}

std::string trim(const std::string& s) {
  const auto b = s.find_first_not_of(" \t");
  const auto e = s.find_last_not_of(" \t");
  return b == std::string::npos ? std::string{} : s.substr(b, e - b + 1);
}

std::vector<std::string> split(const std::string& s, char sep) {
  std::vector<std::string> out;
  std::size_t start = 0;
  while (true) {
    const auto k = s.find(sep, start);
    out.push_back(trim(s.substr(start, k == std::string::npos ? std::string::npos : k - start)));
    if (k == std::string::npos) break;
    start = k + 1;
  }
  return out;
}

// "2 min on, 2 min off" (a repeating cycle) or "once: 0 min-5 min, 10 min-15 min" (one-off
// on-air intervals; off before, between and after them).
power::OperatingPattern parse_pattern(const std::string& text) {
  const Where where = option_where("--pattern");
  const std::string t = trim(text);
  if (t.rfind("once:", 0) == 0) {
    std::vector<power::OnAirInterval> intervals;
    for (const auto& item : split(t.substr(5), ',')) {
      const auto dash = item.find('-', 1);
      if (item.empty() || dash == std::string::npos)
        throw InputError(where, "expected on-air intervals such as \"once: 0 min-5 min, 10 min-15 min\", got \"" +
                                    item + "\"");
      const auto a = parse_time(item.substr(0, dash), where);
      const auto b = parse_time(item.substr(dash + 1), where);
      if (!(b > a)) throw InputError(where, "interval \"" + item + "\" must end after it starts");
      intervals.push_back({a, b});
    }
    return power::OperatingPattern::on_air(std::move(intervals));
  }
  std::vector<power::PatternStep> cycle;
  bool any_on = false;
  for (const auto& item : split(t, ',')) {
    const auto sp = item.find_last_of(" \t");
    const std::string state = sp == std::string::npos ? std::string{} : item.substr(sp + 1);
    if (state != "on" && state != "off")
      throw InputError(where, "expected steps such as \"2 min on, 2 min off\" (each a time then on or off), got \"" +
                                  item + "\"");
    const auto d = parse_time(item.substr(0, sp), where);
    if (!(d.value() > 0.0)) throw InputError(where, "step \"" + item + "\" must last longer than zero");
    cycle.push_back({d, state == "on"});
    any_on = any_on || state == "on";
  }
  if (!any_on) throw InputError(where, "the pattern has no on-air step");
  return power::OperatingPattern::repeating(std::move(cycle));
}

// "0.3 dB/100m", "1 dB/100 ft", "0.01 dB/m" → dB per 100 m.
double parse_loss_per_100m(const std::string& text, const Where& where) {
  std::string t = trim(text);
  t.erase(std::remove(t.begin(), t.end(), ' '), t.end());
  struct U { const char* name; double to_per_100m; };
  // 100 ft = 30.48 m exactly (international foot, 1959).
  for (U u : {U{"dB/100m", 1.0}, U{"dB/100ft", 100.0 / 30.48}, U{"dB/m", 100.0}, U{"dB/ft", 100.0 / 0.3048}}) {
    const std::string n = u.name;
    if (t.size() > n.size() && t.compare(t.size() - n.size(), n.size(), n) == 0) {
      const std::string number = t.substr(0, t.size() - n.size());
      char* end = nullptr;
      const double v = std::strtod(number.c_str(), &end);
      if (end != number.c_str() + number.size() || !std::isfinite(v) || v < 0.0) break;
      return v * u.to_per_100m;
    }
  }
  throw InputError(where, "expected a matched loss such as \"0.3 dB/100m\", \"1 dB/100ft\" or \"0.01 dB/m\", got \"" +
                              text + "\"");
}

double parse_unit_interval(const std::string& text, const Where& where, const char* what) {
  char* end = nullptr;
  const double v = std::strtod(text.c_str(), &end);
  if (text.empty() || end != text.c_str() + text.size() || !(v > 0.0 && v <= 1.0))
    throw InputError(where, std::string("expected ") + what + " between 0 and 1, got \"" + text + "\"");
  return v;
}

std::optional<power::LineSpec> build_line(const DistanceOptions& o) {
  const bool any_detail = !o.line_length.empty() || !o.swr.empty() || !o.load.empty() || !o.line_z0.empty() ||
                          !o.line_loss.empty() || !o.line_loss_freq.empty() || !o.wire_diameter.empty() ||
                          !o.wire_spacing.empty() || !o.velocity_factor.empty() || !o.conductor.empty();
  if (o.line.empty()) {
    if (any_detail) throw InputError(option_where("--line"), "line options given without --line CLASS");
    return std::nullopt;
  }
  if (o.line_length.empty()) throw InputError(option_where("--line-length"), "--line needs --line-length");
  power::LineSpec spec;
  spec.length = parse_length(o.line_length, option_where("--line-length"));
  bounds::length(spec.length.value(), option_where("--line-length"));
  if (o.line == "user") {
    if (o.line_z0.empty() || o.line_loss.empty() || o.line_loss_freq.empty())
      throw InputError(option_where("--line"), "--line user needs --line-z0, --line-loss and --line-loss-freq");
    power::UserLineData u;
    u.z0 = parse_impedance(o.line_z0, option_where("--line-z0"));
    if (!(u.z0.value() > 0.0)) throw InputError(option_where("--line-z0"), "must be above zero");
    u.loss_db_per_100m = parse_loss_per_100m(o.line_loss, option_where("--line-loss"));
    u.reference_frequency = parse_frequency(o.line_loss_freq, option_where("--line-loss-freq"));
    if (!o.velocity_factor.empty())
      u.velocity_factor = parse_unit_interval(o.velocity_factor, option_where("--velocity-factor"), "a velocity factor");
    spec.line = power::user_line("user", u);
  } else if (o.line == "parallel") {
    if (o.wire_diameter.empty() || o.wire_spacing.empty())
      throw InputError(option_where("--line"), "--line parallel needs --wire-diameter and --wire-spacing");
    power::ParallelWireGeometry g;
    g.conductor_diameter = parse_length(o.wire_diameter, option_where("--wire-diameter"));
    g.spacing = parse_length(o.wire_spacing, option_where("--wire-spacing"));
    if (!(g.conductor_diameter.value() > 0.0))
      throw InputError(option_where("--wire-diameter"), "must be above zero");
    if (!(g.spacing > g.conductor_diameter))
      throw InputError(option_where("--wire-spacing"), "centre-to-centre spacing must exceed the wire diameter");
    if (!o.velocity_factor.empty())
      g.velocity_factor = parse_unit_interval(o.velocity_factor, option_where("--velocity-factor"), "a velocity factor");
    if (o.conductor.empty() || o.conductor == "copper")
      g.material = power::ConductorMaterial::copper;
    else if (o.conductor == "copper-clad-steel")
      g.material = power::ConductorMaterial::copper_clad_steel;
    else
      throw InputError(option_where("--conductor"), "expected copper or copper-clad-steel, got \"" + o.conductor + "\"");
    spec.line = power::parallel_wire_line("parallel", g);
  } else {
    const auto& table = power::builtin_feedline_table();
    const auto* l = table.find(o.line);
    if (!l)
      throw InputError(option_where("--line"), "unknown line class \"" + o.line + "\"" +
                                                   did_you_mean(o.line, split_names(table.names() + ", parallel, user")) +
                                                   "; expected one of: " +
                                                   table.names() + ", parallel, user");
    spec.line = *l;
  }
  if (!o.swr.empty() && !o.load.empty()) throw InputError(option_where("--swr"), "give --swr or --load, not both");
  if (!o.swr.empty()) {
    char* end = nullptr;
    const double s = std::strtod(o.swr.c_str(), &end);
    if (end != o.swr.c_str() + o.swr.size() || !std::isfinite(s) || s < 1.0)
      throw InputError(option_where("--swr"), "expected an SWR of 1 or more (a plain ratio such as 2.5), got \"" + o.swr + "\"");
    bounds::swr(s, option_where("--swr"));
    spec.load = power::LoadSpec::from_swr(s);
  } else if (!o.load.empty()) {
    spec.load = power::LoadSpec::from_impedance(parse_complex_impedance(o.load, option_where("--load")));
  }
  return spec;
}

struct TierOutcome {
  limits::LimitValues limit;
  power::PowerChain chain;
  std::optional<exposure::ScreeningDistance> screening;
  std::optional<exposure::ApertureDistance> aperture;
  double distance_m = 0.0;  // exact
};

json chain_json(const power::PowerChain& c) {
  json steps = json::array();
  for (const auto& s : c.steps) steps.push_back({{"name", s.name}, {"power_w", s.power.value()}, {"detail", s.detail}});
  return steps;
}

}  // namespace

void add_distance(CLI::App& root, Commands& commands) {
  auto o = std::make_shared<DistanceOptions>();
  CLI::App* sub = root.add_subcommand("distance", "Far-field screening: power chain and compliance distance per tier");
  sub->add_option("--freq", o->freq, "Frequency, e.g. 144MHz")->required();
  sub->add_option("--power", o->power, "Transmitter PEP, e.g. 1500W")->required();
  sub->add_option("--gain", o->gain, "Antenna gain, e.g. 24dBi or 6dBd")->required();
  sub->add_option("--mode", o->mode, "Emission mode from tables/duty.toml (ssb, ssb-processed, cw, fm, fsk, afsk, carrier, digital-constant, am)");
  sub->add_option("--duty", o->duty, "Duty factor, e.g. 40% (overrides --mode)");
  sub->add_option("--on-air", o->on_air, "Share of every averaging window on the air, e.g. 50%");
  sub->add_option("--pattern", o->pattern,
                  "Operating pattern: \"2 min on, 2 min off\" (repeating) or \"once: 0 min-5 min, 10 min-15 min\"");
  sub->add_option("--line", o->line, "Feed line class (rg-58, rg-8x, rg-213, open-wire-600, ladder-450), parallel or user");
  sub->add_option("--line-length", o->line_length, "Feed line length, e.g. 30m");
  sub->add_option("--swr", o->swr, "SWR at the antenna end of the line, e.g. 2.5");
  sub->add_option("--load", o->load, "Antenna feed impedance, e.g. \"73+j42.5 ohm\"");
  sub->add_option("--line-z0", o->line_z0, "--line user: characteristic impedance, e.g. 450ohm");
  sub->add_option("--line-loss", o->line_loss, "--line user: matched loss, e.g. \"0.3 dB/100m\"");
  sub->add_option("--line-loss-freq", o->line_loss_freq, "--line user: frequency of --line-loss");
  sub->add_option("--wire-diameter", o->wire_diameter, "--line parallel: conductor diameter, e.g. 2mm");
  sub->add_option("--wire-spacing", o->wire_spacing, "--line parallel: centre-to-centre spacing, e.g. 150mm");
  sub->add_option("--velocity-factor", o->velocity_factor, "--line parallel/user: velocity factor (0..1)");
  sub->add_option("--conductor", o->conductor, "--line parallel: copper or copper-clad-steel");
  sub->add_option("--reflection", o->ground,
                  "Ground reflection factor: none (1), epa (2.56, default, as `evaluate`) or full (4)");
  sub->add_option("--ground", o->old_ground, "Renamed: use --reflection none|epa|full")->group("");
  sub->add_option("--standard", o->standard, "Limits: fcc (default), icnirp2020, icnirp1998, sc6");
  sub->add_option("--distance", o->distance, "Minimum distance to a person: check it and the FCC exemption");
  sub->add_option("--size", o->size, "Largest dimension of the antenna (its near field reaches 2·L²/λ)");
  sub->add_option("--dish", o->dish, "Dish diameter: use the aperture model on the beam axis");
  sub->add_option("--dish-efficiency", o->dish_efficiency, "Dish aperture efficiency (default 55%)");
  sub->add_flag("--json", o->json, "JSON output");

  commands.push_back({sub, [o](std::ostream& out, std::ostream&) -> int {
    // ---- inputs, all validated before anything is printed
    const auto f = parse_frequency(o->freq, option_where("--freq"));
    bounds::frequency(f.value(), option_where("--freq"));
    const auto pep = parse_power(o->power, option_where("--power"));
    bounds::power_pep(pep.value(), option_where("--power"));
    std::optional<exposure::Aperture> dish;
    if (!o->dish.empty()) {
      exposure::Aperture a;
      a.diameter = parse_length(o->dish, option_where("--dish"));
      bounds::length(a.diameter.value(), option_where("--dish"));
      if (!(a.diameter.value() > 0.0)) throw InputError(option_where("--dish"), "must be above zero");
      if (!o->dish_efficiency.empty()) {
        a.efficiency = parse_fraction(o->dish_efficiency, option_where("--dish-efficiency"));
        if (!(a.efficiency.value > 0.0)) throw InputError(option_where("--dish-efficiency"), "must be above 0 %");
      }
      dish = a;
    } else if (!o->dish_efficiency.empty()) {
      throw InputError(option_where("--dish-efficiency"), "needs --dish");
    }
    auto gain = parse_gain(o->gain, option_where("--gain"));
    if (std::abs(gain.dbi()) > kMaxGainDbi)
      throw InputError(option_where("--gain"), "\"" + o->gain + "\" is beyond ±60 dBi");
    if (!o->old_ground.empty())
      throw InputError(option_where("--ground"), "renamed: use --reflection none|epa|full (ground classes such as "
                                                 "medium-dry-ground are for `wire --ground` and the station file)");
    const auto ground = exposure::ground_factor_from_string(o->ground);
    if (!ground) throw InputError(option_where("--reflection"), "expected none, epa or full, got \"" + o->ground + "\"");
    const auto standard = limits::standard_from_string(o->standard);
    if (!standard)
      throw InputError(option_where("--standard"), "expected fcc, icnirp2020, icnirp1998 or sc6, got \"" + o->standard + "\"");

    power::ChainInput in;
    in.pep = pep;
    in.frequency = f;
    in.gain = gain;
    std::vector<std::string> cautions;
    if (!o->duty.empty()) {
      in.duty = parse_fraction(o->duty, option_where("--duty"));
      bounds::duty(in.duty.value, option_where("--duty"));
      in.duty_source = "given";
      if (!o->mode.empty()) cautions.push_back("--duty overrides the duty factor of mode " + o->mode);
    }
    if (!o->mode.empty()) {
      const auto& dt = power::builtin_duty_table();
      const auto* m = dt.find(o->mode);
      if (!m)
        throw InputError(option_where("--mode"), "unknown mode \"" + o->mode + "\"" +
                                                     did_you_mean(o->mode, split_names(dt.names())) +
                                                     "; expected one of: " + dt.names());
      if (o->duty.empty()) {
        in.duty = m->duty;
        in.duty_source = "mode " + m->name + ": " + m->source;
      }
    }
    if (o->duty.empty() && o->mode.empty()) {
      in.duty = units::Fraction{1.0};
      in.duty_source = "no mode or duty given: 100 % assumed";
    }
    if (!o->on_air.empty() && !o->pattern.empty())
      throw InputError(option_where("--on-air"), "give --on-air or --pattern, not both");
    if (!o->on_air.empty()) {
      const auto share = parse_fraction(o->on_air, option_where("--on-air"));
      bounds::duty(share.value, option_where("--on-air"));
      in.pattern = power::OperatingPattern::fixed(share);
    }
    else if (!o->pattern.empty())
      in.pattern = parse_pattern(o->pattern);
    in.line = build_line(*o);
    std::optional<units::Length> size;
    if (!o->size.empty()) {
      size = parse_length(o->size, option_where("--size"));
      bounds::length(size->value(), option_where("--size"));
    }
    std::optional<units::Length> person;
    if (!o->distance.empty()) {
      person = parse_length(o->distance, option_where("--distance"));
      bounds::length(person->value(), option_where("--distance"));
      if (!(person->value() > 0.0)) throw InputError(option_where("--distance"), "must be above zero");
    }

    if (dish) {
      // The dish's own gain G = 4πηA/λ² (independent of power) replaces --gain in the chain.
      in.gain = exposure::aperture_regions(*dish, units::watts(1.0), f).gain;
      cautions.push_back("--dish given: the dish gain " + sig(in.gain.dbi(), 4) + " dBi replaces --gain");
    }
    const auto& table = limits::builtin_limit_table_ref(*standard);
    std::vector<TierOutcome> tiers;
    for (const auto& t : table.tiers) {
      TierOutcome r;
      r.limit = limits::lookup(table, t.tier, f, option_where("--freq"));
      r.chain = power::power_chain(in, r.limit.averaging);
      if (dish) {
        const auto regions = exposure::aperture_regions(*dish, r.chain.average_at_antenna, f);
        const auto lim = exposure::screening_density_limit(r.limit);
        r.aperture = exposure::aperture_compliance_distance(regions, r.chain.average_at_antenna, lim.s);
        r.distance_m = r.aperture->distance.value();
      } else {
        r.screening = exposure::screening_distance(r.chain.average_at_antenna, gain, *ground, r.limit, size);
        r.distance_m = r.screening->distance.value();
      }
      tiers.push_back(std::move(r));
    }
    if (tiers.empty()) throw InputError(option_where("--standard"), "the table has no tiers");

    // Worst case over tiers for the top-level figures (longer windows never raise the average).
    const auto worst = std::max_element(tiers.begin(), tiers.end(), [](const auto& a, const auto& b) {
      return a.chain.average_at_antenna < b.chain.average_at_antenna;
    });
    bool near_field = false;
    bool evaluated = true;
    for (const auto& t : tiers) {
      near_field = near_field || (t.screening && t.screening->near_field_warning);
      evaluated = evaluated && t.chain.evaluated;
    }
    const double lambda = constants::c0 / f.value();

    std::optional<exposure::ExemptionResult> exemption;
    if (person) exemption = exposure::evaluate_exemption(worst->chain.average_at_antenna, worst->chain.erp, f, *person);

    cautions.push_back("Screening estimate only: it defers to local codes, the utility and licensed practice. "
                       "Check with the detailed model or by measurement where people may be close.");
    if (dish) cautions.push_back(exposure::kApertureVerifyNote);
    if (in.line && in.line->line.confidence == "verify")
      cautions.push_back("feed-line data for " + in.line->line.name + " are " + in.line->line.source);
    for (const auto& t : tiers) {
      if (t.limit.confidence != limits::Confidence::confirmed)
        cautions.push_back("limits for " + limits::to_string(t.limit.tier) + " are flagged \"" +
                           limits::to_string(t.limit.confidence) + "\": verify against " + t.limit.source);
    }
    std::sort(cautions.begin(), cautions.end());
    cautions.erase(std::unique(cautions.begin(), cautions.end()), cautions.end());

    // At a given distance: inside λ/2π (or the antenna's near field) the far-field model is outside
    // its validity, so no verdict is given there; without one the check cannot pass (exit 1).
    auto verdict_at_person = [&](const TierOutcome& t) -> std::optional<bool> {
      if (!t.chain.evaluated) return std::nullopt;
      if (t.screening && person->value() < t.screening->near_field_boundary.value()) return std::nullopt;
      return person->value() >= t.distance_m;
    };
    int exit_code = kOk;
    if (person)
      for (const auto& t : tiers) {
        const auto v = verdict_at_person(t);
        if (!v || (!*v && t.limit.tier == limits::Tier::uncontrolled)) exit_code = kExceeds;
      }

    if (o->json) {
      json j;
      j["frequency_hz"] = f.value();
      j["pep_w"] = pep.value();
      j["gain_dbi"] = worst->chain.gain.dbi();
      j["standard"] = limits::to_string(*standard);
      j["ground"] = dish ? json("not applied (aperture model on the beam axis)") : json(exposure::to_string(*ground));
      j["reflection_note"] = (!dish && *ground != exposure::GroundFactor::epa)
                                 ? json("differs from evaluate, which screens with epa (2.56, OET 65 Eq. 7)")
                                 : json(nullptr);
      j["ground_factor"] = dish ? json(nullptr) : json(exposure::ground_factor_ratio(*ground));
      j["duty"] = {{"fraction", in.duty.value}, {"source", in.duty_source}};
      j["pattern"] = in.pattern.describe();
      j["evaluated"] = evaluated;
      j["average_power_w"] = worst->chain.average_at_antenna.value();
      j["eirp_w"] = worst->chain.eirp.value();
      j["erp_w"] = worst->chain.erp.value();
      j["line_loss_db"] = worst->chain.line_loss_db;
      if (worst->chain.line) {
        const auto& l = *worst->chain.line;
        j["line"] = {{"class", l.line_name},           {"length_m", l.length.value()},
                     {"z0_ohm", l.z0.value()},         {"matched_loss_db", l.matched_loss_db},
                     {"mismatch_loss_db", l.mismatch_loss_db}, {"total_loss_db", l.total_loss_db},
                     {"gamma_load", l.gamma_load},     {"swr_load", l.swr_load},
                     {"swr_input", l.swr_input},       {"evaluated", l.evaluated},
                     {"note", l.note}};
      } else {
        j["line"] = nullptr;
      }
      j["wavelength_m"] = lambda;
      j["near_field_warning"] = near_field;
      json jt = json::object();
      for (const auto& t : tiers) {
        json x;
        x["averaging_s"] = t.limit.averaging.value();
        x["on_air_fraction"] = t.chain.on_air.value;
        x["average_power_w"] = t.chain.average_at_antenna.value();
        x["eirp_w"] = t.chain.eirp.value();
        x["erp_w"] = t.chain.erp.value();
        x["power_chain"] = chain_json(t.chain);
        if (t.chain.evaluated) {
          x["distance_m"] = exposure::ceil_to(t.distance_m, kStepM);
          x["distance_ft"] = exposure::ceil_to(t.distance_m / constants::metres_per_foot, kStepFt);
          x["distance_exact_m"] = t.distance_m;
        } else {
          x["distance_m"] = nullptr;
          x["distance_ft"] = nullptr;
          x["distance_exact_m"] = nullptr;
          x["not_evaluated"] = "not evaluated — measure or use another method";
        }
        x["limit_source"] = t.limit.source;
        x["limit_confidence"] = limits::to_string(t.limit.confidence);
        if (t.screening) {
          x["model"] = "far field, OET 65 Eq. 3/6/7";
          x["binding"] = exposure::to_string(t.screening->limit.binding);
          x["limit_s_w_per_m2"] = t.screening->limit.s.value();
          x["limit_explanation"] = t.screening->limit.explanation;
          x["near_field_boundary_m"] = t.screening->near_field_boundary.value();
          x["near_field_warning"] = t.screening->near_field_warning;
          x["notes"] = t.screening->notes;
        } else if (t.aperture) {
          x["model"] = "aperture (dish), OET 65 Section 2 — verify";
          x["region"] = exposure::to_string(t.aperture->region);
          x["within_limit_everywhere"] = t.aperture->within_limit_everywhere;
          x["notes"] = json::array({t.aperture->note});
        }
        for (const auto& n : t.chain.notes) x["notes"].push_back(n);
        if (person) {
          const auto v = verdict_at_person(t);
          x["compliant_at_distance"] = v ? json(*v) : json(nullptr);
          if (!v) x["at_distance"] = "not evaluated — measure or use another method (inside the far-field model's validity radius)";
        }
        jt[limits::to_string(t.limit.tier)] = x;
      }
      j["tiers"] = jt;
      if (exemption) {
        json checks = json::array();
        for (const auto& c : exemption->checks) {
          json cj{{"criterion", exposure::to_string(c.criterion)}, {"applicable", c.applicable},
                  {"reason", c.reason}, {"verify", c.verify}};
          if (c.applicable) {
            cj["threshold_w"] = c.threshold.value();
            cj["value_w"] = c.value.value();
            cj["fraction"] = c.fraction;
            cj["exempt"] = c.exempt;
          }
          checks.push_back(cj);
        }
        json e{{"distance_m", person->value()}, {"exempt", exemption->exempt}, {"checks", checks},
               {"note", "an exemption never removes the duty to meet 47 CFR 1.1310"}};
        if (exemption->deciding) {
          const auto& d = exemption->checks[*exemption->deciding];
          e["criterion"] = exposure::to_string(d.criterion);
          e["threshold_w"] = d.threshold.value();
          e["value_w"] = d.value.value();
          e["result"] = d.exempt ? "exempt" : "not exempt";
        } else {
          e["criterion"] = nullptr;
          e["result"] = "no criterion applies: routine evaluation required";
        }
        j["exemption"] = e;
      }
      j["cautions"] = cautions;
      report::check_finite(j, "distance result");
      out << j.dump(2) << "\n";
      return exit_code;
    }

    // ---- text
    if (dish)
      out << "Aperture (dish) screening on the beam axis at " << sig(f.value() / 1e6, 6) << " MHz (" << table.name
          << "; no ground factor)\n";
    else
      out << "Far-field screening at " << sig(f.value() / 1e6, 6) << " MHz (" << table.name << ", ground factor "
          << exposure::to_string(*ground) << " = " << exposure::ground_factor_ratio(*ground) << ")\n";
    if (!dish && *ground != exposure::GroundFactor::epa)
      out << "note: --reflection " << exposure::to_string(*ground) << " differs from `evaluate`, which screens with "
          << "epa (2.56, OET 65 Eq. 7); the distances here are "
          << (exposure::ground_factor_ratio(*ground) > 2.56 ? "larger" : "smaller") << " than evaluate's\n";
    for (const auto& t : tiers) {
      out << "\n" << limits::to_string(t.limit.tier) << " (" << sig(t.limit.averaging.value() / 60.0) << " min average)\n";
      out << "  power chain:\n";
      for (const auto& s : t.chain.steps)
        out << "    " << s.name << ": " << sig(s.power.value(), 5) << " W" << (s.name == "antenna" ? " EIRP" : "")
            << "  " << s.detail << "\n";
      if (!t.chain.evaluated) {
        out << "  distance: not evaluated — measure or use another method\n";
        for (const auto& n : t.chain.notes) out << "  note: " << n << "\n";
        continue;
      }
      if (t.aperture && t.aperture->within_limit_everywhere) {
        out << "  compliance distance: none needed on the beam axis (near-field density within the limit)\n"
            << "  note: " << t.aperture->note << "\n";
        continue;
      }
      out << "  compliance distance: " << fixed(exposure::ceil_to(t.distance_m, kStepM), 1) << " m ("
          << fixed(exposure::ceil_to(t.distance_m / constants::metres_per_foot, kStepFt), 1) << " ft)";
      if (t.screening) {
        out << ", limit " << t.screening->limit.explanation << " (binding " << exposure::to_string(t.screening->limit.binding)
            << ")\n";
        for (const auto& n : t.screening->notes) out << "  note: " << n << "\n";
      } else if (t.aperture) {
        out << " along the beam, " << exposure::to_string(t.aperture->region) << "\n  note: " << t.aperture->note << "\n";
      }
      if (person) {
        const auto v = verdict_at_person(t);
        out << "  at " << sig(person->value()) << " m: "
            << (!v ? "not evaluated — inside " + fixed(t.screening->near_field_boundary.value(), 1) +
                         " m the far-field model does not hold; measure or use the detailed model"
                   : *v ? std::string("within the limit") : std::string("EXCEEDS the limit"))
            << "\n";
      }
    }
    if (exemption) {
      out << "\nFCC exemption at " << sig(person->value()) << " m:\n";
      for (const auto& c : exemption->checks) {
        out << "  " << exposure::to_string(c.criterion) << ": ";
        if (!c.applicable)
          out << "not applicable (" << c.reason << ")\n";
        else
          out << sig(c.value.value()) << " W vs threshold " << sig(c.threshold.value()) << " W → "
              << (c.exempt ? "exempt" : "not exempt") << (c.verify ? " [verify constants]" : "") << "\n";
      }
      out << "  " << (exemption->exempt ? "exempt from routine evaluation" : "routine evaluation required")
          << "; an exemption never removes the duty to meet 47 CFR 1.1310\n";
    }
    out << "\nCautions:\n";
    for (const auto& c : cautions) out << "  - " << c << "\n";
    return exit_code;
  }});
}

}  // namespace standoff::cli
