// Worst-case time averaging of an operating pattern: the largest share of any window of length T
// (the tier's averaging time, e.g. 6 or 30 min) that the transmitter is on the air, and the
// resulting average power = PEP × duty factor × on-air fraction (FCC OET Bulletin 65 Supplement B,
// 1997, "time averaging" and its worked examples; 47 CFR 1.1310 averaging times).
#pragma once

#include <string>
#include <vector>

#include "core/units.hpp"

namespace standoff::power {

// One step of a repeating cycle: `on_air` for `duration`.
struct PatternStep {
  units::Time duration;
  bool on_air = true;
};

// An on-air interval [start, end) on a one-off schedule (the transmitter is off outside every
// interval).
struct OnAirInterval {
  units::Time start;
  units::Time end;
};

// How the transmitter is keyed over time.
//  - continuous: always on (fraction 1 in any window) — the conservative default;
//  - repeating: the cycle of steps repeats forever (e.g. 2 min on, 2 min off);
//  - intervals: a one-off list of on-air intervals, off before, between and after;
//  - fixed_fraction: a given on-air percentage applied to every window (the user's own estimate).
struct OperatingPattern {
  enum class Kind { continuous, repeating, intervals, fixed_fraction };
  Kind kind = Kind::continuous;
  std::vector<PatternStep> cycle;        // repeating
  std::vector<OnAirInterval> intervals;  // intervals (sorted, non-overlapping after normalise)
  units::Fraction fraction{1.0};         // fixed_fraction

  static OperatingPattern continuous();
  static OperatingPattern repeating(std::vector<PatternStep> cycle);
  static OperatingPattern on_air(std::vector<OnAirInterval> intervals);
  static OperatingPattern fixed(units::Fraction on_air_fraction);

  // Short human description, e.g. "repeating: 2 min on, 2 min off".
  std::string describe() const;
};

// The largest fraction of any window of length `window` during which the transmitter is on the
// air (exact: the on-air time is piecewise linear in the window start, so its maximum is reached
// where a window edge meets a switching instant). Throws std::invalid_argument on an empty or
// zero-length cycle or a non-positive window (callers validate user input first).
units::Fraction worst_case_on_air_fraction(const OperatingPattern& pattern, units::Time window);

// PEP × duty × worst-case on-air fraction.
units::Power time_averaged_power(units::Power pep, units::Fraction duty, const OperatingPattern& pattern,
                                 units::Time window);

}  // namespace standoff::power
