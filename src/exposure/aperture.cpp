#include "exposure/aperture.hpp"

#include <algorithm>
#include <cmath>

#include "core/constants.hpp"

namespace standoff::exposure {

std::string to_string(ApertureRegion r) {
  switch (r) {
    case ApertureRegion::near_field: return "near field";
    case ApertureRegion::transition: return "transition region";
    case ApertureRegion::far_field: return "far field";
  }
  return {};
}

ApertureRegions aperture_regions(const Aperture& dish, units::Power p, units::Frequency f) {
  const double d = dish.diameter.value();
  const double eta = dish.efficiency.value;
  const double lambda = constants::c0 / f.value();
  const double area = constants::pi * d * d / 4.0;
  ApertureRegions r;
  r.wavelength = units::metres(lambda);
  r.area = area * units::si::square_meters;
  r.gain = units::Gain{4.0 * constants::pi * eta * area / (lambda * lambda)};  // G = 4πηA/λ²
  r.r_nf = units::metres(d * d / (4.0 * lambda));                              // R_nf = D²/(4λ)
  r.r_ff = units::metres(0.6 * d * d / lambda);                                // R_ff = 0.6·D²/λ
  r.s_nf = units::watts_per_square_metre(16.0 * eta * p.value() / (constants::pi * d * d));  // 16ηP/(πD²)
  r.s_surface = units::watts_per_square_metre(4.0 * p.value() / area);                      // 4P/A
  return r;
}

ApertureRegion aperture_region(const ApertureRegions& r, units::Length dist) {
  if (dist.value() <= r.r_nf.value()) return ApertureRegion::near_field;
  if (dist.value() < r.r_ff.value()) return ApertureRegion::transition;
  return ApertureRegion::far_field;
}

units::PowerDensity aperture_density(const ApertureRegions& r, units::Power p, units::Length dist) {
  const double x = dist.value();
  switch (aperture_region(r, dist)) {
    case ApertureRegion::near_field: return r.s_nf;
    case ApertureRegion::transition: return r.s_nf * (r.r_nf.value() / x);  // S_t = S_nf·R_nf/R
    case ApertureRegion::far_field:
      return units::watts_per_square_metre(p.value() * r.gain.ratio / (4.0 * constants::pi * x * x));
  }
  return r.s_nf;
}

ApertureDistance aperture_compliance_distance(const ApertureRegions& r, units::Power p, units::PowerDensity limit) {
  ApertureDistance out;
  const double s_lim = limit.value();
  if (r.s_nf.value() <= s_lim) {
    out.within_limit_everywhere = true;
    out.note = "on-axis near-field density is within the limit; the surface density 4P/A may still exceed it";
    return out;
  }
  const double r_t = r.s_nf.value() * r.r_nf.value() / s_lim;                             // S_t(R) = S_lim
  const double r_f = std::sqrt(p.value() * r.gain.ratio / (4.0 * constants::pi * s_lim));  // far field
  const double rnf = r.r_nf.value();
  const double rff = r.r_ff.value();
  // The farthest point where S > S_lim over all three regions (S_nf > S_lim here): the transition
  // and far-field formulas meet only approximately at R_ff, so both are tried and the larger kept.
  double dist = rnf;
  out.region = ApertureRegion::near_field;
  if (r_t > rnf) {
    dist = std::min(r_t, rff);
    out.region = ApertureRegion::transition;
  }
  if (r_f > rff && r_f >= dist) {
    dist = r_f;
    out.region = ApertureRegion::far_field;
  }
  out.distance = units::metres(dist);
  out.note = kApertureVerifyNote;
  return out;
}

}  // namespace standoff::exposure
