// Near fields of solved wire currents, E = −jωA − ∇φ and H = ∇×A/μ0 (Balanis, Antenna Theory 3rd
// ed. ch. 3–4), evaluated segment by segment over structure-of-arrays data for speed.
#pragma once

// The rule per segment and point (MOM-NOTES §2 "verify by doubling"; the measured errors are in
// docs/methods.md and tests/em/test_near_field.cpp): beyond 10 segment lengths a 2-point
// Gauss–Legendre rule, from 3 to 10 lengths 4 points, closer a graded composite rule
// (kernel::segment_field). The 2-point far rule runs as one vectorised loop over all segments with
// per-segment terms (node positions, weighted currents and charges) computed once per solution.

#include <complex>
#include <span>
#include <vector>

#include <Eigen/Core>

#include "em/fields.hpp"
#include "em/solve.hpp"

namespace standoff::em {

class NearFieldEvaluator {
 public:
  explicit NearFieldEvaluator(const Solution& solution);

  // Fields at `points` (out.size() == points.size()), RMS at `input_power_w` like near_fields().
  // Const and free of shared mutable state: callers may evaluate disjoint blocks concurrently.
  void evaluate(std::span<const Eigen::Vector3d> points, double input_power_w, std::span<FieldPoint> out) const;
  std::vector<FieldPoint> evaluate(std::span<const Eigen::Vector3d> points, double input_power_w) const;

  // Direct plus image segments (what one point costs).
  std::size_t segment_count() const { return x0_.size(); }

 private:
  void point_field(const Eigen::Vector3d& p, double scale, FieldPoint& out, std::vector<double>& work) const;

  // Per segment (direct first, then images): start, direction, length, 3 radii, centre, currents.
  std::vector<double> x0_, y0_, z0_, tx_, ty_, tz_, len_, rad3_, cx_, cy_, cz_;
  std::vector<std::complex<double>> ia_, ib_;
  // Rule nodes (sets 0–1: the 2-point rule, 2–5: the 4-point rule) and their weighted terms:
  // A = w·Δ·I(s), B = w·Δ·q/ε0 (q line charge).
  static constexpr int kNodeSets = 6;
  std::vector<double> nx_[kNodeSets], ny_[kNodeSets], nz_[kNodeSets], are_[kNodeSets], aim_[kNodeSets],
      bre_[kNodeSets], bim_[kNodeSets];
  std::size_t n_direct_ = 0;
  int ground_ = 0;  // 0 free space, 1 perfect, 2 real (reflection-coefficient approximation)
  std::complex<double> eps_c_{1.0, 0.0};
  double k_ = 0.0, omega_ = 0.0, input_power_w_ = 0.0;
};

}  // namespace standoff::em
