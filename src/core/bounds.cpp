#include "core/bounds.hpp"

#include <cmath>
#include <cstdio>

namespace standoff::bounds {

std::string show(double v) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.6g", v);
  return buf;
}

void length(double metres, const Where& where, bool allow_negative) {
  const double lo = allow_negative ? -kMaxLengthM : 0.0;
  if (!(metres >= lo && metres <= kMaxLengthM))
    throw InputError(where, "must be within " + std::string(allow_negative ? "±" : "0 to ") + "100 km (got " +
                                show(metres) + " m)");
}

void power_pep(double watts, const Where& where) {
  if (!(watts > 0.0)) throw InputError(where, "must be greater than zero (got " + show(watts) + " W)");
  if (!(watts <= kMaxPowerW)) throw InputError(where, "must be at most 10 MW (got " + show(watts) + " W)");
}

void gain_dbi(double dbi, const Where& where) {
  if (!(std::abs(dbi) <= kMaxGainDbi)) throw InputError(where, "must be within ±60 dBi (got " + show(dbi) + " dBi)");
}

void frequency(double hz, const Where& where) {
  if (!(hz > 0.0 && hz <= kMaxFrequencyHz))
    throw InputError(where, "must be above 0 Hz and at most 300 GHz (got " + show(hz) + " Hz)");
}

void duty(double fraction, const Where& where) {
  if (!(fraction > 0.0 && fraction <= 1.0))
    throw InputError(where, "must be above 0 % and at most 100 % (got " + show(fraction * 100.0) + " %)");
}

void tension(double newtons, const Where& where) {
  if (!(newtons >= kMinTensionN && newtons <= kMaxTensionN))
    throw InputError(where, "must be within 1 N to 1 MN (got " + show(newtons) + " N)");
}

void time(double seconds, const Where& where) {
  if (!(seconds >= 0.0 && seconds <= kMaxTimeS))
    throw InputError(where, "must be within 0 s to 24 h (got " + show(seconds) + " s)");
}

void swr(double ratio, const Where& where) {
  if (!(ratio >= 1.0 && ratio <= kMaxSwr))
    throw InputError(where, "expected a finite SWR of 1 or more (at most 1e6), e.g. swr = 1.5 (got " + show(ratio) + ")");
}

int integer(std::int64_t v, std::int64_t lo, std::int64_t hi, const Where& where) {
  if (v < lo || v > hi)
    throw InputError(where, "must be a whole number from " + std::to_string(lo) + " to " + std::to_string(hi) +
                                " (got " + std::to_string(v) + ")");
  return static_cast<int>(v);
}

}  // namespace standoff::bounds

namespace standoff {
std::string printable(const std::string& s) {
  std::string out;
  out.reserve(s.size());
  for (unsigned char c : s) {
    if (c == '\n') out += "\\n";
    else if (c == '\t') out += "\\t";
    else if (c == '\r') out += "\\r";
    else if (c < 0x20 || c == 0x7f) {
      char buf[8];
      std::snprintf(buf, sizeof buf, "\\x%02X", c);
      out += buf;
    } else out += static_cast<char>(c);
  }
  return out;
}
}  // namespace standoff
