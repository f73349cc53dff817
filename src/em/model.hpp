// Input model of the thin-wire method-of-moments engine: straight wires with radius and
// conductivity, delta-gap feeds, lumped loads, the ground and the frequency (site frame, SI units).
#pragma once

#include <complex>
#include <cstddef>
#include <limits>
#include <string>
#include <vector>

#include <Eigen/Core>
#include <Eigen/Geometry>

#include "core/constants.hpp"

namespace standoff::em {

// Site frame: metres, x east, y north, z up; the ground surface is the plane z = 0.
struct Wire {
  Eigen::Vector3d a{0, 0, 0};  // start point, m
  Eigen::Vector3d b{0, 0, 0};  // end point, m (current is positive from a towards b)
  double radius_m = 1e-3;
  int segments = 0;  // 0 = automatic: segment length <= lambda/20 (never above lambda/10)
  // Conductivity for the skin-effect loss, S/m; infinity = perfect conductor (no loss).
  double conductivity_s_per_m = constants::sigma_copper;
  std::string name;  // used in messages; "wire N" when empty
};

// Delta-gap voltage source at the node nearest to `position` (0 = end a, 1 = end b) of a wire.
// Peak phasor, volts; positive voltage drives current from a towards b.
struct Feed {
  std::size_t wire = 0;
  double position = 0.5;
  std::complex<double> voltage{1.0, 0.0};
};

// Lumped series impedance at the node nearest to `position` of a wire, ohms.
struct Load {
  std::size_t wire = 0;
  double position = 0.5;
  std::complex<double> z_ohm{0.0, 0.0};
};

enum class GroundKind { free_space, perfect, real };

// Homogeneous ground below z = 0. eps_r and sigma are used only for GroundKind::real.
struct Ground {
  GroundKind kind = GroundKind::free_space;
  double eps_r = 1.0;
  double sigma_s_per_m = 0.0;
  std::string name = "free space";
};

inline Ground free_space() { return Ground{}; }
inline Ground perfect_ground() { return Ground{GroundKind::perfect, 1.0, 0.0, "perfect ground"}; }
inline Ground real_ground(double eps_r, double sigma_s_per_m, std::string name) {
  return Ground{GroundKind::real, eps_r, sigma_s_per_m, std::move(name)};
}

struct Model {
  std::vector<Wire> wires;
  std::vector<Feed> feeds;
  std::vector<Load> loads;
  Ground ground;
  double frequency_hz = 0.0;

  double wavelength_m() const { return constants::c0 / frequency_hz; }
};

}  // namespace standoff::em
