// Human-exposure limits (reference levels / MPE) as published piecewise power laws, value = a·f^b
// with f in MHz, per tier and frequency band. Sources: 47 CFR 1.1310 Table 1; ICNIRP 2020 Table 5;
// ICNIRP 1998 Tables 6–7 / EU 1999/519/EC; Health Canada Safety Code 6 (2015) Table 5.
// A frequency outside every band of a table is an error, never an extrapolation.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "core/units.hpp"

namespace standoff::limits {

enum class Standard { fcc, icnirp2020, icnirp1998, sc6 };
enum class Tier { controlled, uncontrolled };

// "fcc", "icnirp2020", "icnirp1998", "sc6"; "controlled", "uncontrolled".
std::string to_string(Standard s);
std::string to_string(Tier t);
std::optional<Standard> standard_from_string(const std::string& s);
std::optional<Tier> tier_from_string(const std::string& s);

// How sure we are of a table's values (REFERENCES.md): confirmed, partly, verify.
enum class Confidence { confirmed, partly, verify };
std::string to_string(Confidence c);

// a·f^b with f in MHz, in the row's unit (V/m, A/m, W/m²).
struct PowerLaw {
  double a = 0.0;
  double b = 0.0;
  double at_mhz(double f_mhz) const;
};

// One band of one tier.
struct Band {
  double f_min_mhz = 0.0;
  double f_max_mhz = 0.0;
  std::optional<PowerLaw> e_v_per_m;
  std::optional<PowerLaw> h_a_per_m;
  std::optional<PowerLaw> s_w_per_m2;
  bool s_is_equivalent = false;  // S is a plane-wave-equivalent (E and H bind)
  int source_line = 0;           // line in the table file, for error messages
};

struct TierTable {
  Tier tier = Tier::uncontrolled;
  std::string document_tier_name;  // the words the document uses, e.g. "general population/uncontrolled"
  units::Time averaging;           // averaging time for this tier
  std::vector<Band> bands;         // sorted, contiguous
};

// One published table (one TOML file under tables/limits/).
struct LimitTable {
  Standard standard = Standard::fcc;
  std::string document;  // e.g. "47 CFR § 1.1310(e)(1)"
  std::string table;     // e.g. "Table 1"
  int year = 0;
  Confidence confidence = Confidence::verify;
  std::string note;      // free text from the file (e.g. what is left out and why)
  std::string file;      // path it was loaded from, e.g. "tables/limits/fcc.toml"
  std::vector<TierTable> tiers;

  const TierTable* find(Tier t) const;
  std::string source() const;  // "document, table (year)"
};

// Limits at one frequency for one tier. Absent quantities are ones the table does not give.
struct LimitValues {
  Standard standard = Standard::fcc;
  Tier tier = Tier::uncontrolled;
  units::Frequency frequency;
  std::optional<units::EField> e;
  std::optional<units::HField> h;
  std::optional<units::PowerDensity> s;
  bool s_is_equivalent = false;
  units::Time averaging;
  std::string source;
  Confidence confidence = Confidence::verify;
};

// Throws InputError (naming the table file and its frequency range) when f is outside the table,
// or when the table has no such tier.
LimitValues lookup(const LimitTable& table, Tier tier, units::Frequency f);

// The binding power density for a plane wave: S itself where given, otherwise the smaller of
// E²/η0 and η0·H² — used by screening models. Absent only if the table gives no E, H or S.
std::optional<units::PowerDensity> plane_wave_density(const LimitValues& v);

}  // namespace standoff::limits
