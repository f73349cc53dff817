// Thin-wire method of moments: mixed-potential Pocklington EFIE, Galerkin testing with triangle
// basis functions, reduced kernel (Harrington 1968 ch. 4; Balanis, Antenna Theory 3rd ed. ch. 8).
#pragma once

#include <complex>
#include <cstddef>
#include <memory>
#include <string>
#include <vector>

#include <Eigen/Core>

#include "em/model.hpp"

namespace standoff::em {

struct Mesh;  // segmentation and basis functions (em/mesh.hpp)

// Unknowns above this are refused (InputError): the dense complex matrix takes 16 N^2 bytes,
// 4000 unknowns = 256 MB, and the LU (8/3 N^3 flops) takes tens of seconds on one core.
inline constexpr std::size_t kMaxUnknowns = 4000;

struct SolveOptions {
  double max_segment_wavelengths = 1.0 / 20.0;  // automatic segmentation rule
  std::size_t max_unknowns = kMaxUnknowns;
  bool integrate_pattern = true;  // radiated power by integrating the far field (needed for efficiency)
};

// Result at one feed. Peak phasors for the model's feed voltages.
struct FeedResult {
  std::size_t wire = 0;
  double position = 0.0;               // actual node position used (0..1)
  std::complex<double> voltage;        // V
  std::complex<double> current;        // A, positive from wire end a towards b
  std::complex<double> impedance_ohm;  // V / I (active impedance when there are several feeds)
};

struct Solution {
  Model model;  // as given (with automatic segment counts filled in)
  std::shared_ptr<const Mesh> mesh;
  Eigen::VectorXcd currents;  // basis amplitudes, A (peak), for the model's feed voltages
  std::vector<FeedResult> feeds;

  // Powers for the model's feed voltages (peak phasors: P = 1/2 Re{V I*}), W.
  double input_power_w = 0.0;
  double radiated_power_w = 0.0;   // far-field integral (upper half space over ground)
  double ohmic_loss_w = 0.0;       // conductor skin-effect loss
  double load_loss_w = 0.0;        // resistive part of lumped loads
  double ground_loss_w = 0.0;      // real ground: input - radiated - ohmic - load (0 otherwise)
  double efficiency = 0.0;         // radiated / input
  std::size_t segments = 0;
  std::size_t unknowns = 0;
  std::vector<std::string> warnings;

  // Impedance at the first feed, ohm.
  std::complex<double> impedance() const { return feeds.empty() ? std::complex<double>{} : feeds.front().impedance_ohm; }
};

// Checks the geometry (InputError naming the wire for: zero-length wire, radius > half length,
// non-positive radius, wire below ground or lying on it, overlapping or crossing wires,
// segments > lambda/10, segment/radius < 4 (warning below 8), parallel wires closer than 4 radii,
// feed or load at a free wire end, more unknowns than the cap), then fills and solves.
Solution solve(const Model& model, const SolveOptions& options = {});

// Current (peak, A) at both ends of every segment, positive along the segment direction.
struct SegmentCurrent {
  Eigen::Vector3d start, end;
  std::size_t wire;
  std::complex<double> i_start, i_end;
};
std::vector<SegmentCurrent> segment_currents(const Solution& solution);

// Geometry checks and segmentation only (no solve): throws InputError like solve(), returns the
// warnings. Useful for validating station input up front.
std::vector<std::string> check_geometry(const Model& model, const SolveOptions& options = {});

}  // namespace standoff::em

namespace standoff::em {

// The moment-method impedance matrix alone (without lumped loads), ohm; for tests of the fill
// (reciprocity: Z is complex symmetric; reaction of a sampled current).
struct System {
  std::shared_ptr<const Mesh> mesh;
  Eigen::MatrixXcd z;
};
System assemble(const Model& model, const SolveOptions& options = {});

}  // namespace standoff::em
