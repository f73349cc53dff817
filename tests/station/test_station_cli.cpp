// Bad station files through the CLI: exit code 2, "standoff: error: file:line: field: message" on
// stderr, and nothing written (the --out directory is not even created). DESIGN.md exit codes.
#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>
#include <sstream>

#include <nlohmann/json.hpp>

#include "cli/run.hpp"
#include "cli_support.hpp"
#include "guide_example.hpp"
#include "io/station_toml.hpp"

namespace fs = std::filesystem;

namespace {

using standoff::test::run_cli;

fs::path scratch_dir() {
  const fs::path d = fs::temp_directory_path() / ("standoff-station-cli-" + std::to_string(::getpid()));
  fs::create_directories(d);
  return d;
}

std::string replace(std::string text, const std::string& from, const std::string& to) {
  const auto pos = text.find(from);
  REQUIRE(pos != std::string::npos);
  text.replace(pos, from.size(), to);
  return text;
}

}  // namespace

TEST_CASE("bad station files: exit 2, file:line:field, nothing written", "[cli][station]") {
  const std::string demo(standoff::station::demo_station_text());
  struct Case {
    const char* name;
    const char* from;
    const char* to;
    const char* expect;  // in stderr, after the file name and line
  };
  const Case c = GENERATE(values<Case>({
      {"unknown antenna reference", "antenna = \"doublet\"", "antenna = \"doublett\"", "operation[0].antenna: unknown antenna"},
      {"duplicate transmitter", "name = \"hf transceiver\"", "name = \"hf amplifier\"", "transmitter.name: duplicate name"},
      {"antenna below ground", "height = \"12 m\"", "height = \"-12 m\"", "antenna[0].height: antenna is below ground"},
      {"unknown mode", "mode = \"fsk\"", "mode = \"smoke-signals\"", "operation[1].mode: unknown mode"},
      {"unknown line class", "class = \"ladder-450\"", "class = \"ladder-999\"", "feed_line[0].class: unknown feed-line class"},
      {"frequency outside the limits table", "frequency = \"7.15 MHz\"", "frequency = \"100 kHz\"", "operation[0].frequency"},
  }));
  CAPTURE(c.name);
  const fs::path dir = scratch_dir();
  const fs::path file = dir / "bad.toml";
  {
    std::ofstream f(file);
    f << replace(demo, c.from, c.to);
  }
  const fs::path out = dir / "report-out";
  fs::remove_all(out);
  const auto r = run_cli({"evaluate", file.string(), "--out", out.string()});
  CAPTURE(r.err);
  CHECK(r.code == 2);
  CHECK(r.err.rfind("standoff: error: " + file.string() + ":", 0) == 0);
  CHECK(r.err.find(c.expect) != std::string::npos);
  CHECK_FALSE(fs::exists(out));
  CHECK(r.out.empty());
  fs::remove_all(dir);
}

TEST_CASE("a missing station file is exit 2", "[cli][station]") {
  const auto r = run_cli({"evaluate", "/nonexistent/station.toml"});
  CHECK(r.code == 2);
  CHECK(r.err.find("/nonexistent/station.toml") != std::string::npos);
}

TEST_CASE("the user guide's complete example evaluates", "[cli][station]") {
  const std::string example = user_guide_example();
  const fs::path dir = scratch_dir();
  const fs::path file = dir / "example.toml";
  {
    std::ofstream f(file);
    f << example;
  }
  const auto r = run_cli({"evaluate", file.string(), "--json", "--threads", "2"});
  INFO(r.err);
  CHECK((r.code == 0 || r.code == 1));
  const auto j = nlohmann::json::parse(r.out);
  CHECK(j["operations"].size() == 2);
  fs::remove_all(dir);
}
