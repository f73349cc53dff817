// Far-field screening: power density S = g·P·G/(4πR²) with ground factor g = 1 (none, OET 65
// Eq. 3), 2.56 (EPA ground-reflection factor 1.6², Eq. 7) or 4 (field doubling over a perfect
// reflector, Eq. 6); and the compliance distance R = √(g·P·G/(4π·S_lim)) per tier (FCC OET
// Bulletin 65, Ed. 97-01, Section 2). Below 30 MHz the limit is the smaller plane-wave equivalent
// of the E and H limits, S_E = E²/η0 and S_H = η0·H², and the binding one is reported.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "core/units.hpp"
#include "limits/limits.hpp"

namespace standoff::exposure {

enum class GroundFactor { none, epa, full };

std::string to_string(GroundFactor g);                                 // "none", "epa", "full"
std::optional<GroundFactor> ground_factor_from_string(const std::string& s);
double ground_factor_ratio(GroundFactor g);                            // 1, 2.56, 4

// The warning printed when a screening distance falls inside λ/2π or the antenna's near field.
inline constexpr const char* kNearFieldWarning =
    "far-field estimate; conservative in the reactive near field — use the detailed model";

// S = g·P·G/(4πR²) at distance R > 0 in the main beam.
units::PowerDensity far_field_density(units::Power average_power, units::Gain gain, units::Length r,
                                      GroundFactor ground);

// Which limit quantity sets the screening density.
enum class Binding { s, e, h };
std::string to_string(Binding b);  // "S", "E", "H"

struct DensityLimit {
  units::PowerDensity s;  // the power density the screening uses
  Binding binding = Binding::s;
  std::string explanation;  // e.g. "plane-wave equivalent of E = 58.03 V/m: E²/η0"
};

// S where the table gives S and it is not a plane-wave equivalent; otherwise the smaller of
// E²/η0 and η0·H² (always below 30 MHz for the FCC table, whose S there is an equivalent).
// Throws InputError if the values give no E, H or S.
DensityLimit screening_density_limit(const limits::LimitValues& v);

struct ScreeningDistance {
  limits::Tier tier = limits::Tier::uncontrolled;
  units::Time averaging;
  units::Length distance;         // exact value; round UP for display (ceil_to)
  DensityLimit limit;
  units::Length near_field_boundary;  // max(λ/2π, 2·L²/λ when the antenna size L is known)
  bool near_field_warning = false;
  std::vector<std::string> notes;
};

// Compliance distance along the main beam for average power P at the antenna. `antenna_size` is
// the largest dimension of the antenna if known (then the near field reaches 2·L²/λ).
ScreeningDistance screening_distance(units::Power average_power, units::Gain gain, GroundFactor ground,
                                     const limits::LimitValues& limit,
                                     std::optional<units::Length> antenna_size = std::nullopt);

// Round a non-negative value UP to a multiple of `step` (distances always round up).
double ceil_to(double value, double step);
// Round a non-negative value DOWN to a multiple of `step` (power limits always round down).
double floor_to(double value, double step);

}  // namespace standoff::exposure
