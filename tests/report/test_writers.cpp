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
  for (const char* text : {"Verdict per operation", "Power chain", "Permitted PEP", "Screening distance",
                           "Detailed distance", "Power-line clearances", "Assumptions and methods", "Cautions",
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
