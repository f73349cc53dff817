// Human-exposure limits (reference levels / MPE) as published piecewise power laws, value = a·f^b
// with f in MHz, per tier and frequency band. Sources: 47 CFR 1.1310 Table 1; ICNIRP 2020 Table 5;
// ICNIRP 1998 Tables 6–7 / EU 1999/519/EC; Health Canada Safety Code 6 (2015) Table 5.
// A frequency outside every band of a table is an error, never an extrapolation.
// Band edges: a band covers (f_min, f_max]; a frequency exactly at a breakpoint belongs to the lower
// band (ICNIRP writes ">30–400 MHz"); the first band of a tier also includes its own f_min.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "core/error.hpp"
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
  // Averaging time in seconds as a·f^b (f in MHz) where it varies with frequency inside the band
  // (ICNIRP 1998 above 10 GHz: 68/f_G^1.05 min); absent = the tier's averaging time.
  std::optional<PowerLaw> averaging_s;
  int source_line = 0;           // line in the table file, for error messages

  // f_min < f ≤ f_max (or f == f_min when `first`): the band-edge convention above.
  bool contains_mhz(double f_mhz, bool first) const;
};

struct TierTable {
  Tier tier = Tier::uncontrolled;
  std::string document_tier_name;  // the words the document uses, e.g. "general population/uncontrolled"
  units::Time averaging;           // averaging time for this tier
  std::vector<Band> bands;         // sorted, contiguous
  std::string table;               // the tier's own table number, if the document splits them
  Confidence confidence = Confidence::verify;  // may differ between tiers (ICNIRP 1998)

  double f_min_mhz() const { return bands.empty() ? 0.0 : bands.front().f_min_mhz; }
  double f_max_mhz() const { return bands.empty() ? 0.0 : bands.back().f_max_mhz; }
};

// One published table (one TOML file under tables/limits/).
struct LimitTable {
  Standard standard = Standard::fcc;
  std::string name;      // short display name, e.g. "US FCC"
  std::string document;  // e.g. "47 CFR § 1.1310(e)(1)"
  std::string table;     // e.g. "Table 1"
  int year = 0;
  Confidence confidence = Confidence::verify;  // the weakest flag over the file's rows
  std::string note;      // free text from the file (e.g. what is left out and why)
  std::string file;      // path it was loaded from, e.g. "tables/limits/fcc.toml"
  std::vector<TierTable> tiers;

  const TierTable* find(Tier t) const;
  std::string source() const;  // "document, table (year)"
  std::string source(const TierTable& t) const;  // same, with the tier's own table number if any
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
  std::string document_tier;  // the document's words for the tier
};

// Throws InputError (naming the table file and its frequency range) when f is outside the table,
// or when the table has no such tier. `where` says where f came from (e.g. a station file line).
LimitValues lookup(const LimitTable& table, Tier tier, units::Frequency f, const Where& where = {});

// The binding power density for a plane wave (S = E²/η0 = η0·H²): the smallest of S, E²/η0 and
// η0·H² over the quantities the table gives — a plane wave meets all of them only below this.
// Used by screening models. Absent only if the table gives no E, H or S.
std::optional<units::PowerDensity> plane_wave_density(const LimitValues& v);

// "confirmed", "partly", "verify" → Confidence.
std::optional<Confidence> confidence_from_string(const std::string& s);

// Every standard ID, in the order the CLI lists them.
inline constexpr Standard kAllStandards[] = {Standard::fcc, Standard::icnirp2020, Standard::icnirp1998,
                                             Standard::sc6};

}  // namespace standoff::limits
