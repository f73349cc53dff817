// `standoff demo`, `standoff evaluate docs/examples/demo-station.toml --json` and `standoff field`
// through run() in-process: the JSON contract of issue 5 (verdict, operations[] with name,
// frequency_hz, pep_w, average_power_w, max_ratio, max_at {x_m,y_m,z_m}, zone, tier,
// permitted_pep_w, screening_distance_m and detailed_distance_m {controlled, uncontrolled}, method,
// notes), exit codes per DESIGN.md, demo == evaluate of the same file, and the demo's finding.
#include <unistd.h>

#include <catch2/catch.hpp>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>

#include "cli/run.hpp"
#include "cli_support.hpp"

using nlohmann::json;

namespace {

using standoff::test::run_cli;

const std::string kDemoFile = std::string(STANDOFF_SOURCE_DIR) + "/docs/examples/demo-station.toml";

std::filesystem::path demo_out_dir() {
  return std::filesystem::temp_directory_path() / ("standoff-demo-out-" + std::to_string(::getpid()));
}

// One full demo run shared by the tests: --json and --out together.
const json& demo_json() {
  static const json j = [] {
    std::filesystem::remove_all(demo_out_dir());
    const auto r = run_cli({"demo", "--json", "--threads", "2", "--out", demo_out_dir().string()});
    INFO(r.err);
    REQUIRE(r.code == 0);  // the demo has a finding on purpose; demo exits 0 once evaluated (evaluate: 1)
    return json::parse(r.out);
  }();
  return j;
}

}  // namespace

TEST_CASE("demo and evaluate of the demo station: contract, report files, equality, text", "[cli]") {
  SECTION("demo --json holds the issue-5 contract") {
    const json& j = demo_json();
    REQUIRE(j.contains("verdict"));
    CHECK(j["verdict"] == "exceeds");
    REQUIRE(j["operations"].is_array());
    REQUIRE(j["operations"].size() >= 5);
    bool some_exceeds = false;
    for (const auto& op : j["operations"]) {
      CAPTURE(op["name"]);
      for (const char* k : {"name", "frequency_hz", "pep_w", "average_power_w", "max_ratio", "max_at", "zone", "tier",
                            "permitted_pep_w", "screening_distance_m", "detailed_distance_m", "method", "notes"})
        CHECK(op.contains(k));
      for (const char* k : {"x_m", "y_m", "z_m"}) CHECK(op["max_at"].contains(k));
      for (const char* d : {"screening_distance_m", "detailed_distance_m"})
        for (const char* t : {"controlled", "uncontrolled"}) CHECK(op[d].contains(t));
      CHECK(op["frequency_hz"].get<double>() > 0.0);
      CHECK(op["average_power_w"].get<double>() <= op["pep_w"].get<double>());
      CHECK(op["notes"].is_array());
      // Permitted PEP × worst ratio = PEP (rounded down to 3 significant figures: within 1 % below).
      if (op["permitted_pep_w"].is_number()) {
        const double prod = op["permitted_pep_w"].get<double>() * op["max_ratio"].get<double>();
        CHECK(prod <= op["pep_w"].get<double>() * (1 + 1e-12));
        CHECK(prod >= 0.99 * op["pep_w"].get<double>());
      }
      if (op["max_ratio"].is_number() && op["max_ratio"].get<double>() > 1.0) some_exceeds = true;
    }
    CHECK(some_exceeds);  // the demo shows what a finding looks like
  }
  SECTION("demo --out writes the report files through the report writers") {
    demo_json();
    for (const char* f : {"report.html", "report.md", "report.json", "site-map.svg"})
      CHECK(std::filesystem::exists(demo_out_dir() / f));
    // The JSON file is the same record as --json printed (one JSON producer).
    std::ifstream in(demo_out_dir() / "report.json");
    const json file = json::parse(in);
    CHECK(file["operations"] == demo_json()["operations"]);
    std::filesystem::remove_all(demo_out_dir());
  }
  SECTION("evaluate docs/examples/demo-station.toml --json equals demo") {
    const auto r = run_cli({"evaluate", kDemoFile, "--json", "--threads", "1"});
    INFO(r.err);
    REQUIRE(r.code == 1);
    json a = json::parse(r.out);
    json b = demo_json();
    // Same station, same results; only the date and the input file's name may differ.
    for (json* j : {&a, &b}) {
      j->erase("date");
      (*j)["station"].erase("input_file");
    }
    CHECK(a["operations"] == b["operations"]);  // also: 1 thread vs 2 threads give identical numbers
    CHECK(a["verdict"] == b["verdict"]);
    CHECK(a["station"]["input_sha256"] == b["station"]["input_sha256"]);
  }
  SECTION("demo prints one row per operation and the cautions") {
    const auto r = run_cli({"demo", "--threads", "2"});
    CHECK(r.code == 0);  // demo: the finding is intended, exit 0 (evaluate exits 1, checked above)
    for (const auto& op : demo_json()["operations"])
      CHECK(r.out.find(op["name"].get<std::string>()) != std::string::npos);
    CHECK(r.out.find("utility") != std::string::npos);
    CHECK(r.err.empty());  // no progress output when not on a terminal
  }
}

TEST_CASE("field --at gives E, H and ratios at a point", "[cli]") {
  const auto r =
      run_cli({"field", kDemoFile, "--at", "30m,20m,1.5m", "--operation", "2 m FM on the collinear", "--json"});
  INFO(r.err);
  REQUIRE((r.code == 0 || r.code == 1));
  const json j = json::parse(r.out);
  REQUIRE(j["operations"].size() == 1);
  const auto& op = j["operations"][0];
  CHECK(op["evaluated"] == true);
  // Screening point source: plane-wave relation |E| = η0 |H| (376.73 Ω, CODATA 2018).
  CHECK(op["e_v_per_m"].get<double>() / op["h_a_per_m"].get<double>() == Approx(376.730313668).epsilon(1e-9));
  CHECK(op["ratio"]["controlled"].get<double>() < op["ratio"]["uncontrolled"].get<double>());
}

TEST_CASE("field: bad --at and unknown operation are exit 2", "[cli]") {
  CHECK(run_cli({"field", kDemoFile, "--at", "30,20,1.5"}).code == 2);  // no units
  CHECK(run_cli({"field", kDemoFile, "--at", "30m,20m"}).code == 2);
  const auto r = run_cli({"field", kDemoFile, "--at", "1m,1m,1m", "--operation", "nope"});
  CHECK(r.code == 2);
  CHECK(r.err.find("--operation") != std::string::npos);
  CHECK(run_cli({"demo", "--standard", "osha"}).code == 2);
}

TEST_CASE("a bare --out writes the report to reports/<station-name>/", "[cli]") {
  // Issue 7: `--out DIR` defaults to reports/<station-name>/ — the demo station is "Demo station".
  const std::filesystem::path here = std::filesystem::current_path();
  const std::filesystem::path tmp =
      std::filesystem::temp_directory_path() / ("standoff-bare-out-" + std::to_string(::getpid()));
  std::filesystem::remove_all(tmp);
  std::filesystem::create_directories(tmp);
  std::filesystem::current_path(tmp);
  const auto r = run_cli({"demo", "--out", "--threads", "2"});
  std::filesystem::current_path(here);
  INFO(r.err);
  CHECK(r.code == 0);
  CHECK(std::filesystem::exists(tmp / "reports" / "demo-station" / "report.html"));
  CHECK(std::filesystem::exists(tmp / "reports" / "demo-station" / "report.json"));
  CHECK(r.out.find("reports/demo-station") != std::string::npos);
  std::filesystem::remove_all(tmp);
}
