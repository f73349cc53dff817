// Plausibility bounds on input quantities, checked at load time for station files and command-line
// options alike (docs/user-guide.md, "Limits on input"). Method: range checks; bounds are common practice (no source).
#pragma once

// A value outside these bounds is almost certainly a typing error (a missing decimal point, a wrong
// prefix); accepting it would print numbers that look valid. Each check throws InputError naming
// `where` and the allowed range. The bounds are deliberately wide: they stop runaway work and
// overflow, they are not a judgement on what a station may be.

#include <cstdint>
#include <limits>
#include <string>

#include "core/error.hpp"
#include "core/units.hpp"

namespace standoff::bounds {

// Shortest number text for messages ("1e+300", "12.5").
std::string show(double v);

inline constexpr double kMaxLengthM = 100e3;       // lengths, coordinates, heights: 100 km
inline constexpr double kMaxPowerW = 10e6;         // PEP: 10 MW
inline constexpr double kMaxGainDbi = 60.0;        // |gain| ≤ 60 dBi
inline constexpr double kMaxFrequencyHz = 300e9;   // 300 GHz (the top of every limits table)
inline constexpr double kMinTensionN = 1.0;        // wire tension 1 N ..
inline constexpr double kMaxTensionN = 1e6;        // .. 1 MN
inline constexpr double kMaxTimeS = 86400.0;       // operating-pattern steps: one day
inline constexpr double kMaxSwr = 1e6;             // SWR 1 .. 1e6 (finite)

// "must be <what> (got <value>)" helpers. All are NaN-safe (a NaN fails every check).
void length(double metres, const Where& where, bool allow_negative = false);
void power_pep(double watts, const Where& where);
void gain_dbi(double dbi, const Where& where);
void frequency(double hz, const Where& where);
void duty(double fraction, const Where& where);  // 0 < duty ≤ 1
void tension(double newtons, const Where& where);
void time(double seconds, const Where& where);
void swr(double ratio, const Where& where);

// An integer from a file, range-checked before any cast (TOML integers are 64-bit).
int integer(std::int64_t v, std::int64_t lo, std::int64_t hi, const Where& where);

// Generic bounds by dimension, applied by the file loaders to every quantity they parse:
// lengths within ±100 km, powers ≤ 10 MW, frequencies ≤ 300 GHz, gains within ±60 dBi, times
// ≤ 24 h. Quantity-specific bounds (PEP > 0, tension) are checked where the key is known.
inline void check(const units::Length& q, const Where& w) { length(q.value(), w, true); }
inline void check(const units::Power& q, const Where& w) {
  if (!(q.value() <= kMaxPowerW)) throw InputError(w, "must be at most 10 MW (got " + show(q.value()) + " W)");
}
inline void check(const units::Frequency& q, const Where& w) { frequency(q.value(), w); }
inline void check(const units::Gain& q, const Where& w) { gain_dbi(q.dbi(), w); }
inline void check(const units::Time& q, const Where& w) { time(q.value(), w); }
template <class Q>
void check(const Q&, const Where&) {}  // angles, fractions (bounded by their parsers), others


}  // namespace standoff::bounds

namespace standoff {
// `s` with control characters (and DEL) written as \n, \t, \r or \xHH, so that a name from a file
// can never start a new line or move the cursor in the text output.
std::string printable(const std::string& s);
}  // namespace standoff
