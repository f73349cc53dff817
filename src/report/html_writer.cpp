// Self-contained HTML form of the evaluation record: inline CSS and SVG, no external resources
// (no scripts, fonts, images or links to fetch), print styles that fit both A4 and US Letter.
#include <fmt/format.h>

#include "report/findings.hpp"
#include "report/format.hpp"
#include "report/svg.hpp"
#include "report/writers.hpp"
#include "exposure/remedies.hpp"

namespace standoff::report {

namespace {

std::string esc(const std::string& s) { return xml_escape(s); }

// A verdict shown as a word in a box whose fill and symbol carry the meaning in greyscale and for
// colour-blind readers too: solid box with ✖ for EXCEEDS/FAIL, outlined box with ✔ for
// WITHIN LIMITS/PASS, dashed box with ? for NOT EVALUATED. The word carries it in any case.
std::string badge(const std::string& verdict, const std::string& word = "") {
  const bool bad = verdict == "exceeds" || verdict == "fail";
  const bool good = verdict == "within" || verdict == "pass";
  const char* cls = bad ? "bad" : good ? "good" : "unknown";
  const char* symbol = bad ? "\u2716" : good ? "\u2714" : "?";
  return fmt::format("<span class=\"verdict {}\"><span class=\"sym\" aria-hidden=\"true\">{}</span> {}</span>", cls, symbol,
                     esc(word.empty() ? fmtx::verdict_word(verdict) : word));
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

std::string key_value_table(const std::vector<std::vector<std::string>>& rows, const std::string& cls = "title") {
  std::string h = "<table class=\"" + cls + "\"><tbody>\n";
  for (const auto& row : rows) h += "<tr><th>" + row[0] + "</th><td>" + row[1] + "</td></tr>\n";
  return h + "</tbody></table>\n";
}

// A CSS string literal (for the running page header and footer).
std::string css_string(const std::string& s) {
  std::string out = "\"";
  for (const char c : s) {
    if (c == '"' || c == '\\') out += '\\';
    if (c == '\n' || c == '<' || c == '>') continue;
    out += c;
  }
  return out + "\"";
}

constexpr const char* kStyle = R"(
:root { --ink: #1a1a1a; --rule: #c8c8c8; --bad: #B84A00; --good: #00664a; --unknown: #8a5a00; }
* { box-sizing: border-box; }
body { font-family: "DejaVu Sans", Arial, Helvetica, sans-serif; color: var(--ink); margin: 0 auto;
       max-width: 60rem; padding: 1.5rem; line-height: 1.35; font-size: 11pt; background: #fff; }
h1 { font-size: 1.45rem; margin: 0 0 .4rem; }
h2 { font-size: 1.15rem; margin: 1.4rem 0 .5rem; border-bottom: 2px solid var(--ink); padding-bottom: .15rem; }
h3 { font-size: 1.02rem; margin: 1rem 0 .3rem; }
p { margin: .35rem 0; }
table { border-collapse: collapse; width: 100%; margin: .3rem 0 .7rem; font-size: .92em; }
th, td { border: 1px solid var(--rule); padding: .2rem .35rem; text-align: left; vertical-align: top;
         overflow-wrap: break-word; }
th { background: #f0f0f0; }
thead { display: table-header-group; }
tr { break-inside: avoid; page-break-inside: avoid; }
table.title th { width: 30%; }
code, .hash { font-family: "DejaVu Sans Mono", "Courier New", monospace; font-size: .85em; word-break: break-all; }
.verdict { display: inline-block; padding: 0 .4rem; border: 2px solid; border-radius: 3px; font-weight: bold;
           white-space: nowrap; print-color-adjust: exact; -webkit-print-color-adjust: exact; }
.verdict.bad { color: #ffffff; background: var(--bad); border-color: var(--bad); }
.verdict.good { color: var(--good); background: #ffffff; border-color: var(--good); }
.verdict.unknown { color: var(--unknown); background: #ffffff; border-color: var(--unknown); border-style: dashed; }
.answer .verdicts { display: flex; flex-wrap: wrap; gap: .5rem 2rem; font-size: 1.15rem; margin: .5rem 0; }
.answer .headline { font-size: 1.02rem; font-weight: bold; }
.answer ol { margin: .3rem 0 .5rem; padding-left: 1.4rem; }
.answer li { margin: .25rem 0; }
.meta { font-size: .85rem; color: #333; }
.signature td { height: 2.2rem; }
.blank { display: inline-block; min-width: 18rem; border-bottom: 1px solid var(--ink); height: 1.3rem; }
figure { margin: .5rem 0 .8rem; }
figure svg { max-width: 100%; height: auto; display: block; }
figure.small svg { max-height: 95mm; width: auto; margin: 0 auto; }
figcaption { font-size: .82rem; color: #444; margin-top: .25rem; }
.cautions { border: 2px solid var(--bad); padding: .3rem 1rem; }
.cautions li { margin: .25rem 0; }
.note { font-size: .86rem; color: #333; }
.op-grid { display: grid; grid-template-columns: minmax(0, 1.1fr) minmax(0, 1fr); gap: .2rem .8rem; align-items: start; }
.op-grid figure { margin: .3rem 0; }
table.kv th { width: 30%; }
p.chain { font-size: .85em; }
table.all-checks td, table.all-checks th { padding: .1rem .3rem; }
.op h3 { margin-top: .6rem; }
@page { size: auto; margin: 16mm 14mm 16mm 14mm; }
@media print {
  /* The printable width of A4 (210 mm) and US Letter (215.9 mm) with 14 mm margins is at least
     182 mm, the height at least 247 mm (Letter): content is sized to fit both. */
  body { max-width: none; padding: 0; font-size: 8.5pt; }
  h2 { break-after: avoid; page-break-after: avoid; }
  h3 { break-after: avoid; page-break-after: avoid; }
  figure, .cautions li, .op-grid, table.chain, .signature, .answer .verdicts { break-inside: avoid; page-break-inside: avoid; }
  .op p { break-after: avoid; page-break-after: avoid; }
  .op { font-size: 8pt; }
  table.ops { font-size: 7.5pt; }
  figure svg { max-height: 200mm; }
  figure.chart svg { max-height: 52mm; }
  /* The appendix lists every check (71 in the demo): one printed page, rows one text line high. */
  table.all-checks { font-size: 6.5pt; line-height: 1.15; margin: .2rem 0 .3rem; }
  table.all-checks td { white-space: nowrap; padding: 0 .3rem; }
  table.all-checks .verdict { border-width: 1px; padding: 0 .25rem; line-height: 1.1; }
  #methods table, #methods ul { font-size: 7.5pt; }
  .op .note { font-size: 7.5pt; margin: .1rem 0; }
  section.answer { break-after: page; page-break-after: always; }
}
)";

}  // namespace

std::string to_html(const Record& r) {
  const auto& ev = r.evaluation;
  const std::string verdict = overall_verdict(r);
  std::string h = "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n";
  h += "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n";
  h += "<title>Evaluation record — " + esc(r.meta.station_name) + "</title>\n";
  h += "<style>" + std::string(kStyle);
  // Running header and footer of the printed record: station, date, page x of y (one line: the
  // demo-report test skips lines carrying the date and time).
  h += "@page { @top-left { content: " + css_string("Evaluation record — " + r.meta.station_name) +
       "; font-size: 8pt; color: #444; } @top-right { content: " + css_string(r.meta.date) +
       "; font-size: 8pt; color: #444; } @bottom-right { content: \"page \" counter(page) \" of \" counter(pages); "
       "font-size: 8pt; color: #444; } @bottom-left { content: " +
       css_string("standoff " + r.meta.tool_version) + "; font-size: 8pt; color: #444; } }\n";
  h += "</style>\n</head>\n<body>\n";

  // ---- Page 1: the answer ----
  h += "<section class=\"answer\" id=\"answer\">\n";
  h += "<h1>RF exposure and installation-safety record — " + esc(r.meta.station_name) + "</h1>\n";
  std::string standards;
  for (const auto& s : r.meta.standards) {
    standards += (standards.empty() ? "" : "; ") + fmt::format("{}, {} ({})", s.document, s.table, s.year);
  }
  h += "<p class=\"meta\">" + esc("Station " + r.meta.station_name + " · evaluated " + r.meta.date + " · limits " + standards) +
       "</p>\n";
  h += "<div class=\"verdicts\" id=\"verdicts-headline\"><span>RF exposure: " + badge(exposure_verdict(r)) +
       "</span><span>Installation: " +
       badge(installation_verdict(r), installation_headline(r).substr(std::string("Installation: ").size())) +
       "</span></div>\n";
  h += "<p class=\"headline\">" + esc(headline_sentence(r)) + "</p>\n";
  const auto fs = findings(r);
  if (!fs.empty()) {
    h += "<h2>Findings and remedies</h2>\n<ol id=\"findings\">\n";
    for (const auto& f : fs) h += "<li>" + esc(f.sentence) + "</li>\n";
    h += "</ol>\n";
  }
  h += "<figure class=\"small\">\n" + site_map_svg(r, false, true) +
       "<figcaption>Site overview (plan, north up). The full map with its legend follows the details.</figcaption>\n"
       "</figure>\n";
  h += "<table class=\"signature\"><tbody>\n<tr><th>Evaluated by</th><td>" +
       (r.meta.evaluated_by.empty() ? std::string() : esc(r.meta.evaluated_by)) + "</td><th>Signature</th><td>" +
       (r.meta.signature.empty() ? std::string() : esc(r.meta.signature)) + "</td><th>Date</th><td></td></tr>\n</tbody></table>\n";
  h += "</section>\n";

  // ---- Details ----
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
  rows.push_back({"RF exposure", badge(exposure_verdict(r))});
  rows.push_back({"Installation", badge(installation_verdict(r), installation_headline(r).substr(std::string("Installation: ").size()))});
  rows.push_back({"Combined verdict", badge(verdict)});
  h += "<section class=\"details\" id=\"title-block\"><h2>Record</h2>\n" + key_value_table(rows) + "</section>\n";

  h += "<section id=\"verdicts\"><h2>Verdict per operation</h2>\n";
  rows.clear();
  bool absurd = false;
  for (const auto& op : ev.operations) {
    const bool e = op.evaluated_anywhere;
    absurd |= op.permitted_pep_w && *op.permitted_pep_w > 100000.0;
    rows.push_back({esc(op.name), esc(fmtx::frequency(op.frequency_hz)), esc(fmtx::power(op.pep_w)),
                    esc(fmtx::power(op.average_power_w)), e ? esc(fmtx::percent_up(op.worst.ratio)) : "not evaluated",
                    e ? esc(fmtx::where(op.worst.at) + ", " + op.worst.zone + " (" + tier_name(op.worst.tier) + ")") : "—",
                    esc(fmtx::permitted_power(op.permitted_pep_w)), badge(exposure::to_string(op.verdict))});
  }
  h += table({"Operation", "Frequency", "PEP", "Average at antenna", "Worst (% of limit)", "Where, zone (tier)",
              "Permitted PEP", "Verdict"},
             rows, "ops");
  h += "<p class=\"note\">Exposure is a percentage of the limit of the tier that applies where it occurs (power "
       "ratio: (E/E<sub>lim</sub>)², (H/H<sub>lim</sub>)² or S/S<sub>lim</sub>). Percentages and distances are "
       "rounded up, permitted power down.";
  if (absurd) h += " " + esc(fmtx::kAbsurdPowerNote);
  h += "</p>\n";
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

  h += "<section id=\"operations\"><h2>Operations</h2>\n<p class=\"note\">Each chart: worst exposure at body height "
       "versus horizontal distance from the antenna, in percent of each tier's limit, with the keep-away distances, "
       "the property line and the nearest neighbour's point marked.</p>\n";
  for (const auto& op : ev.operations) {
    h += "<div class=\"op\" id=\"op-" + slug(op.name) + "\">\n<h3>" + esc(op.name) + " " +
         badge(exposure::to_string(op.verdict)) + "</h3>\n";
    h += "<p>" + esc(fmt::format("Transmitter {}, feed line {}, antenna {}; {}{}. Model: {}. Limits: {}.", op.transmitter,
                                 op.feed_line, op.antenna, fmtx::frequency(op.frequency_hz),
                                 op.group.empty() ? "" : "; group " + op.group, op.method, op.limits_source)) +
         "</p>\n";
    // The power chain as one paragraph of steps (a table of it would take a third of a page).
    h += "<p class=\"chain\"><strong>Power chain:</strong> ";
    for (std::size_t k = 0; k < op.chain.size(); ++k) {
      const auto& st = op.chain[k];
      h += (k > 0 ? " → " : "") + std::string("<span class=\"step\">") + esc(st.label) + " <strong>" +
           esc(fmtx::power(st.power_w)) + "</strong>" + (st.detail.empty() ? "" : " (" + esc(st.detail) + ")") + "</span>";
    }
    h += "</p>\n<div class=\"op-grid\">\n";
    rows.clear();
    if (op.evaluated_anywhere) {
      rows.push_back({"Worst", esc(fmtx::percent_up(op.worst.ratio) + " of the " + tier_name(op.worst.tier) +
                                   " limit (" + op.worst.quantity + ") at " + fmtx::where(op.worst.at) + ", " +
                                   op.worst.zone)});
    } else {
      rows.push_back({"Worst", "not evaluated — measure or use another method"});
    }
    rows.push_back({"Permitted PEP", esc(fmtx::permitted_power(op.permitted_pep_w))});
    rows.push_back({"Keep-away, screening",
                    esc("C " + fmtx::length_up(op.screening_distance.controlled_m, r.units) + " · U " +
                        fmtx::length_up(op.screening_distance.uncontrolled_m, r.units))});
    rows.push_back({"Keep-away, detailed",
                    esc("C " + fmtx::length_up(op.detailed_distance.controlled_m, r.units) + " · U " +
                        fmtx::length_up(op.detailed_distance.uncontrolled_m, r.units))});
    if (op.not_evaluated_count > 0) {
      rows.push_back({"Not evaluated", esc(fmt::format(
                                           "{} place(s) too close for the model — measure or use another method",
                                           op.not_evaluated_count))});
    }
    for (const auto& p : op.points) {
      rows.push_back({esc(p.name + (p.tier == limits::Tier::controlled ? " (C)" : " (U)")),
                      p.evaluated ? esc(fmtx::percent_up(p.ratio) + " at " + fmtx::where(p.at))
                                  : esc("not evaluated — " + p.reason)});
    }
    h += "<div>" + key_value_table(rows, "kv") + "</div>\n";
    if (!op.ratio_vs_distance.empty()) {
      h += "<figure class=\"chart\">\n" + ratio_chart_svg(op, false, chart_marks(r, op)) + "</figure>\n";
    }
    h += "</div>\n";
    const auto remedies = exposure::operation_remedies(op);
    if (!op.notes.empty() || !remedies.empty()) {
      h += "<ul class=\"note\">\n";
      for (const auto& rm : remedies) h += "<li>Remedy: " + esc(rm.text) + "</li>\n";
      for (const auto& n : op.notes) h += "<li>" + esc(n) + "</li>\n";
      h += "</ul>\n";
    }
    h += "</div>\n";
  }
  h += "</section>\n";

  h += "<section class=\"map\" id=\"map\"><h2>Site map</h2>\n<figure>\n" + site_map_svg(r, false) +
       "<figcaption>Contours show where the worst case over all operations (and the sum over each group) reaches "
       "100 % (solid) and 50 % (dashed) of the controlled (C, blue) and uncontrolled (U, vermillion) limits at body "
       "height. Hatched grey cells were not evaluated — measure there or use another method.</figcaption>\n"
       "</figure>\n</section>\n";

  h += "<section id=\"power-lines\"><h2>Installation near power lines</h2>\n";
  if (r.lines) {
    rows.clear();
    for (const auto& c : r.lines->checks) {
      if (c.pass) continue;
      rows.push_back({esc(c.rule), esc(c.subject), esc(c.line), esc(fmtx::check_required(c, r.units)),
                      esc(fmtx::check_actual(c, r.units)), badge("fail"), esc(c.note)});
    }
    if (!rows.empty()) {
      h += "<h3>Failed checks</h3>\n" +
           table({"Check", "Subject", "Power line", "Required", "Actual", "Result", "Note"}, rows, "fails");
    }
    rows.clear();
    for (const auto& s : rule_summaries(r)) {
      rows.push_back({esc(s.rule), s.failed > 0 ? badge("fail", fmt::format("{} FAIL", s.failed)) : "",
                      s.passed > 0 ? badge("pass", fmt::format("{} PASS", s.passed)) : "", esc(s.source)});
    }
    h += "<h3>Checks by rule</h3>\n" + table({"Rule", "Failed", "Passed", "Source (cited once per rule)"}, rows, "rules");
    h += "<p class=\"note\">Every check, passed or failed, is listed in the appendix and in report.json.</p>\n";
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

  if (r.placement) h += r.placement->html_section;  // issue 10: `evaluate --place`

  h += "<section id=\"cautions\"><h2>Cautions</h2>\n<div class=\"cautions\"><ul>\n";
  for (const auto& c : all_cautions(r)) h += "<li><strong>Caution:</strong> " + esc(c) + "</li>\n";
  h += "</ul></div>\n</section>\n";

  h += "<section id=\"methods\"><h2>Assumptions and methods</h2>\n<ul>\n";
  if (!ev.body_rule.empty()) h += "<li>Body line: " + esc(ev.body_rule) + "</li>\n";
  h += "<li>" + esc(fmt::format("Zone grid spacing: {} m.", ev.grid_spacing_m)) + "</li>\n";
  for (const auto& a : r.assumptions) h += "<li>" + esc(a) + "</li>\n";
  h += "</ul>\n";
  rows.clear();
  for (const auto& ref : r.references) rows.push_back({esc(ref.topic), esc(ref.source)});
  h += table({"Topic", "Method and source"}, rows);
  h += "</section>\n";

  if (r.lines && !r.lines->checks.empty()) {
    rows.clear();
    for (const auto& c : r.lines->checks) {
      rows.push_back({esc(c.rule), esc(c.subject), esc(c.line), esc(fmtx::check_required(c, r.units)),
                      esc(fmtx::check_actual(c, r.units)), badge(c.pass ? "pass" : "fail")});
    }
    h += "<section class=\"appendix\" id=\"appendix-checks\"><h2>Appendix: every installation check</h2>\n" +
         table({"Check", "Subject", "Power line", "Required", "Actual", "Result"}, rows, "all-checks") +
         "<p class=\"note\">Sources per rule are in “Checks by rule” above.</p>\n</section>\n";
  }
  h += "</body>\n</html>\n";
  return h;
}

}  // namespace standoff::report
