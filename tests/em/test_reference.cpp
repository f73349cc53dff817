// Reference checks of the thin-wire MoM engine against published closed forms (Balanis, Kraus),
// image theory, an independent Hallén/pulse formulation written here, and power conservation.
#include <catch2/catch.hpp>

#include <cmath>
#include <complex>
#include <vector>

#include <Eigen/LU>
#include <boost/math/quadrature/gauss.hpp>

#include "em/builders.hpp"
#include "em/fields.hpp"
#include "em/mesh.hpp"
#include "em/solve.hpp"
#include "em_test_util.hpp"

using namespace standoff;
using cd = std::complex<double>;

namespace {

constexpr double kF = 14.2e6;
const double kLambda = constants::c0 / kF;
const double kK = 2 * constants::pi / kLambda;

em::Conductor perfect(double radius) { return {radius, INFINITY}; }

em::Model straight_dipole(double length, double radius, int segments, const em::Ground& g = em::free_space(),
                          double height = 0.0) {
  em::Placement at;
  at.height_m = height;
  em::Model m = em::dipole(kF, length, at, perfect(radius), g);
  m.wires[0].segments = segments;
  return m;
}

// Independent formulation: Hallén's equation for a centre-fed straight dipole (Balanis eq. 8-25,
// e^{+jωt}): ∫ I(z') K(z − z') dz' = −j/η [C cos kz + (V/2) sin k|z|], K = e^{−jkR}/(4πR),
// R = √((z − z')² + a²), with pulse currents at z_n = nΔ (n = 0..M−1, I_M = 0 at the end),
// symmetric about the feed, point-matched at z_m = mΔ (m = 0..M). Returns V/I(0).
cd hallen_impedance(double length, double radius, int m_pulses) {
  const double h = length / 2, d = h / m_pulses, a2 = radius * radius, eta = constants::eta0;
  const cd j(0, 1);
  // ∫_{u1}^{u2} K(u) du: 1/R part in closed form, the rest by 20-point Gauss–Legendre.
  auto kint = [&](double u1, double u2) {
    const cd sing = std::asinh(u2 / radius) - std::asinh(u1 / radius);
    const double re = boost::math::quadrature::gauss<double, 20>::integrate(
        [&](double u) { const double r = std::sqrt(u * u + a2); return (std::cos(kK * r) - 1.0) / r; }, u1, u2);
    const double im = boost::math::quadrature::gauss<double, 20>::integrate(
        [&](double u) { const double r = std::sqrt(u * u + a2); return -std::sin(kK * r) / r; }, u1, u2);
    return (sing + cd(re, im)) / (4 * constants::pi);
  };
  const int n = m_pulses + 1;
  Eigen::MatrixXcd a = Eigen::MatrixXcd::Zero(n, n);
  Eigen::VectorXcd rhs(n);
  for (int mi = 0; mi <= m_pulses; ++mi) {
    const double z = mi * d;
    // Pulse 0 spans [−Δ/2, Δ/2]; pulse q ≥ 1 spans [qΔ − Δ/2, qΔ + Δ/2] and its mirror image.
    a(mi, 0) = kint(z - 0.5 * d, z + 0.5 * d);
    for (int q = 1; q < m_pulses; ++q) {
      const double lo = q * d - 0.5 * d, hi = q * d + 0.5 * d;
      a(mi, q) = kint(z - hi, z - lo) + kint(z + lo, z + hi);
    }
    a(mi, m_pulses) = (j / eta) * std::cos(kK * z);  // unknown C
    rhs(mi) = -(j / eta) * 0.5 * std::sin(kK * z);   // V = 1
  }
  const Eigen::VectorXcd x = a.partialPivLu().solve(rhs);
  return 1.0 / x(0);
}

double resonant_length(const std::function<double(double)>& reactance, double l0) {
  double la = l0, lb = 1.02 * l0, xa = reactance(la), xb = reactance(lb);
  for (int i = 0; i < 40 && std::abs(xb) > 1e-6; ++i) {
    const double ln = lb - xb * (lb - la) / (xb - xa);
    la = lb;
    xa = xb;
    lb = ln;
    xb = reactance(lb);
  }
  return lb;
}

}  // namespace

TEST_CASE("reaction of a sinusoidal current through Z approaches the induced-EMF impedance", "[em][reference]") {
  // Source: Balanis, Antenna Theory 3rd ed. eqs. 8-60a/8-61a for l = λ/2: Z = (η/4π)[Cin(2π) + j Si(2π)]
  // = 73.1 + j42.5 Ω (the radius term vanishes because sin kl = 0); Cin and Si by Boost quadrature.
  // Galerkin reaction <I, Z I>/I(0)² of the sampled sinusoid uses the same reduced kernel.
  const double f = 100e6, lambda = constants::c0 / f, k = 2 * constants::pi / lambda, h = lambda / 4;
  const cd expected = constants::eta0 / (4 * constants::pi) * cd(em_test::cin(2 * constants::pi), em_test::si(2 * constants::pi));
  CHECK(expected.real() == Approx(73.1).margin(0.05));  // Balanis §4.6 value, as printed
  CHECK(expected.imag() == Approx(42.5).margin(0.05));
  const double a_over_lambda = GENERATE(1e-3, 1e-4, 1e-5);
  em::Model m;
  m.frequency_hz = f;
  em::Wire w;
  w.a = {0, 0, -h};
  w.b = {0, 0, h};
  w.radius_m = a_over_lambda * lambda;
  w.segments = 60;
  w.conductivity_s_per_m = INFINITY;
  m.wires.push_back(w);
  m.feeds.push_back({});
  const em::System sys = em::assemble(m);
  Eigen::VectorXcd cur(59);
  for (int j = 1; j < 60; ++j) cur(j - 1) = std::sin(k * (h - std::abs(-h + 2 * h * j / 60.0)));
  const cd z = (cur.transpose() * sys.z * cur)(0, 0);
  INFO("a/lambda = " << a_over_lambda << ": Z = " << z);
  // 0.5 %: piecewise-linear sampling of the sinusoid (60 pieces) and quadrature.
  CHECK(std::abs(z - expected) < 5e-3 * std::abs(expected));
}

TEST_CASE("dipole impedance and resonant length agree with an independent Hallén solution", "[em][reference]") {
  // a/λ = 0.001 as in issue 4. Hallén with pulses (above) is a different equation, basis and
  // testing; both use a delta-gap feed and the reduced kernel.
  const double a = 1e-3 * kLambda;
  const cd zh = hallen_impedance(0.5 * kLambda, a, 60);
  const cd zm = em::solve(straight_dipole(0.5 * kLambda, a, 40)).impedance();
  INFO("Hallen " << zh << ", MoM " << zm);
  // Resistance within 3 %, reactance within 4 Ω: the two delta-gap models differ (gap capacitance).
  CHECK(zm.real() == Approx(zh.real()).epsilon(0.03));
  CHECK(zm.imag() == Approx(zh.imag()).margin(4.0));

  const double lh = resonant_length([&](double l) { return hallen_impedance(l, a, 60).imag(); }, 0.48 * kLambda);
  const auto res = em::resonate([&](double l) { return straight_dipole(l, a, 40); }, 0.48 * kLambda);
  INFO("resonant length: Hallen " << lh / kLambda << " lambda, MoM " << res.length_m / kLambda << " lambda");
  // Published: about 0.476 λ at a/λ = 0.001 (issue 4; from memory, verify against Balanis Fig. 8.?
  // King's tables). Both formulations within 0.5 % of each other, and within 1 % of 0.476 λ.
  CHECK(res.length_m == Approx(lh).epsilon(0.005));
  CHECK(res.length_m / kLambda == Approx(0.476).epsilon(0.01));
  CHECK(std::abs(res.impedance_ohm.imag()) < 0.01);
}

TEST_CASE("thin half-wave dipole: directivity 1.64 and power balance", "[em][reference]") {
  // Source: Balanis eq. 4-91: D0 = 4/Cin(2π) ≈ 1.643 (2.15 dBi) for the sinusoidal current.
  const auto sol = em::solve(straight_dipole(0.5 * kLambda, 1e-5 * kLambda, 40));
  const auto pk = em::peak_gain(sol);
  const double d_ref = 4.0 / em_test::cin(2 * constants::pi);
  // 1 %: the MoM current of a thin dipole deviates slightly from a sinusoid.
  CHECK(pk.gain == Approx(d_ref).epsilon(0.01));
  // Broadside: the peak direction is perpendicular to the wire (which runs north, +y).
  const double ce = std::cos(pk.direction.elevation_rad);
  CHECK(std::abs(ce * std::cos(pk.direction.azimuth_rad)) < 0.02);
  // Lossless: radiated = input within 1 % (issue 4 power balance).
  CHECK(sol.radiated_power_w == Approx(sol.input_power_w).epsilon(0.01));
}

TEST_CASE("short dipole radiation resistance tends to 20 pi^2 (L/lambda)^2 as the wire thins", "[em][reference]") {
  // Source: Balanis eq. 4-37 (triangular current, L ≪ λ). The solved current departs from the
  // triangle by O(1/Ω), Ω = 2 ln(L/a) (delta-gap charge near the feed; King, The Theory of Linear
  // Antennas — from memory, verify), so the check is the trend plus 4 % at L/a = 1e6 (1/Ω = 3.6 %).
  const double ratio = GENERATE(0.01, 0.02, 0.05);
  const double len = ratio * kLambda, r_ref = 20 * constants::pi * constants::pi * ratio * ratio;
  double last_error = 1.0;
  for (double l_over_a : {1e2, 1e3, 1e4, 1e6}) {
    const double err = std::abs(em::solve(straight_dipole(len, len / l_over_a, 10)).impedance().real() / r_ref - 1.0);
    CHECK(err < last_error);
    last_error = err;
  }
  CHECK(last_error < 0.04);
  // With two segments the current IS the triangle: then only the O((kL)²) terms remain (0.5 %).
  CHECK(em::solve(straight_dipole(len, len / 1000, 2)).impedance().real() == Approx(r_ref).epsilon(0.005));
}

TEST_CASE("solved half-wave dipole tends to 73.1 + j42.5 ohm as the wire thins", "[em][reference]") {
  // Source: Balanis §4.6 (induced EMF, thin limit). The solved current converges to the sinusoid
  // slowly (O(1/Ω)); at a/λ = 1e-8 (Ω ≈ 37) within 4 %, and the resistance falls as a shrinks.
  double last_r = 1e9;
  for (double a_over_lambda : {1e-3, 1e-5, 1e-8}) {
    const cd z = em::solve(straight_dipole(0.5 * kLambda, a_over_lambda * kLambda, 40)).impedance();
    CHECK(z.real() < last_r);
    last_r = z.real();
    if (a_over_lambda == 1e-8) CHECK(std::abs(z - cd(73.1, 42.5)) < 0.04 * std::abs(cd(73.1, 42.5)));
  }
}

TEST_CASE("small loop radiation resistance 20 pi^2 (C/lambda)^4", "[em][reference]") {
  // Source: Balanis eqs. 5-24/5-24a: R = η(π/6)(k²S/π)² for a loop of area S (= 20π²(C/λ)⁴ for a
  // circle with η = 120π). Evaluated with the polygon's own area; 3 %: the current is not quite
  // uniform at C = λ/20 and λ/30.
  const double c_over_l = GENERATE(1.0 / 20, 1.0 / 30);
  const int sides = 16;
  em::Placement at;
  at.height_m = 0;
  em::Model m = em::horizontal_loop(kF, c_over_l * kLambda, sides, at, perfect(1e-5 * kLambda), em::free_space());
  for (auto& w : m.wires) w.segments = 2;
  const auto sol = em::solve(m);
  const double side = c_over_l * kLambda / sides;
  const double area = sides * side * side / (4 * std::tan(constants::pi / sides));
  const double r_ref = constants::eta0 * (constants::pi / 6) * std::pow(kK * kK * area / constants::pi, 2);
  CHECK(sol.impedance().real() == Approx(r_ref).epsilon(0.03));
  // Cross-check of the printed form for a circle of the same perimeter (polygon area is 2.6 %
  // (16 sides) below the circle's, so R is 5 % lower).
  CHECK(r_ref < 20 * constants::pi * constants::pi * std::pow(c_over_l, 4));
}

TEST_CASE("quarter-wave monopole on perfect ground is half the dipole (image theory)", "[em][reference]") {
  // Source: image theory (Balanis §4.7.1): Z_monopole = Z_dipole/2 exactly for the same current.
  const double a = 1e-4 * kLambda;
  const auto zd = em::solve(straight_dipole(0.5 * kLambda, a, 40)).impedance();
  em::Placement at;
  at.height_m = 0;
  em::Model mono = em::monopole(kF, 0.25 * kLambda, at, perfect(a), em::perfect_ground());
  mono.wires[0].segments = 20;
  const auto sm = em::solve(mono);
  CHECK(std::abs(sm.impedance() - 0.5 * zd) < 1e-6 * std::abs(zd));  // same integrals, rounding only
  // Thin limit ≈ 36.5 Ω (Balanis §4.7.1, half of 73.1 Ω), approached as O(1/Ω): 10 % at a/λ = 1e-4.
  CHECK(sm.impedance().real() == Approx(36.5).epsilon(0.10));
  // Over the ground plane: radiated power over the upper half space equals the input power.
  CHECK(sm.radiated_power_w == Approx(sm.input_power_w).epsilon(0.01));
  // Directivity doubles: 2 × 1.64 ≈ 3.28 (5.16 dBi) for the thin limit (image theory); 2 %.
  CHECK(em::peak_gain(sm).gain == Approx(2 * 4.0 / em_test::cin(2 * constants::pi)).epsilon(0.02));
}

TEST_CASE("horizontal dipole over perfect ground equals the dipole with its antiphase image", "[em][reference]") {
  // Source: image theory (Balanis §4.7.2): perfect ground ≡ a mirrored dipole driven in antiphase.
  const double a = 1e-3 * kLambda, hgt = 0.2 * kLambda, len = 0.48 * kLambda;
  const auto over = em::solve(straight_dipole(len, a, 30, em::perfect_ground(), hgt));
  em::Model two = straight_dipole(len, a, 30, em::free_space(), hgt);
  em::Model img = straight_dipole(len, a, 30, em::free_space(), -hgt);
  two.wires.push_back(img.wires[0]);
  two.feeds.push_back({1, 0.5, {-1.0, 0.0}});
  const auto free2 = em::solve(two);
  CHECK(std::abs(over.impedance() - free2.feeds[0].impedance_ohm) < 1e-9 * std::abs(over.impedance()));
  CHECK(over.radiated_power_w == Approx(over.input_power_w).epsilon(0.01));
}

TEST_CASE("reciprocity: Z is complex symmetric and mutual admittances agree", "[em][reference]") {
  // Source: reciprocity theorem (Harrington 1968 §4.?; Balanis §3.8): Z_mn = Z_nm, Y12 = Y21.
  em::Placement at;
  at.height_m = 0.15 * kLambda;
  em::Model v = em::inverted_v(kF, 0.5 * kLambda, 0.6, at, perfect(1e-3 * kLambda), em::real_ground(13, 5e-3, "test"));
  v.wires.push_back({{3.0, 2.0, 4.0}, {3.0, 2.0, 4.0 + 0.3 * kLambda}, 1e-3 * kLambda, 0, INFINITY, "vertical"});
  const em::System sys = em::assemble(v);
  const double rel = (sys.z - sys.z.transpose()).norm() / sys.z.norm();
  CHECK(rel < 1e-12);  // rounding only
  auto drive = [&](int which) {
    em::Model m = v;
    m.feeds = {{0, 1.0, {which == 0 ? 1.0 : 0.0, 0.0}}, {2, 0.5, {which == 1 ? 1.0 : 0.0, 0.0}}};
    return em::solve(m);
  };
  const cd y21 = drive(0).feeds[1].current, y12 = drive(1).feeds[0].current;
  CHECK(std::abs(y21 - y12) < 1e-9 * std::abs(y21));
}

TEST_CASE("folded dipole: step-up of about 4 and Kraus unequal-radius step-up", "[em][reference]") {
  // Sources: 4 × the dipole (≈ 292 Ω at resonance; common practice (no source)) and Kraus,
  // Antennas 2nd ed. §? (from memory, verify against Kraus "folded dipole"): step-up
  // (1 + ln(s/r1)/ln(s/r2))², r1 fed conductor. The formula is quasi-static (s ≪ λ): 10 %.
  const double s = 0.01 * kLambda, r = 1e-4 * kLambda;
  em::Placement at;
  at.height_m = 0;
  auto folded = [&](double r1, double r2, double len) {
    em::Model m = em::folded_dipole(kF, len, s, at, perfect(r1), perfect(r2), em::free_space());
    m.wires[0].segments = m.wires[1].segments = 40;
    m.wires[2].segments = m.wires[3].segments = 1;
    return m;
  };
  // Reference dipole: same length, equivalent radius √(r s) of the pair (Balanis §9.5, from
  // memory, verify).
  const double len = 0.48 * kLambda;
  const auto zd = em::solve(straight_dipole(len, std::sqrt(r * s), 40)).impedance();
  const auto zf = em::solve(folded(r, r, len)).impedance();
  INFO("dipole " << zd << ", folded " << zf);
  CHECK(zf.real() / zd.real() == Approx(4.0).epsilon(0.05));  // 5 %: transmission-line mode
  const auto res = em::resonate([&](double l) { return folded(r, r, l); }, len);
  CHECK(res.impedance_ohm.real() == Approx(292).epsilon(0.1));

  const double r1 = 0.5 * r, r2 = 2.5 * r;
  const double kraus = std::pow(1 + std::log(s / r1) / std::log(s / r2), 2);
  const auto zu = em::solve(folded(r1, r2, len)).impedance();
  INFO("unequal " << zu << ", Kraus step-up " << kraus);
  CHECK(zu.real() / zd.real() == Approx(kraus).epsilon(0.10));
}

TEST_CASE("power balance with conductor and load losses", "[em][reference]") {
  // Source: conservation of energy (Poynting): input = radiated + ohmic + load, within 1 %.
  em::Placement at;
  at.height_m = 0;
  em::Model m = em::dipole(3.6e6, 39.0, at, em::Conductor{em::awg_radius_m(28), constants::sigma_copper}, em::free_space());
  m.loads.push_back({0, 0.25, {20.0, 5.0}});
  const auto sol = em::solve(m);
  INFO("ohmic " << sol.ohmic_loss_w / sol.input_power_w << ", load " << sol.load_loss_w / sol.input_power_w);
  CHECK(sol.ohmic_loss_w > 0.01 * sol.input_power_w);  // the check is meaningful: losses are visible
  CHECK(sol.load_loss_w > 0.01 * sol.input_power_w);
  CHECK(sol.radiated_power_w + sol.ohmic_loss_w + sol.load_loss_w == Approx(sol.input_power_w).epsilon(0.01));
  CHECK(sol.efficiency == Approx(sol.radiated_power_w / sol.input_power_w).epsilon(1e-12));
}

TEST_CASE("AWG radius from the ASTM B258 definition", "[em][reference]") {
  // Source: ASTM B258 / standard AWG tables: 12 AWG = 2.053 mm, 14 AWG = 1.628 mm, 0000 = 11.684 mm.
  CHECK(2 * em::awg_radius_m(12) == Approx(2.053e-3).epsilon(1e-3));
  CHECK(2 * em::awg_radius_m(14) == Approx(1.628e-3).epsilon(1e-3));
  CHECK(2 * em::awg_radius_m(-3) == Approx(11.684e-3).epsilon(1e-3));
}
