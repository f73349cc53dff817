#include "siting/catenary.hpp"

#include <cmath>
#include <stdexcept>

namespace standoff::siting {

Catenary::Catenary(double L, double dz, double c) : L_(L), dz_(dz), c_(c) {
  if (!(L > 0.0) || !(c > 0.0) || !std::isfinite(dz) || !std::isfinite(c))
    throw std::invalid_argument("catenary: span and parameter must be positive and finite");
  // z(L) = dz  ⇔  2c·sinh(L/2c)·sinh((L/2 − x0)/c) = dz.
  x0_ = 0.5 * L - c * std::asinh(dz / (2.0 * c * std::sinh(L / (2.0 * c))));
}

Catenary Catenary::from_parameter(double span_m, double dz_m, double c_m) { return Catenary(span_m, dz_m, c_m); }

Catenary Catenary::from_tension(double span_m, double dz_m, double tension_n, double weight_n_per_m) {
  if (!(tension_n > 0.0) || !(weight_n_per_m > 0.0))
    throw std::invalid_argument("catenary: tension and weight must be positive");
  return Catenary(span_m, dz_m, tension_n / weight_n_per_m);
}

Catenary Catenary::from_midspan_sag(double span_m, double dz_m, double sag_m) {
  if (!(span_m > 0.0) || !(sag_m > 0.0)) throw std::invalid_argument("catenary: span and sag must be positive");
  // The mid-span sag decreases monotonically as c grows: bisect on log c. The lower bracket keeps
  // cosh(L/2c) finite (L/2c ≤ 350).
  double lo = std::log(span_m / 700.0);
  double hi = std::log(span_m * 1e9);
  if (Catenary(span_m, dz_m, std::exp(hi)).midspan_sag() > sag_m)
    throw std::invalid_argument("catenary: sag too small to resolve");
  for (int i = 0; i < 200; ++i) {
    const double mid = 0.5 * (lo + hi);
    if (Catenary(span_m, dz_m, std::exp(mid)).midspan_sag() > sag_m)
      lo = mid;
    else
      hi = mid;
  }
  return Catenary(span_m, dz_m, std::exp(0.5 * (lo + hi)));
}

double Catenary::z(double x) const { return c_ * (std::cosh((x - x0_) / c_) - std::cosh(x0_ / c_)); }

double Catenary::slope(double x) const { return std::sinh((x - x0_) / c_); }

double Catenary::sag_below_chord(double x) const { return dz_ * x / L_ - z(x); }

double Catenary::max_sag() const {
  // Where the wire is parallel to the chord: sinh((x − x0)/c) = dz/L (inside the span by the
  // mean-value theorem).
  const double x = x0_ + c_ * std::asinh(dz_ / L_);
  return sag_below_chord(x);
}

double Catenary::lowest_x() const {
  if (x0_ <= 0.0) return 0.0;
  if (x0_ >= L_) return L_;
  return x0_;
}

double Catenary::length() const { return c_ * (std::sinh((L_ - x0_) / c_) + std::sinh(x0_ / c_)); }

double Catenary::end_tension(int end, double weight_n_per_m) const {
  const double x = end == 0 ? 0.0 : L_;
  return weight_n_per_m * c_ * std::cosh((x - x0_) / c_);
}

}  // namespace standoff::siting
