// The report writers: contract keys of the JSON record, "not evaluated" as null, self-contained
// HTML, well-formed SVG (strict checker in xml_check.hpp), contours on the map at the closed-form
// radii, colour only when asked, directed rounding, slugs, and the all-or-nothing file staging.
#include <catch2/catch.hpp>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <numbers>
#include <sstream>

#include "fixture.hpp"
#include "report/findings.hpp"
#include "report/format.hpp"
#include "report/svg.hpp"
#include "report/writers.hpp"
#include "xml_check.hpp"

using namespace standoff::report;
using standoff::report::test::synthetic_record;
namespace fs = std::filesystem;
using standoff::limits::Tier;

TEST_CASE("the strict XML checker refuses what is not well-formed", "[report][xml]") {
  // W3C XML 1.0 well-formedness constraints: element type match, unique attributes, quoted values,
  // references to declared entities only, a single root.
  CHECK_FALSE(test::xml_well_formed("<svg><g></g></svg>"));
  CHECK_FALSE(test::xml_well_formed("<?xml version=\"1.0\"?>\n<svg a=\"1&amp;2\"><t>x &lt; y &#233;</t></svg>\n"));
  const auto bad = GENERATE(as<std::string>{}, "<svg><g></svg>", "<svg a=1></svg>", "<svg a=\"1\" a=\"2\"/>",
                            "<svg>&nbsp;</svg>", "<svg>a & b</svg>", "<svg/><svg/>", "<svg><g>", "text<svg/>",
                            "<svg a=\"<\"/>", "<svg a=\"1\"b=\"2\"/>");
  INFO(bad);
  CHECK(test::xml_well_formed(bad).has_value());
}

TEST_CASE("JSON record carries the evaluate --json contract keys", "[report][json]") {
  const Record r = synthetic_record();
  const auto j = to_json(r);
  CHECK(j.at("schema_version") == kSchemaVersion);
  // Overall verdict: exposure exceeds in the fixture.
  CHECK(j.at("verdict") == "exceeds");
  REQUIRE(j.at("operations").size() == 2);
  const auto& op = j.at("operations")[0];
  // Issue 5 contract: every key present.
  for (const char* key : {"name", "frequency_hz", "pep_w", "average_power_w", "max_ratio", "max_at", "zone", "tier",
                          "permitted_pep_w", "screening_distance_m", "detailed_distance_m", "method", "notes"}) {
    INFO(key);
    CHECK(op.contains(key));
  }
  CHECK(op.at("max_at").at("x_m") == 21.0);
  CHECK(op.at("screening_distance_m").at("uncontrolled") == 9.33);
  CHECK(op.at("detailed_distance_m").at("controlled") == 3.2);
  CHECK(op.at("tier") == "uncontrolled");
  // A place that could not be evaluated is null, never a number.
  const auto& ne = j.at("operations")[1];
  CHECK(ne.at("max_ratio").is_null());
  CHECK(ne.at("max_at").is_null());
  CHECK(ne.at("permitted_pep_w").is_null());
  CHECK(ne.at("detailed_distance_m").at("controlled").is_null());
  CHECK(op.at("points")[1].at("ratio").is_null());
  CHECK(op.at("ratio_vs_distance")[0].at("ratio_uncontrolled").is_null());
  // Issue 6 contract for the clearance checks.
  const auto& checks = j.at("power_lines").at("checks");
  REQUIRE(checks.size() == 2);
  for (const char* key : {"rule", "source", "subject", "line", "required_m", "actual_m", "pass", "note"}) {
    CHECK(checks[0].contains(key));
  }
  CHECK(j.at("power_lines").at("verdict") == "fail");
  CHECK(j.at("evaluated_by") == "");
  CHECK(j.at("signature") == "");
  CHECK(j.at("cautions").size() >= 5);
}

TEST_CASE("a failed clearance check makes the overall verdict exceed", "[report][json]") {
  Record r = synthetic_record();
  r.evaluation.verdict = standoff::exposure::Verdict::within;
  CHECK(overall_verdict(r) == "exceeds");
  r.lines->checks[1].pass = true;
  CHECK(overall_verdict(r) == "within");
}

TEST_CASE("the site map draws the 100 % and 50 % contours at the closed-form radii", "[report][svg]") {
  // Synthetic field ratio = (r100/r)² (fixture.hpp): the uncontrolled 100 % contour is the circle
  // r = r100, the 50 % contour r = r100·√2; the controlled layer is 0.45× so its 100 % contour is
  // r100·√0.45 and its 50 % contour r100·√0.9. Grid 0.5 m: allow h²/r + 1 % (interpolation error).
  const Record r = synthetic_record();
  const auto contours = map_contours(r.evaluation);
  struct Expect {
    standoff::limits::Tier tier;
    double level;
    double radius;
  };

  const double r100 = test::kR100;
  for (const Expect e : {Expect{Tier::uncontrolled, 1.0, r100}, Expect{Tier::uncontrolled, 0.5, r100 * std::sqrt(2.0)},
                         Expect{Tier::controlled, 1.0, r100 * std::sqrt(0.45)},
                         Expect{Tier::controlled, 0.5, r100 * std::sqrt(0.9)}}) {
    int found = 0;
    for (const auto& c : contours) {
      if (c.tier != e.tier || c.level != e.level) continue;
      ++found;
      CHECK(c.line.closed);
      for (const auto& p : c.line.points) {
        CHECK(std::hypot(p.x_m - test::kCx, p.y_m - test::kCy) == Approx(e.radius).margin(0.25 / e.radius + 0.01 * e.radius));
      }
    }
    CHECK(found == 1);
  }
}

TEST_CASE("group sums enter the map's worst case", "[report][svg]") {
  // Two operations in one group, each half of the synthetic field: alone each peaks at 50 %, so the
  // 100 % contour exists only because their sum counts (47 CFR 1.1307(b)(5)).
  Record r = synthetic_record();
  auto& g = r.evaluation.grids[0];
  auto half = g.layers[0];
  for (auto& v : half.ratio_uncontrolled) v *= 0.5;
  for (auto& v : half.ratio_controlled) v *= 0.5;
  g.layers = {half, half};
  g.layers[0].operation = "a";
  g.layers[1].operation = "b";
  const Grid alone = envelope_grid(r.evaluation, g, Tier::uncontrolled);
  r.evaluation.groups.push_back({"together", {"a", "b"}, true, {}, standoff::exposure::Verdict::exceeds, {}});
  const Grid summed = envelope_grid(r.evaluation, g, Tier::uncontrolled);
  const std::size_t k = 30 * 81 + 52;  // node (26 m, 15 m): 6 m from the antenna, ratio exactly 1 in total
  CHECK(alone.values[k] == Approx(0.5).epsilon(1e-12));
  CHECK(summed.values[k] == Approx(1.0).epsilon(1e-12));
}

TEST_CASE("every SVG is well-formed and the HTML is self-contained", "[report][svg][html]") {
  const Record r = synthetic_record();
  const auto files = report_files(r);
  std::set<std::string> names;
  for (const auto& [name, content] : files) {
    names.insert(name);
    if (name.ends_with(".svg")) {
      INFO(name);
      const auto err = test::xml_well_formed(content);
      CHECK_FALSE(err);
      if (err) WARN(*err);
    }
  }
  CHECK(names.count("report.html"));
  CHECK(names.count("report.md"));
  CHECK(names.count("report.json"));
  CHECK(names.count("site-map.svg"));
  CHECK(names.count("chart-20-m-ssb.svg"));
  CHECK_FALSE(names.count("chart-2-m-fm.svg"));  // no samples, no chart

  const std::string html = to_html(r);
  // No external resources: no scripts, links, images by URL, imports or url() other than #fragments.
  CHECK(html.find("<script") == std::string::npos);
  CHECK(html.find("<link") == std::string::npos);
  CHECK(html.find("<img") == std::string::npos);
  CHECK(html.find("@import") == std::string::npos);
  CHECK(html.find("src=") == std::string::npos);
  CHECK(html.find("href=") == std::string::npos);
  // Every url() refers to a fragment of the page itself (an SVG pattern).
  for (std::size_t at = html.find("url("); at != std::string::npos; at = html.find("url(", at + 4)) {
    CHECK(html[at + 4] == '#');
  }
  // Every http(s) URL is the SVG namespace name, which is an identifier, not fetched.
  for (const char* scheme : {"http://", "https://"}) {
    for (std::size_t at = html.find(scheme); at != std::string::npos; at = html.find(scheme, at + 1)) {
      const std::size_t end = html.find_first_of("\"' <)", at);
      CHECK(html.substr(at, end - at) == "http://www.w3.org/2000/svg");
    }
  }
  CHECK(html.find("id=\"site-map\"") != std::string::npos);
  CHECK(html.find("@media print") != std::string::npos);
  // Escaping of the station name.
  CHECK(html.find("Test Station &lt;A&amp;B&gt;") != std::string::npos);
  CHECK(html.find("<A&B>") == std::string::npos);
  // Content required by issue 7.
  for (const char* text : {"Verdict per operation", "Power chain", "Permitted PEP", "Keep-away, screening",
                           "Keep-away, detailed", "Installation near power lines", "Findings and remedies",
                           "RF exposure:", "Installation:", "Checks by rule", "Appendix: every installation check", "Assumptions and methods", "Cautions",
                           "RF burns", "power line", "falls", "lightning", "local codes", "Evaluated by", "Signature",
                           "SHA-256", "confidence: confirmed"}) {
    INFO(text);
    CHECK(html.find(text) != std::string::npos);
  }
}

TEST_CASE("Markdown never passes station text through as HTML", "[report][markdown]") {
  const std::string md = to_markdown(synthetic_record());
  CHECK(md.find("Test Station &lt;A&B&gt;") != std::string::npos);
  CHECK(md.find("<A&B>") == std::string::npos);
  CHECK(md.find("a note with | pipe") != std::string::npos);      // a list item keeps its pipe
  CHECK(md.find("![Site map") != std::string::npos);
  CHECK(md.find("(chart-20-m-ssb.svg)") != std::string::npos);
}

TEST_CASE("the site map shows every kind of site element", "[report][svg]") {
  const std::string svg = site_map_svg(synthetic_record(), true);
  for (const char* id : {"sm-zones", "sm-buildings", "sm-boundary", "sm-fall-zones", "sm-contours", "sm-power-lines",
                         "sm-antennas", "sm-supports", "sm-points", "sm-north", "sm-scale", "sm-legend",
                         "sm-not-evaluated"}) {
    INFO(id);
    CHECK(svg.find(std::string("id=\"") + id + "\"") != std::string::npos);
  }
  // Contours are labelled by percentage of the limit and tier.
  CHECK(svg.find(">100 % U<") != std::string::npos);
  CHECK(svg.find(">50 % C<") != std::string::npos);
  // The fall-zone circle has the support's radius at the map's scale: the scale is read from the
  // scale bar (its width in px and its label in metres).
  auto attr_after = [&](std::size_t from, const std::string& name) {
    const std::size_t at = svg.find(name + "=\"", from) + name.size() + 2;
    return std::stod(svg.substr(at, svg.find('"', at) - at));
  };
  const std::size_t bar = svg.find("<g id=\"sm-scale\">");
  REQUIRE(bar != std::string::npos);
  const double bar_px = attr_after(bar, "width");
  const std::size_t text_end = svg.find(" m</text>", bar);
  const std::size_t text_start = svg.rfind('>', text_end) + 1;
  const double bar_m = std::stod(svg.substr(text_start, text_end - text_start));
  const std::size_t circle = svg.find("<circle", svg.find("<g id=\"sm-fall-zones\">"));
  REQUIRE(circle != std::string::npos);
  CHECK(attr_after(circle, "r") / (bar_px / bar_m) == Approx(15.0).margin(0.02));  // SVG numbers carry 2 decimals
}

TEST_CASE("terminal text uses colour only when asked", "[report][text]") {
  const Record r = synthetic_record();
  std::ostringstream plain, coloured;
  write_text(r, plain, {false});
  write_text(r, coloured, {true});
  CHECK(plain.str().find('\x1b') == std::string::npos);
  CHECK(coloured.str().find("\x1b[1;31mEXCEEDS\x1b[0m") != std::string::npos);
  CHECK(plain.str().find("EXCEEDS") != std::string::npos);
  CHECK(plain.str().find("not evaluated") != std::string::npos);
  // no-color.org: colour only on a terminal, and never when NO_COLOR is set to a non-empty value.
  CHECK(use_colour(true, nullptr));
  CHECK(use_colour(true, ""));
  CHECK_FALSE(use_colour(true, "1"));
  CHECK_FALSE(use_colour(false, nullptr));
}

TEST_CASE("text tables are aligned by characters, not bytes", "[report][text]") {
  standoff::report::fmtx::TextTable t;
  t.header = {"a", "b"};
  t.rows = {{"µ§²", "x"}, {"abcd", "y"}};
  const std::string s = t.render();
  // Column b starts at the same character column on each row: 4 (widest a) + 2 spaces.
  std::istringstream in(s);
  std::string line;
  std::getline(in, line);
  std::getline(in, line);
  std::getline(in, line);
  CHECK(line == "µ§²   x");
  std::getline(in, line);
  CHECK(line == "abcd  y");
}

TEST_CASE("directed rounding: distances up, power down, ratios up", "[report][rounding]") {
  // Closed form by hand: ceil to 0.1 m, floor to 3 significant figures, ceil to 0.1 %.
  CHECK(round_distance_up(3.21) == Approx(3.3).epsilon(1e-12));
  CHECK(round_distance_up(3.2) == Approx(3.2).epsilon(1e-12));   // already on the grid: unchanged
  CHECK(round_distance_up(12.3) == Approx(12.3).epsilon(1e-12));
  CHECK(round_power_down(706.49) == Approx(706.0).epsilon(1e-12));
  CHECK(round_power_down(1234.5) == Approx(1230.0).epsilon(1e-12));
  CHECK(round_power_down(87.69) == Approx(87.6).epsilon(1e-12));
  CHECK(round_power_down(1500.0) == Approx(1500.0).epsilon(1e-12));
  CHECK(round_distance_up(-1e-17) == 0.0);  // no distance needed is 0.0 m, never "-0.0 m"
  CHECK(standoff::report::fmtx::distance_up(-0.0) == "0.0 m");
  CHECK(round_percent_up(2.1234) == Approx(212.4).epsilon(1e-12));
  CHECK(round_percent_up(0.5) == Approx(50.0).epsilon(1e-12));
  CHECK(standoff::report::fmtx::distance_down(2.99) == "2.9 m");
  CHECK(standoff::report::fmtx::distance_up(std::nullopt) == "not evaluated");
}

TEST_CASE("slugs for the default report directory", "[report][slug]") {
  CHECK(slug("Demo Station (north garden)") == "demo-station-north-garden");
  CHECK(slug("  --Ümlaut Site-- ") == "mlaut-site");
  CHECK(slug("../../etc") == "etc");
  CHECK(slug("***") == "station");
  CHECK(chart_file_name("20 m SSB") == "chart-20-m-ssb.svg");
}

namespace {
fs::path fresh_dir(const std::string& tag) {
  const fs::path d = fs::temp_directory_path() / ("standoff-report-" + tag + "-" + std::to_string(::getpid()));
  fs::remove_all(d);
  return d;
}
std::string slurp(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  return std::string(std::istreambuf_iterator<char>(in), {});
}
}  // namespace

TEST_CASE("write_report writes every file and leaves no temporary", "[report][files]") {
  const fs::path dir = fresh_dir("ok");
  const Record r = synthetic_record();
  // A stale chart from an operation no longer in the station must go.
  fs::create_directories(dir);
  { std::ofstream(dir / "chart-old-operation.svg") << "<svg/>"; }
  const auto written = write_report(r, dir / ".." / dir.filename());
  CHECK(written.size() == report_files(r).size());
  CHECK(slurp(dir / "report.json").find("\"schema_version\": 1") != std::string::npos);
  CHECK(slurp(dir / "site-map.svg").rfind("<?xml", 0) == 0);
  CHECK_FALSE(fs::exists(dir / "chart-old-operation.svg"));
  for (const auto& e : fs::directory_iterator(dir)) CHECK(e.path().filename().string().rfind(".tmp", 0) != 0);
  fs::remove_all(dir);
}

TEST_CASE("a failure while staging leaves the old report untouched and no partial files", "[report][files]") {
  const fs::path dir = fresh_dir("fail");
  fs::create_directories(dir);
  { std::ofstream(dir / "a.txt") << "old a"; }
  // The staging name of b.txt is taken by a directory, so writing it fails after a.txt was staged.
  fs::create_directories(dir / ".tmp-b.txt");
  CHECK_THROWS_AS(write_files_atomically(dir, {{"a.txt", "new a"}, {"b.txt", "new b"}}), standoff::InputError);
  CHECK(slurp(dir / "a.txt") == "old a");
  CHECK_FALSE(fs::exists(dir / "b.txt"));
  CHECK_FALSE(fs::exists(dir / ".tmp-a.txt"));
  // A final name taken by a directory is found before anything is renamed.
  fs::remove_all(dir / ".tmp-b.txt");
  fs::create_directories(dir / "b.txt");
  CHECK_THROWS_AS(write_files_atomically(dir, {{"a.txt", "new a"}, {"b.txt", "new b"}}), standoff::InputError);
  CHECK(slurp(dir / "a.txt") == "old a");
  CHECK_FALSE(fs::exists(dir / ".tmp-a.txt"));
  CHECK_FALSE(fs::exists(dir / ".tmp-b.txt"));
  // Names with a path are refused.
  CHECK_THROWS_AS(write_files_atomically(dir, {{"../x.txt", "x"}}), standoff::InputError);
  fs::remove_all(dir);
}

TEST_CASE("an output directory that cannot be created is bad input", "[report][files]") {
  const fs::path dir = fresh_dir("file");
  fs::create_directories(dir);
  { std::ofstream(dir / "plain") << "x"; }
  CHECK_THROWS_AS(write_report(synthetic_record(), dir / "plain" / "sub"), standoff::InputError);
  fs::remove_all(dir);
}

// ---- issue 13: the two verdicts, finding sentences, the terminal summary, numbers for people ----

TEST_CASE("the two verdicts are kept apart and combined", "[report][verdicts]") {
  auto r = synthetic_record();  // exposure exceeds, one of two clearance checks fails
  CHECK(exposure_verdict(r) == "exceeds");
  CHECK(installation_verdict(r) == "fail");
  CHECK(exposure_headline(r) == "RF exposure: EXCEEDS");
  CHECK(installation_headline(r) == "Installation: FAIL (1 of 2 checks)");
  const auto j = to_json(r);
  CHECK(j.at("exposure_verdict") == "exceeds");
  CHECK(j.at("installation_verdict") == "fail");
  CHECK(j.at("verdict") == "exceeds");
  CHECK(j.at("installation_failures") == 1);

  r.evaluation.verdict = standoff::exposure::Verdict::within;
  r.lines->checks[1].pass = true;
  CHECK(exposure_headline(r) == "RF exposure: WITHIN LIMITS");
  CHECK(installation_headline(r) == "Installation: PASS (2 checks)");
  CHECK(to_json(r).at("installation_verdict") == "pass");
  CHECK(overall_verdict(r) == "within");
  r.lines.reset();
  CHECK(installation_verdict(r) == "not checked");
  CHECK(to_json(r).at("installation_verdict") == "not checked");
  // Every written form says both.
  r = synthetic_record();
  std::ostringstream text;
  write_text(r, text, {});
  for (const std::string& form : {text.str(), to_markdown(r), to_html(r)}) {
    CHECK(form.find("RF exposure") != std::string::npos);
    CHECK(form.find("EXCEEDS") != std::string::npos);
    CHECK(form.find("Installation") != std::string::npos);
    CHECK(form.find("FAIL") != std::string::npos);
  }
}

TEST_CASE("one sentence per finding: what, where, how much, remedy", "[report][findings]") {
  auto r = synthetic_record();
  r.units = UnitSystem::metric;
  const auto fs = findings(r);
  // The exceeding operation (the not-evaluated one is a finding too) and the failed check.
  REQUIRE(fs.size() == 3);
  const std::string& exp = fs[0].sentence;
  CHECK(exp.find("20 m SSB") == 0);
  CHECK(exp.find("212.4 %") != std::string::npos);               // how much: 2.1234 rounded up to 0.1 %
  CHECK(exp.find("(21.0, 15.0, 1.0) m") != std::string::npos);   // where
  CHECK(exp.find("3.2 m") != std::string::npos);                 // detailed keep-away, controlled
  CHECK(exp.find("8.7 m") != std::string::npos);                 // detailed keep-away, uncontrolled
  CHECK(exp.find("706 W") != std::string::npos);                 // permitted PEP, rounded down
  CHECK(fs[1].sentence.find("not be evaluated") != std::string::npos);
  const std::string& inst = fs[2].sentence;
  CHECK_FALSE(fs[2].exposure);
  CHECK(inst.find("Standing clearance: the wire can come within 2.9 m of the L1 where at least 3.1 m is required "
                  "(NFPA 70 810.13)") == 0);
  CHECK(inst.find("re-tension") != std::string::npos);  // the generic remedy for the rule
  // A computed remedy replaces the generic one of the finding about the same subject, and one for
  // an operation is appended to its sentence.
  r.remedies = {{"wire", "raise the wire's lowest point to 8.2 m."}, {"20 m SSB", "or move the antenna 4 m north"}};
  const auto fs2 = findings(r);
  CHECK(fs2[2].sentence.find("raise the wire's lowest point to 8.2 m.") != std::string::npos);
  CHECK(fs2[2].sentence.find("re-tension") == std::string::npos);
  CHECK(fs2[0].sentence.find("or move the antenna 4 m north.") != std::string::npos);
  // Feet beside metres when asked (the approach distance is a rule in feet).
  r.units = UnitSystem::both;
  CHECK(findings(r)[2].sentence.find("3.1 m (10.1 ft)") != std::string::npos);  // 3.05 m, rounded up in each unit
}

TEST_CASE("remedies differing only by the power line merge; nothing left between them is said plainly",
          "[report][findings]") {
  auto r = synthetic_record();
  r.units = UnitSystem::metric;
  // The failed check against L1, and the same rule and subject against L2, with nothing left between them.
  r.lines->checks[1].actual_m = 0.0;
  auto twin = r.lines->checks[1];
  twin.line = "L2";
  r.lines->checks.push_back(twin);
  r.remedies = {{"wire / standing clearance", "move it 3.05 m further from \"L1\"."},
                {"wire / standing clearance", "move it 3.05 m further from \"L2\"."}};
  const auto fs = findings(r);
  REQUIRE(fs.size() == 3);
  const std::string& inst = fs[2].sentence;
  CHECK(inst.find("Standing clearance: the wire can reach the L1 and the L2 where at least 3.1 m is required "
                  "(NFPA 70 810.13); move it 3.05 m further from \"L1\" and \"L2\".") == 0);
  CHECK(inst.find("0.0 m") == std::string::npos);
  CHECK(fs[2].brief.find("(NFPA 70 810.13)") == std::string::npos);  // the summary's form leaves the source out
  CHECK(headline_sentence(r).find("reaching them where 3.1 m is required") != std::string::npos);
  // Three lines: "A", "B" and "C"; a remedy worded otherwise stays a clause of its own.
  r.remedies.push_back({"wire / standing clearance", "move it 3.05 m further from \"L3\"."});
  r.remedies.push_back({"wire / standing clearance", "or lower it 1 m from \"L3\"."});
  CHECK(findings(r)[2].sentence.find("further from \"L1\", \"L2\" and \"L3\"; or lower it 1 m from \"L3\".") !=
        std::string::npos);
}

TEST_CASE("the terminal summary folds to the width and --verbose keeps the detail", "[report][text]") {
  const auto r = synthetic_record();
  for (const std::size_t width : {100u, 60u, 40u}) {
    std::ostringstream out;
    TextOptions o;
    o.width = width;
    write_text(r, out, o);
    std::istringstream in(out.str());
    for (std::string line; std::getline(in, line);) {
      INFO(width << ": " << line);
      CHECK(fmtx::display_width(line) <= width);
    }
  }
  std::ostringstream verbose;
  TextOptions v;
  v.verbose = true;
  write_text(r, verbose, v);
  CHECK(verbose.str().find("duty factor (SSB, 20 %)") != std::string::npos);  // every power-chain step
  CHECK(text_width("72") == 72);
  CHECK(text_width("") == 100);
  CHECK(text_width("250") == 100);
  CHECK(text_width("abc") == 100);
}

TEST_CASE("wrapping never cuts a word and keeps the indents", "[report][text]") {
  const std::string w = fmtx::wrap("alpha beta gamma delta", 12, "* ", "  ");
  CHECK(w == "* alpha beta\n  gamma\n  delta\n");
  CHECK(fmtx::wrap("averyveryverylongword x", 8, "", "") == "averyveryverylongword\nx\n");
}

TEST_CASE("numbers for people", "[report][numbers]") {
  CHECK(fmtx::power(1500) == "1500 W");
  CHECK(fmtx::power(92400) == "92.4 kW");
  CHECK(fmtx::power(12300) == "12.3 kW");
  CHECK(fmtx::permitted_power(603000.0) == "more than 100 kW");
  CHECK(fmtx::permitted_power(6.519) == "6.51 W");  // rounded down
  CHECK(fmtx::percent_up(230.132) == "23 014 %");
  CHECK(fmtx::percent_up(2.1234) == "212.4 %");
  CHECK(fmtx::voltage(240) == "240 V");
  CHECK(fmtx::voltage(7200) == "7.2 kV");
  // 10 ft = 3.048 m exactly (NIST SP 811, international foot): up and down to 0.1 ft.
  CHECK(fmtx::length_up(3.048, UnitSystem::both) == "3.1 m (10.0 ft)");
  CHECK(fmtx::length_up(3.048, UnitSystem::imperial) == "10.0 ft");
  CHECK(fmtx::length_down(3.06, UnitSystem::both) == "3.0 m (10.0 ft)");
  CHECK(fmtx::length_up(3.048, UnitSystem::metric) == "3.1 m");
  // No exponent notation in any text output of the record.
  auto r = synthetic_record();
  r.evaluation.operations[0].permitted_pep_w = 4.2e9;
  std::ostringstream text;
  write_text(r, text, {});
  for (const std::string& form : {text.str(), to_markdown(r)}) {
    CHECK(form.find("e+") == std::string::npos);
    CHECK(form.find("more than 100 kW") != std::string::npos);
  }
}

TEST_CASE("cautions are said once each, gravest first", "[report][cautions]") {
  auto r = synthetic_record();
  r.lines->cautions = {"Call the utility before any work near overhead lines: have them confirm the voltage.",
                       "Assume every overhead line is energised and uninsulated, including service drops.",
                       "Sag grows with heat, ice and wind."};
  r.evaluation.cautions = {"Fields are computed without buildings in them."};
  r.cautions = all_cautions(r);
  const auto c = all_cautions(r);  // a second pass over its own output adds nothing
  CHECK(c.size() == r.cautions.size());
  CHECK(c.front().find("Overhead power lines kill") == 0);  // electrocution first
  CHECK(c[1].find("RF burns") != std::string::npos);
  std::size_t utility = 0;
  for (const auto& s : c) utility += s.find("Call the utility") != std::string::npos ? 1 : 0;
  CHECK(utility == 1);
  const auto pos = [&](const char* key) {
    return std::find_if(c.begin(), c.end(), [&](const std::string& s) { return s.find(key) != std::string::npos; }) - c.begin();
  };
  CHECK(pos("Sag grows") < pos("Fields are computed"));  // physical harm before the model's caveats
  CHECK(pos("local codes") == static_cast<long>(c.size()) - 1);
}

TEST_CASE("map labels do not overlap and the map shows lines, wires, worst points and failures", "[report][svg]") {
  LabelPlacer p;
  const auto a = p.place("first label", 10, {{100, 100, "start"}});
  const auto b = p.place("second label", 10, {{105, 100, "start"}, {100, 120, "start"}});
  CHECK(a == 0);
  CHECK(b == 1);  // the first candidate overlaps the first label
  CHECK_FALSE(p.boxes()[0].overlaps(p.boxes()[1]));

  auto r = synthetic_record();
  r.map.spans.push_back({"wire", "antenna", {12, 15, 10}, {28, 15, 10}});
  r.map.spans.push_back({"feeder", "feed_line", {20, 15, 10}, {5, 5, 3}});
  const std::string svg = site_map_svg(r, true);
  CHECK(svg.find("id=\"sm-power-lines\"") != std::string::npos);
  CHECK(svg.find("class=\"approach\"") != std::string::npos);   // approach distance band around L1
  CHECK(svg.find("L1 — 7.2 kV, 8 m") != std::string::npos);    // labelled with voltage and height
  CHECK(svg.find("stroke-dasharray=\"7 3\"") != std::string::npos);  // the feed line span
  CHECK(svg.find("id=\"sm-worst\"") != std::string::npos);
  CHECK(svg.find("FAIL standing clearance: wire") != std::string::npos);
  CHECK(svg.find("origin (0, 0)") != std::string::npos);
  CHECK(svg.find(" ft</text>") != std::string::npos);          // scale bar in feet too
  CHECK(svg.find("id=\"sm-title-block\"") != std::string::npos);
  // Fall zones outlined (never filled) in a hue no contour uses.
  const auto fz = svg.substr(svg.find("id=\"sm-fall-zones\""), 400);
  CHECK(fz.find("fill=\"none\"") != std::string::npos);
  CHECK(fz.find(palette::bluish_green) != std::string::npos);
  CHECK_FALSE(test::xml_well_formed(svg));
}

TEST_CASE("a 10 % contour appears when nothing reaches 50 %", "[report][svg]") {
  auto r = synthetic_record();
  for (auto& g : r.evaluation.grids) {
    for (auto& l : g.layers) {
      for (auto& v : l.ratio_controlled) v *= 0.01;  // peak 36 × 0.01 < 50 %
      for (auto& v : l.ratio_uncontrolled) v *= 0.01;
    }
  }
  const auto cs = map_contours(r.evaluation);
  REQUIRE_FALSE(cs.empty());
  for (const auto& c : cs) CHECK(c.level == Approx(0.1));
}

TEST_CASE("charts mark the keep-away distances, the property line and the neighbour, with a feet axis", "[report][svg]") {
  const auto r = synthetic_record();
  const auto marks = chart_marks(r, r.evaluation.operations[0]);
  REQUIRE(marks.property_line_m);
  CHECK(*marks.property_line_m == Approx(15.0));  // antenna at (20, 15) in a 40 × 30 m boundary
  REQUIRE(marks.neighbour_m);
  CHECK(*marks.neighbour_m == Approx(std::hypot(15.0, 10.0)));
  const std::string svg = ratio_chart_svg(r.evaluation.operations[0], true, marks);
  CHECK(svg.find("property line 15.0 m") != std::string::npos);
  CHECK(svg.find("window 18.1 m") != std::string::npos);
  CHECK(svg.find("keep-away, controlled 3.2 m") != std::string::npos);
  CHECK(svg.find("(ft)") != std::string::npos);
  CHECK_FALSE(test::xml_well_formed(svg));
}

TEST_CASE("the chart's axis title never meets its tick labels", "[report][svg]") {
  auto op = synthetic_record().evaluation.operations[0];
  for (auto& smp : op.ratio_vs_distance) {
    if (smp.ratio_uncontrolled) smp.ratio_uncontrolled = *smp.ratio_uncontrolled * 1e4;
  }
  const std::string svg = ratio_chart_svg(op, true);
  const std::string widest = ">100 000 000 %</text>";  // the top decade: 36 × 10^4 → 10^8 %
  const auto at = svg.find(widest);
  REQUIRE(at != std::string::npos);
  const auto x_at = svg.rfind("x=\"", at);
  const double x_end = std::stod(svg.substr(x_at + 3));
  // Right-aligned at x_end; about 0.6 em a character at 11 px (the placer's estimate). The rotated
  // title is centred at x = 14 with 11 px text: it reaches x = 20.
  const double x_start = x_end - 0.6 * 11.0 * 13.0;
  CHECK(x_start > 20.0);
}
