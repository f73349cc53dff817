// Self-contained HTML form of the evaluation record: inline CSS and SVG, no external resources
// (no scripts, fonts, images or links to fetch), print styles that fit both A4 and US Letter.
#include <fmt/format.h>

#include "report/format.hpp"
#include "report/svg.hpp"
#include "report/writers.hpp"
#include "exposure/remedies.hpp"

namespace standoff::report {

namespace {

std::string esc(const std::string& s) { return xml_escape(s); }

// A verdict shown as a word in a coloured box: the word carries the meaning, the colour only helps.
std::string badge(const std::string& verdict) {
  const char* cls = (verdict == "exceeds" || verdict == "fail")  ? "bad"
                    : (verdict == "within" || verdict == "pass") ? "good"
                                                                 : "unknown";
  return fmt::format("<span class=\"verdict {}\">{}</span>", cls, esc(fmtx::verdict_word(verdict)));
}

std::string table(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows,
                  const std::string& cls = "") {
  std::string s = cls.empty() ? "<table>\n<thead><tr>" : "<table class=\"" + cls + "\">\n<thead><tr>";
  for (const auto& h : header) s += "<th>" + esc(h) + "</th>";
  s += "</tr></thead>\n<tbody>\n";
  for (const auto& r : rows) {
    s += "<tr>";
    for (const auto& c : r) s += "<td>" + c + "</td>";  // cells are already HTML
    s += "</tr>\n";
  }
  return s + "</tbody>\n</table>\n";
}

constexpr const char* kStyle = R"(
:root { --ink: #1a1a1a; --rule: #c8c8c8; --bad: #D55E00; --good: #009E73; --unknown: #E69F00; }
* { box-sizing: border-box; }
body { font-family: "DejaVu Sans", Arial, Helvetica, sans-serif; color: var(--ink); margin: 0 auto;
       max-width: 60rem; padding: 1.5rem; line-height: 1.4; font-size: 11pt; background: #fff; }
h1 { font-size: 1.5rem; margin: 0 0 .8rem; }
h2 { font-size: 1.2rem; margin: 1.8rem 0 .6rem; border-bottom: 2px solid var(--ink); padding-bottom: .15rem; }
h3 { font-size: 1.05rem; margin: 1.3rem 0 .4rem; }
table { border-collapse: collapse; width: 100%; margin: .4rem 0 .9rem; font-size: .9rem; }
th, td { border: 1px solid var(--rule); padding: .25rem .4rem; text-align: left; vertical-align: top; }
th { background: #f0f0f0; }
td.num, th.num { text-align: right; }
table.title th { width: 30%; }
code, .hash { font-family: "DejaVu Sans Mono", "Courier New", monospace; font-size: .85em; word-break: break-all; }
.verdict { display: inline-block; padding: 0 .35rem; border: 2px solid; border-radius: 3px; font-weight: bold; }
.verdict.bad { color: var(--bad); border-color: var(--bad); }
.verdict.good { color: #00664a; border-color: var(--good); }
.verdict.unknown { color: #8a5a00; border-color: var(--unknown); }
.blank { display: inline-block; min-width: 18rem; border-bottom: 1px solid var(--ink); height: 1.3rem; }
figure { margin: .6rem 0 1rem; }
figure svg { max-width: 100%; height: auto; display: block; }
figcaption { font-size: .85rem; color: #444; margin-top: .3rem; }
.cautions { border: 2px solid var(--bad); padding: .4rem 1rem; }
.cautions li { margin: .3rem 0; }
.note { font-size: .9rem; color: #333; }
@page { size: auto; margin: 15mm; }
@media print {
  /* The printable width of A4 (210 mm) and US Letter (215.9 mm) with 15 mm margins is at least
     180 mm, the height at least 249 mm (Letter, 279.4 mm): content is sized to fit both. */
  body { max-width: 180mm; padding: 0; font-size: 9.5pt; }
  h2 { break-after: avoid; page-break-after: avoid; }
  table, figure, .cautions, .op { break-inside: avoid; page-break-inside: avoid; }
  figure svg { max-height: 230mm; }
  .verdict { print-color-adjust: exact; -webkit-print-color-adjust: exact; }
  section.map { break-before: page; page-break-before: always; }
}
)";

}  // namespace

std::string to_html(const Record& r) {
  const auto& ev = r.evaluation;
  const std::string verdict = overall_verdict(r);
  std::string h = "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n";
  h += "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n";
  h += "<title>Evaluation record — " + esc(r.meta.station_name) + "</title>\n";
  h += "<style>" + std::string(kStyle) + "</style>\n</head>\n<body>\n";
  h += "<h1>RF exposure and installation-safety evaluation — " + esc(r.meta.station_name) + "</h1>\n";

  std::vector<std::vector<std::string>> rows = {
      {"Station", esc(r.meta.station_name)},
      {"Date", esc(r.meta.date)},
      {"Tool version", "standoff " + esc(r.meta.tool_version)},
      {"Input file", esc(r.meta.input_file)},
      {"SHA-256 of the input file", "<span class=\"hash\">" + esc(r.meta.input_sha256) + "</span>"},
  };
  for (const auto& s : r.meta.standards) {
    rows.push_back({"Limits (" + esc(s.id) + ")", esc(fmt::format("{}, {} ({}); table file {}; confidence: {}",
                                                                  s.document, s.table, s.year, s.file, s.confidence))});
  }
  rows.push_back({"Overall verdict", badge(verdict)});
  rows.push_back({"Evaluated by", r.meta.evaluated_by.empty() ? "<span class=\"blank\"></span>" : esc(r.meta.evaluated_by)});
  rows.push_back({"Signature", r.meta.signature.empty() ? "<span class=\"blank\"></span>" : esc(r.meta.signature)});
  // The title block is a two-column table whose first column is a header cell.
  h += "<section id=\"title-block\"><table class=\"title\"><tbody>\n";
  for (const auto& row : rows) h += "<tr><th>" + row[0] + "</th><td>" + row[1] + "</td></tr>\n";
  h += "</tbody></table></section>\n";

  h += "<section id=\"verdicts\"><h2>Verdict per operation</h2>\n";
  rows.clear();
  for (const auto& op : ev.operations) {
    const bool e = op.evaluated_anywhere;
    rows.push_back({esc(op.name), esc(fmtx::frequency(op.frequency_hz)), esc(fmtx::power(op.pep_w)),
                    esc(fmtx::power(op.average_power_w)), e ? esc(fmtx::percent_up(op.worst.ratio)) : "not evaluated",
                    e ? esc(fmtx::where(op.worst.at) + ", " + op.worst.zone + " (" + tier_name(op.worst.tier) + ")") : "—",
                    esc(fmtx::power_down(op.permitted_pep_w)), badge(exposure::to_string(op.verdict))});
  }
  h += table({"Operation", "Frequency", "PEP", "Average power at antenna", "Worst exposure (% of limit)",
              "Where, zone (tier)", "Permitted PEP", "Verdict"},
             rows);
  h += "<p class=\"note\">Exposure is a percentage of the limit of the tier that applies where it occurs (power "
       "ratio: (E/E<sub>lim</sub>)², (H/H<sub>lim</sub>)² or S/S<sub>lim</sub>). Percentages and distances are "
       "rounded up, permitted power down.</p>\n";
  if (!ev.groups.empty()) {
    rows.clear();
    for (const auto& g : ev.groups) {
      std::string names;
      for (const auto& n : g.operations) names += (names.empty() ? "" : ", ") + n;
      rows.push_back({esc(g.name), esc(names), g.evaluated_anywhere ? esc(fmtx::percent_up(g.worst.ratio)) : "not evaluated",
                      g.evaluated_anywhere ? esc(fmtx::where(g.worst.at) + ", " + g.worst.zone) : "—",
                      badge(exposure::to_string(g.verdict))});
    }
    h += "<h3>Sources that transmit together (47 CFR 1.1307(b)(5))</h3>\n";
    h += table({"Group", "Operations", "Worst sum of ratios", "Where", "Verdict"}, rows);
  }
  h += "</section>\n";

  h += "<section class=\"map\" id=\"map\"><h2>Site map</h2>\n<figure>\n" + site_map_svg(r, false);
  h += "<figcaption>Contours show where the worst case over all operations (and the sum over each group) reaches "
       "100 % (solid) and 50 % (dashed) of the controlled (C, blue) and uncontrolled (U, vermillion) limits at body "
       "height. Hatched grey cells were not evaluated — measure there or use another method.</figcaption>\n"
       "</figure>\n</section>\n";

  h += "<section id=\"operations\"><h2>Operations</h2>\n";
  for (const auto& op : ev.operations) {
    h += "<div class=\"op\" id=\"op-" + slug(op.name) + "\">\n<h3>" + esc(op.name) + " " +
         badge(exposure::to_string(op.verdict)) + "</h3>\n";
    h += "<p>" + esc(fmt::format("Transmitter {}, feed line {}, antenna {}; {}{}.", op.transmitter, op.feed_line,
                                 op.antenna, fmtx::frequency(op.frequency_hz),
                                 op.group.empty() ? "" : "; group " + op.group)) +
         "</p>\n";
    rows.clear();
    for (const auto& s : op.chain) rows.push_back({esc(s.label), esc(fmtx::power(s.power_w)), esc(s.detail)});
    h += "<p><strong>Power chain</strong></p>\n" + table({"Step", "Power", "Detail"}, rows);
    rows.clear();
    rows.push_back({"Model", esc(op.method)});
    rows.push_back({"Limits", esc(op.limits_source)});
    if (op.evaluated_anywhere) {
      rows.push_back({"Worst exposure", esc(fmtx::percent_up(op.worst.ratio) + " of the " + tier_name(op.worst.tier) +
                                            " limit (" + op.worst.quantity + ")")});
      rows.push_back({"Where", esc(fmtx::where(op.worst.at) + " in " + op.worst.zone)});
    } else {
      rows.push_back({"Worst exposure", "not evaluated — measure or use another method"});
    }
    rows.push_back({"Permitted PEP", esc(fmtx::power_down(op.permitted_pep_w))});
    rows.push_back({"Screening distance (far-field model)", esc(fmtx::tiers(op.screening_distance))});
    rows.push_back({"Detailed distance (worst direction, body height)", esc(fmtx::tiers(op.detailed_distance))});
    if (op.not_evaluated_count > 0) {
      rows.push_back({"Not evaluated", esc(fmt::format(
                                           "{} place(s) too close for the model — measure or use another method",
                                           op.not_evaluated_count))});
    }
    h += "<table class=\"title\"><tbody>\n";
    for (const auto& row : rows) h += "<tr><th>" + row[0] + "</th><td>" + row[1] + "</td></tr>\n";
    h += "</tbody></table>\n";
    if (!op.points.empty()) {
      rows.clear();
      for (const auto& p : op.points) {
        rows.push_back({esc(p.name), esc(tier_name(p.tier)), esc(fmtx::where(p.at)),
                        p.evaluated ? esc(fmtx::percent_up(p.ratio)) : esc("not evaluated — " + p.reason)});
      }
      h += table({"Point of interest", "Tier", "At", "Exposure (% of limit)"}, rows);
    }
    const auto remedies = exposure::operation_remedies(op);
    if (!op.notes.empty() || !remedies.empty()) {
      h += "<ul class=\"note\">\n";
      for (const auto& rm : remedies) h += "<li>Remedy: " + esc(rm.text) + "</li>\n";
      for (const auto& n : op.notes) h += "<li>" + esc(n) + "</li>\n";
      h += "</ul>\n";
    }
    if (!op.ratio_vs_distance.empty()) {
      h += "<figure>\n" + ratio_chart_svg(op, false) +
           "<figcaption>Worst exposure at body height versus horizontal distance from the antenna, "
           "in percent of each tier's limit.</figcaption>\n</figure>\n";
    }
    h += "</div>\n";
  }
  h += "</section>\n";

  h += "<section id=\"power-lines\"><h2>Power-line clearances</h2>\n";
  if (r.lines) {
    rows.clear();
    for (const auto& c : r.lines->checks) {
      rows.push_back({esc(c.rule), esc(c.subject), esc(c.line), esc(fmtx::check_required(c)),
                      esc(fmtx::check_actual(c)), badge(c.pass ? "pass" : "fail"), esc(c.source), esc(c.note)});
    }
    h += table({"Check", "Subject", "Power line", "Required", "Actual", "Result", "Source", "Note"}, rows);
    bool any_remedy = false;
    for (const auto& c : r.lines->checks) any_remedy |= !c.remedies.empty();
    if (!r.lines->assumptions.empty() || any_remedy) {
      h += "<ul class=\"note\">\n";
      for (const auto& c : r.lines->checks)
        for (const auto& rm : c.remedies) h += "<li>Remedy (" + esc(c.rule) + ", " + esc(c.subject) + "): " + esc(rm.text) + "</li>\n";
      for (const auto& a : r.lines->assumptions) h += "<li>Assumption: " + esc(a) + "</li>\n";
      h += "</ul>\n";
    }
  } else {
    h += "<p>The station file describes no power lines or supports; no clearance checks were made.</p>\n";
  }
  h += "</section>\n";

  h += "<section id=\"methods\"><h2>Assumptions and methods</h2>\n<ul>\n";
  if (!ev.body_rule.empty()) h += "<li>Body line: " + esc(ev.body_rule) + "</li>\n";
  h += "<li>" + esc(fmt::format("Zone grid spacing: {} m.", ev.grid_spacing_m)) + "</li>\n";
  for (const auto& a : r.assumptions) h += "<li>" + esc(a) + "</li>\n";
  h += "</ul>\n";
  rows.clear();
  for (const auto& ref : r.references) rows.push_back({esc(ref.topic), esc(ref.source)});
  h += table({"Topic", "Method and source"}, rows);
  h += "</section>\n";

  h += "<section id=\"cautions\"><h2>Cautions</h2>\n<div class=\"cautions\"><ul>\n";
  for (const auto& c : all_cautions(r)) h += "<li><strong>Caution:</strong> " + esc(c) + "</li>\n";
  h += "</ul></div>\n</section>\n";
  h += "</body>\n</html>\n";
  return h;
}

}  // namespace standoff::report
