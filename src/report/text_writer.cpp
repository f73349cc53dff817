// Terminal form of the evaluation record: aligned plain-text tables; ANSI colour for verdicts only
// when the caller says so (use_colour: a terminal and NO_COLOR unset).
#include <unistd.h>

#include <algorithm>
#include <cstdlib>
#include <ostream>

#include <fmt/format.h>

#include "report/findings.hpp"
#include "report/format.hpp"
#include "report/writers.hpp"
#include "exposure/remedies.hpp"

namespace standoff::report {

bool use_colour(bool is_terminal, const char* no_color_env) {
  const bool no_color = no_color_env != nullptr && no_color_env[0] != '\0';
  return is_terminal && !no_color;
}

std::size_t text_width(const char* columns_env) {
  if (columns_env == nullptr || columns_env[0] == '\0') return 100;
  char* end = nullptr;
  const long v = std::strtol(columns_env, &end, 10);
  if (end == nullptr || *end != '\0' || v < 40 || v > 100) return 100;
  return static_cast<std::size_t>(v);
}

bool use_colour_for_fd(int fd) { return use_colour(::isatty(fd) == 1, std::getenv("NO_COLOR")); }

namespace {

std::string paint(const std::string& text, const std::string& verdict, bool colour) {
  if (!colour) return text;
  // Bold red for a finding, green when within/pass, yellow for not evaluated.
  const char* code = (verdict == "exceeds" || verdict == "fail") ? "\x1b[1;31m"
                     : (verdict == "within" || verdict == "pass") ? "\x1b[32m"
                                                                  : "\x1b[33m";
  return code + text + "\x1b[0m";
}

std::string paint_headline(const std::string& headline, const std::string& verdict, bool colour) {
  const auto colon = headline.find(": ");
  if (colon == std::string::npos) return headline;
  return headline.substr(0, colon + 2) + paint(headline.substr(colon + 2), verdict, colour);
}

// The summary: who and what, the two verdicts, one sentence per finding, one line per operation,
// the installation checks by rule, the gravest cautions and the signature line.
void write_summary(const Record& r, std::ostream& out, const TextOptions& options) {
  const auto& ev = r.evaluation;
  const std::size_t w = options.width;
  out << fmtx::wrap("standoff evaluation record — " + r.meta.station_name + " · " + r.meta.date + " · standoff " +
                        r.meta.tool_version,
                    w, "", "  ");
  for (const auto& s : r.meta.standards) {
    out << fmtx::wrap("limits " + s.document + ", " + s.table + " (" + std::to_string(s.year) + ") [" + s.confidence +
                          "]; input " + r.meta.input_file,
                      w, "", "  ");
  }
  const bool one_line = exposure_headline(r).size() + 4 + installation_headline(r).size() <= w;
  out << paint_headline(exposure_headline(r), exposure_verdict(r), options.colour) << (one_line ? "    " : "\n")
      << paint_headline(installation_headline(r), installation_verdict(r), options.colour) << "\n";
  // The findings say what the headline sentence says, one by one; without findings, the headline.
  const auto fs = findings(r);
  if (fs.empty()) out << fmtx::wrap(headline_sentence(r), w, "", "") << "\n";
  if (!fs.empty()) {
    out << "Findings and remedies\n";
    for (std::size_t k = 0; k < fs.size(); ++k) {
      const std::string num = std::to_string(k + 1) + ". ";
      out << fmtx::wrap(fs[k].brief.empty() ? fs[k].sentence : fs[k].brief, w, "  " + num, std::string(2 + num.size(), ' '));
    }
    out << "\n";
  }

  fmtx::TextTable ops;
  ops.header = {"operation", "worst", "where (tier)", "permitted PEP", "verdict"};
  bool absurd = false;
  for (const auto& op : ev.operations) {
    const bool e = op.evaluated_anywhere;
    const std::string v = exposure::to_string(op.verdict);
    absurd |= op.permitted_pep_w && *op.permitted_pep_w > 100000.0;
    ops.rows.push_back({op.name, e ? fmtx::percent_up(op.worst.ratio) : "not evaluated",
                        e ? op.worst.zone + (op.worst.tier == limits::Tier::controlled ? " (C)" : " (U)") : "—",
                        fmtx::permitted_power(op.permitted_pep_w), paint(fmtx::verdict_word(v), v, options.colour)});
  }
  for (const auto& g : ev.groups) {
    const std::string v = exposure::to_string(g.verdict);
    const bool e = g.evaluated_anywhere;
    ops.rows.push_back({"group " + g.name + " (sum)", e ? fmtx::percent_up(g.worst.ratio) : "not evaluated",
                        e ? g.worst.zone + (g.worst.tier == limits::Tier::controlled ? " (C)" : " (U)") : "—", "",
                        paint(fmtx::verdict_word(v), v, options.colour)});
  }
  out << fmtx::wrap("Exposure, worst place per operation (% of the limit; C = controlled, U = uncontrolled tier)", w, "", "");
  out << ops.render_fit(w, "  ");
  if (absurd) out << fmtx::wrap(fmtx::kAbsurdPowerNote, w, "  ", "  ");
  out << "\n";

  if (r.lines && !r.lines->checks.empty()) {
    // Per rule: failures named, passes counted.
    std::vector<std::string> rules;
    for (const auto& c : r.lines->checks) {
      if (std::find(rules.begin(), rules.end(), c.rule) == rules.end()) rules.push_back(c.rule);
    }
    out << fmtx::wrap("Installation checks near power lines (sources in the report and with --verbose)", w, "", "");
    std::string passes, fails;  // "rule count, …": the failures are named in the findings above
    for (const auto& rule : rules) {
      std::size_t pass = 0, fail = 0;
      std::vector<std::pair<std::string, std::string>> failed;  // subject, lines
      for (const auto& c : r.lines->checks) {
        if (c.rule != rule) continue;
        if (c.pass) {
          ++pass;
          continue;
        }
        ++fail;
        auto it = std::find_if(failed.begin(), failed.end(), [&](const auto& f) { return f.first == c.subject; });
        if (it == failed.end()) {
          failed.push_back({c.subject, ""});
          it = failed.end() - 1;
        }
        if (!c.line.empty()) it->second += (it->second.empty() ? " vs " : ", ") + c.line;
      }
      if (fail > 0) {
        std::string names;
        for (const auto& f : failed) names += (names.empty() ? "" : "; ") + f.first + f.second;
        // Named here only when the findings do not name them (they always do; kept for safety).
        fails += (fails.empty() ? "" : ", ") + rule + " " + std::to_string(fail) + (fs.empty() ? " (" + names + ")" : "");
      }
      if (pass > 0) passes += (passes.empty() ? "" : ", ") + rule + " " + std::to_string(pass);
    }
    std::string verdicts;
    if (!fails.empty()) verdicts = paint("FAIL", "fail", options.colour) + " " + fails + (fs.empty() ? "" : " (see the findings)");
    if (!passes.empty()) verdicts += (verdicts.empty() ? "" : "; ") + paint("PASS", "pass", options.colour) + " " + passes;
    out << fmtx::wrap(verdicts, w, "  ", "    ");
    out << "\n";
  }

  const auto cautions = all_cautions(r);
  const std::size_t shown = std::min<std::size_t>(cautions.size(), 1);
  // The gravest caution on the heading's line; all of them in the report and with --verbose.
  const std::string heading =
      "Gravest caution (of " + std::to_string(cautions.size()) + "; all with --verbose)";
  if (shown == 0) out << fmtx::wrap(heading, w, "", "");
  for (std::size_t k = 0; k < shown; ++k) out << fmtx::wrap(heading + ": " + cautions[k], w, "", "  ");
}

}  // namespace

void write_text(const Record& r, std::ostream& out, const TextOptions& options) {
  if (!options.verbose) {
    write_summary(r, out, options);
    return;
  }
  const auto& ev = r.evaluation;
  out << "standoff evaluation record — " << r.meta.station_name << "\n";
  out << "  date " << r.meta.date << " · standoff " << r.meta.tool_version << "\n";
  out << "  input " << r.meta.input_file << " (SHA-256 " << r.meta.input_sha256 << ")\n";
  for (const auto& s : r.meta.standards) {
    out << "  limits " << s.document << ", " << s.table << " (" << s.year << ") [" << s.confidence << "]\n";
  }
  out << "  " << paint_headline(exposure_headline(r), exposure_verdict(r), options.colour) << "\n";
  out << "  " << paint_headline(installation_headline(r), installation_verdict(r), options.colour) << "\n";
  out << "  " << headline_sentence(r) << "\n\n";
  const auto fs = findings(r);
  if (!fs.empty()) {
    out << "Findings and remedies\n";
    for (std::size_t k = 0; k < fs.size(); ++k) out << "  " << k + 1 << ". " << fs[k].sentence << "\n";
    out << "\n";
  }

  fmtx::TextTable ops;
  ops.header = {"operation", "frequency", "PEP", "avg at antenna", "worst", "zone (tier)", "permitted PEP", "verdict"};
  fmtx::TextTable dist;
  dist.header = {"operation", "worst at (x, y, z)", "screening C", "screening U", "detailed C", "detailed U"};
  for (const auto& op : ev.operations) {
    const bool e = op.evaluated_anywhere;
    const std::string v = exposure::to_string(op.verdict);
    ops.rows.push_back({op.name, fmtx::frequency(op.frequency_hz), fmtx::power(op.pep_w),
                        fmtx::power(op.average_power_w), e ? fmtx::percent_up(op.worst.ratio) : "not evaluated",
                        e ? op.worst.zone + " (" + tier_name(op.worst.tier) + ")" : "—",
                        fmtx::permitted_power(op.permitted_pep_w), paint(fmtx::verdict_word(v), v, options.colour)});
    dist.rows.push_back({op.name, e ? fmtx::where(op.worst.at) : "—", fmtx::distance_up(op.screening_distance.controlled_m),
                         fmtx::distance_up(op.screening_distance.uncontrolled_m),
                         fmtx::distance_up(op.detailed_distance.controlled_m, op.detailed_distance.controlled_none),
                         fmtx::distance_up(op.detailed_distance.uncontrolled_m, op.detailed_distance.uncontrolled_none)});
  }
  out << "Operations (worst exposure in % of the limit of the tier where it occurs)\n";
  out << ops.render("  ") << "\n";
  out << "Where, and compliance distances (C = controlled, U = uncontrolled tier)\n";
  out << dist.render("  ") << "\n";

  if (!ev.groups.empty()) {
    fmtx::TextTable groups;
    groups.header = {"group (transmit together)", "operations", "worst sum", "where", "zone (tier)", "verdict"};
    for (const auto& g : ev.groups) {
      std::string names;
      for (const auto& n : g.operations) names += (names.empty() ? "" : ", ") + n;
      const std::string v = exposure::to_string(g.verdict);
      groups.rows.push_back({g.name, names, g.evaluated_anywhere ? fmtx::percent_up(g.worst.ratio) : "not evaluated",
                             g.evaluated_anywhere ? fmtx::where(g.worst.at) : "—",
                             g.evaluated_anywhere ? g.worst.zone + " (" + tier_name(g.worst.tier) + ")" : "—",
                             paint(fmtx::verdict_word(v), v, options.colour)});
    }
    out << "Groups (47 CFR 1.1307(b)(5): the sum of ratios must not exceed 100 %)\n" << groups.render("  ") << "\n";
  }

  for (const auto& op : ev.operations) {
    out << op.name << " — " << op.method << "; limits: " << op.limits_source << "\n";
    for (const auto& step : op.chain) {
      out << "  " << step.label << ": " << fmtx::power(step.power_w) << (step.detail.empty() ? "" : "  (" + step.detail + ")")
          << "\n";
    }
    for (const auto& p : op.points) {
      out << "  point " << p.name << " (" << tier_name(p.tier) << "): "
          << (p.evaluated ? fmtx::percent_up(p.ratio) + " of the limit" : "not evaluated — " + p.reason) << "\n";
    }
    if (op.not_evaluated_count > 0) {
      out << "  " << op.not_evaluated_count
          << " place(s) not evaluated (too close for the model) — measure or use another method\n";
    }
    for (const auto& rm : exposure::operation_remedies(op)) out << "  remedy: " << rm.text << "\n";
    for (const auto& n : op.notes) out << "  note: " << n << "\n";
  }
  out << "\n";

  if (r.lines) {
    fmtx::TextTable lines;
    lines.header = {"check", "subject", "power line", "required", "actual", "result", "source"};
    for (const auto& c : r.lines->checks) {
      const std::string v = c.pass ? "pass" : "fail";
      lines.rows.push_back({c.rule, c.subject, c.line, fmtx::check_required(c, r.units),
                            fmtx::check_actual(c, r.units),
                            paint(fmtx::verdict_word(v), v, options.colour), c.source});
    }
    out << "Power-line clearances\n" << lines.render("  ");
    for (const auto& c : r.lines->checks)
      for (const auto& rm : c.remedies) out << "  remedy (" << c.rule << ", " << c.subject << "): " << rm.text << "\n";
    for (const auto& a : r.lines->assumptions) out << "  assumption: " << a << "\n";
    out << "\n";
  }

  out << "Cautions\n";
  for (const auto& c : all_cautions(r)) out << "  ! " << c << "\n";
  out << "\nEvaluated by: ______________________   Signature: ______________________   Date: __________\n";
}

}  // namespace standoff::report
