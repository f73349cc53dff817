// `standoff lines`: exit codes (0 clear, 1 a check fails, 2 bad input), the JSON contract keys of
// issue 6, and the demo station's installation checks.
#include <catch2/catch.hpp>

#include <set>
#include <sstream>

#include <nlohmann/json.hpp>

#include "cli/run.hpp"

using standoff::cli::run;
using Catch::Matchers::Contains;

namespace {
struct Result {
  int code;
  std::string out;
  std::string err;
};
Result lines(std::vector<std::string> args) {
  std::ostringstream out, err;
  args.insert(args.begin(), "lines");
  const int code = run(args, out, err);
  return {code, out.str(), err.str()};
}
const std::string data = STANDOFF_TEST_DATA_DIR "/siting/";
}  // namespace

TEST_CASE("lines: a clear site passes with exit 0 and prints the cautions", "[cli]") {
  const auto r = lines({data + "clear-site.toml"});
  CHECK(r.code == 0);
  CHECK_THAT(r.out, Contains("Call the utility"));
  CHECK_THAT(r.out, Contains("all checks pass"));
}

TEST_CASE("lines: a mast too close to a line fails with exit 1", "[cli]") {
  const auto r = lines({data + "mast-too-close.toml", "--json"});
  CHECK(r.code == 1);
  const auto j = nlohmann::json::parse(r.out);
  CHECK(j.at("verdict") == "fail");
  bool found = false;
  for (const auto& c : j.at("checks")) {
    for (const char* key : {"rule", "source", "subject", "line", "required_m", "actual_m", "pass", "note"})
      CHECK(c.contains(key));
    if (c.at("rule") == "fall zone") {
      found = true;
      CHECK(c.at("pass") == false);
      CHECK(c.at("required_m").get<double>() == Approx(15.0));  // US CPSC: 1.5 × 10 m
      CHECK(c.at("actual_m").get<double>() == Approx(12.0));
    }
  }
  CHECK(found);
  CHECK(j.at("cautions").size() >= 4);
}

TEST_CASE("lines: bad input → exit 2 with file:line: field", "[cli]") {
  const auto r = lines({data + "bad-span.toml"});
  CHECK(r.code == 2);
  CHECK_THAT(r.err, Contains("bad-span.toml:12: span[0].to"));
  CHECK(r.out.empty());
  CHECK(lines({data + "no-such-file.toml"}).code == 2);
  CHECK(lines({}).code == 2);
}

TEST_CASE("lines: the demo station lists fall-zone, standing-clearance and crossing checks", "[cli]") {
  const auto r = lines({STANDOFF_SOURCE_DIR "/docs/examples/demo-station.toml", "--json"});
  REQUIRE((r.code == 0 || r.code == 1));
  const auto j = nlohmann::json::parse(r.out);
  std::set<std::string> rules;
  for (const auto& c : j.at("checks")) {
    rules.insert(c.at("rule").get<std::string>());
    CHECK_FALSE(c.at("source").get<std::string>().empty());
  }
  CHECK(rules.count("fall zone"));
  CHECK(rules.count("standing clearance"));
  CHECK(rules.count("no crossing"));
  CHECK(r.code == (j.at("verdict") == "pass" ? 0 : 1));
}
