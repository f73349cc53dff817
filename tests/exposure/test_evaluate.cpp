// The evaluation's bookkeeping against closed forms: linearity in power (doubling power doubles
// every ratio; permitted PEP × worst ratio = PEP), tier assignment by zone and group sums against
// the limits printed in 47 CFR 1.1310 Table 1, the validity radius of the thin-wire model (points
// within 3 wire radii are "not evaluated", never a number), and identical results for any thread count.
#include <catch2/catch.hpp>

#include <cmath>

#include "eval_test_util.hpp"

using namespace evaltest;
namespace em = standoff::em;
using standoff::constants::eta0;
using standoff::constants::pi;
using lim::Tier;

namespace {

std::shared_ptr<const em::Solution> hf_dipole() {
  em::Placement at{0.0, 0.0, 8.0, pi / 2};
  return std::make_shared<em::Solution>(
      em::solve(em::dipole(14.2e6, 10.1, at, em::Conductor{1e-3}, em::real_ground(15.0, 0.005, "average"))));
}

ex::EvaluationInput dipole_input(const std::shared_ptr<const em::Solution>& sol, double p) {
  ex::EvaluationInput in;
  in.sources = {mom_source(sol, p)};
  in.limits = {fcc_limits(14.2e6)};
  in.zones = {square_zone("yard", Tier::uncontrolled, -6.0, -6.0, 12.0)};
  in.points = {{"window", Tier::uncontrolled, {8.0, 3.0, 4.0}}};
  return in;
}

ex::EvaluationOptions coarse(unsigned threads = 2) {
  ex::EvaluationOptions o;
  o.grid_spacing_m = 1.0;
  o.threads = threads;
  return o;
}

// 47 CFR 1.1310 Table 1 at 14.2 MHz, printed formulas: uncontrolled 824/f V/m, 2.19/f A/m;
// controlled 1842/f V/m, 4.89/f A/m. A plane wave of density S: ratio = max(S·η0/E², S/(η0·H²)).
double ratio_14(double s, Tier t) {
  const double e = (t == Tier::controlled ? 1842.0 : 824.0) / 14.2;
  const double h = (t == Tier::controlled ? 4.89 : 2.19) / 14.2;
  return std::max(s * eta0 / (e * e), s / (eta0 * h * h));
}
// 30–300 MHz, uncontrolled: 27.5 V/m, 0.073 A/m, 0.2 mW/cm² = 2 W/m².
double ratio_145_uncontrolled(double s) {
  return std::max({s * eta0 / (27.5 * 27.5), s / (eta0 * 0.073 * 0.073), s / 2.0});
}

}  // namespace

TEST_CASE("linearity: doubling the power doubles every ratio; permitted PEP × worst = PEP", "[closed_form]") {
  const auto sol = hf_dipole();
  const auto a = ex::evaluate(dipole_input(sol, 100.0), coarse());
  const auto b = ex::evaluate(dipole_input(sol, 200.0), coarse());
  const auto& oa = a.operations.at(0);
  const auto& ob = b.operations.at(0);
  REQUIRE(oa.evaluated_anywhere);
  // Ratios are power ratios, linear in power: exact to rounding (1e-9).
  CHECK(ob.worst.ratio == Approx(2.0 * oa.worst.ratio).epsilon(1e-9));
  REQUIRE(a.grids.size() == 1);
  const auto& la = a.grids[0].layers[0];
  const auto& lb = b.grids[0].layers[0];
  for (std::size_t c = 0; c < la.ratio_uncontrolled.size(); ++c) {
    CHECK(lb.ratio_uncontrolled[c] == Approx(2.0 * la.ratio_uncontrolled[c]).epsilon(1e-9).margin(1e-300));
    CHECK(lb.ratio_controlled[c] == Approx(2.0 * la.ratio_controlled[c]).epsilon(1e-9).margin(1e-300));
  }
  CHECK(ob.points[0].ratio == Approx(2.0 * oa.points[0].ratio).epsilon(1e-9));
  for (std::size_t k = 0; k < oa.ratio_vs_distance.size(); ++k)
    CHECK(*ob.ratio_vs_distance[k].ratio_uncontrolled == Approx(2.0 * *oa.ratio_vs_distance[k].ratio_uncontrolled).epsilon(1e-9));
  // Permitted PEP = PEP / worst ratio, rounded DOWN to 3 significant figures: within 1 % below.
  REQUIRE(oa.permitted_pep_w.has_value());
  const double product = *oa.permitted_pep_w * oa.worst.ratio;
  CHECK(product <= oa.pep_w);
  CHECK(product >= 0.99 * oa.pep_w);
}

TEST_CASE("tier assignment by zone: each zone is compared with its own tier's limit", "[closed_form]") {
  const double s = 2.0;  // W/m², uniform
  ex::EvaluationInput in;
  in.sources = {uniform_source(14.2e6, s, "hf")};
  in.limits = {fcc_limits(14.2e6)};
  in.zones = {square_zone("household", Tier::controlled, 0, 0, 2), square_zone("street", Tier::uncontrolled, 5, 0, 2)};
  const auto ev = ex::evaluate(in, coarse());
  REQUIRE(ev.grids.size() == 2);
  const auto& op = ev.operations.at(0);
  // The worst place is in the uncontrolled zone (the lower limit) with that tier.
  CHECK(op.worst.zone == "street");
  CHECK(op.worst.tier == Tier::uncontrolled);
  // 1 %: the table rows are stored to the printed precision.
  CHECK(op.worst.ratio == Approx(ratio_14(s, Tier::uncontrolled)).epsilon(0.01));
  for (const auto& g : ev.grids)
    for (std::size_t c = 0; c < g.state.size(); ++c) {
      if (g.state[c] != ex::CellState::evaluated) continue;
      CHECK(g.layers[0].ratio_controlled[c] == Approx(ratio_14(s, Tier::controlled)).epsilon(0.01));
      CHECK(g.layers[0].ratio_uncontrolled[c] == Approx(ratio_14(s, Tier::uncontrolled)).epsilon(0.01));
    }
  // Exceeds only if above 1: S = 2 W/m² is 22 % of the uncontrolled limit → within.
  CHECK(op.verdict == ex::Verdict::within);
}

TEST_CASE("group summation: Σ ratios at every place (47 CFR 1.1307(b)(5))", "[closed_form]") {
  const double s1 = 5.0, s2 = 1.2;  // W/m²
  ex::EvaluationInput in;
  in.sources = {uniform_source(14.2e6, s1, "hf"), uniform_source(145e6, s2, "vhf")};
  in.sources[0].group = in.sources[1].group = "together";
  in.limits = {fcc_limits(14.2e6), fcc_limits(145e6)};
  in.zones = {square_zone("garden", Tier::uncontrolled, 0, 0, 3)};
  in.points = {{"window", Tier::uncontrolled, {10, 0, 4}}};
  const auto ev = ex::evaluate(in, coarse());
  const double r1 = ratio_14(s1, Tier::uncontrolled), r2 = ratio_145_uncontrolled(s2);
  REQUIRE(ev.groups.size() == 1);
  const auto& g = ev.groups[0];
  CHECK(g.operations.size() == 2);
  // Each alone is within (r1 ≈ 0.56, r2 = 0.6); together they exceed.
  CHECK(ev.operations[0].verdict == ex::Verdict::within);
  CHECK(ev.operations[1].verdict == ex::Verdict::within);
  CHECK(g.worst.ratio == Approx(r1 + r2).epsilon(0.01));
  CHECK(g.verdict == ex::Verdict::exceeds);
  CHECK(ev.verdict == ex::Verdict::exceeds);
}

TEST_CASE("points within the thin-wire validity radius are not evaluated, never a number", "[closed_form]") {
  // Ground-mounted quarter-wave monopole, 5 cm radius, standing on a cell centre (0.25, 0.25).
  em::Placement at{0.25, 0.25, 0.0, 0.0};
  const auto sol = std::make_shared<em::Solution>(
      em::solve(em::monopole(14.2e6, 5.0, at, em::Conductor{0.05}, em::perfect_ground())));
  ex::EvaluationInput in;
  in.sources = {mom_source(sol, 100.0, 0.25, 0.25)};
  in.limits = {fcc_limits(14.2e6)};
  in.zones = {square_zone("garden", Tier::controlled, -5, -5, 10)};
  in.points = {{"at the wire", Tier::controlled, {0.25, 0.25, 1.0}}, {"clear", Tier::controlled, {3.0, 3.0, 1.0}}};
  ex::EvaluationOptions o;
  o.threads = 2;
  const auto ev = ex::evaluate(in, o);
  const auto& op = ev.operations.at(0);
  CHECK(op.not_evaluated_count >= 2);  // the cell on the wire and the point of interest
  CHECK_FALSE(op.not_evaluated.empty());
  CHECK_FALSE(op.points[0].evaluated);
  CHECK(op.points[1].evaluated);
  CHECK(op.verdict != ex::Verdict::within);
  const auto& g = ev.grids.at(0);
  const int i = static_cast<int>(std::lround((0.25 - g.origin_x_m) / g.spacing_m));
  const int j = static_cast<int>(std::lround((0.25 - g.origin_y_m) / g.spacing_m));
  const std::size_t c = static_cast<std::size_t>(j) * g.nx + i;
  CHECK(g.layers[0].state[c] == ex::CellState::not_evaluated);
  CHECK(g.state[c] == ex::CellState::not_evaluated);
  CHECK(g.layers[0].ratio_controlled[c] == 0.0);
  // The worst place is never the unevaluated cell.
  CHECK(std::hypot(op.worst.at.x_m - 0.25, op.worst.at.y_m - 0.25) > 3 * 0.05);
}

TEST_CASE("identical results for any thread count", "[closed_form]") {
  const auto sol = hf_dipole();
  const auto a = ex::evaluate(dipole_input(sol, 100.0), coarse(1));
  const auto b = ex::evaluate(dipole_input(sol, 100.0), coarse(3));
  CHECK(a.operations[0].worst.ratio == b.operations[0].worst.ratio);
  CHECK(a.grids[0].layers[0].ratio_uncontrolled == b.grids[0].layers[0].ratio_uncontrolled);
  CHECK(a.operations[0].detailed_distance.uncontrolled_m == b.operations[0].detailed_distance.uncontrolled_m);
}

TEST_CASE("exposure_ratio follows the published table structure", "[closed_form]") {
  const auto l = fcc_limits(14.2e6).uncontrolled;
  // E binds alone when H is zero: (E/E_lim)² with E_lim = 824/14.2 V/m (47 CFR 1.1310 Table 1).
  const auto r = ex::exposure_ratio(29.0 * 29.0, 0.0, l);
  CHECK(std::string(r.quantity) == "E");
  CHECK(r.value == Approx(std::pow(29.0 / (824.0 / 14.2), 2)).epsilon(1e-3));
  const auto rh = ex::exposure_ratio(0.0, 0.1 * 0.1, l);
  CHECK(std::string(rh.quantity) == "H");
  CHECK(rh.value == Approx(std::pow(0.1 / (2.19 / 14.2), 2)).epsilon(1e-3));
  // 440 MHz uncontrolled: S only, f/1500 mW/cm² → S_eq = max(E²/η0, η0 H²).
  const auto u = fcc_limits(440e6).uncontrolled;
  const auto rs = ex::exposure_ratio(eta0 * 1.0, 0.0, u);  // S_eq = 1 W/m²
  CHECK(std::string(rs.quantity) == "S");
  CHECK(rs.value == Approx(1.0 / (440.0 / 1500.0 * 10.0)).epsilon(1e-3));
}

TEST_CASE("rounding: distances up to 0.1 m, power down to 3 significant figures", "[closed_form]") {
  CHECK(ex::round_up_distance(2.01) == Approx(2.1));
  CHECK(ex::round_up_distance(2.1) == Approx(2.1));
  CHECK(ex::round_down_power(6519.9) == Approx(6510.0));
  CHECK(ex::round_down_power(6.5199) == Approx(6.51));
}

TEST_CASE("coarse-first grids: same worst place as the full grid, estimates never lower and far below the limit",
          "[closed_form]") {
  // Two HF dipoles over average ground; a 64 m square zone so that the 8, 4 and 2 m blocks are used.
  struct Case {
    double f_hz, length_m, height_m, power_w;
  };
  const Case k = GENERATE(Case{14.2e6, 10.1, 8.0, 400.0}, Case{7.1e6, 20.1, 12.0, 1500.0});
  em::Placement at{0.0, 0.0, k.height_m, pi / 2};
  const auto sol = std::make_shared<em::Solution>(
      em::solve(em::dipole(k.f_hz, k.length_m, at, em::Conductor{1e-3}, em::real_ground(15.0, 0.005, "average"))));
  ex::EvaluationInput in;
  in.sources = {mom_source(sol, k.power_w)};
  in.limits = {fcc_limits(k.f_hz)};
  in.zones = {square_zone("yard", Tier::uncontrolled, -32.0, -32.0, 64.0)};
  ex::EvaluationOptions full, fast;
  full.threads = fast.threads = 2;
  full.coarse_first = false;
  const auto a = ex::evaluate(in, full);
  const auto b = ex::evaluate(in, fast);
  // The worst place is computed in both (it is near the antenna or above the 5 % threshold).
  CHECK(b.operations[0].worst.ratio == a.operations[0].worst.ratio);
  CHECK(b.operations[0].worst.at.x_m == a.operations[0].worst.at.x_m);
  CHECK(b.operations[0].worst.at.y_m == a.operations[0].worst.at.y_m);
  const auto& la = a.grids[0].layers[0];
  const auto& lb = b.grids[0].layers[0];
  std::size_t estimated = 0;
  // Largest computed ratio / largest corner ratio (estimate / 2); measured 1.0005 at 14.2 MHz and
  // 1.0000 at 7.1 MHz (GCC 12, x86-64): the field far from the wire decays monotonically here.
  double worst_under = 0.0;
  for (std::size_t c = 0; c < la.ratio_uncontrolled.size(); ++c) {
    if (lb.ratio_uncontrolled[c] == la.ratio_uncontrolled[c]) continue;  // computed in both
    ++estimated;
    // Estimated cells: below the 5 % threshold and never below the computed value.
    CHECK(lb.ratio_uncontrolled[c] < 0.05);
    CHECK(lb.ratio_uncontrolled[c] >= la.ratio_uncontrolled[c]);
    CHECK(lb.ratio_controlled[c] >= la.ratio_controlled[c]);
    worst_under = std::max(worst_under, 2.0 * la.ratio_uncontrolled[c] / lb.ratio_uncontrolled[c]);
  }
  INFO("estimated " << estimated << " of " << la.ratio_uncontrolled.size() << " cells; largest computed/corner ratio "
                    << worst_under);
  CHECK(estimated > la.ratio_uncontrolled.size() / 2);  // most of the zone is far below the limit
  CHECK(worst_under < 2.0);
}
