// Aperture (dish) antennas on the beam axis, FCC OET Bulletin 65 Section 2 (equation numbers to be
// verified in the bulletin — every result carries a "verify" flag until then):
//   near field R ≤ R_nf = D²/(4λ): S_nf = 16·η·P/(π·D²);  at the surface S_surface = 4·P/A;
//   transition R_nf < R < R_ff = 0.6·D²/λ: S_t = S_nf·R_nf/R;
//   far field R ≥ R_ff: S = P·G/(4πR²), G = 4π·η·A/λ², A = π·D²/4.
// D dish diameter, η aperture efficiency, P average power at the feed.
#pragma once

#include <string>

#include "core/units.hpp"

namespace standoff::exposure {

// True until the formulas above have been read in the bulletin (REFERENCES.md §4 [verify]).
inline constexpr bool kApertureFormulasVerified = false;
inline constexpr const char* kApertureVerifyNote =
    "aperture formulas from memory (FCC OET Bulletin 65 Section 2) — verify against the bulletin";

struct Aperture {
  units::Length diameter;
  units::Fraction efficiency{0.55};
};

struct ApertureRegions {
  units::Length wavelength;
  units::Area area;
  units::Gain gain;
  units::Length r_nf;          // end of the near field, D²/(4λ)
  units::Length r_ff;          // start of the far field, 0.6·D²/λ
  units::PowerDensity s_nf;    // on-axis near-field density
  units::PowerDensity s_surface;
};

enum class ApertureRegion { near_field, transition, far_field };
std::string to_string(ApertureRegion r);

ApertureRegions aperture_regions(const Aperture& dish, units::Power average_power, units::Frequency f);

// On-axis density at distance R ≥ 0 from the aperture.
units::PowerDensity aperture_density(const ApertureRegions& regions, units::Power average_power, units::Length r);
ApertureRegion aperture_region(const ApertureRegions& regions, units::Length r);

struct ApertureDistance {
  units::Length distance;  // 0 when the near-field density is already within the limit
  ApertureRegion region = ApertureRegion::near_field;
  bool within_limit_everywhere = false;  // S_nf ≤ limit: compliant at any distance on the axis
  std::string note;
};

// Distance along the beam beyond which S ≤ limit. Where the transition and far-field formulas do
// not meet exactly at R_ff, the larger (more cautious) distance is returned.
ApertureDistance aperture_compliance_distance(const ApertureRegions& regions, units::Power average_power,
                                              units::PowerDensity limit);

}  // namespace standoff::exposure
