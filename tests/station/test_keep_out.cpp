// Keep-out areas and zones with holes (issue 12): a fence drawn at the detailed keep-away distance
// around the demo's garden vertical makes that operation comply for the people it keeps out, the
// distance taken from the evaluation itself (not typed in).
#include <catch2/catch.hpp>

#include <cmath>
#include <optional>
#include <string>

#include <fmt/format.h>

#include "core/plan_geometry.hpp"
#include "exposure/evaluate.hpp"
#include "exposure/remedies.hpp"
#include "siting/checks.hpp"
#include "io/clearances_toml.hpp"
#include "assemble/sources.hpp"
#include "io/station_toml.hpp"

using namespace standoff;
using Catch::Matchers::Contains;

namespace {

const char* kOp = "20 m RTTY on the vertical";

exposure::OperationResult evaluate_vertical(const std::string& text) {
  const auto st = station::load_station(text, "demo.toml");
  assemble::BuildOptions bo;
  bo.only_operation = kOp;
  const auto built = assemble::build(st, bo);
  exposure::EvaluationOptions eo;
  eo.grid_spacing_m = 1.0;  // small grid: the test stays fast
  const auto ev = exposure::evaluate(built.input, eo);
  REQUIRE(ev.operations.size() == 1);
  return ev.operations[0];
}

// A square fence of half-side d about (x, y): every point outside it is at least d away.
std::string fence(double x, double y, double d, const std::string& keeps_out) {
  return fmt::format(R"(
[[zone]]
name = "vertical fence"
kind = "keep_out"
keeps_out = "{}"
barrier = "1.2 m wooden fence with a locked gate"
polygon = [["{:.2f} m", "{:.2f} m"], ["{:.2f} m", "{:.2f} m"], ["{:.2f} m", "{:.2f} m"], ["{:.2f} m", "{:.2f} m"]]
)",
                     keeps_out, x - d, y - d, x + d, y - d, x + d, y + d, x - d, y + d);
}

}  // namespace

TEST_CASE("keep-out: a fence at the detailed distance around the demo vertical makes it comply", "[station]") {
  const std::string demo(station::demo_station_text());
  const auto before = evaluate_vertical(demo);
  REQUIRE(before.verdict == exposure::Verdict::exceeds);
  // The garden around the vertical is a controlled zone: the controlled distance is the one to fence.
  REQUIRE(before.detailed_distance.controlled_m);
  const double d = *before.detailed_distance.controlled_m;
  INFO("detailed controlled distance " << d << " m");
  CHECK(d > 0.5);
  const auto after = evaluate_vertical(demo + fence(6.0, 34.0, d, "everyone"));
  CHECK(after.verdict == exposure::Verdict::within);
  // A fence that keeps out only the uncontrolled public leaves the controlled garden evaluated.
  const auto public_only = evaluate_vertical(demo + fence(6.0, 34.0, d, "uncontrolled"));
  CHECK(public_only.verdict == exposure::Verdict::exceeds);
  // Half the distance is not enough.
  const auto small = evaluate_vertical(demo + fence(6.0, 34.0, 0.5 * d, "everyone"));
  CHECK(small.verdict == exposure::Verdict::exceeds);
}

TEST_CASE("zones with holes: points in a hole are outside the zone, its edge inside", "[station]") {
  // Closed-form geometry (Boost.Geometry predicates): a 10 m square with a 2 m square hole.
  const geometry::Area a{{{0, 0}, {10, 0}, {10, 10}, {0, 10}}, {{{4, 4}, {6, 4}, {6, 6}, {4, 6}}}};
  CHECK(geometry::inside(a, {1, 1}));
  CHECK_FALSE(geometry::inside(a, {5, 5}));
  CHECK(geometry::inside(a, {4, 5}));   // the hole's edge belongs to the zone (evaluated: conservative)
  CHECK(geometry::inside(a, {10, 5}));  // the outer edge too
  CHECK_FALSE(geometry::inside(a, {11, 5}));
  CHECK(geometry::signed_area(a.outer) == Approx(100.0));
  CHECK(geometry::signed_area({{0, 0}, {0, 10}, {10, 10}, {10, 0}}) == Approx(-100.0));
  CHECK(geometry::self_intersection({{0, 0}, {10, 10}, {10, 0}, {0, 10}}));
  CHECK(geometry::distance_to_segment({3, 4}, {0, 0}, {0, 10}) == Approx(3.0));
  // From the station file: a hole outside the polygon is refused with its field.
  std::string demo(station::demo_station_text());
  const std::string garden = "name = \"garden\"\npolygon = [[\"0 m\", \"0 m\"], [\"40 m\", \"0 m\"], [\"40 m\", \"70 m\"], [\"0 m\", \"70 m\"]]\n";
  REQUIRE(demo.find(garden) != std::string::npos);
  std::string with_hole = demo;
  with_hole.replace(with_hole.find(garden), garden.size(),
                    garden + "holes = [[[\"2 m\", \"30 m\"], [\"10 m\", \"30 m\"], [\"10 m\", \"38 m\"], [\"2 m\", \"38 m\"]]]\n");
  const auto st = station::load_station(with_hole, "demo.toml");
  REQUIRE(st.site.zones.size() >= 2);
  CHECK(st.site.zones[1].holes.size() == 1);
  std::string outside = demo;
  outside.replace(outside.find(garden), garden.size(),
                  garden + "holes = [[[\"50 m\", \"30 m\"], [\"60 m\", \"30 m\"], [\"60 m\", \"38 m\"]]]\n");
  CHECK_THROWS_WITH(station::load_station(outside, "demo.toml"), Contains("zone[1].holes") && Contains("not inside"));
}

TEST_CASE("unzoned parts of the property are reported, or evaluated with [site] default_tier", "[cli]") {
  // The demo's garden covers the whole boundary; shrink it to the southern half (y 0..35 m).
  std::string demo(station::demo_station_text());
  const std::string garden = "polygon = [[\"0 m\", \"0 m\"], [\"40 m\", \"0 m\"], [\"40 m\", \"70 m\"], [\"0 m\", \"70 m\"]]\ntier = \"controlled\"";
  const auto at = demo.find(garden);
  REQUIRE(at != std::string::npos);
  demo.replace(at, garden.size(), "polygon = [[\"0 m\", \"0 m\"], [\"40 m\", \"0 m\"], [\"40 m\", \"35 m\"], [\"0 m\", \"35 m\"]]\ntier = \"controlled\"");
  const auto st = station::load_station(demo, "demo.toml");
  const auto built = assemble::build(st);
  REQUIRE(built.unzoned.size() == 1);
  // 40 m × 35 m = 1400 m² uncovered (closed-form area).
  CHECK_THAT(built.unzoned[0], Contains("not evaluated: no zone covers 1400 m²") && Contains("y 35 to 70 m"));
  const std::string with_default = [&] {
    std::string t = demo;
    t.replace(t.find("[site]\n"), 7, "[site]\ndefault_tier = \"uncontrolled\"\n");
    return t;
  }();
  const auto st2 = station::load_station(with_default, "demo.toml");
  const auto built2 = assemble::build(st2);
  REQUIRE(built2.unzoned.size() == 1);
  CHECK_THAT(built2.unzoned[0], Contains("default_tier = uncontrolled"));
  bool zone = false;
  for (const auto& z : built2.input.zones) zone |= z.name == "unzoned part 1" && z.tier == limits::Tier::uncontrolled;
  CHECK(zone);
}

TEST_CASE("remedies: the computed PEP and duty make the demo vertical comply", "[station]") {
  // Self-consistency of the remedies with the evaluation (the exposure ratio is proportional to
  // the average power: linear field equations; OET 65 Supplement B for duty × on-air share).
  const std::string demo(station::demo_station_text());
  const auto before = evaluate_vertical(demo);
  const auto rs = exposure::operation_remedies(before);
  std::optional<double> pep, duty;
  for (const auto& r : rs) {
    if (r.kind == "max_pep") pep = r.value;
    if (r.kind == "max_duty") duty = r.value;
  }
  REQUIRE(pep);
  REQUIRE(duty);
  const std::string amp = "name = \"hf amplifier\"\npep = \"1.5 kW\"";
  std::string lower = demo;
  lower.replace(lower.find(amp), amp.size(), fmt::format("name = \"hf amplifier\"\npep = \"{:.1f} W\"", *pep));
  CHECK(evaluate_vertical(lower).verdict == exposure::Verdict::within);
  const std::string mode = "frequency = \"14.08 MHz\"\nmode = \"fsk\"";
  std::string less_duty = demo;
  less_duty.replace(less_duty.find(mode), mode.size(), fmt::format("frequency = \"14.08 MHz\"\nduty = \"{:.1f} %\"", *duty));
  CHECK(evaluate_vertical(less_duty).verdict == exposure::Verdict::within);
}

TEST_CASE("remedies: the computed support height passes the fall zone", "[station]") {
  // US CPSC fall zone max(1.5 H, H + 10 ft): a 10 m mast 12 m from the line fails (15 m needed);
  // the remedy's largest height is min(12/1.5, 12 − 3.048) = 8 m, which passes.
  siting::SiteElements site;
  siting::PowerLine l;
  l.name = "line";
  l.path = {{units::metres(0.0), units::metres(0.0)}, {units::metres(50.0), units::metres(0.0)}};
  l.height = units::metres(8.0);
  l.voltage = siting::LineVoltage{siting::volts(7200.0), siting::VoltageReference::phase_to_ground};
  site.power_lines.push_back(l);
  siting::Support s;
  s.name = "mast";
  s.base = {units::metres(20.0), units::metres(12.0)};
  s.height = units::metres(10.0);
  site.supports.push_back(s);
  const auto& t = siting::builtin_clearance_tables();
  auto fall_zone = [&](const siting::LinesReport& r) -> const siting::Check& {
    for (const auto& c : r.checks)
      if (c.rule == "fall zone") return c;
    FAIL("no fall zone check");
    return r.checks.front();
  };
  const auto r1 = siting::run_checks(site, t);
  const auto& c1 = fall_zone(r1);
  REQUIRE_FALSE(c1.pass());
  std::optional<double> h, move;
  for (const auto& rm : c1.remedies) {
    if (rm.kind == "max_height") h = rm.value;
    if (rm.kind == "move_away") move = rm.value;
  }
  REQUIRE(h);
  REQUIRE(move);
  CHECK(*h == Approx(8.0));
  CHECK(*move == Approx(3.0));
  site.supports[0].height = units::metres(*h);
  CHECK(fall_zone(siting::run_checks(site, t)).pass());
  site.supports[0].height = units::metres(10.0);
  site.supports[0].base.y = units::metres(12.0 + *move);
  CHECK(fall_zone(siting::run_checks(site, t)).pass());
}
