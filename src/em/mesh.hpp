// Segmentation of the wires and the triangle basis functions on their nodes (n − 1 functions at
// an n-wire junction, so Kirchhoff's current law holds by construction; Balanis ch. 8).
#pragma once

#include <array>
#include <complex>
#include <cstddef>
#include <string>
#include <vector>

#include <Eigen/Core>

#include "em/model.hpp"

namespace standoff::em {

// One straight segment: start point, unit direction, length, radius, surface impedance per metre.
struct Segment {
  Eigen::Vector3d p0;
  Eigen::Vector3d t;  // unit vector along the wire (from wire end a to b)
  double length = 0.0;
  double radius = 0.0;
  std::size_t wire = 0;
  int index_on_wire = 0;
  std::complex<double> z_per_m{0.0, 0.0};  // skin-effect series impedance, ohm/m
  Eigen::Vector3d centre() const { return p0 + 0.5 * length * t; }
  Eigen::Vector3d p1() const { return p0 + length * t; }
};

// Half of a triangle: on one segment the shape rises (N = s/Δ) or falls (N = 1 − s/Δ); `sign` is
// +1 when the basis current flows along the segment direction t.
struct BasisPiece {
  int segment = -1;
  bool rising = true;
  double sign = 1.0;
};

struct Basis {
  std::array<BasisPiece, 2> pieces;
  int count = 0;      // 1 for a wire end connected to the ground, 2 otherwise
  bool grounded = false;
};

struct Mesh {
  std::vector<Segment> segments;
  std::vector<Basis> bases;
  std::vector<int> first_segment;  // per wire: index of its first segment
  std::vector<int> segment_count;  // per wire
  std::vector<std::string> warnings;
  double k = 0.0;       // wavenumber, rad/m
  double omega = 0.0;   // rad/s
};

// Segments the model and builds the bases; throws InputError for bad geometry.
Mesh build_mesh(const Model& model, double max_segment_wavelengths, std::size_t max_unknowns);

}  // namespace standoff::em
