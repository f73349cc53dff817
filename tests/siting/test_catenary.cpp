// Exact catenary against a textbook worked example, closed-form identities, Boost.Math
// quadrature and minimisation (independent numerical references), and the parabolic form for
// small sag. Notation as in src/siting/catenary.hpp.
#include <catch2/catch.hpp>

#include <cmath>

#include <boost/math/quadrature/gauss_kronrod.hpp>
#include <boost/math/tools/minima.hpp>

#include "core/constants.hpp"
#include "siting/catenary.hpp"
#include "siting/checks.hpp"
#include "io/clearances_toml.hpp"

using namespace standoff;
using namespace standoff::siting;

TEST_CASE("catenary: level span 500 ft with 100 ft sag, 3 lb/ft", "[reference]") {
  // from memory, verify against Beer & Johnston, Vector Mechanics for Engineers: Statics, cables
  // chapter, sample problem "uniform cable weighing 3 lb/ft, span 500 ft, sag 100 ft":
  // c = 328 ft, T_min = 984 lb, T_max = 1284 lb, length 550 ft (printed to 3–4 digits).
  const double ft = constants::metres_per_foot;
  const double w = 3.0 * constants::newtons_per_pound_force / ft;  // 3 lb/ft in N/m
  const double lbf = constants::newtons_per_pound_force;
  const auto c = Catenary::from_midspan_sag(500 * ft, 0.0, 100 * ft);
  CHECK(c.parameter() / ft == Approx(328).epsilon(0.002));   // printed to 3 digits
  CHECK(w * c.parameter() / lbf == Approx(984).epsilon(0.001));  // T_min = H, 3 digits
  CHECK(c.end_tension(0, w) / lbf == Approx(1284).epsilon(0.0005));  // 4 digits
  CHECK(c.end_tension(1, w) / lbf == Approx(1284).epsilon(0.0005));
  CHECK(c.length() / ft == Approx(550).epsilon(0.001));     // 3 digits
  // Level-span identity T_end = H + w·d (REFERENCES.md §7): exact up to float rounding.
  CHECK(c.end_tension(0, w) == Approx(w * c.parameter() + w * 100 * ft).epsilon(1e-12));
}

TEST_CASE("catenary: ends, arc length, tensions and lowest point vs independent numerics", "[closed_form]") {
  struct Case { double L; double dz; double c; };
  auto k = GENERATE(Case{30, 0, 275}, Case{40, 6, 60}, Case{25, -8, 10}, Case{100, 30, 40}, Case{12, 11, 3});
  CAPTURE(k.L, k.dz, k.c);
  const auto cat = Catenary::from_parameter(k.L, k.dz, k.c);
  // The curve passes through both supports (definition of x0).
  CHECK(cat.z(0.0) == Approx(0.0).margin(1e-12 * k.L));
  CHECK(cat.z(k.L) == Approx(k.dz).margin(1e-9 * k.L));
  // Arc length S = ∫ √(1 + z'²) dx by adaptive Gauss–Kronrod (Boost.Math), tolerance 1e-10.
  using boost::math::quadrature::gauss_kronrod;
  const double S = gauss_kronrod<double, 31>::integrate(
      [&](double x) { return std::sqrt(1.0 + cat.slope(x) * cat.slope(x)); }, 0.0, k.L, 15, 1e-13);
  CHECK(cat.length() == Approx(S).epsilon(1e-10));
  // Tension along the tangent with horizontal component H = w·c: T = H·√(1 + z'²) (statics).
  const double w = 0.2;
  CHECK(cat.end_tension(1, w) == Approx(w * k.c * std::sqrt(1.0 + cat.slope(k.L) * cat.slope(k.L))).epsilon(1e-12));
  // Lowest point by Brent minimisation (Boost.Math) over the span: 1e-9 m for 52-bit search.
  const auto low = boost::math::tools::brent_find_minima([&](double x) { return cat.z(x); }, 0.0, k.L, 52);
  CHECK(cat.lowest_z() == Approx(low.second).margin(1e-8));  // Brent locates x to ~√eps
  // Largest sag below the chord by Brent minimisation of −sag.
  const auto sag = boost::math::tools::brent_find_minima([&](double x) { return -cat.sag_below_chord(x); }, 0.0, k.L, 52);
  CHECK(cat.max_sag() == Approx(-sag.second).margin(1e-8));
  // A measured mid-span sag gives back the same catenary (bisection to full precision).
  const auto back = Catenary::from_midspan_sag(k.L, k.dz, cat.midspan_sag());
  CHECK(back.parameter() == Approx(k.c).epsilon(1e-8));
}

TEST_CASE("catenary tends to the parabola wL²/(8H) for small sag", "[convergence]") {
  // Series: d = c(cosh u − 1) = (L²/8c)(1 + u²/12 + O(u⁴)), u = L/(2c) (Beer & Johnston: parabolic
  // cable for small sag). The relative excess over the parabola divided by u²/12 must tend to 1.
  const double L = 30.0;
  double previous_error = 1.0;
  for (double c : {30.0, 100.0, 300.0, 1000.0, 3000.0}) {
    const auto cat = Catenary::from_parameter(L, 0.0, c);
    const double u = L / (2.0 * c);
    const double excess = cat.midspan_sag() / cat.parabolic_midspan_sag() - 1.0;
    const double error = std::abs(excess / (u * u / 12.0) - 1.0);
    CAPTURE(c, excess, error);
    CHECK(error < previous_error);  // shrinks as the sag shrinks (next term ∝ u²)
    previous_error = error;
  }
  CHECK(previous_error < 1e-5);
}

TEST_CASE("sag of 14 AWG copper over 30 m at 50 N, from the wire-table weight", "[reference]") {
  // Wire weight 12.43 lb/1000 ft for 14 AWG copper (standard wire tables, REFERENCES.md §7);
  // sag d = c(cosh(L/2c) − 1), c = H/w (Beer & Johnston). Hand value: w = 0.18141 N/m,
  // c = 275.6 m, d = 0.408 m.
  const double w = 12.43 * constants::kilograms_per_pound / (1000 * constants::metres_per_foot) *
                   constants::standard_gravity;
  const double c = 50.0 / w;
  const double expected = c * (std::cosh(15.0 / c) - 1.0);
  CHECK(expected == Approx(0.408).margin(0.0005));
  CHECK(w * 900.0 / (8.0 * 50.0) == Approx(expected).epsilon(0.001));  // parabola, small sag

  // The same through the span model with the wire class from tables/clearances.toml.
  Span s;
  s.name = "test";
  s.from = Point3{units::metres(0), units::metres(0), units::metres(10)};
  s.to = Point3{units::metres(30), units::metres(0), units::metres(10)};
  const auto* wc = builtin_clearance_tables().find_wire("14-awg-hard-drawn-copper");
  REQUIRE(wc);
  s.mass_per_length = wc->mass_per_length;
  s.tension = newtons(50.0);
  const auto shape = span_shape(s);
  REQUIRE(shape.catenary);
  CHECK(shape.catenary->midspan_sag() == Approx(expected).epsilon(1e-12));
  CHECK(shape.lowest_z_m() == Approx(10.0 - expected).epsilon(1e-12));
}
