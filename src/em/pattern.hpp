// Far field of the solved currents (radiation vector of piecewise-linear segment currents, with
// ground images weighted by the Fresnel coefficients; Balanis §4.8, §6) and its power integral.
#pragma once

#include <Eigen/Core>

#include "em/solve.hpp"

namespace standoff::em::detail {

// r·E (peak, V) in direction `dir` (unit vector), phase reference at the origin.
Eigen::Vector3cd far_field(const Solution& solution, const Eigen::Vector3d& dir);

// Radiated power (peak-phasor convention, W): ∯ |rE|²/(2η0) dΩ over the sphere (free space) or
// the upper half space (ground).
double radiated_power(const Solution& solution);

// Complex relative permittivity of the model's ground, εr − jσ/(ωε0).
std::complex<double> ground_eps_c(const Model& model);

}  // namespace standoff::em::detail
