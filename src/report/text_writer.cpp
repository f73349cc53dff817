// Terminal form of the evaluation record: aligned plain-text tables; ANSI colour for verdicts only
// when the caller says so (use_colour: a terminal and NO_COLOR unset).
#include <unistd.h>

#include <cstdlib>
#include <ostream>

#include <fmt/format.h>

#include "report/format.hpp"
#include "report/writers.hpp"
#include "exposure/remedies.hpp"

namespace standoff::report {

bool use_colour(bool is_terminal, const char* no_color_env) {
  const bool no_color = no_color_env != nullptr && no_color_env[0] != '\0';
  return is_terminal && !no_color;
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

}  // namespace

void write_text(const Record& r, std::ostream& out, const TextOptions& options) {
  const auto& ev = r.evaluation;
  const std::string verdict = overall_verdict(r);
  out << "standoff evaluation record — " << r.meta.station_name << "\n";
  out << "  date " << r.meta.date << " · standoff " << r.meta.tool_version << "\n";
  out << "  input " << r.meta.input_file << " (SHA-256 " << r.meta.input_sha256 << ")\n";
  for (const auto& s : r.meta.standards) {
    out << "  limits " << s.document << ", " << s.table << " (" << s.year << ") [" << s.confidence << "]\n";
  }
  out << "  verdict: " << paint(fmtx::verdict_word(verdict), verdict, options.colour) << "\n\n";

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
                        fmtx::power_down(op.permitted_pep_w), paint(fmtx::verdict_word(v), v, options.colour)});
    dist.rows.push_back({op.name, e ? fmtx::where(op.worst.at) : "—", fmtx::distance_up(op.screening_distance.controlled_m),
                         fmtx::distance_up(op.screening_distance.uncontrolled_m),
                         fmtx::distance_up(op.detailed_distance.controlled_m),
                         fmtx::distance_up(op.detailed_distance.uncontrolled_m)});
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
      lines.rows.push_back({c.rule, c.subject, c.line, fmtx::check_required(c),
                            fmtx::check_actual(c),
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
