#include "exposure/screening.hpp"

#include <algorithm>
#include <cmath>
#include <sstream>

#include "core/number_text.hpp"
#include "core/constants.hpp"
#include "core/error.hpp"

namespace standoff::exposure {
namespace {
}  // namespace

std::string to_string(GroundFactor g) {
  switch (g) {
    case GroundFactor::none: return "none";
    case GroundFactor::epa: return "epa";
    case GroundFactor::full: return "full";
  }
  return {};
}

std::optional<GroundFactor> ground_factor_from_string(const std::string& s) {
  if (s == "none") return GroundFactor::none;
  if (s == "epa") return GroundFactor::epa;
  if (s == "full") return GroundFactor::full;
  return std::nullopt;
}

double ground_factor_ratio(GroundFactor g) {
  switch (g) {
    case GroundFactor::none: return 1.0;   // OET 65 Eq. 3
    case GroundFactor::epa: return 2.56;   // OET 65 Eq. 7: (1.6)²
    case GroundFactor::full: return 4.0;   // OET 65 Eq. 6: field doubling, S = EIRP/(πR²)
  }
  return 4.0;
}

std::string to_string(Binding b) {
  switch (b) {
    case Binding::s: return "S";
    case Binding::e: return "E";
    case Binding::h: return "H";
  }
  return {};
}

units::PowerDensity far_field_density(units::Power p, units::Gain g, units::Length r, GroundFactor ground) {
  const double rr = r.value();
  return units::watts_per_square_metre(ground_factor_ratio(ground) * p.value() * g.ratio /
                                       (4.0 * constants::pi * rr * rr));
}

DensityLimit screening_density_limit(const limits::LimitValues& v) {
  if (v.s && !v.s_is_equivalent)
    return {*v.s, Binding::s, "power-density limit S = " + significant(v.s->value()) + " W/m²"};
  std::optional<DensityLimit> best;
  if (v.e) {
    const double e = v.e->value();
    const double s = e * e / constants::eta0;
    best = DensityLimit{units::watts_per_square_metre(s), Binding::e,
                        "plane-wave equivalent of E = " + significant(e) + " V/m: E²/η0 = " + significant(s) + " W/m²"};
  }
  if (v.h) {
    const double h = v.h->value();
    const double s = constants::eta0 * h * h;
    if (!best || s < best->s.value())
      best = DensityLimit{units::watts_per_square_metre(s), Binding::h,
                          "plane-wave equivalent of H = " + significant(h) + " A/m: η0·H² = " + significant(s) + " W/m²"};
  }
  if (best) return *best;
  if (v.s) return {*v.s, Binding::s, "plane-wave-equivalent power density S = " + significant(v.s->value()) + " W/m²"};
  throw InputError(Where{v.source, 0, "limits"}, "the limits table gives no E, H or S at this frequency");
}

ScreeningDistance screening_distance(units::Power p, units::Gain g, GroundFactor ground,
                                     const limits::LimitValues& limit, std::optional<units::Length> antenna_size) {
  ScreeningDistance r;
  r.tier = limit.tier;
  r.averaging = limit.averaging;
  r.limit = screening_density_limit(limit);
  const double s_lim = r.limit.s.value();
  // OET 65 Eq. 3/6/7 solved for R: S_lim = g·P·G/(4πR²).
  r.distance = units::metres(std::sqrt(ground_factor_ratio(ground) * p.value() * g.ratio / (4.0 * constants::pi * s_lim)));
  const double lambda = constants::c0 / limit.frequency.value();
  double boundary = lambda / (2.0 * constants::pi);
  if (antenna_size) boundary = std::max(boundary, 2.0 * antenna_size->value() * antenna_size->value() / lambda);
  r.near_field_boundary = units::metres(boundary);
  if (r.distance.value() < boundary) {
    r.near_field_warning = true;
    r.notes.push_back(kNearFieldWarning);
  }
  if (limit.frequency.value() < 30e6)
    r.notes.push_back(
        "below 30 MHz: over well-conducting ground the magnetic field of a low horizontal wire can exceed this "
        "estimate near the surface (image theory) — check H with the detailed model");
  return r;
}

namespace {
// k steps as a double: divide by the integer 1/step when step < 1 so that 0.1-steps print cleanly.
double steps_to_value(double k, double step) {
  const double inv = std::round(1.0 / step);
  return step < 1.0 && std::abs(inv * step - 1.0) < 1e-12 ? k / inv : k * step;
}
}  // namespace

double ceil_to(double value, double step) {
  // A tiny allowance so that a value already on the grid (up to rounding noise) stays there.
  return std::max(0.0, steps_to_value(std::ceil(value / step - 1e-9), step)) + 0.0;  // never "-0"
}

double floor_to(double value, double step) {
  return std::max(0.0, steps_to_value(std::floor(value / step + 1e-9), step)) + 0.0;
}

}  // namespace standoff::exposure
