// `standoff limits FREQ [--standard ID] [--tier controlled|uncontrolled] [--json]`: the published
// exposure limits at one frequency, per tier, from the embedded tables (src/limits/limits_toml.hpp).
#include <cmath>
#include <cstdio>
#include <memory>
#include <ostream>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "report/finite_check.hpp"
#include "cli/command.hpp"
#include "core/quantity_parse.hpp"
#include "limits/limits.hpp"
#include "io/limits_toml.hpp"

namespace standoff::cli {
namespace {

using limits::Confidence;
using limits::LimitTable;
using limits::LimitValues;
using limits::Tier;

struct LimitsOptions {
  std::string frequency;
  std::string standard = "fcc";
  std::string tier;
  bool json = false;
};

// A limit printed with 4 significant digits, rounded DOWN so that the printed limit is never
// above the published one (STYLE: power limits round down).
std::string limit_text(double v) {
  if (!(v > 0.0)) return "0";
  const int e = static_cast<int>(std::floor(std::log10(v)));
  const double scale = std::pow(10.0, 3 - e);
  const double floored = std::floor(v * scale * (1.0 + 1e-12)) / scale;  // 1e-12: 61.4 stays 61.4
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.4g", floored);
  return buf;
}

std::string frequency_text(units::Frequency f) {
  const double hz = f.value();
  char buf[48];
  if (hz >= 1e9)
    std::snprintf(buf, sizeof buf, "%.6g GHz", hz / 1e9);
  else if (hz >= 1e6)
    std::snprintf(buf, sizeof buf, "%.6g MHz", hz / 1e6);
  else
    std::snprintf(buf, sizeof buf, "%.6g kHz", hz / 1e3);
  return buf;
}

std::string confidence_note(Confidence c, const LimitTable& t) {
  switch (c) {
    case Confidence::confirmed: return "";
    case Confidence::partly:
      return "note: PARTLY CONFIRMED - some rows read in the published text, the rest pinned by continuity "
             "at breakpoints; check against " + t.document + " before relying on them.";
    case Confidence::verify:
      return "VERIFY: these values are recalled and not yet read in the published text; verify against " +
             t.document + ", " + t.table + " before relying on them.";
  }
  return "";
}

// One tier: either its values, or why it is not shown.
struct TierResult {
  Tier tier;
  std::optional<LimitValues> values;
  std::string not_tabulated;  // reason, when values is empty
};

void print_text(std::ostream& out, const LimitTable& table, units::Frequency f, const std::vector<TierResult>& rs) {
  out << "Exposure limits at " << frequency_text(f) << " - " << table.name << ": " << table.source() << "\n";
  for (const auto& r : rs) {
    out << "\n" << limits::to_string(r.tier);
    if (!r.values) {
      out << ": not tabulated - " << r.not_tabulated << "\n";
      continue;
    }
    const LimitValues& v = *r.values;
    out << " (\"" << v.document_tier << "\"), averaged over " << limit_text(v.averaging.value() / 60.0) << " min\n";
    const std::string none = "not given by the table at this frequency";
    out << "  E  " << (v.e ? limit_text(v.e->value()) + " V/m" : none) << "\n";
    out << "  H  " << (v.h ? limit_text(v.h->value()) + " A/m" : none) << "\n";
    if (v.s) {
      const double s = v.s->value();
      out << "  S  " << limit_text(s) << " W/m2 (" << limit_text(s / 10.0) << " mW/cm2)";
      out << (v.s_is_equivalent ? ", plane-wave equivalent: the E and H limits are the ones that bind here" : "")
          << "\n";
    } else {
      out << "  S  " << none << (v.e || v.h ? "; E and H must both hold whatever the field region" : "") << "\n";
    }
    out << "  source: " << v.source << "; confidence: " << limits::to_string(v.confidence) << "\n";
    if (const auto note = confidence_note(v.confidence, table); !note.empty()) out << "  " << note << "\n";
  }
  if (!table.note.empty()) out << "\nTable note: " << table.note << "\n";
  out << "\nLimits are RMS values of the unperturbed incident field, averaged over the time shown "
         "(printed values rounded down to 4 digits). Which tier applies, and any stricter local rule, "
         "is set by your regulator and local codes; this listing does not replace them.\n";
}

void print_json(std::ostream& out, const LimitTable& table, units::Frequency f, const std::vector<TierResult>& rs) {
  using nlohmann::json;
  json j;
  j["standard"] = limits::to_string(table.standard);
  j["name"] = table.name;
  j["frequency_hz"] = f.value();
  j["tiers"] = json::object();
  for (const auto& r : rs) {
    if (!r.values) {
      j["not_tabulated"][limits::to_string(r.tier)] = r.not_tabulated;
      continue;
    }
    const LimitValues& v = *r.values;
    json t;
    t["e_v_per_m"] = v.e ? json(v.e->value()) : json(nullptr);
    t["h_a_per_m"] = v.h ? json(v.h->value()) : json(nullptr);
    t["s_w_per_m2"] = v.s ? json(v.s->value()) : json(nullptr);
    t["s_is_equivalent"] = v.s_is_equivalent;
    t["averaging_s"] = v.averaging.value();
    t["source"] = v.source;
    t["confidence"] = limits::to_string(v.confidence);
    t["document_tier"] = v.document_tier;
    j["tiers"][limits::to_string(r.tier)] = t;
  }
  report::check_finite(j, "limits result");  // no NaN or inf reaches the output (issue 14)
  out << j.dump(2) << "\n";
}

int run_limits(const LimitsOptions& o, std::ostream& out) {
  const units::Frequency f = parse_frequency(o.frequency, option_where("FREQ"));
  const auto standard = limits::standard_from_string(o.standard);
  if (!standard)
    throw InputError(option_where("--standard"), "unknown standard \"" + o.standard +
                                                     "\": expected fcc, icnirp2020, icnirp1998 or sc6");
  const LimitTable& table = limits::builtin_limit_table_ref(*standard);

  std::vector<Tier> wanted;
  if (!o.tier.empty()) {
    const auto t = limits::tier_from_string(o.tier);
    if (!t) throw InputError(option_where("--tier"), "unknown tier \"" + o.tier + "\": expected controlled or uncontrolled");
    if (table.find(*t) == nullptr)
      throw InputError(option_where("--tier"), table.name + " (" + table.file + ") has no " + o.tier +
                                                   " tier: only " + limits::to_string(table.tiers.front().tier) +
                                                   " is tabulated");
    wanted.push_back(*t);
  } else {
    for (Tier t : {Tier::controlled, Tier::uncontrolled}) wanted.push_back(t);
  }

  std::vector<TierResult> results;
  int found = 0;
  std::string ranges;  // "controlled 0.065–300000 MHz, uncontrolled 0.15–300000 MHz"
  for (Tier t : wanted) {
    TierResult r{t, std::nullopt, ""};
    if (table.find(t) == nullptr) {
      r.not_tabulated = "this table holds no " + limits::to_string(t) + " tier (see " + table.file + ")";
    } else {
      try {
        r.values = limits::lookup(table, t, f, option_where("FREQ"));
        ++found;
      } catch (const InputError& e) {
        if (!o.tier.empty()) throw;  // the one tier asked for is out of range
        r.not_tabulated = e.message();
        const auto* tt = table.find(t);
        char buf[96];
        std::snprintf(buf, sizeof buf, "%s%s %.6g–%.6g MHz", ranges.empty() ? "" : ", ", limits::to_string(t).c_str(),
                      tt->f_min_mhz(), tt->f_max_mhz());
        ranges += buf;
      }
    }
    results.push_back(std::move(r));
  }
  if (found == 0)
    throw InputError(option_where("FREQ"), frequency_text(f) + " is outside every tier of " + table.name + " (" +
                                               table.file + "): " + ranges + " (no extrapolation)");
  if (o.json)
    print_json(out, table, f, results);
  else
    print_text(out, table, f, results);
  return kOk;
}

}  // namespace

void add_limits(CLI::App& root, Commands& commands) {
  auto opts = std::make_shared<LimitsOptions>();
  CLI::App* sub = root.add_subcommand("limits", "Print the published exposure limits at one frequency");
  sub->add_option("FREQ", opts->frequency, "Frequency with its unit, e.g. 14.2MHz or \"2.4 GHz\"")->required();
  sub->add_option("--standard", opts->standard, "Limits table: fcc, icnirp2020, icnirp1998 or sc6")
      ->capture_default_str();
  sub->add_option("--tier", opts->tier, "Only this tier: controlled or uncontrolled (default: both)");
  sub->add_flag("--json", opts->json, "Write JSON instead of text");
  commands.push_back(Command{sub, [opts](std::ostream& out, std::ostream&) { return run_limits(*opts, out); }});
}

}  // namespace standoff::cli
