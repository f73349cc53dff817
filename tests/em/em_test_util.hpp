// Independent closed forms shared by the em tests: sine and cosine integrals by Boost.Math
// adaptive Gauss–Kronrod quadrature (Abramowitz & Stegun 5.2.1, 5.2.2).
#pragma once

#include <cmath>
#include <complex>

#include <boost/math/quadrature/gauss_kronrod.hpp>

#include "core/constants.hpp"

namespace em_test {

// Si(x) = ∫0^x sin t / t dt (A&S 5.2.1).
inline double si(double x) {
  return boost::math::quadrature::gauss_kronrod<double, 61>::integrate(
      [](double t) { return t == 0.0 ? 1.0 : std::sin(t) / t; }, 0.0, x, 15, 1e-13);
}
// Cin(x) = ∫0^x (1 − cos t)/t dt (A&S 5.2.2).
inline double cin(double x) {
  return boost::math::quadrature::gauss_kronrod<double, 61>::integrate(
      [](double t) { return t == 0.0 ? 0.0 : (1.0 - std::cos(t)) / t; }, 0.0, x, 15, 1e-13);
}

// Closed-form fields of a centre-fed thin dipole on the z axis, half-length h, current
// I(z) = Im sin k(h − |z|) (Schelkunoff; Jordan & Balmain, Electromagnetic Waves and Radiating Systems 2nd ed.
// ch. 14 — chapter from memory, verify; Balanis, Antenna Theory 3rd ed. §8.6; MOM-NOTES §3),
// at cylindrical (rho, z), peak phasors, e^{+jωt}.
struct DipoleFields {
  std::complex<double> e_z, e_rho, h_phi;
};
inline DipoleFields schelkunoff(double rho, double z, double h, double k, std::complex<double> im) {
  using cd = std::complex<double>;
  const double eta = standoff::constants::eta0, pi = standoff::constants::pi;
  const double r1 = std::hypot(rho, z - h), r2 = std::hypot(rho, z + h), r = std::hypot(rho, z);
  const cd j(0.0, 1.0);
  const cd e1 = std::exp(-j * k * r1), e2 = std::exp(-j * k * r2), e0 = std::exp(-j * k * r);
  DipoleFields f;
  f.e_z = -j * (eta * im / (4 * pi)) * (e1 / r1 + e2 / r2 - 2.0 * std::cos(k * h) * e0 / r);
  f.e_rho = j * (eta * im / (4 * pi * rho)) * ((z - h) * e1 / r1 + (z + h) * e2 / r2 - 2.0 * z * std::cos(k * h) * e0 / r);
  f.h_phi = j * (im / (4 * pi * rho)) * (e1 + e2 - 2.0 * std::cos(k * h) * e0);
  return f;
}

}  // namespace em_test
