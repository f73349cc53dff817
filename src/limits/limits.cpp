#include "limits/limits.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "core/constants.hpp"

namespace standoff::limits {
namespace {

// A frequency within this relative distance of a band edge is taken to be on the edge, so that
// "1.34 MHz" lands on the published breakpoint whatever the binary rounding of 1.34e6/1e6.
constexpr double kEdgeSnap = 1e-9;

std::string format_mhz(double f_mhz) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.6g", f_mhz);
  return buf;
}

}  // namespace

std::string to_string(Standard s) {
  switch (s) {
    case Standard::fcc: return "fcc";
    case Standard::icnirp2020: return "icnirp2020";
    case Standard::icnirp1998: return "icnirp1998";
    case Standard::sc6: return "sc6";
  }
  return "unknown";
}

std::string to_string(Tier t) {
  switch (t) {
    case Tier::controlled: return "controlled";
    case Tier::uncontrolled: return "uncontrolled";
  }
  return "unknown";
}

std::string to_string(Confidence c) {
  switch (c) {
    case Confidence::confirmed: return "confirmed";
    case Confidence::partly: return "partly";
    case Confidence::verify: return "verify";
  }
  return "unknown";
}

std::optional<Standard> standard_from_string(const std::string& s) {
  for (Standard st : kAllStandards)
    if (to_string(st) == s) return st;
  return std::nullopt;
}

std::optional<Tier> tier_from_string(const std::string& s) {
  for (Tier t : {Tier::controlled, Tier::uncontrolled})
    if (to_string(t) == s) return t;
  return std::nullopt;
}

std::optional<Confidence> confidence_from_string(const std::string& s) {
  for (Confidence c : {Confidence::confirmed, Confidence::partly, Confidence::verify})
    if (to_string(c) == s) return c;
  return std::nullopt;
}

double PowerLaw::at_mhz(double f_mhz) const { return b == 0.0 ? a : a * std::pow(f_mhz, b); }

bool Band::contains_mhz(double f_mhz, bool first) const {
  return (f_mhz > f_min_mhz || (first && f_mhz == f_min_mhz)) && f_mhz <= f_max_mhz;
}

const TierTable* LimitTable::find(Tier t) const {
  for (const auto& tt : tiers)
    if (tt.tier == t) return &tt;
  return nullptr;
}

std::string LimitTable::source() const {
  return document + ", " + table + " (" + std::to_string(year) + ")";
}

std::string LimitTable::source(const TierTable& t) const {
  return document + ", " + (t.table.empty() ? table : t.table) + " (" + std::to_string(year) + ")";
}

LimitValues lookup(const LimitTable& table, Tier tier, units::Frequency f, const Where& where) {
  const TierTable* tt = table.find(tier);
  const std::string which = table.name + " (" + table.file + ")";
  if (tt == nullptr || tt->bands.empty())
    throw InputError(where, which + " has no " + to_string(tier) + " tier");
  double f_mhz = f.value() / 1e6;
  const std::string range = format_mhz(tt->f_min_mhz()) + "–" + format_mhz(tt->f_max_mhz()) + " MHz";
  if (!std::isfinite(f_mhz) || f_mhz <= 0.0)
    throw InputError(where, "frequency must be above zero; " + which + " " + to_string(tier) + " covers " + range);
  for (const auto& b : tt->bands)
    for (double edge : {b.f_min_mhz, b.f_max_mhz})
      if (std::abs(f_mhz - edge) <= kEdgeSnap * edge) f_mhz = edge;
  for (std::size_t i = 0; i < tt->bands.size(); ++i) {
    const Band& b = tt->bands[i];
    if (!b.contains_mhz(f_mhz, i == 0)) continue;
    LimitValues v;
    v.standard = table.standard;
    v.tier = tier;
    v.frequency = f;
    if (b.e_v_per_m) v.e = units::volts_per_metre(b.e_v_per_m->at_mhz(f_mhz));
    if (b.h_a_per_m) v.h = units::amperes_per_metre(b.h_a_per_m->at_mhz(f_mhz));
    if (b.s_w_per_m2) v.s = units::watts_per_square_metre(b.s_w_per_m2->at_mhz(f_mhz));
    v.s_is_equivalent = b.s_is_equivalent;
    v.averaging = b.averaging_s ? units::seconds(b.averaging_s->at_mhz(f_mhz)) : tt->averaging;
    v.source = table.source(*tt);
    v.confidence = tt->confidence;
    v.document_tier = tt->document_tier_name;
    return v;
  }
  throw InputError(where, format_mhz(f.value() / 1e6) + " MHz is outside " + which + " " + to_string(tier) +
                              " limits, which cover " + range + " only (no extrapolation)");
}

std::optional<units::PowerDensity> plane_wave_density(const LimitValues& v) {
  std::optional<double> s;
  auto take = [&s](double x) { s = s ? std::min(*s, x) : x; };
  if (v.s) take(v.s->value());
  if (v.e) take(v.e->value() * v.e->value() / constants::eta0);
  if (v.h) take(constants::eta0 * v.h->value() * v.h->value());
  if (!s) return std::nullopt;
  return units::watts_per_square_metre(*s);
}

}  // namespace standoff::limits
