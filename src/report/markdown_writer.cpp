// Markdown form of the evaluation record; drawings are referenced as the SVG files beside it.
#include <fmt/format.h>

#include "report/findings.hpp"
#include "report/format.hpp"
#include "report/writers.hpp"
#include "exposure/remedies.hpp"

namespace standoff::report {

std::string chart_file_name(const std::string& operation) { return "chart-" + slug(operation) + ".svg"; }

namespace {

// Text from the station file: '<' and '>' as entities, so that a name can never become HTML markup
// in a Markdown viewer.
std::string text(const std::string& s) {
  std::string out;
  for (const char c : s) {
    if (c == '<') out += "&lt;";
    else if (c == '>') out += "&gt;";
    else out += c;
  }
  return out;
}

// A table cell: as text(), with pipes escaped and newlines flattened.
std::string cell(const std::string& s) {
  std::string out;
  for (const char c : s) {
    if (c == '<') out += "&lt;";
    else if (c == '>') out += "&gt;";
    else if (c == '|') out += "\\|";
    else if (c == '\n') out += ' ';
    else out += c;
  }
  return out;
}

std::string row(const std::vector<std::string>& cells) {
  std::string s = "|";
  for (const auto& c : cells) {
    // Appended piece by piece: GCC 12 gives a false -Wrestrict for `"literal" + std::string` here.
    s += ' ';
    s += cell(c);
    s += " |";
  }
  return s + "\n";
}

std::string table(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows) {
  std::string s = row(header) + "|";
  for (std::size_t k = 0; k < header.size(); ++k) s += "---|";
  s += "\n";
  for (const auto& r : rows) s += row(r);
  return s + "\n";
}

}  // namespace

std::string to_markdown(const Record& r) {
  const auto& ev = r.evaluation;
  const std::string verdict = overall_verdict(r);
  std::string md = "# RF exposure and installation-safety evaluation — " + text(r.meta.station_name) + "\n\n";
  md += "**" + exposure_headline(r) + "** · **" + installation_headline(r) + "**\n\n";
  md += text(headline_sentence(r)) + "\n\n";
  const auto fs = findings(r);
  if (!fs.empty()) {
    md += "## Findings and remedies\n\n";
    for (std::size_t k = 0; k < fs.size(); ++k) md += std::to_string(k + 1) + ". " + text(fs[k].sentence) + "\n";
    md += "\n";
  }

  std::vector<std::vector<std::string>> title = {
      {"Station", r.meta.station_name},
      {"Date", r.meta.date},
      {"Tool version", "standoff " + r.meta.tool_version},
      {"Input file", r.meta.input_file},
      {"SHA-256 of the input file", "`" + r.meta.input_sha256 + "`"},
  };
  for (const auto& s : r.meta.standards) {
    title.push_back({"Limits (" + s.id + ")", fmt::format("{}, {} ({}); table file {}; confidence: {}", s.document,
                                                          s.table, s.year, s.file, s.confidence)});
  }
  title.push_back({"RF exposure", "**" + fmtx::verdict_word(exposure_verdict(r)) + "**"});
  title.push_back({"Installation", "**" + installation_headline(r).substr(std::string("Installation: ").size()) + "**"});
  title.push_back({"Combined verdict", "**" + fmtx::verdict_word(verdict) + "**"});
  title.push_back({"Evaluated by", r.meta.evaluated_by.empty() ? "______________________________" : r.meta.evaluated_by});
  title.push_back({"Signature", r.meta.signature.empty() ? "______________________________" : r.meta.signature});
  md += table({"Item", "Value"}, title);

  md += "## Verdict per operation\n\n";
  std::vector<std::vector<std::string>> rows;
  for (const auto& op : ev.operations) {
    const bool e = op.evaluated_anywhere;
    rows.push_back({op.name, fmtx::frequency(op.frequency_hz), fmtx::power(op.pep_w), fmtx::power(op.average_power_w),
                    e ? fmtx::percent_up(op.worst.ratio) : "not evaluated",
                    e ? fmtx::where(op.worst.at) + ", " + op.worst.zone + " (" + tier_name(op.worst.tier) + ")" : "—",
                    fmtx::permitted_power(op.permitted_pep_w), "**" + fmtx::verdict_word(exposure::to_string(op.verdict)) + "**"});
  }
  md += table({"Operation", "Frequency", "PEP", "Average power at antenna", "Worst exposure (% of limit)", "Where, zone (tier)",
               "Permitted PEP", "Verdict"},
              rows);
  md += "Exposure is given as a percentage of the limit of the tier that applies where it occurs (power ratio: "
        "(E/E_lim)², (H/H_lim)² or S/S_lim). Percentages and distances are rounded up, permitted power down.\n\n";

  if (!ev.groups.empty()) {
    md += "### Sources that transmit together (47 CFR 1.1307(b)(5))\n\n";
    rows.clear();
    for (const auto& g : ev.groups) {
      std::string names;
      for (const auto& n : g.operations) names += (names.empty() ? "" : ", ") + n;
      rows.push_back({g.name, names, g.evaluated_anywhere ? fmtx::percent_up(g.worst.ratio) : "not evaluated",
                      g.evaluated_anywhere ? fmtx::where(g.worst.at) + ", " + g.worst.zone : "—",
                      "**" + fmtx::verdict_word(exposure::to_string(g.verdict)) + "**"});
    }
    md += table({"Group", "Operations", "Worst sum of ratios", "Where", "Verdict"}, rows);
  }

  md += "## Site map\n\n![Site map: zones, antennas, supports, power lines and exposure contours](site-map.svg)\n\n";
  md += "Contours show where the worst case over all operations (and the sum over each group) reaches 100 % "
        "(solid) and 50 % (dashed) of the controlled (C, blue) and uncontrolled (U, vermillion) limits at body "
        "height. Hatched grey cells were not evaluated — measure there or use another method.\n\n";

  md += "## Operations\n\n";
  for (const auto& op : ev.operations) {
    md += "### " + text(op.name) + "\n\n";
    md += text(fmt::format("Transmitter {}, feed line {}, antenna {}; {}{}.", op.transmitter, op.feed_line, op.antenna,
                           fmtx::frequency(op.frequency_hz), op.group.empty() ? "" : "; group " + op.group)) +
          "\n\n";
    md += "**Power chain**\n\n";
    rows.clear();
    for (const auto& s : op.chain) rows.push_back({s.label, fmtx::power(s.power_w), s.detail});
    md += table({"Step", "Power", "Detail"}, rows);
    md += "**Model:** " + text(op.method) + ". **Limits:** " + text(op.limits_source) + ".\n\n";
    rows.clear();
    if (op.evaluated_anywhere) {
      rows.push_back({"Worst exposure", fmtx::percent_up(op.worst.ratio) + " of the " + tier_name(op.worst.tier) +
                                            " limit (" + op.worst.quantity + ")"});
      rows.push_back({"Where", fmtx::where(op.worst.at) + " in " + op.worst.zone});
    } else {
      rows.push_back({"Worst exposure", "not evaluated — measure or use another method"});
    }
    rows.push_back({"Permitted PEP", fmtx::permitted_power(op.permitted_pep_w)});
    rows.push_back({"Screening distance (far-field model)", fmtx::tiers(op.screening_distance)});
    rows.push_back({"Detailed distance (worst direction, body height)", fmtx::tiers(op.detailed_distance)});
    if (op.not_evaluated_count > 0) {
      rows.push_back({"Not evaluated", fmt::format("{} place(s) too close for the model — measure or use another method",
                                                   op.not_evaluated_count)});
    }
    md += table({"Result", "Value"}, rows);
    if (!op.points.empty()) {
      rows.clear();
      for (const auto& p : op.points) {
        rows.push_back({p.name, tier_name(p.tier), fmtx::where(p.at),
                        p.evaluated ? fmtx::percent_up(p.ratio) : "not evaluated — " + p.reason});
      }
      md += table({"Point of interest", "Tier", "At", "Exposure (% of limit)"}, rows);
    }
    const auto remedies = exposure::operation_remedies(op);
    for (const auto& rm : remedies) md += "- Remedy: " + text(rm.text) + "\n";
    for (const auto& n : op.notes) md += "- " + text(n) + "\n";
    if (!op.notes.empty() || !remedies.empty()) md += "\n";
    if (!op.ratio_vs_distance.empty()) {
      md += "![Exposure ratio versus distance, " + text(op.name) + "](" + chart_file_name(op.name) + ")\n\n";
    }
  }

  md += "## Installation near power lines\n\n";
  if (r.lines) {
    rows.clear();
    for (const auto& c : r.lines->checks) {
      if (c.pass) continue;
      rows.push_back({c.rule, c.subject, c.line, fmtx::check_required(c, r.units), fmtx::check_actual(c, r.units),
                      "**FAIL**", c.note});
    }
    if (!rows.empty()) {
      md += "### Failed checks\n\n" + table({"Check", "Subject", "Power line", "Required", "Actual", "Result", "Note"}, rows);
    }
    rows.clear();
    for (const auto& s : rule_summaries(r)) {
      rows.push_back({s.rule, s.failed > 0 ? "**" + std::to_string(s.failed) + " FAIL**" : "",
                      s.passed > 0 ? std::to_string(s.passed) + " PASS" : "", s.source});
    }
    md += "### Checks by rule\n\n" + table({"Rule", "Failed", "Passed", "Source (cited once per rule)"}, rows);
    bool any = !r.lines->assumptions.empty();
    for (const auto& c : r.lines->checks)
      for (const auto& rm : c.remedies) {
        md += "- Remedy (" + text(c.rule) + ", " + text(c.subject) + "): " + text(rm.text) + "\n";
        any = true;
      }
    for (const auto& a : r.lines->assumptions) md += "- Assumption: " + text(a) + "\n";
    if (any) md += "\n";
    md += "Every check is listed in the appendix at the end and in report.json.\n\n";
  } else {
    md += "The station file describes no power lines or supports; no clearance checks were made.\n\n";
  }

  md += "## Assumptions and methods\n\n";
  if (!ev.body_rule.empty()) md += "- Body line: " + text(ev.body_rule) + "\n";
  md += fmt::format("- Zone grid spacing: {} m.\n", ev.grid_spacing_m);
  for (const auto& a : r.assumptions) md += "- " + text(a) + "\n";
  md += "\n";
  rows.clear();
  for (const auto& ref : r.references) rows.push_back({ref.topic, ref.source});
  md += table({"Topic", "Method and source"}, rows);

  md += "## Cautions\n\n";
  for (const auto& c : all_cautions(r)) md += "- **Caution:** " + text(c) + "\n";
  md += "\n";
  if (r.lines && !r.lines->checks.empty()) {
    rows.clear();
    for (const auto& c : r.lines->checks) {
      rows.push_back({c.rule, c.subject, c.line, fmtx::check_required(c, r.units), fmtx::check_actual(c, r.units),
                      c.pass ? "PASS" : "**FAIL**"});
    }
    md += "## Appendix: every installation check\n\n" +
          table({"Check", "Subject", "Power line", "Required", "Actual", "Result"}, rows);
  }
  return md;
}

}  // namespace standoff::report
