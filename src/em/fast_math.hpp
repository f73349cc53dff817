// Branch-free sine and cosine for vectorised loops: Cody–Waite argument reduction (W. J. Cody &
// W. Waite, Software Manual for the Elementary Functions, 1980) and Taylor polynomials.
#pragma once

namespace standoff::em::fast_math {

// sin and cos of x (|x| < 1e8) without a library call, so that loops calling it vectorise: x = n·π/2 + r with
// |r| ≤ π/4 (three-part Cody–Waite reduction, exact for n < 2^27), Taylor series of sin to r^15
// and cos to r^16 (truncation below 5e-17 for |r| ≤ π/4), quadrant by selects. Accurate to a few
// ulp for |x| up to ~1e7 (checked against std::sin/std::cos in tests/em/test_near_field.cpp).
inline void sincos(double x, double& s, double& c) {
  constexpr double two_over_pi = 0.63661977236758134308;
  constexpr double magic = 6755399441055744.0;  // 1.5·2^52: adding it rounds to an integer
  // π/2 split so that n·p1 and n·p2 are exact for n < 2^27 (Cody & Waite 1980).
  constexpr double p1 = 1.5707963109016418457031250;
  constexpr double p2 = 1.5893254712295857827e-08;
  constexpr double p3 = 6.1232339957367574e-17;
  const double n = (x * two_over_pi + magic) - magic;
  const double r = ((x - n * p1) - n * p2) - n * p3;
  const double z = r * r;
  // Horner with 1/k! coefficients.
  const double sp =
      r * (1.0 +
           z * (-1.0 / 6.0 +
                z * (1.0 / 120.0 +
                     z * (-1.0 / 5040.0 +
                          z * (1.0 / 362880.0 +
                               z * (-1.0 / 39916800.0 + z * (1.0 / 6227020800.0 + z * (-1.0 / 1307674368000.0))))))));
  const double cp =
      1.0 +
      z * (-0.5 +
           z * (1.0 / 24.0 +
                z * (-1.0 / 720.0 +
                     z * (1.0 / 40320.0 +
                          z * (-1.0 / 3628800.0 +
                               z * (1.0 / 479001600.0 + z * (-1.0 / 87178291200.0 + z * (1.0 / 20922789888000.0))))))));
  // Quadrant q = n mod 4 in floating point (no branches, so that the loop vectorises):
  // floor(n/4) = round(n/4 − 3/8) (any integer n) and floor(q/2) = round(q/2 − 1/4).
  const double q = n - 4.0 * ((n * 0.25 - 0.375 + magic) - magic);
  const double hi = (q * 0.5 - 0.25 + magic) - magic;    // 1 for q = 2, 3
  const double odd = q - 2.0 * hi;                        // 1 for q = 1, 3
  const double cneg = odd + hi - 2.0 * odd * hi;          // 1 for q = 1, 2
  const double s0 = odd * cp + (1.0 - odd) * sp, c0 = odd * sp + (1.0 - odd) * cp;
  s = (1.0 - 2.0 * hi) * s0;
  c = (1.0 - 2.0 * cneg) * c0;
}

}  // namespace standoff::em::fast_math
