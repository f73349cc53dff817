// The issue-6 checks on small hand-computed sites. Every expected distance is worked out by hand
// in the comment beside it (Pythagoras in the plane of the geometry); the required distances come
// from the published rules (OSHA 29 CFR 1910.333(c)(3)(i) / 1926.1408 Table A: 10 ft = 3.048 m →
// 3.05 m rounded up; US CPSC Release 02-151: 1.5 × height; NFPA 70 Table 810.52).
#include <catch2/catch.hpp>

#include <cmath>

#include "core/constants.hpp"
#include "siting/checks.hpp"
#include "io/clearances_toml.hpp"

using namespace standoff;
using namespace standoff::siting;

namespace {

units::Length m(double v) { return units::metres(v); }

// A 7.2 kV (phase to ground) distribution line at height h along y = 0 (or x = 12 when `north`).
PowerLine line(double h, bool north = false) {
  PowerLine l;
  l.name = "line";
  l.kind = LineKind::distribution;
  if (north)
    l.path = {PlanPoint{m(12), m(-50)}, PlanPoint{m(12), m(50)}};
  else
    l.path = {PlanPoint{m(-50), m(0)}, PlanPoint{m(50), m(0)}};
  l.height = m(h);
  l.voltage = LineVoltage{volts(7.2e3), VoltageReference::phase_to_ground};
  return l;
}

Support mast(double x, double y, double h) {
  Support s;
  s.name = "mast";
  s.base = PlanPoint{m(x), m(y)};
  s.height = m(h);
  return s;
}

Span wire(Point3 a, Point3 b, double sag, std::optional<double> swing_deg, SpanKind kind = SpanKind::antenna) {
  Span s;
  s.name = "wire";
  s.kind = kind;
  s.from = a;
  s.to = b;
  s.sag = m(sag);
  if (swing_deg) s.swing = units::radians(*swing_deg * constants::pi / 180.0);
  return s;
}

// Returns a copy: callers may pass a temporary report.
Check find(const LinesReport& r, const std::string& rule) {
  for (const auto& c : r.checks)
    if (c.rule == rule) return c;
  FAIL("no check " << rule);
  throw;
}

}  // namespace

TEST_CASE("fall zone and fall reach of a 10 m mast 12 m from a line", "[closed_form]") {
  SiteElements site;
  site.power_lines = {line(8.0)};
  site.supports = {mast(20, 12, 10)};
  const auto r = run_checks(site, builtin_clearance_tables());
  const auto& zone = find(r, "fall zone");
  CHECK(zone.required->value() == Approx(15.0));  // 1.5 × 10 m (CPSC) > 10 m + 10 ft
  CHECK(zone.actual->value() == Approx(12.0));
  CHECK(zone.status == CheckStatus::fail);
  CHECK_THAT(zone.source, Catch::Matchers::Contains("CPSC"));
  const auto& reach = find(r, "fall reach");
  CHECK(reach.required->value() == Approx(3.05));  // 10 ft = 3.048 m, rounded up
  CHECK(reach.actual->value() == Approx(4.42));    // √(12² + 8²) − 10 = 4.422 m, rounded down
  CHECK(reach.pass());
  CHECK(r.verdict() == "fail");
}

TEST_CASE("raising: tilt-up arc and a hand-held support", "[closed_form]") {
  SiteElements site;
  site.power_lines = {line(6.0, true)};  // along x = 12 m at 6 m
  Support s = mast(0, 0, 10);
  s.tilt = TiltUp{m(1.0), units::radians(constants::pi / 2.0)};  // lies towards the east, pivot at 1 m
  site.supports = {s};
  const auto r = run_checks(site, builtin_clearance_tables());
  // Quarter disc of radius 9 m about (0, 1 m) in the x–z plane; the line at (12, 6): the
  // direction atan(5/12) lies inside the arc, so the distance is √(12² + 5²) − 9 = 4 m. Sampling
  // allowance ≤ 9 m × (π/720)/2 = 2 cm.
  const auto& tilt = find(r, "raising: tilt-up arc");
  CHECK(tilt.actual->value() <= 4.0);
  CHECK(tilt.actual->value() >= 3.97);
  CHECK(tilt.pass());
  // The whole 10 m mast held at 2.5 m (hand reach): √(12² + 3.5²) − 10 = 12.5 − 10 = 2.5 m < 3.05 m.
  const auto& held = find(r, "raising: hand-held object");
  CHECK(held.actual->value() == Approx(2.5));
  CHECK(held.status == CheckStatus::fail);
}

TEST_CASE("standing clearance of a sagging wire parallel to a line, still and swinging", "[closed_form]") {
  SiteElements site;
  site.power_lines = {line(8.0)};
  const Point3 a{m(-20), m(5), m(10)}, b{m(20), m(5), m(10)};
  SECTION("no swing: lowest point (0, 5, 9) → √(5² + 1²) = 5.099 m") {
    site.spans = {wire(a, b, 1.0, 0.0)};
    const auto& c = find(run_checks(site, builtin_clearance_tables()), "standing clearance");
    CHECK(c.actual->value() == Approx(5.09));
    CHECK(c.pass());
  }
  SECTION("any swing: min over ψ of √(30 − 10 sin ψ − 4 cos ψ) = √(30 − √116) = 4.385 m") {
    site.spans = {wire(a, b, 1.0, std::nullopt)};
    const auto r = run_checks(site, builtin_clearance_tables());
    const auto& c = find(r, "standing clearance");
    CHECK(c.actual->value() <= 4.385);
    CHECK(c.actual->value() >= 4.35);  // sampling allowance ≤ 1 m × 2.5° / 2 = 2.2 cm
    CHECK_FALSE(r.assumptions.empty());  // swing not stated is an assumption
  }
}

TEST_CASE("a wire crossing a line in plan fails the crossing and clearance checks", "[closed_form]") {
  SiteElements site;
  site.power_lines = {line(8.0)};
  // North–south wire at 10 m over the line, 1 m sag at mid-span (over the line): 1 m clearance.
  site.spans = {wire(Point3{m(0), m(-10), m(10)}, Point3{m(0), m(10), m(10)}, 1.0, 0.0)};
  const auto r = run_checks(site, builtin_clearance_tables());
  const auto& cross = find(r, "no crossing");
  CHECK(cross.status == CheckStatus::fail);
  CHECK(cross.actual->value() == 0.0);
  CHECK_THAT(cross.source, Catch::Matchers::Contains("810.13"));
  const auto& clear = find(r, "standing clearance");
  CHECK(clear.actual->value() == Approx(1.0).margin(0.011));
  CHECK(clear.status == CheckStatus::fail);
}

TEST_CASE("failed-support swing: the wire swings about the other end", "[closed_form]") {
  SiteElements site;
  site.power_lines = {line(8.0)};
  // 20 m span at 10 m, 0.5 m sag: S ≈ L + 8d²/(3L) = 20.033 m. About (0, 20, 10):
  // √(20² + 2²) − 20.033 = 0.066 m; about (0, 40, 10): 20.02 m. The smaller counts.
  site.spans = {wire(Point3{m(0), m(20), m(10)}, Point3{m(0), m(40), m(10)}, 0.5, 0.0)};
  const auto& c = find(run_checks(site, builtin_clearance_tables()), "failed-support swing");
  CHECK(c.actual->value() == Approx(0.06).margin(0.0051));
  CHECK(c.status == CheckStatus::fail);
}

TEST_CASE("antenna conductor size per NFPA 70 Table 810.52", "[reference]") {
  // NFPA 70 Table 810.52 (REFERENCES.md §7): 14 AWG up to 45 m; longer spans 10 AWG hard-drawn
  // copper or 12 AWG copper-clad steel; other materials are not listed.
  const auto& t = builtin_clearance_tables();
  struct Case { const char* wire; double span; bool pass; };
  auto c = GENERATE(Case{"14-awg-hard-drawn-copper", 40, true}, Case{"14-awg-hard-drawn-copper", 50, false},
                    Case{"10-awg-hard-drawn-copper", 50, true}, Case{"12-awg-copper-clad-steel", 50, true},
                    Case{"14-awg-copper-clad-steel", 50, false}, Case{"14-awg-copper", 20, false});
  CAPTURE(c.wire, c.span);
  SiteElements site;
  Span s = wire(Point3{m(0), m(0), m(12)}, Point3{m(c.span), m(0), m(12)}, 1.0, 0.0);
  s.wire = *t.find_wire(c.wire);
  site.spans = {s};
  const auto& check = find(run_checks(site, t), "antenna conductor size");
  CHECK(check.pass() == c.pass);
}

TEST_CASE("radiating wire lower than 3 m is flagged", "[closed_form]") {
  SiteElements site;
  // Ends at 4 m, 1.5 m sag → lowest point 2.5 m < 3 m (common practice: RF burn).
  site.spans = {wire(Point3{m(0), m(20), m(4)}, Point3{m(30), m(20), m(4)}, 1.5, 0.0)};
  const auto& c = find(run_checks(site, builtin_clearance_tables()), "radiating wire height");
  CHECK(c.actual->value() == Approx(2.5).margin(0.0051));
  CHECK(c.required->value() == Approx(3.0));
  CHECK(c.status == CheckStatus::fail);
  CHECK_THAT(c.note, Catch::Matchers::Contains("RF burn"));
}

TEST_CASE("unknown voltage on a transmission line: not evaluated, never a number", "[closed_form]") {
  SiteElements site;
  PowerLine l = line(20.0);
  l.kind = LineKind::transmission;
  l.voltage.reset();
  site.power_lines = {l};
  site.supports = {mast(0, 50, 10)};
  const auto r = run_checks(site, builtin_clearance_tables());
  const auto& c = find(r, "fall reach");
  CHECK(c.status == CheckStatus::not_evaluated);
  CHECK_FALSE(c.required);
  CHECK_THAT(c.note, Catch::Matchers::StartsWith("not evaluated"));
  CHECK(r.verdict() == "fail");
  CHECK(r.cautions.size() >= 4);
}
