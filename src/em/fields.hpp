// Near fields (E and H, complex vectors) and far-field gain of a solved wire antenna, from the
// piecewise-linear MoM currents: E = -jωA - ∇φ, H = ∇×A/μ0 (Balanis, Antenna Theory ch. 3, 4, 8).
#pragma once

#include <span>
#include <vector>

#include <Eigen/Core>

#include "core/units.hpp"
#include "em/solve.hpp"

namespace standoff::em {

// RMS phasors (e^{+jωt}) scaled so that the feeds deliver the stated input power.
// valid == false for points within 3 wire radii of a wire axis (or of its image under ground,
// or below ground): the thin-wire model does not hold there and both vectors are NaN.
struct FieldPoint {
  Eigen::Vector3cd e_v_per_m;
  Eigen::Vector3cd h_a_per_m;
  bool valid = true;
};

// Thread-safe (const, no shared mutable state): callers may split the points across threads.
std::vector<FieldPoint> near_fields(const Solution& solution, std::span<const Eigen::Vector3d> points,
                                    double input_power_w);
inline std::vector<FieldPoint> near_fields(const Solution& solution, std::span<const Eigen::Vector3d> points,
                                           units::Power input_power) {
  return near_fields(solution, points, input_power.value());
}

// Directions: elevation above the horizontal plane and azimuth clockwise from north (+y), radians.
struct Direction {
  double elevation_rad = 0.0;
  double azimuth_rad = 0.0;
};

// Far-field gain (ratio, relative to isotropic, including conductor/load/ground loss) in one
// direction. Over ground, directions below the horizon have zero gain.
double gain(const Solution& solution, const Direction& direction);

struct PatternPeak {
  double gain = 0.0;  // ratio
  double gain_dbi = 0.0;
  Direction direction;
};
// Peak gain on a grid of `step_rad` followed by local refinement.
PatternPeak peak_gain(const Solution& solution, double step_rad = 0.0175);

}  // namespace standoff::em
