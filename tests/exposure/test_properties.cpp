// Invariants over generated valid stations (issue 14), run in-process through the CLI's run().
// Fixed seed; the ranges are documented in docs/validation.md ("Property test"):
//   PEP 1 W–1 kW; frequency 3.5–430 MHz; antenna: 4/6 gain-only (−3 to 12 dBi), 1/6 collinear
//   (0 to 12 dBi), 1/6 half-wave dipole (MoM, 50–430 MHz); height 1–20 m; one square zone of 3–8 m
//   side within 15 m of the antenna;
//   mode ssb/cw/fm or a duty of 10–100 %; half the stations feed through 1–30 m of rg-213.
// Each station must evaluate (exit 0 or 1, never 2 or 3), every number of its JSON record must be
// finite, permitted PEP × worst ratio = PEP (ratios are linear in power: OET 65 Eq. 3, S ∝ P —
// closed form), doubling the PEP doubles every ratio, and 1 and 2 threads give identical records.
#include <unistd.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <random>
#include <string>

#include <catch2/catch.hpp>
#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "cli_support.hpp"

namespace fs = std::filesystem;
using nlohmann::json;
using standoff::test::run_cli;

namespace {

constexpr int kStations = 200;
constexpr unsigned kSeed = 20261203;

struct Generated {
  std::string text;  // with the placeholder {pep} for the transmitter's PEP in W
  double pep_w;
};

Generated generate(std::mt19937& rng) {
  auto uni = [&](double a, double b) { return std::uniform_real_distribution<double>(a, b)(rng); };
  auto pick = [&](int n) { return std::uniform_int_distribution<int>(0, n - 1)(rng); };
  // 0 gain, 1 collinear, 2 dipole (one in six: the MoM near field costs most of the run time)
  const int r6 = pick(6);
  const int kind = r6 < 4 ? 0 : r6 - 3;
  const double f_mhz = kind == 2 ? uni(50.0, 430.0) : uni(3.5, 430.0);
  const double ax = uni(-5.0, 5.0), ay = uni(-5.0, 5.0), h = uni(1.0, 20.0);
  const double side = uni(3.0, 8.0), zx = ax + uni(-15.0, 15.0), zy = ay + uni(-15.0, 15.0);
  auto sq = [&](double x, double y, double s) {
    return fmt::format("[[\"{:.3f} m\", \"{:.3f} m\"], [\"{:.3f} m\", \"{:.3f} m\"], [\"{:.3f} m\", \"{:.3f} m\"], "
                       "[\"{:.3f} m\", \"{:.3f} m\"]]",
                       x, y, x + s, y, x + s, y + s, x, y + s);
  };
  std::string t = "[station]\nname = \"generated\"\n\n[site]\nboundary = " + sq(-40, -40, 80) + "\n\n";
  t += "[[zone]]\nname = \"z\"\ntier = \"" + std::string(pick(2) ? "controlled" : "uncontrolled") +
       "\"\npolygon = " + sq(zx, zy, side) + "\n\n";
  t += "[[transmitter]]\nname = \"tx\"\npep = \"{pep} W\"\n\n";
  const bool line = pick(2) == 1;
  if (line) t += fmt::format("[[feed_line]]\nname = \"coax\"\nclass = \"rg-213\"\nlength = \"{:.2f} m\"\n\n", uni(1, 30));
  t += fmt::format("[[antenna]]\nname = \"a\"\nposition = [\"{:.3f} m\", \"{:.3f} m\"]\nheight = \"{:.3f} m\"\n", ax, ay, h);
  if (kind == 0) t += fmt::format("kind = \"gain\"\ngain = \"{:.2f} dBi\"\n", uni(-3, 12));
  if (kind == 1) t += fmt::format("kind = \"collinear\"\ngain = \"{:.2f} dBi\"\nlength = \"{:.2f} m\"\n", uni(0, 12), uni(0.5, 3));
  if (kind == 2)
    t += fmt::format("kind = \"dipole\"\nlength = \"{:.4f} m\"\nwire_diameter = \"2 mm\"\nazimuth = \"{:.1f} deg\"\n",
                     0.48 * 299.792458 / f_mhz, uni(0, 180));
  t += fmt::format("\n[[operation]]\nname = \"op\"\ntransmitter = \"tx\"\nantenna = \"a\"\nfrequency = \"{:.4f} MHz\"\n", f_mhz);
  if (line) t += "feed_line = \"coax\"\n";
  const int m = pick(4);
  if (m == 3) t += fmt::format("duty = \"{:.1f} %\"\n", uni(10, 100));
  else t += std::string("mode = \"") + (m == 0 ? "ssb" : m == 1 ? "cw" : "fm") + "\"\n";
  // Two decimals, so that the doubled PEP is written exactly.
  return {t, std::round(std::exp(uni(0.0, std::log(1000.0))) * 100.0) / 100.0};
}

std::string with_pep(std::string text, double pep) {
  const auto at = text.find("{pep}");
  return text.replace(at, 5, fmt::format("{:.2f}", pep));
}

void check_all_finite(const json& j, const std::string& path = "") {
  if (j.is_number_float()) {
    INFO(path);
    CHECK(std::isfinite(j.get<double>()));
  } else if (j.is_object()) {
    for (auto it = j.begin(); it != j.end(); ++it) check_all_finite(it.value(), path + "/" + it.key());
  } else if (j.is_array()) {
    for (std::size_t i = 0; i < j.size(); ++i) check_all_finite(j[i], path + "/" + std::to_string(i));
  }
}

json evaluate(const fs::path& file, const std::string& text, const char* threads) {
  {
    std::ofstream out(file);
    out << text;
  }
  const auto r = run_cli({"evaluate", file.string(), "--json", "--threads", threads});
  INFO(text << "\n" << r.err);
  REQUIRE((r.code == 0 || r.code == 1));
  json j = json::parse(r.out);
  j.erase("date");
  return j;
}

}  // namespace

TEST_CASE("generated valid stations: finite numbers, linear in power, independent of threads", "[cli]") {
  std::mt19937 rng(kSeed);
  const fs::path file = fs::temp_directory_path() / ("standoff-property-" + std::to_string(::getpid()) + ".toml");
  for (int s = 0; s < kStations; ++s) {
    const Generated g = generate(rng);
    INFO("station " << s << ":\n" << with_pep(g.text, g.pep_w));
    const json one = evaluate(file, with_pep(g.text, g.pep_w), "1");
    check_all_finite(one);
    for (const auto& op : one["operations"]) {
      if (!op["max_ratio"].is_number() || !op["permitted_pep_w"].is_number()) continue;
      const double ratio = op["max_ratio"].get<double>();
      if (!(ratio > 0.0)) continue;
      // Permitted PEP is rounded DOWN to three significant figures: within 0.1 % + rounding.
      CHECK(op["permitted_pep_w"].get<double>() * ratio <= op["pep_w"].get<double>() * (1.0 + 1e-9));
      CHECK(op["permitted_pep_w"].get<double>() * ratio >= op["pep_w"].get<double>() * (1.0 - 1e-2));
    }
    // Every 8th station: 2 threads give the same record, and doubling the PEP doubles every ratio.
    if (s % 8 != 0) continue;
    CHECK(evaluate(file, with_pep(g.text, g.pep_w), "2") == one);
    const json twice = evaluate(file, with_pep(g.text, 2.0 * g.pep_w), "1");
    REQUIRE(twice["operations"].size() == one["operations"].size());
    for (std::size_t k = 0; k < one["operations"].size(); ++k) {
      const auto& a = one["operations"][k];
      const auto& b = twice["operations"][k];
      for (const char* key : {"max_ratio", "peak_ratio"})
        if (a[key].is_number()) CHECK(b[key].get<double>() == Approx(2.0 * a[key].get<double>()).epsilon(1e-9));
    }
  }
  std::error_code ec;
  fs::remove(file, ec);
}
