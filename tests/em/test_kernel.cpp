// Closed-form and independent-quadrature checks of the numeric kernels: Gauss–Legendre rules,
// segment-pair integrals of the reduced kernel, Fresnel coefficients, and segment fields.
#include <catch2/catch.hpp>

#include <cmath>
#include <complex>
#include <vector>

#include <boost/math/quadrature/gauss_kronrod.hpp>

#include "em/fields.hpp"
#include "em/kernel.hpp"
#include "em/mesh.hpp"
#include "em/solve.hpp"
#include "em_test_util.hpp"

using namespace standoff;
using cd = std::complex<double>;
using GK = boost::math::quadrature::gauss_kronrod<double, 61>;

TEST_CASE("Gauss-Legendre rules integrate polynomials of degree 2n-1 exactly", "[em][kernel]") {
  // Source: property of n-point Gauss–Legendre quadrature (Abramowitz & Stegun 25.4.29).
  const int n = GENERATE(1, 2, 3, 5, 8, 16);
  const auto g = em::kernel::gauss_legendre(n);
  for (int deg = 0; deg <= 2 * n - 1; ++deg) {
    double s = 0.0;
    for (std::size_t i = 0; i < g.x.size(); ++i) s += g.w[i] * std::pow(g.x[i], deg);
    CHECK(s == Approx(1.0 / (deg + 1)).epsilon(1e-13));  // rounding only
  }
}

namespace {

// Independent reference for S[α][β] and T by nested adaptive Gauss–Kronrod (Boost.Math), the inner
// integral split where the source comes closest to the observation point.
struct RefIntegrals {
  cd s[2][2];
  cd t;
};
RefIntegrals reference(const em::kernel::Line& p, const em::kernel::Line& q, double a2, double k) {
  RefIntegrals out{};
  for (int part = 0; part < 2; ++part)
    for (int alpha = 0; alpha < 3; ++alpha)
      for (int beta = 0; beta < 3; ++beta) {
        if ((alpha == 2) != (beta == 2)) continue;  // (2,2) = T
        auto outer = [&](double s) {
          const Eigen::Vector3d r = p.p0 + s * p.t;
          const double s0 = std::clamp((r - q.p0).dot(q.t), 0.0, q.length);
          auto inner = [&](double sp) {
            const double rr = std::sqrt((r - (q.p0 + sp * q.t)).squaredNorm() + a2);
            const cd g = std::exp(cd(0.0, -k * rr)) / (4.0 * constants::pi * rr);
            const double nb = beta == 2 ? 1.0 : (beta == 1 ? sp / q.length : 1.0 - sp / q.length);
            return part == 0 ? (g * nb).real() : (g * nb).imag();
          };
          double v = 0.0;
          if (s0 > 0.0) v += GK::integrate(inner, 0.0, s0, 12, 1e-10);
          if (s0 < q.length) v += GK::integrate(inner, s0, q.length, 12, 1e-10);
          const double na = alpha == 2 ? 1.0 : (alpha == 1 ? s / p.length : 1.0 - s / p.length);
          return na * v;
        };
        const double v = GK::integrate(outer, 0.0, p.length, 12, 1e-9);
        cd& dst = alpha == 2 ? out.t : out.s[alpha][beta];
        dst += part == 0 ? cd(v, 0.0) : cd(0.0, v);
      }
  return out;
}

}  // namespace

TEST_CASE("segment-pair integrals of the reduced kernel match adaptive quadrature", "[em][kernel]") {
  const double lambda = 1.0, k = 2.0 * constants::pi / lambda, d = lambda / 40.0;
  struct Case {
    const char* name;
    em::kernel::Line p, q;
    double a;
  };
  const Eigen::Vector3d z(0, 0, 1), x(1, 0, 0);
  const Eigen::Vector3d bent = Eigen::Vector3d(1, 0, 1).normalized();
  const std::vector<Case> cases{
      {"self, thick (delta/a = 10)", {{0, 0, 0}, z, d}, {{0, 0, 0}, z, d}, d / 10},
      {"self, thin (delta/a = 250)", {{0, 0, 0}, z, d}, {{0, 0, 0}, z, d}, d / 250},
      {"adjacent collinear", {{0, 0, 0}, z, d}, {{0, 0, d}, z, d}, d / 50},
      {"junction at 45 degrees", {{0, 0, 0}, z, d}, {{0, 0, d}, bent, d}, d / 50},
      {"parallel, 0.5 delta apart", {{0, 0, 0}, z, d}, {{0.5 * d, 0, 0.3 * d}, z, d}, d / 50},
      {"perpendicular, 1.5 delta", {{0, 0, 0}, z, d}, {{1.5 * d, 0, 0}, x, d}, d / 50},
      {"far (6 delta)", {{0, 0, 0}, z, d}, {{2 * d, 0, 6 * d}, x, d}, d / 50},
  };
  for (const auto& c : cases) {
    SECTION(c.name) {
      const auto ours = em::kernel::pair_integrals(c.p, c.q, c.a * c.a, k);
      const auto ref = reference(c.p, c.q, c.a * c.a, k);
      // Tolerance: graded 5-point outer and 6-point smooth-part rules, ~1e-5 relative to the
      // largest entry (well below the thin-wire model error of ~1e-3).
      const double scale = std::abs(ref.t);
      for (int a = 0; a < 2; ++a)
        for (int b = 0; b < 2; ++b) CHECK(std::abs(ours.s[a][b] - ref.s[a][b]) < 2e-5 * scale);
      CHECK(std::abs(ours.t - ref.t) < 2e-5 * scale);
    }
  }
}

TEST_CASE("Fresnel reflection coefficients: limits and normal incidence", "[em][kernel]") {
  // Source: Balanis, Antenna Theory 3rd ed. §4.8 (eqs. 4-125, 4-126): at normal incidence
  // R_v = −R_h = (√εc − 1)/(√εc + 1); for σ → ∞, R_v → +1 and R_h → −1.
  const cd eps(15.0, -3.6);
  const auto [rv, rh] = em::kernel::reflection(eps, 1.0);
  const cd expect = (std::sqrt(eps) - 1.0) / (std::sqrt(eps) + 1.0);
  CHECK(std::abs(rv - expect) < 1e-14);
  CHECK(std::abs(rh + expect) < 1e-14);
  const double cos_t = GENERATE(0.05, 0.3, 0.7, 1.0);
  const auto [rv2, rh2] = em::kernel::reflection(cd(10.0, -1e9), cos_t);
  // |εc| = 1e9: R_v ≈ 1 − 2/(√εc cosθ) and R_h ≈ −1 + 2cosθ/√εc (first order in 1/√εc).
  CHECK(std::abs(rv2 - 1.0) < 2.5 / (std::sqrt(1e9) * cos_t));
  CHECK(std::abs(rh2 + 1.0) < 2.5 * cos_t / std::sqrt(1e9));
  // Grazing incidence: both coefficients → −1 (Balanis §4.8 Fig. 4.28 discussion).
  const auto [rv3, rh3] = em::kernel::reflection(eps, 0.0);
  CHECK(std::abs(rv3 + 1.0) < 1e-12);
  CHECK(std::abs(rh3 + 1.0) < 1e-12);
}

namespace {

// A straight z-directed dipole model (|z| <= h) with n segments, currents replaced by `current(z)`
// sampled at the nodes; input power set to 1/2 W so that near_fields(..., 1 W) returns the peak
// fields of exactly these currents.
em::Solution imposed(double h, int n, double radius, double f, const std::function<cd(double)>& current) {
  em::Model m;
  m.frequency_hz = f;
  em::Wire w;
  w.a = {0, 0, -h};
  w.b = {0, 0, h};
  w.radius_m = radius;
  w.segments = n;
  w.conductivity_s_per_m = INFINITY;
  m.wires.push_back(w);
  m.feeds.push_back({0, 0.5, {1.0, 0.0}});
  em::SolveOptions o;
  o.integrate_pattern = false;
  em::Solution s = em::solve(m, o);
  for (int j = 1; j < n; ++j) s.currents(j - 1) = current(-h + 2.0 * h * j / n);
  s.input_power_w = 0.5;
  return s;
}

}  // namespace

TEST_CASE("near-field routine reproduces the closed-form fields of a sinusoidal current", "[em][kernel]") {
  // Source: Schelkunoff closed form (em_test_util.hpp; Balanis §8.6). The current is sampled on
  // 400 linear pieces; the piecewise-linear error is O((kΔ)²) ≈ 1e-4.
  const double f = 100e6, lambda = constants::c0 / f, k = 2 * constants::pi / lambda, h = lambda / 4;
  const cd im(1.0, 0.0);
  const auto sol = imposed(h, 400, 1e-6 * lambda, f, [&](double z) { return im * std::sin(k * (h - std::abs(z))); });
  std::vector<Eigen::Vector3d> pts;
  for (double rho : {0.05, 0.1, 0.3, 1.0})
    for (double z : {-0.4, 0.0, 0.1, 0.24, 0.6}) pts.emplace_back(rho * lambda, 0.0, z * lambda);
  const auto fields = em::near_fields(sol, pts, 1.0);
  for (std::size_t i = 0; i < pts.size(); ++i) {
    INFO("rho/lambda = " << pts[i].x() / lambda << ", z/lambda = " << pts[i].z() / lambda);
    const auto ref = em_test::schelkunoff(pts[i].x(), pts[i].z(), h, k, im);
    const auto& fp = fields[i];
    REQUIRE(fp.valid);
    const double emag = std::hypot(std::abs(ref.e_z), std::abs(ref.e_rho));
    // E within 0.5 % of |E| (piecewise-linear current, kΔ = π/400 per piece).
    CHECK(std::abs(fp.e_v_per_m.z() - ref.e_z) < 5e-3 * emag);
    CHECK(std::abs(fp.e_v_per_m.x() - ref.e_rho) < 5e-3 * emag);
    CHECK(std::abs(fp.e_v_per_m.y()) < 1e-6 * emag);
    // H within 0.5 % (same reason); φ̂ = +y on the x axis.
    CHECK(std::abs(fp.h_a_per_m.y() - ref.h_phi) < 5e-3 * std::abs(ref.h_phi));
  }
}

TEST_CASE("near fields of a very short element match the Hertzian dipole", "[em][kernel]") {
  // Source: Balanis, Antenna Theory 3rd ed. eqs. 4-8a..4-10c (MOM-NOTES §3). A triangular current of
  // peak I0 over length L has moment I·l = I0·L/2; higher multipoles are O((L/r)²) < 1e-4 here.
  const double f = 30e6, lambda = constants::c0 / f, k = 2 * constants::pi / lambda, len = lambda / 2000;
  const auto sol = imposed(len / 2, 2, len / 100, f, [](double) { return cd(1.0, 0.0); });
  const double il = len / 2;
  const double eta = constants::eta0;
  const cd j(0, 1);
  for (double r_l : {0.02, 0.1, 0.5, 2.0})
    for (double theta : {0.3, 1.0, constants::pi / 2}) {
      const double r = r_l * lambda;
      const Eigen::Vector3d p(r * std::sin(theta), 0, r * std::cos(theta));
      const auto fp = em::near_fields(sol, std::span<const Eigen::Vector3d>(&p, 1), 1.0).front();
      const cd ex = std::exp(-j * k * r);
      const cd hphi = j * k * il * std::sin(theta) / (4 * constants::pi * r) * (1.0 + 1.0 / (j * k * r)) * ex;
      const cd er = eta * il * std::cos(theta) / (2 * constants::pi * r * r) * (1.0 + 1.0 / (j * k * r)) * ex;
      const cd eth = j * eta * k * il * std::sin(theta) / (4 * constants::pi * r) *
                     (1.0 + 1.0 / (j * k * r) - 1.0 / (k * r * k * r)) * ex;
      const Eigen::Vector3d rhat(std::sin(theta), 0, std::cos(theta)), that(std::cos(theta), 0, -std::sin(theta));
      const Eigen::Vector3cd e_ref = er * rhat.cast<cd>() + eth * that.cast<cd>();
      INFO("r/lambda = " << r_l << ", theta = " << theta);
      // 1e-3 relative: dipole-moment approximation and quadrature.
      CHECK((fp.e_v_per_m - e_ref).norm() < 1e-3 * e_ref.norm());
      CHECK(std::abs(fp.h_a_per_m.y() - hphi) < 1e-3 * std::abs(hphi));
    }
}
