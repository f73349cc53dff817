// Helpers for the evaluation tests: sources built from a MoM solution or a uniform plane wave, and
// the published limits (47 CFR 1.1310 Table 1 via the embedded table) at a frequency.
#pragma once

#include <memory>

#include "core/constants.hpp"
#include "em/builders.hpp"
#include "em/fields.hpp"
#include "exposure/evaluate.hpp"
#include "io/limits_toml.hpp"

namespace evaltest {

namespace ex = standoff::exposure;
namespace lim = standoff::limits;

inline ex::SourceLimits fcc_limits(double f_hz) {
  const auto& t = lim::builtin_limit_table_ref(lim::Standard::fcc);
  ex::SourceLimits l;
  l.controlled = lim::lookup(t, lim::Tier::controlled, standoff::units::hertz(f_hz));
  l.uncontrolled = lim::lookup(t, lim::Tier::uncontrolled, standoff::units::hertz(f_hz));
  return l;
}

inline ex::SourceInput mom_source(std::shared_ptr<const standoff::em::Solution> sol, double p_w, double x = 0,
                                  double y = 0, std::string name = "mom") {
  ex::SourceInput s;
  s.name = std::move(name);
  s.frequency_hz = sol->model.frequency_hz;
  s.pep_w = p_w;
  s.average_power_w = p_w;
  s.method = "detailed (MoM)";
  s.centre = {x, y};
  for (const auto& w : sol->model.wires) s.footprint.push_back({{w.a.x(), w.a.y()}, {w.b.x(), w.b.y()}});
  s.field = [sol, p_w](std::span<const Eigen::Vector3d> pts) { return standoff::em::near_fields(*sol, pts, p_w); };
  s.max_search_distance_m = 20.0;
  return s;
}

// A uniform plane wave of power density s (W/m²) everywhere: |E| = √(S η0), |H| = √(S/η0).
inline ex::SourceInput uniform_source(double f_hz, double s_w_per_m2, std::string name, double pep_w = 100.0) {
  ex::SourceInput src;
  src.name = std::move(name);
  src.frequency_hz = f_hz;
  src.pep_w = pep_w;
  src.average_power_w = pep_w;
  src.method = "test plane wave";
  src.centre = {0.0, 0.0};
  src.footprint.push_back({{0.0, 0.0}, {0.0, 0.0}});
  src.max_search_distance_m = 5.0;
  const double e = std::sqrt(s_w_per_m2 * standoff::constants::eta0);
  const double h = std::sqrt(s_w_per_m2 / standoff::constants::eta0);
  src.field = [e, h](std::span<const Eigen::Vector3d> pts) {
    std::vector<standoff::em::FieldPoint> out(pts.size());
    for (auto& f : out) {
      f.e_v_per_m = Eigen::Vector3cd(e, 0.0, 0.0);
      f.h_a_per_m = Eigen::Vector3cd(0.0, h, 0.0);
      f.valid = true;
    }
    return out;
  };
  return src;
}

inline ex::ZoneInput square_zone(std::string name, lim::Tier tier, double x0, double y0, double side) {
  ex::ZoneInput z;
  z.name = std::move(name);
  z.tier = tier;
  z.polygon = {{x0, y0}, {x0 + side, y0}, {x0 + side, y0 + side}, {x0, y0 + side}};
  return z;
}

}  // namespace evaltest
