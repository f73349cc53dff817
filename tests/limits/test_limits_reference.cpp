// Published spot values of every built-in limits table (tests/data/limits_cases.toml: each value is
// the published formula evaluated by hand, with the table named beside it), continuity of the
// built-in tables at every published breakpoint, and the plane-wave density of the limits.
#include <catch2/catch.hpp>

#include <cmath>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include <toml++/toml.h>

#include "core/constants.hpp"
#include "core/quantity_parse.hpp"
#include "limits/limits.hpp"
#include "io/limits_toml.hpp"

using namespace standoff;
using namespace standoff::limits;
using Catch::Matchers::Contains;

namespace {

struct Expected {
  std::optional<double> value;
  double tolerance = 0.0;  // relative
};

struct SpotCase {
  std::string standard, tier, frequency, source;
  Expected e, h, s, averaging_min;
  std::optional<bool> s_is_equivalent;
  std::string error_contains;
  int line = 0;
};

std::string read_file(const std::string& path) {
  std::ifstream in(path);
  REQUIRE(in.good());
  std::stringstream ss;
  ss << in.rdbuf();
  return ss.str();
}

std::vector<SpotCase> load_cases() {
  const toml::table root = toml::parse(read_file(STANDOFF_TEST_DATA_DIR "/limits_cases.toml"));
  const toml::table& tol = *root["tolerance"].as_table();
  std::vector<SpotCase> out;
  for (const toml::node& n : *root["case"].as_array()) {
    const toml::table& t = *n.as_table();
    SpotCase c;
    c.line = static_cast<int>(n.source().begin.line);
    c.standard = t["standard"].value_or(std::string{});
    c.tier = t["tier"].value_or(std::string{});
    c.frequency = t["frequency"].value_or(std::string{});
    c.source = t["source"].value_or(std::string{});
    c.error_contains = t["error_contains"].value_or(std::string{});
    const auto case_tol = t["tolerance"].value<double>();
    if (case_tol) REQUIRE(t["tolerance_reason"].value<std::string>());  // every tolerance carries its reason
    auto get = [&](const char* key) {
      return Expected{t[key].value<double>(), case_tol ? *case_tol : *tol[key].value<double>()};
    };
    c.e = get("e_v_per_m");
    c.h = get("h_a_per_m");
    c.s = get("s_w_per_m2");
    c.averaging_min = get("averaging_min");
    c.s_is_equivalent = t["s_is_equivalent"].value<bool>();
    out.push_back(c);
  }
  return out;
}

template <class Q>
void check_quantity(const char* name, const std::optional<Q>& ours, const Expected& published) {
  INFO(name);
  if (!published.value) {
    CHECK_FALSE(ours.has_value());  // the table gives no such limit here
    return;
  }
  REQUIRE(ours.has_value());
  CHECK(ours->value() == Approx(*published.value).epsilon(published.tolerance));
}

}  // namespace

TEST_CASE("spot values of the published tables", "[limits][reference]") {
  static const std::vector<SpotCase> cases = load_cases();
  REQUIRE(cases.size() >= 32);
  const SpotCase& c = GENERATE(from_range(cases));
  INFO("tests/data/limits_cases.toml:" << c.line << ": " << c.standard << " " << c.tier << " " << c.frequency
                                       << " - " << c.source);
  const auto standard = standard_from_string(c.standard);
  const auto tier = tier_from_string(c.tier);
  REQUIRE(standard);
  REQUIRE(tier);
  const LimitTable& table = builtin_limit_table_ref(*standard);
  const units::Frequency f = parse_frequency(c.frequency);
  if (!c.error_contains.empty()) {
    CHECK_THROWS_WITH(lookup(table, *tier, f), Contains(c.error_contains));
    return;
  }
  const LimitValues v = lookup(table, *tier, f);
  check_quantity("E (V/m)", v.e, c.e);
  check_quantity("H (A/m)", v.h, c.h);
  check_quantity("S (W/m2)", v.s, c.s);
  REQUIRE(c.averaging_min.value);
  CHECK(v.averaging.value() / 60.0 == Approx(*c.averaging_min.value).epsilon(c.averaging_min.tolerance));
  if (c.s_is_equivalent) CHECK(v.s_is_equivalent == *c.s_is_equivalent);
}

TEST_CASE("every table has at least 8 spot values per tier it holds", "[limits][reference]") {
  const std::vector<SpotCase> cases = load_cases();
  for (Standard s : kAllStandards) {
    for (const auto& tt : builtin_limit_table_ref(s).tiers) {
      const auto n = std::count_if(cases.begin(), cases.end(), [&](const SpotCase& c) {
        return c.standard == to_string(s) && c.tier == to_string(tt.tier) && c.error_contains.empty();
      });
      INFO(to_string(s) << " " << to_string(tt.tier));
      CHECK(n >= 8);
    }
  }
}

// The published steps between rows: the documents round their coefficients, so a few quantities
// jump by more than 1 % at a breakpoint. Each entry: standard, tier, breakpoint (MHz), quantity,
// the two published values either side, and the source.
struct PublishedStep {
  const char* standard;
  const char* tier;
  double f_mhz;
  char quantity;  // 'E' or 'H'
  double below, above;
};
// from memory, verify against ICNIRP 2020 Table 5 (REFERENCES.md §1.2):
//   occupational 30 MHz H 4.9/30 vs 0.16; 400 MHz E 61 vs 3·√400; public 400 MHz H 0.073 vs 0.0037·√400.
// ICNIRP 1998 Tables 6–7 (REFERENCES.md §1.3): public 10 MHz E 87/√10 vs 28; 400 MHz E 28 vs 1.375·√400,
//   H 0.073 vs 0.0037·√400; 2000 MHz H 0.0037·√2000 vs 0.16; occupational 400 MHz E 61 vs 3·√400;
//   2000 MHz E 3·√2000 vs 137.
const PublishedStep kPublishedSteps[] = {
    {"icnirp2020", "controlled", 30.0, 'H', 4.9 / 30.0, 0.16},
    {"icnirp2020", "controlled", 400.0, 'E', 61.0, 60.0},
    {"icnirp2020", "uncontrolled", 400.0, 'H', 0.073, 0.074},
    {"icnirp1998", "uncontrolled", 10.0, 'E', 87.0 / std::sqrt(10.0), 28.0},
    {"icnirp1998", "uncontrolled", 400.0, 'E', 28.0, 27.5},
    {"icnirp1998", "uncontrolled", 400.0, 'H', 0.073, 0.074},
    {"icnirp1998", "uncontrolled", 2000.0, 'H', 0.0037 * std::sqrt(2000.0), 0.16},
    {"icnirp1998", "controlled", 400.0, 'E', 61.0, 60.0},
    {"icnirp1998", "controlled", 2000.0, 'E', 3.0 * std::sqrt(2000.0), 137.0},
};

TEST_CASE("limits are continuous at every breakpoint, except the published steps", "[limits][reference]") {
  // Printed precision of the tables: 1 % (DESIGN.md invariant; loader tolerance kContinuityTolerance).
  int checked = 0, steps = 0;
  for (Standard s : kAllStandards) {
    const LimitTable& table = builtin_limit_table_ref(s);
    for (const auto& tt : table.tiers) {
      for (std::size_t i = 1; i < tt.bands.size(); ++i) {
        const double f = tt.bands[i].f_min_mhz;
        // Just below and just above the breakpoint through the public lookup.
        const LimitValues lo = lookup(table, tt.tier, units::hertz(f * 1e6 * (1.0 - 1e-7)));
        const LimitValues hi = lookup(table, tt.tier, units::hertz(f * 1e6 * (1.0 + 1e-7)));
        auto compare = [&](char q, std::optional<double> a, std::optional<double> b) {
          if (!a || !b) return;
          INFO(to_string(s) << " " << to_string(tt.tier) << " " << f << " MHz " << q);
          const PublishedStep* step = nullptr;
          for (const auto& p : kPublishedSteps)
            if (p.standard == to_string(s) && p.tier == to_string(tt.tier) && p.f_mhz == f && p.quantity == q) step = &p;
          if (step != nullptr) {
            CHECK(*a == Approx(step->below).epsilon(1e-6));  // the published values either side
            CHECK(*b == Approx(step->above).epsilon(1e-6));
            ++steps;
          } else {
            CHECK(*a == Approx(*b).epsilon(0.01));
            ++checked;
          }
        };
        auto val = [](const auto& q) { return q ? std::optional<double>(q->value()) : std::nullopt; };
        compare('E', val(lo.e), val(hi.e));
        compare('H', val(lo.h), val(hi.h));
        compare('S', val(lo.s), val(hi.s));
      }
    }
  }
  CHECK(steps == static_cast<int>(std::size(kPublishedSteps)));  // every listed step exists
  CHECK(checked > 40);
}

TEST_CASE("each built-in table names its source, year and confidence", "[limits][reference]") {
  struct Expect { Standard s; int year; Confidence c; double f_lo, f_hi; };
  // Years, flags and ranges from REFERENCES.md §1.1–1.4.
  auto e = GENERATE(Expect{Standard::fcc, 1996, Confidence::confirmed, 0.3, 1e5},
                    Expect{Standard::icnirp2020, 2020, Confidence::verify, 0.1, 3e5},
                    Expect{Standard::icnirp1998, 1998, Confidence::partly, 0.065, 3e5},
                    Expect{Standard::sc6, 2015, Confidence::partly, 10.0, 15000.0});
  const LimitTable& t = builtin_limit_table_ref(e.s);
  INFO(to_string(e.s));
  CHECK(t.standard == e.s);
  CHECK(t.year == e.year);
  CHECK(t.confidence == e.c);
  CHECK(t.file == "tables/limits/" + to_string(e.s) + ".toml");
  CHECK_FALSE(t.document.empty());
  CHECK_FALSE(t.table.empty());
  double lo = 1e300, hi = 0.0;
  for (const auto& tt : t.tiers) {
    CHECK_FALSE(tt.document_tier_name.empty());
    lo = std::min(lo, tt.f_min_mhz());
    hi = std::max(hi, tt.f_max_mhz());
  }
  CHECK(lo == e.f_lo);
  CHECK(hi == e.f_hi);
}

TEST_CASE("tier confidence: ICNIRP 1998 general public confirmed, occupational partly", "[limits][reference]") {
  // REFERENCES.md §1.3.
  const LimitTable& t = builtin_limit_table_ref(Standard::icnirp1998);
  CHECK(t.find(Tier::uncontrolled)->confidence == Confidence::confirmed);
  CHECK(t.find(Tier::controlled)->confidence == Confidence::partly);
  CHECK(builtin_limit_table_ref(Standard::sc6).find(Tier::controlled) == nullptr);  // not tabulated
}

TEST_CASE("plane-wave density: the smallest of S, E²/η0 and η0·H²", "[limits][closed_form]") {
  // Plane wave: S = E²/η0 = η0·H², η0 = 376.730313668 Ω (CODATA 2018). Published limits from
  // 47 CFR § 1.1310 Table 1 and ICNIRP 2020 Table 5 (from memory, verify against ICNIRP 2020).
  const double eta0 = 376.730313668;
  // FCC uncontrolled 14.2 MHz: S = 180/14.2² mW/cm² = 8.92680 W/m²; E²/η0 = (824/14.2)²/η0 = 8.93814;
  // η0·H² = η0·(2.19/14.2)² = 8.96070 → S binds.
  auto fcc = lookup(builtin_limit_table_ref(Standard::fcc), Tier::uncontrolled, units::hertz(14.2e6));
  CHECK(plane_wave_density(fcc)->value() == Approx(1800.0 / (14.2 * 14.2)).epsilon(1e-12));
  CHECK(plane_wave_density(fcc)->value() < std::pow(824.0 / 14.2, 2) / eta0);  // S binds, not E
  // ICNIRP 2020 public 14.2 MHz: no S; E²/η0 = (300/14.2^0.7)²/η0 = 5.82114 < η0·H² = 9.04272.
  auto icn = lookup(builtin_limit_table_ref(Standard::icnirp2020), Tier::uncontrolled, units::hertz(14.2e6));
  CHECK_FALSE(icn.s.has_value());
  CHECK(plane_wave_density(icn)->value() == Approx(std::pow(300.0 / std::pow(14.2, 0.7), 2) / eta0).epsilon(1e-12));
  CHECK(plane_wave_density(icn)->value() == Approx(5.82114).epsilon(1e-5));
  // ICNIRP 1998 public 5 GHz: S = 10 W/m², but 61²/η0 = 9.87709 and η0·0.16² = 9.64430 W/m² → H binds.
  auto i98 = lookup(builtin_limit_table_ref(Standard::icnirp1998), Tier::uncontrolled, units::hertz(5e9));
  CHECK(plane_wave_density(i98)->value() == Approx(9.64430).epsilon(1e-5));
  // FCC controlled 1296 MHz: S only, 1296/300 mW/cm² = 43.2 W/m².
  auto fcc_uhf = lookup(builtin_limit_table_ref(Standard::fcc), Tier::controlled, units::hertz(1296e6));
  CHECK(plane_wave_density(fcc_uhf)->value() == Approx(43.2).epsilon(1e-12));
}

TEST_CASE("lookup names the table file and range and where the frequency came from", "[limits]") {
  const LimitTable& t = builtin_limit_table_ref(Standard::fcc);
  const Where w{"station.toml", 7, "transmitter.frequency"};
  CHECK_THROWS_WITH(lookup(t, Tier::uncontrolled, units::hertz(150e3), w),
                    Contains("station.toml:7: transmitter.frequency") && Contains("tables/limits/fcc.toml") &&
                        Contains("0.3–100000 MHz") && Contains("no extrapolation"));
  CHECK_THROWS_WITH(lookup(builtin_limit_table_ref(Standard::sc6), Tier::controlled, units::hertz(100e6)),
                    Contains("no controlled tier"));
  // A frequency a rounding step off the breakpoint lands on it (lower band): 1.34 MHz written in kHz.
  CHECK(lookup(t, Tier::uncontrolled, parse_frequency("1340 kHz")).e->value() == 614.0);
}
