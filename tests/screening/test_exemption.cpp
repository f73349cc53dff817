// FCC exemption, 47 CFR § 1.1307(b)(3)(i): (C) thresholds against the identity
// ERP_th = S_uncontrolled·4πR²/(1.64·4) (OET 65 Eq. 6 with a half-wave dipole, EIRP = 1.64·ERP),
// with S from 47 CFR 1.1310 Table 1; (B) against the check value 2.48 GHz, 0.5 cm → 2.72 mW
// (REFERENCES.md §2, constants [verify]); (A) 1 mW; the multiple-source sum.
#include <catch2/catch.hpp>

#include <cmath>

#include "core/constants.hpp"
#include "exposure/exemption.hpp"

using namespace standoff;
using namespace standoff::exposure;

namespace {
// 47 CFR 1.1310 Table 1, general population/uncontrolled, W/m² (mW/cm² × 10).
double s_uncontrolled(double f_mhz) {
  if (f_mhz <= 1.34) return 1000.0;
  if (f_mhz <= 30.0) return 1800.0 / (f_mhz * f_mhz);
  if (f_mhz <= 300.0) return 2.0;
  if (f_mhz <= 1500.0) return f_mhz / 150.0;
  return 10.0;
}
}  // namespace

TEST_CASE("(C) thresholds equal Eq. 6 with dipole gain at the uncontrolled limit", "[exemption]") {
  auto f_mhz = GENERATE(0.5, 1.0, 3.5, 14.2, 28.0, 50.0, 146.0, 440.0, 1296.0, 2400.0, 10000.0);
  const double r = 25.0;
  const double identity = s_uncontrolled(f_mhz) * 4.0 * constants::pi * r * r / (1.64 * 4.0);
  const auto th = exemption_c_threshold(units::hertz(f_mhz * 1e6), units::metres(r));
  REQUIRE(th);
  CAPTURE(f_mhz);
  CHECK(th->value() == Approx(identity).epsilon(0.005));  // the rule prints 3 significant digits
}

TEST_CASE("(B) threshold check value and shape", "[exemption]") {
  // REFERENCES.md §2: 2.48 GHz at 0.5 cm → 2.72 mW (constants 60/2040/3060 from memory, verify
  // against 47 CFR 1.1307(b)(3)(i)(B)).
  const auto th = exemption_b_threshold(units::hertz(2.48e9), units::metres(0.005));
  REQUIRE(th);
  CHECK(th->value() * 1e3 == Approx(2.72).epsilon(0.005));  // printed to 3 digits
  // 20–40 cm: ERP_20cm = 3060 mW above 1.5 GHz, 2040·f_G mW below.
  CHECK(exemption_b_threshold(units::hertz(2.48e9), units::metres(0.3))->value() == Approx(3.06));
  CHECK(exemption_b_threshold(units::hertz(0.9e9), units::metres(0.3))->value() == Approx(2.040 * 0.9));
  CHECK_FALSE(exemption_b_threshold(units::hertz(0.2e9), units::metres(0.1)));
  CHECK_FALSE(exemption_b_threshold(units::hertz(2.4e9), units::metres(0.5)));
}

TEST_CASE("exemption evaluation picks the applicable criteria", "[exemption]") {
  // 0.5 mW: exempt by (A) at any distance.
  auto a = evaluate_exemption(units::watts(0.5e-3), units::watts(0.5e-3), units::hertz(146e6), units::metres(0.01));
  CHECK(a.exempt);
  CHECK(a.checks[*a.deciding].criterion == ExemptionCriterion::a);
  // 146 MHz at 0.1 m: λ/2π = 0.33 m, so (C) does not apply; (B) does not cover 146 MHz.
  auto b = evaluate_exemption(units::watts(5), units::watts(5), units::hertz(146e6), units::metres(0.1));
  CHECK_FALSE(b.exempt);
  CHECK_FALSE(b.checks[1].applicable);
  CHECK_FALSE(b.checks[2].applicable);
  // 146 MHz, 10 m: threshold 3.83·100 = 383 W ERP; 100 W ERP is exempt, 500 W is not.
  auto c = evaluate_exemption(units::watts(60), units::watts(100), units::hertz(146e6), units::metres(10));
  CHECK(c.exempt);
  CHECK(c.checks[2].threshold.value() == Approx(383.0));
  auto d = evaluate_exemption(units::watts(300), units::watts(500), units::hertz(146e6), units::metres(10));
  CHECK_FALSE(d.exempt);
  CHECK(d.checks[*d.deciding].criterion == ExemptionCriterion::c);
}

TEST_CASE("multiple sources: the fractions must sum to at most 1", "[exemption]") {
  // § 1.1307(b)(3)(ii)
  CHECK(multiple_sources_exempt({0.4, 0.35, 0.25}));
  CHECK_FALSE(multiple_sources_exempt({0.6, 0.5}));
  CHECK(exemption_sum({0.6, 0.5}) == Approx(1.1));
}
