// Branch-free sine and cosine for vectorised loops: Cody–Waite argument reduction (W. J. Cody &
// W. Waite, Software Manual for the Elementary Functions, 1980) and minimax polynomials.
#pragma once

namespace standoff::em::fast_math {

// sin and cos of x (|x| < 1e8) without a library call, so that loops calling it vectorise: x = n·π/2 + r with
// |r| ≤ π/4 (three-part Cody–Waite reduction, exact for n < 2^27), minimax polynomials of
// degree 13 and 14, quadrant by selects. Accurate to a few
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
  // Minimax polynomials on [−π/4, π/4] (coefficients of the Cephes library, S. L. Moshier 1989,
  // from memory — checked against the C library in tests/em/test_near_field.cpp):
  // sin r = r + r³·P(r²), cos r = 1 − r²/2 + r⁴·Q(r²).
  const double sp =
      r + r * z *
              (-1.66666666666666307295e-1 +
               z * (8.33333333332211858878e-3 +
                    z * (-1.98412698295895385996e-4 +
                         z * (2.75573136213857245213e-6 + z * (-2.50507477628578072866e-8 + z * 1.58962301576546568060e-10)))));
  const double cp =
      1.0 - 0.5 * z +
      z * z *
          (4.16666666666665929218e-2 +
           z * (-1.38888888888730564116e-3 +
                z * (2.48015872888517045348e-5 +
                     z * (-2.75573141792967388112e-7 + z * (2.08757008419747316778e-9 + z * -1.13585365213876817300e-11)))));
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
