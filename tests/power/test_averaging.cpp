// Worst-case time averaging against the worked examples of FCC OET Bulletin 65 Supplement B (1997),
// pp. 13–14 (REFERENCES.md §3), and hand counts of on-air minutes for one-off schedules.
#include <catch2/catch.hpp>

#include "power/averaging.hpp"

using namespace standoff;
using namespace standoff::power;

namespace {
units::Time minutes(double m) { return units::seconds(60.0 * m); }
OperatingPattern cycle(double on_min, double off_min) {
  return OperatingPattern::repeating({{minutes(on_min), true}, {minutes(off_min), false}});
}
const units::Time k6min = minutes(6);    // 47 CFR 1.1310: controlled averaging time
const units::Time k30min = minutes(30);  // 47 CFR 1.1310: uncontrolled averaging time
}  // namespace

TEST_CASE("Supplement B worked cases: average power in 6- and 30-minute windows", "[averaging]") {
  struct Case {
    const char* what;
    double pep_w;
    double duty;
    OperatingPattern pattern;
    units::Time window;
    double expected_w;
    double rel_tol;  // each with its reason below
  };
  auto c = GENERATE(
      // OET 65 Supp. B: 1500 W PEP SSB (20 %), 2 min on / 2 min off → 200 W in 6 min (4 of 6 min on).
      Case{"ssb 2/2, 6 min", 1500, 0.20, cycle(2, 2), k6min, 200.0, 1e-12},
      // Hand count (worst window starts with a transmission: 8 × 2 min on within 30 min = 16/30) →
      // 160 W. REFERENCES.md §3 lists 200 W for this row, which a repeating 2-on/2-off cycle cannot
      // reach; flagged for the lead: verify against OET 65 Supp. B pp. 13–14.
      Case{"ssb 2/2, 30 min", 1500, 0.20, cycle(2, 2), k30min, 160.0, 1e-12},
      // OET 65 Supp. B: 7 min on / 7 min off → 300 W in 6 min (always on in the worst window).
      Case{"ssb 7/7, 6 min", 1500, 0.20, cycle(7, 7), k6min, 300.0, 1e-12},
      // OET 65 Supp. B: 159 W in 30 min; the bulletin rounds 16/30 to 0.53 (300 × 0.5333 = 160 W),
      // so 1 % covers its rounding.
      Case{"ssb 7/7, 30 min", 1500, 0.20, cycle(7, 7), k30min, 159.0, 0.01},
      // OET 65 Supp. B: 500 W CW (40 %), 15 s every 2 min → 25 W in both windows.
      Case{"cw 15 s / 2 min, 6 min", 500, 0.40,
           OperatingPattern::repeating({{units::seconds(15), true}, {units::seconds(105), false}}), k6min, 25.0, 1e-12},
      Case{"cw 15 s / 2 min, 30 min", 500, 0.40,
           OperatingPattern::repeating({{units::seconds(15), true}, {units::seconds(105), false}}), k30min, 25.0, 1e-12},
      // OET 65 Supp. B: 250 W FM (100 %), 5 on / 5 off → 208.3 W (6 min: 5 of 6), 125 W (30 min: 15 of 30).
      Case{"fm 5/5, 6 min", 250, 1.0, cycle(5, 5), k6min, 208.3, 2e-4},  // printed to 0.1 W
      Case{"fm 5/5, 30 min", 250, 1.0, cycle(5, 5), k30min, 125.0, 1e-12});
  CAPTURE(c.what);
  const double p = time_averaged_power(units::watts(c.pep_w), units::Fraction{c.duty}, c.pattern, c.window).value();
  CHECK(p == Approx(c.expected_w).epsilon(c.rel_tol));
}

TEST_CASE("one-off on-air intervals: worst window found by hand count", "[averaging]") {
  // On 0–5 min and 10–15 min, then off: best 6-min window holds 5 min; 30-min window holds all 10.
  const auto p = OperatingPattern::on_air({{minutes(0), minutes(5)}, {minutes(10), minutes(15)}});
  CHECK(worst_case_on_air_fraction(p, k6min).value == Approx(5.0 / 6.0));
  CHECK(worst_case_on_air_fraction(p, k30min).value == Approx(10.0 / 30.0));
  // On 0–2 and 5–7 min: window [0, 6] holds 2 + 1 min, [1, 7] holds 1 + 2 min; covering both
  // transmissions needs 7 min, so 3 of 6 is the worst.
  const auto q = OperatingPattern::on_air({{minutes(0), minutes(2)}, {minutes(5), minutes(7)}});
  CHECK(worst_case_on_air_fraction(q, k6min).value == Approx(0.5));
  // Overlapping intervals are merged, not counted twice: on 0–4 min only.
  const auto r = OperatingPattern::on_air({{minutes(0), minutes(3)}, {minutes(1), minutes(4)}});
  CHECK(worst_case_on_air_fraction(r, k6min).value == Approx(4.0 / 6.0));
}

TEST_CASE("limits of the averaging", "[averaging]") {
  // Continuous operation: fraction 1 in any window (conservative default).
  CHECK(worst_case_on_air_fraction(OperatingPattern::continuous(), k6min).value == 1.0);
  // A fixed on-air share is used as given.
  CHECK(worst_case_on_air_fraction(OperatingPattern::fixed(units::Fraction{0.3}), k30min).value == Approx(0.3));
  // A cycle longer than the window that starts with a long transmission: always on.
  CHECK(worst_case_on_air_fraction(cycle(10, 50), k6min).value == Approx(1.0));
  // The long-run share of a cycle is a lower bound in any window length (k × period: equal).
  CHECK(worst_case_on_air_fraction(cycle(1, 2), minutes(30)).value == Approx(1.0 / 3.0));
  CHECK_THROWS(worst_case_on_air_fraction(cycle(1, 1), units::seconds(0)));
}
