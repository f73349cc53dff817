// The committed demo report (reports/demo/) is what `standoff demo --out DIR` writes today, apart
// from the date and the tool version. If this fails after an intended change, regenerate with
//   build/<dir>/standoff demo --out reports/demo
// and review the diff before committing it.
#include <catch2/catch.hpp>

#include <stdlib.h>
#include <unistd.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>

#include <nlohmann/json.hpp>

#include "cli/run.hpp"
#include "report/format.hpp"
#include "xml_check.hpp"

namespace fs = std::filesystem;

namespace {

std::string slurp(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  return std::string(std::istreambuf_iterator<char>(in), {});
}

// The file without the lines that carry the date or the tool version.
std::vector<std::string> stable_lines(const std::string& text) {
  // A UTC timestamp "YYYY-MM-DDTHH:MM:SSZ" anywhere in the line (std::regex is avoided: GCC 12
  // warns falsely inside it under the sanitizer build).
  auto has_timestamp = [](const std::string& line) {
    const char* shape = "dddd-dd-ddTdd:dd:ddZ";
    for (std::size_t at = 0; at + 20 <= line.size(); ++at) {
      bool ok = true;
      for (std::size_t k = 0; k < 20 && ok; ++k) {
        const char c = line[at + k];
        ok = shape[k] == 'd' ? (c >= '0' && c <= '9') : c == shape[k];
      }
      if (ok) return true;
    }
    return false;
  };
  std::vector<std::string> out;
  std::istringstream in(text);
  for (std::string line; std::getline(in, line);) {
    const bool version = line.find("Tool version") != std::string::npos || line.find("\"version\":") != std::string::npos;
    if (!version && !has_timestamp(line)) out.push_back(line);
  }
  return out;
}

// Equal, or equal but for full-precision numbers that differ in their last bits: the near-field
// kernel has an AVX2 and a portable build (the sanitizer build uses the portable one), and their
// sums round differently in the last place. 1e-9 relative is far below any figure shown to people.
bool same_up_to_last_bits(const std::string& a, const std::string& b) {
  if (a == b) return true;
  auto is_num = [](char c) { return (c >= '0' && c <= '9') || c == '.' || c == '-' || c == '+' || c == 'e' || c == 'E'; };
  std::size_t i = 0, j = 0;
  while (i < a.size() && j < b.size()) {
    const bool da = a[i] >= '0' && a[i] <= '9', db = b[j] >= '0' && b[j] <= '9';
    if (da && db) {
      std::size_t ie = i, je = j;
      while (ie < a.size() && is_num(a[ie])) ++ie;
      while (je < b.size() && is_num(b[je])) ++je;
      const double x = std::strtod(a.substr(i, ie - i).c_str(), nullptr), y = std::strtod(b.substr(j, je - j).c_str(), nullptr);
      if (!(std::fabs(x - y) <= 1e-9 * std::max(std::fabs(x), std::fabs(y)))) return false;
      i = ie;
      j = je;
    } else {
      if (a[i] != b[j]) return false;
      ++i;
      ++j;
    }
  }
  return i == a.size() && j == b.size();
}

std::map<std::string, std::string> files_in(const fs::path& dir) {
  std::map<std::string, std::string> m;
  for (const auto& e : fs::directory_iterator(dir)) {
    if (e.is_regular_file()) m[e.path().filename().string()] = slurp(e.path());
  }
  return m;
}

}  // namespace

TEST_CASE("standoff demo --out regenerates the committed demo report", "[report][demo]") {
  const fs::path committed = fs::path(STANDOFF_SOURCE_DIR) / "reports" / "demo";
  REQUIRE(fs::is_directory(committed));
  const fs::path dir = fs::temp_directory_path() / ("standoff-demo-report-" + std::to_string(::getpid()));
  fs::remove_all(dir);
  std::ostringstream out, err;
  ::unsetenv("COLUMNS");  // the summary's width is 100 columns unless COLUMNS narrows it
  const int code = standoff::cli::run({"demo", "--out", dir.string(), "--threads", "2"}, out, err);
  INFO(err.str());
  REQUIRE(code == 0);  // demo exits 0 once evaluated; its finding is intended (issue 5)

  // The terminal summary of the demo fits 100 columns and 40 lines (issue 13), and says both verdicts.
  {
    std::istringstream in(out.str());
    std::size_t lines = 0;
    for (std::string line; std::getline(in, line);) {
      ++lines;
      INFO(line);
      CHECK(standoff::report::fmtx::display_width(line) <= 100);
    }
    CHECK(lines <= 40);
    CHECK(out.str().find("RF exposure: EXCEEDS") != std::string::npos);
    // The counts agree with the record's own checks (report.json, written beside it).
    std::ifstream jf(dir / "report.json");
    const auto rec = nlohmann::json::parse(jf);
    const std::string want = "Installation: FAIL (" + std::to_string(rec.at("installation_failures").get<int>()) + " of " +
                             std::to_string(rec.at("installation_checks").get<int>()) + " checks)";
    CHECK(rec.at("installation_failures").get<int>() > 0);
    CHECK(out.str().find(want) != std::string::npos);
  }

  const auto fresh = files_in(dir), old = files_in(committed);
  std::vector<std::string> fresh_names, old_names;
  for (const auto& [n, _] : fresh) fresh_names.push_back(n);
  for (const auto& [n, _] : old) old_names.push_back(n);
  CHECK(fresh_names == old_names);
  for (const auto& [name, text] : fresh) {
    if (!old.count(name)) continue;
    INFO(name << " differs from reports/demo/" << name << " (regenerate with: standoff demo --out reports/demo)");
    const auto a = stable_lines(text), b = stable_lines(old.at(name));
    CHECK(a.size() == b.size());
    for (std::size_t k = 0; k < std::min(a.size(), b.size()); ++k) {
      if (!same_up_to_last_bits(a[k], b[k])) {
        INFO("first difference at stable line " << k + 1 << ":\n  new: " << a[k] << "\n  old: " << b[k]);
        CHECK(a[k] == b[k]);
        break;
      }
    }
  }

  // The regenerated record shows the intended finding, and every SVG is well-formed.
  const auto j = nlohmann::json::parse(fresh.at("report.json"));
  CHECK(j.at("verdict") == "exceeds");
  CHECK(j.at("exposure_verdict") == "exceeds");
  CHECK(j.at("installation_verdict") == "fail");
  for (const auto& [name, text] : fresh) {
    if (name.size() > 4 && name.substr(name.size() - 4) == ".svg") {
      INFO(name);
      CHECK_FALSE(standoff::report::test::xml_well_formed(text));
    }
  }
  fs::remove_all(dir);
}
