// Far-field screening against FCC OET Bulletin 65 (Ed. 97-01) Eq. 3, 6, 7 and the main-beam table
// of Supplement B (144 MHz, 24 dBi): 90 / 166 / 287 ft controlled at 150 / 500 / 1500 W and 642 ft
// uncontrolled at 1500 W. Limits are written by hand from 47 CFR 1.1310 Table 1, ICNIRP 1998
// Table 6 and ICNIRP 2020 Table 5 (REFERENCES.md §1).
#include <catch2/catch.hpp>

#include <cmath>

#include "core/constants.hpp"
#include "exposure/screening.hpp"

using namespace standoff;
using namespace standoff::exposure;

namespace {
limits::LimitValues s_limit(limits::Tier tier, double f_hz, double s_w_per_m2) {
  limits::LimitValues v;
  v.tier = tier;
  v.frequency = units::hertz(f_hz);
  v.s = units::watts_per_square_metre(s_w_per_m2);
  v.averaging = units::seconds(tier == limits::Tier::controlled ? 360 : 1800);
  return v;
}
limits::LimitValues eh_limit(double f_hz, double e, double h, bool with_equivalent_s) {
  limits::LimitValues v;
  v.frequency = units::hertz(f_hz);
  v.e = units::volts_per_metre(e);
  v.h = units::amperes_per_metre(h);
  if (with_equivalent_s) {
    v.s = units::watts_per_square_metre(e * e / 377.0);
    v.s_is_equivalent = true;
  }
  v.averaging = units::seconds(360);
  return v;
}
constexpr double kFt = constants::metres_per_foot;
}  // namespace

TEST_CASE("Supplement B 144 MHz, 24 dBi main-beam distances", "[screening]") {
  struct Row { double power_w; limits::Tier tier; double s_w_per_m2; double printed_ft; };
  // 47 CFR 1.1310 Table 1, 30–300 MHz: controlled 1.0 mW/cm² = 10 W/m², uncontrolled 0.2 = 2 W/m².
  auto r = GENERATE(Row{150, limits::Tier::controlled, 10.0, 90}, Row{500, limits::Tier::controlled, 10.0, 166},
                    Row{1500, limits::Tier::controlled, 10.0, 287}, Row{1500, limits::Tier::uncontrolled, 2.0, 642});
  CAPTURE(r.power_w, r.printed_ft);
  const auto d = screening_distance(units::watts(r.power_w), units::Gain::from_dbi(24.0), GroundFactor::epa,
                                    s_limit(r.tier, 144e6, r.s_w_per_m2));
  // The bulletin prints whole feet (truncated; the 500 W row reads as rounded): within 1 ft.
  CHECK(std::abs(d.distance.value() / kFt - r.printed_ft) < 1.0);
  CHECK_FALSE(d.near_field_warning);
  CHECK(d.limit.binding == Binding::s);
}

TEST_CASE("ground factors reproduce OET 65 Eq. 3, 6 and 7", "[screening]") {
  const auto p = units::watts(100);
  const auto g = units::Gain::from_dbi(6.0);
  const auto r = units::metres(10);
  const double eirp = 100.0 * std::pow(10.0, 0.6);
  // Eq. 3: S = EIRP/(4πR²); Eq. 6: S = EIRP/(πR²); Eq. 7: S = 2.56·EIRP/(4πR²).
  CHECK(far_field_density(p, g, r, GroundFactor::none).value() == Approx(eirp / (4 * constants::pi * 100)));
  CHECK(far_field_density(p, g, r, GroundFactor::full).value() == Approx(eirp / (constants::pi * 100)));
  CHECK(far_field_density(p, g, r, GroundFactor::epa).value() == Approx(2.56 * eirp / (4 * constants::pi * 100)));
  // The compliance distance puts S exactly at the limit.
  const auto lim = s_limit(limits::Tier::uncontrolled, 146e6, 2.0);
  for (auto gf : {GroundFactor::none, GroundFactor::epa, GroundFactor::full}) {
    const auto d = screening_distance(p, g, gf, lim);
    CHECK(far_field_density(p, g, d.distance, gf).value() == Approx(2.0).epsilon(1e-12));
  }
}

TEST_CASE("below 30 MHz the smaller plane-wave equivalent of E and H binds", "[screening]") {
  // FCC uncontrolled 14.2 MHz: 824/f = 58.03 V/m, 2.19/f = 0.1542 A/m (47 CFR 1.1310 Table 1):
  // E²/η0 = 8.938 W/m² < η0·H² = 8.960 W/m², so E binds.
  const auto fcc = screening_density_limit(eh_limit(14.2e6, 824.0 / 14.2, 2.19 / 14.2, true));
  CHECK(fcc.binding == Binding::e);
  CHECK(fcc.s.value() == Approx(std::pow(824.0 / 14.2, 2) / constants::eta0));
  // ICNIRP 1998 occupational 7.1 MHz (Table 6, 1–10 MHz: 610/f V/m, 1.6/f A/m): η0·H² = 19.13 W/m²
  // < E²/η0 = 19.59 W/m², so H binds.
  const auto icnirp = screening_density_limit(eh_limit(7.1e6, 610.0 / 7.1, 1.6 / 7.1, false));
  CHECK(icnirp.binding == Binding::h);
  CHECK(icnirp.s.value() == Approx(constants::eta0 * std::pow(1.6 / 7.1, 2)));
}

TEST_CASE("near-field warning inside λ/2π or the antenna's near field", "[screening]") {
  // 3.6 MHz: λ/2π = 13.25 m. 10 W, 0 dBd, FCC uncontrolled 3.6 MHz (180/f² mW/cm² equivalent,
  // E = 824/f V/m): the distance is a few metres, inside λ/2π.
  const auto lim = eh_limit(3.6e6, 824.0 / 3.6, 2.19 / 3.6, true);
  const auto d = screening_distance(units::watts(10), units::Gain::from_dbd(0), GroundFactor::full, lim);
  CHECK(d.near_field_boundary.value() == Approx(constants::c0 / 3.6e6 / (2 * constants::pi)));
  CHECK(d.distance.value() < d.near_field_boundary.value());
  CHECK(d.near_field_warning);
  REQUIRE_FALSE(d.notes.empty());
  CHECK(d.notes.front() == kNearFieldWarning);
  // A 2 m antenna at 1.3 GHz has its near field out to 2L²/λ = 34.7 m.
  const auto e = screening_distance(units::watts(5), units::Gain::from_dbi(15), GroundFactor::none,
                                    s_limit(limits::Tier::controlled, 1.3e9, 43.3), units::metres(2.0));
  CHECK(e.near_field_boundary.value() == Approx(2 * 4.0 * 1.3e9 / constants::c0));
  CHECK(e.near_field_warning);
}

TEST_CASE("rounding: distances up, powers down", "[screening]") {
  CHECK(ceil_to(87.61, 0.1) == Approx(87.7));
  CHECK(ceil_to(87.6, 0.1) == Approx(87.6));  // already on the grid
  CHECK(floor_to(12.39, 0.1) == Approx(12.3));
}
