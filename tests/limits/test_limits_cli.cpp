// `standoff limits` through run() in-process: the issue-2 acceptance case (47 CFR § 1.1310 Table 1,
// uncontrolled 14.2 MHz: 824/14.2 = 58.03 V/m, 2.19/14.2 = 0.1542 A/m, 180/14.2² mW/cm² = 8.927 W/m²),
// units required, out-of-range and missing-tier refusals, the verify flag, and the JSON keys.
#include <catch2/catch.hpp>

#include <cmath>
#include <sstream>

#include <nlohmann/json.hpp>

#include "cli/run.hpp"
#include "cli_support.hpp"

using Catch::Matchers::Contains;
using nlohmann::json;

namespace {

using standoff::test::run_cli;

}  // namespace

TEST_CASE("limits 14.2MHz --standard fcc --json: the acceptance values", "[cli][limits]") {
  const auto r = run_cli({"limits", "14.2MHz", "--standard", "fcc", "--json"});
  REQUIRE(r.code == 0);
  const json j = json::parse(r.out);
  CHECK(j["standard"] == "fcc");
  CHECK(j["frequency_hz"].get<double>() == Approx(14.2e6));
  const json& u = j["tiers"]["uncontrolled"];
  // 47 CFR § 1.1310(e)(1) Table 1; issue 2 acceptance: ±0.1 %.
  CHECK(u["e_v_per_m"].get<double>() == Approx(58.03).epsilon(1e-3));
  CHECK(u["h_a_per_m"].get<double>() == Approx(0.1542).epsilon(1e-3));
  CHECK(u["s_w_per_m2"].get<double>() == Approx(8.927).epsilon(1e-3));
  CHECK(u["s_is_equivalent"] == true);                       // starred row below 30 MHz
  CHECK(u["averaging_s"].get<double>() == Approx(1800.0));  // 30 min
  CHECK(u["confidence"] == "confirmed");
  CHECK(u["source"].get<std::string>().find("1.1310") != std::string::npos);
  // Controlled, same table: 1842/14.2 = 129.718 V/m, 6-min average.
  const json& c = j["tiers"]["controlled"];
  CHECK(c["e_v_per_m"].get<double>() == Approx(1842.0 / 14.2).epsilon(1e-9));
  CHECK(c["averaging_s"].get<double>() == Approx(360.0));
}

TEST_CASE("limits: JSON gives null where the table gives no limit", "[cli][limits]") {
  // 47 CFR § 1.1310 Table 1: 300–1500 MHz gives S only (controlled f/300 mW/cm² → 43.2 W/m² at 1296 MHz).
  const auto r = run_cli({"limits", "1296 MHz", "--json", "--tier", "controlled"});
  REQUIRE(r.code == 0);
  const json j = json::parse(r.out);
  CHECK(j["tiers"].size() == 1);
  const json& c = j["tiers"]["controlled"];
  CHECK(c["e_v_per_m"].is_null());
  CHECK(c["h_a_per_m"].is_null());
  CHECK(c["s_w_per_m2"].get<double>() == Approx(43.2).epsilon(1e-9));
  CHECK(c["s_is_equivalent"] == false);
}

TEST_CASE("limits: bad input is exit 2 with a message", "[cli][limits]") {
  struct Bad { std::vector<std::string> args; std::string message; };
  auto bad = GENERATE(
      Bad{{"limits", "14"}, "no unit"},                                  // units are required
      Bad{{"limits", "14 furlongs"}, "unknown unit"},
      Bad{{"limits", "200kHz"}, "0.3–100000 MHz"},                       // FCC table starts at 0.3 MHz
      Bad{{"limits", "101 GHz", "--tier", "uncontrolled"}, "0.3–100000 MHz"},
      Bad{{"limits", "5 MHz", "--standard", "sc6"}, "10–15000 MHz"},     // SC6 rows held: 10 MHz–15 GHz
      Bad{{"limits", "100 MHz", "--standard", "sc6", "--tier", "controlled"}, "no controlled tier"},
      Bad{{"limits", "100 MHz", "--standard", "nrpb"}, "unknown standard"},
      Bad{{"limits", "100 MHz", "--tier", "public"}, "unknown tier"},
      Bad{{"limits"}, "FREQ"});
  CAPTURE(bad.args);
  const auto r = run_cli(bad.args);
  CHECK(r.code == 2);
  CHECK_THAT(r.err, Contains(bad.message));
  CHECK(r.out.empty());  // nothing written half-way
}

TEST_CASE("limits: text output shows both tiers, units and the verify flag", "[cli][limits]") {
  const auto fcc = run_cli({"limits", "14.2MHz"});
  REQUIRE(fcc.code == 0);
  CHECK_THAT(fcc.out, Contains("controlled") && Contains("uncontrolled") && Contains("58.02 V/m") &&
                          Contains("0.1542 A/m") && Contains("8.926 W/m2 (0.8926 mW/cm2)") &&
                          Contains("plane-wave equivalent") && Contains("30 min") && Contains("6 min"));
  CHECK_THAT(fcc.out, !Contains("VERIFY"));  // FCC Table 1 is confirmed
  // ICNIRP 2020 is flagged [verify] in REFERENCES.md §1.2: the note must be visible.
  const auto icn = run_cli({"limits", "14.2 MHz", "--standard", "icnirp2020"});
  REQUIRE(icn.code == 0);
  CHECK_THAT(icn.out, Contains("VERIFY") && Contains("46.82 V/m"));  // 300/14.2^0.7 = 46.829, rounded down
  const auto icn_json = json::parse(run_cli({"limits", "14.2 MHz", "--standard", "icnirp2020", "--json"}).out);
  CHECK(icn_json["tiers"]["uncontrolled"]["confidence"] == "verify");
  CHECK(icn_json["tiers"]["uncontrolled"]["s_w_per_m2"].is_null());  // none tabulated below 30 MHz
}

TEST_CASE("limits: SC6 shows only the tier it tabulates", "[cli][limits]") {
  const auto r = run_cli({"limits", "146MHz", "--standard", "sc6"});
  REQUIRE(r.code == 0);
  CHECK_THAT(r.out, Contains("controlled: not tabulated") && Contains("22.06 V/m") && Contains("PARTLY"));
  const json j = json::parse(run_cli({"limits", "146MHz", "--standard", "sc6", "--json"}).out);
  CHECK(j["tiers"].contains("uncontrolled"));
  CHECK_FALSE(j["tiers"].contains("controlled"));
  CHECK(j["not_tabulated"].contains("controlled"));
}

TEST_CASE("limits: ICNIRP 1998 above 10 GHz averages over 68/f_G^1.05 min", "[cli][limits]") {
  // ICNIRP 1998 (REFERENCES.md §1.3): 68/28^1.05 min = 2.05586 min = 123.352 s at 28 GHz.
  const json j = json::parse(run_cli({"limits", "28 GHz", "--standard", "icnirp1998", "--json"}).out);
  CHECK(j["tiers"]["uncontrolled"]["averaging_s"].get<double>() == Approx(60.0 * 68.0 / std::pow(28.0, 1.05)));
  CHECK(j["tiers"]["uncontrolled"]["e_v_per_m"].get<double>() == Approx(61.0));
  // Below the general-public rows (150 kHz) but inside the occupational ones (65 kHz): the
  // occupational tier is shown, the other is reported as not tabulated.
  const auto r = run_cli({"limits", "100 kHz", "--standard", "icnirp1998", "--json"});
  REQUIRE(r.code == 0);
  const json k = json::parse(r.out);
  CHECK(k["tiers"]["controlled"]["e_v_per_m"].get<double>() == Approx(610.0));  // Table 6: 610 V/m
  CHECK_THAT(k["not_tabulated"]["uncontrolled"].get<std::string>(), Contains("0.15–300000 MHz"));
}
