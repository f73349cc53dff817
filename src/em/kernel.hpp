// Numeric kernels of the MoM engine: Gauss–Legendre rules, segment-pair integrals of the reduced
// thin-wire kernel with the 1/R part integrated analytically, and fields of a straight segment
// with a linear current (Balanis, Antenna Theory 3rd ed. §8.3–8.4; MOM-NOTES §2).
#pragma once

#include <complex>
#include <span>
#include <utility>

#include <Eigen/Core>
#include <Eigen/Geometry>

namespace standoff::em::kernel {

using cd = std::complex<double>;

// Gauss–Legendre nodes and weights on [0, 1] for n = 1..16 (Golub–Welsch via Newton iteration).
struct Rule {
  std::span<const double> x, w;
};
Rule gauss_legendre(int n);

// Straight source or observation segment: start, unit direction, length.
struct Line {
  Eigen::Vector3d p0, t;
  double length = 0.0;
  Eigen::Vector3d centre() const { return p0 + 0.5 * length * t; }
};

// S[α][β] = ∫∫ N_α(s) N_β(s') G(R) ds ds' and T = ∫∫ G(R) ds ds' over observation segment p
// (s) and source segment q (s'), N_0 = 1 − s/Δ, N_1 = s/Δ, G = e^{−jkR}/(4πR),
// R = √(|r(s) − r'(s')|² + a²) (reduced kernel; a² = a_p·a_q).
struct PairIntegrals {
  cd s[2][2];
  cd t;
};
PairIntegrals pair_integrals(const Line& p, const Line& q, double a2, double k);

// Fresnel reflection coefficients for a homogeneous half space with complex relative
// permittivity eps_c = εr − jσ/(ωε0), at incidence angle θ from the normal (Balanis §4.8):
// first = R_v (parallel / TM), second = R_h (perpendicular / TE).
std::pair<cd, cd> reflection(cd eps_c, double cos_theta);

// E and H (peak) at r from a filament segment carrying the linear current Ia → Ib (A, along t)
// and the line charge −(Ib − Ia)/(jωΔ): E = −jωA − ∇φ, H = ∇G × t I. Graded Gauss–Legendre
// toward the foot of the perpendicular; accurate from a few radii from the axis.
void segment_field(const Eigen::Vector3d& r, const Line& seg, cd ia, cd ib, double k, double omega,
                   Eigen::Vector3cd& e, Eigen::Vector3cd& h);

}  // namespace standoff::em::kernel
