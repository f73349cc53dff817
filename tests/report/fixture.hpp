// A synthetic evaluation record used to exercise the report writers. The station, powers and
// distances are invented test inputs (not results of ours presented as outside checks); the one
// field with a known answer is the exposure grid, ratio(r) = (r100 / r)², whose 100 % and 50 %
// contours are circles of radius r100 and r100·√2 around the antenna (closed form).
#pragma once

#include <cmath>
#include <limits>

#include "report/record.hpp"

namespace standoff::report::test {

inline constexpr double kR100 = 6.0;  // m, radius of the 100 % contour of the synthetic field
inline constexpr double kCx = 20.0;   // antenna position in plan
inline constexpr double kCy = 15.0;

inline double synthetic_ratio(double x, double y) {
  const double r2 = (x - kCx) * (x - kCx) + (y - kCy) * (y - kCy);
  return kR100 * kR100 / std::max(r2, 1e-6);
}

inline Record synthetic_record() {
  using limits::Tier;
  Record r;
  r.meta.station_name = "Test Station <A&B>";
  r.meta.date = "2026-01-01T00:00:00Z";
  r.meta.tool_version = "0.0.0-test";
  r.meta.input_file = "tests/station.toml";
  r.meta.input_sha256 = std::string(64, 'a');
  r.meta.standards.push_back({"fcc", "47 CFR § 1.1310(e)(1)", "Table 1", 1996, "confirmed", "tables/limits/fcc.toml", ""});

  auto& ev = r.evaluation;
  ev.station = r.meta.station_name;
  ev.body_rule = "spatial average of E² and H² over 0–2 m";
  ev.grid_spacing_m = 0.5;
  ev.verdict = exposure::Verdict::exceeds;

  exposure::OperationResult a;
  a.name = "20 m SSB";
  a.transmitter = "tx";
  a.feed_line = "ladder";
  a.antenna = "wire";
  a.frequency_hz = 14.2e6;
  a.pep_w = 1500;
  a.chain = {{"transmitter PEP", 1500, ""}, {"duty factor (SSB, 20 %)", 300, ""}, {"feed-line loss", 270, "0.46 dB"}};
  a.average_power_w = 270;
  a.method = "detailed (MoM)";
  a.limits_source = "47 CFR § 1.1310(e)(1), Table 1 (1996)";
  a.evaluated_anywhere = true;
  a.worst = {{21.0, 15.0, 1.0}, "garden", Tier::uncontrolled, 2.1234, 2.5, "E", 80.0, 0.2};
  a.permitted_pep_w = 706.4;
  a.screening_distance = {4.01, 9.33};
  a.detailed_distance = {3.2, 8.7};
  a.verdict = exposure::Verdict::exceeds;
  a.notes = {"a note with | pipe"};
  a.not_evaluated_count = 4;
  a.points.push_back({"window", Tier::uncontrolled, {5, 5, 4}, true, 0.3, "E", 10, 0.03, ""});
  a.points.push_back({"roof", Tier::uncontrolled, {20, 15, 6}, false, 0, "", 0, 0, "within 0.3 m of a wire"});
  for (int k = 1; k <= 40; ++k) {
    const double d = 0.5 * k;
    exposure::DistanceSample s{d, synthetic_ratio(kCx + d, kCy) * 0.45, synthetic_ratio(kCx + d, kCy)};
    if (k == 1) s = {d, std::nullopt, std::nullopt};
    a.ratio_vs_distance.push_back(s);
  }
  ev.operations.push_back(a);

  exposure::OperationResult b;
  b.name = "2 m FM";
  b.frequency_hz = 146.52e6;
  b.pep_w = 50;
  b.average_power_w = 25;
  b.method = "screening (far field, OET 65 Eq. 7)";
  b.evaluated_anywhere = false;
  b.verdict = exposure::Verdict::not_evaluated;
  ev.operations.push_back(b);

  // Zone grid over the garden with the synthetic field; a few cells next to the antenna are not evaluated.
  exposure::ZoneGrid g;
  g.zone = "garden";
  g.tier = Tier::uncontrolled;
  g.origin_x_m = 0.0;
  g.origin_y_m = 0.0;
  g.spacing_m = 0.5;
  g.nx = 81;
  g.ny = 61;
  g.state.assign(static_cast<std::size_t>(g.nx * g.ny), exposure::CellState::evaluated);
  exposure::ZoneGrid::OperationLayer layer;
  layer.operation = a.name;
  layer.ratio_controlled.resize(g.state.size());
  layer.ratio_uncontrolled.resize(g.state.size());
  for (int j = 0; j < g.ny; ++j) {
    for (int i = 0; i < g.nx; ++i) {
      const std::size_t k = static_cast<std::size_t>(j * g.nx + i);
      const double x = g.origin_x_m + i * g.spacing_m, y = g.origin_y_m + j * g.spacing_m;
      if (std::hypot(x - kCx, y - kCy) < 1.0) {
        g.state[k] = exposure::CellState::not_evaluated;
        continue;
      }
      layer.ratio_uncontrolled[k] = synthetic_ratio(x, y);
      layer.ratio_controlled[k] = 0.45 * synthetic_ratio(x, y);
    }
  }
  g.layers.push_back(layer);
  ev.grids.push_back(g);

  r.map.boundary = {{0, 0}, {40, 0}, {40, 30}, {0, 30}};
  r.map.buildings.push_back({"house", {{2, 2}, {12, 2}, {12, 10}, {2, 10}}, "2 floors"});
  r.map.zones.push_back({"garden", Tier::uncontrolled, {{0, 0}, {40, 0}, {40, 30}, {0, 30}}});
  r.map.antennas.push_back({"wire", {{{12, 15, 10}, {28, 15, 10}}}, Point3{kCx, kCy, 10}});
  r.map.supports.push_back({"mast", "mast", {12, 15}, 10.0, 15.0});
  r.map.power_lines.push_back({"L1", {{-5, 35}, {45, 35}}, "7.2 kV, 8 m"});
  r.map.points.push_back({"window", {5, 5, 4}, Tier::uncontrolled});

  LinesSection lines;
  lines.checks.push_back({"fall zone", "US CPSC Release 02-151", "mast", "L1", 15.0, 20.04, true, ""});
  lines.checks.push_back({"standing clearance", "NFPA 70 810.13", "wire", "L1", 3.05, 2.99, false, "too close"});
  lines.assumptions = {"line height unknown: 5.5 m assumed"};
  r.lines = lines;
  r.assumptions = {"ground: average"};
  r.references = default_references();
  return r;
}

}  // namespace standoff::report::test
