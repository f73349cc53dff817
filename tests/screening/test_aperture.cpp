// Aperture (dish) model of FCC OET Bulletin 65 Section 2 (formulas [verify], REFERENCES.md §4):
// continuity between the transition and far-field formulas at R_ff, the textbook gain of a
// circular aperture G = η(πD/λ)², and S_nf = η·S_surface (both follow from A = πD²/4).
#include <catch2/catch.hpp>

#include <cmath>

#include "core/constants.hpp"
#include "exposure/aperture.hpp"

using namespace standoff;
using namespace standoff::exposure;

TEST_CASE("dish: regions, gain and continuity at R_ff", "[aperture]") {
  struct Case { double d_m; double f_hz; double eta; };
  auto c = GENERATE(Case{3.0, 10e9, 0.55}, Case{1.2, 2.4e9, 0.6}, Case{10.0, 1.296e9, 0.5});
  CAPTURE(c.d_m, c.f_hz);
  const auto p = units::watts(100);
  const auto r = aperture_regions({units::metres(c.d_m), units::Fraction{c.eta}}, p, units::hertz(c.f_hz));
  const double lambda = constants::c0 / c.f_hz;
  // Textbook circular aperture gain G = η(πD/λ)² (e.g. Balanis, Antenna Theory, aperture chapter).
  CHECK(r.gain.ratio == Approx(c.eta * std::pow(constants::pi * c.d_m / lambda, 2)));
  // S_nf = 16ηP/(πD²) = η·(4P/A): the on-axis near field is η times the surface average.
  CHECK(r.s_nf.value() == Approx(c.eta * r.s_surface.value()));
  CHECK(r.r_nf.value() < r.r_ff.value());
  // Continuity at R_ff: S_t(R_ff)/S_ff(R_ff) = (16/(2.4π)) / (π/1.44) = 0.973 for any dish — the two
  // formulas meet within 3 %, as the bulletin's region model intends.
  const double just_below = r.r_ff.value() * (1 - 1e-9);
  const double s_t = aperture_density(r, p, units::metres(just_below)).value();
  const double s_f = aperture_density(r, p, r.r_ff).value();
  CHECK(s_t / s_f == Approx(16.0 / (2.4 * constants::pi) / (constants::pi / 1.44)).epsilon(1e-6));
  CHECK(std::abs(s_t / s_f - 1.0) < 0.03);
  // At R_nf the transition formula gives S_nf (continuity at the other edge).
  CHECK(aperture_density(r, p, units::metres(r.r_nf.value() * (1 + 1e-12))).value() == Approx(r.s_nf.value()));
}

TEST_CASE("dish: compliance distance puts the on-axis density at the limit", "[aperture]") {
  const auto p = units::watts(100);
  const auto r = aperture_regions({units::metres(3.0), units::Fraction{0.55}}, p, units::hertz(10e9));
  // A limit reached in the transition region.
  const double s_mid = r.s_nf.value() * r.r_nf.value() / (0.5 * (r.r_nf.value() + r.r_ff.value()));
  auto d = aperture_compliance_distance(r, p, units::watts_per_square_metre(s_mid));
  CHECK(d.region == ApertureRegion::transition);
  CHECK(aperture_density(r, p, d.distance).value() == Approx(s_mid));
  // A limit reached in the far field.
  auto e = aperture_compliance_distance(r, p, units::watts_per_square_metre(1.0));
  CHECK(e.region == ApertureRegion::far_field);
  CHECK(aperture_density(r, p, e.distance).value() == Approx(1.0));
  // A limit between S_t(R_ff) and S_ff(R_ff): the far-field formula sets the distance (beyond R_ff).
  const double s_between = 0.5 * (aperture_density(r, p, units::metres(r.r_ff.value() * (1 - 1e-9))).value() +
                                  aperture_density(r, p, r.r_ff).value());
  auto g = aperture_compliance_distance(r, p, units::watts_per_square_metre(s_between));
  CHECK(g.distance.value() > r.r_ff.value());
  CHECK(aperture_density(r, p, g.distance).value() == Approx(s_between));
  // Near field already within the limit.
  auto z = aperture_compliance_distance(r, p, units::watts_per_square_metre(2 * r.s_nf.value()));
  CHECK(z.within_limit_everywhere);
  CHECK(z.distance.value() == 0.0);
}
