// Physical constants, each with its source. Exact values are marked exact.
#pragma once

#include <numbers>

namespace standoff::constants {

inline constexpr double pi = std::numbers::pi;
// Speed of light in vacuum, m/s — exact (SI definition, CODATA 2018).
inline constexpr double c0 = 299'792'458.0;
// Vacuum magnetic permeability, H/m — CODATA 2018 recommended value (no longer exact after 2019 SI).
inline constexpr double mu0 = 1.25663706212e-6;
// Vacuum electric permittivity, F/m — CODATA 2018 (= 1/(mu0 c0^2)).
inline constexpr double eps0 = 8.8541878128e-12;
// Impedance of free space, ohm — CODATA 2018 (= mu0 c0).
inline constexpr double eta0 = 376.730313668;
// Annealed copper conductivity, S/m — IACS 1913 standard (100 % IACS).
inline constexpr double sigma_copper = 5.8e7;
// Half-wave dipole gain over isotropic as a ratio (2.15 dBi), FCC OET Bulletin 65 Eq. 5: EIRP = 1.64 ERP.
inline constexpr double dipole_gain = 1.64;
// Length conversions — exact by definition (international yard and pound agreement, 1959).
inline constexpr double metres_per_foot = 0.3048;
inline constexpr double metres_per_inch = 0.0254;
inline constexpr double metres_per_mile = 1609.344;
// Standard acceleration of gravity, m/s² — exact (3rd CGPM, 1901).
inline constexpr double standard_gravity = 9.80665;
// Mass and force conversions — exact by definition (international pound, 1959; lbf = lb × g_n).
inline constexpr double kilograms_per_pound = 0.45359237;
inline constexpr double newtons_per_pound_force = kilograms_per_pound * standard_gravity;

}  // namespace standoff::constants
