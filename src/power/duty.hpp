// Duty factor of an emission mode: average power over a transmission divided by its peak envelope
// power (PEP). Values from FCC OET Bulletin 65 Supplement B (1997), Table 2; AM with a carrier is
// derived from the modulation index m (sine modulation): average/PEP = (1 + m²/2)/(1 + m)².
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "core/units.hpp"

namespace standoff::power {

// One emission mode of tables/duty.toml. Mode names are ours; `source` names the document row.
struct DutyMode {
  std::string name;         // e.g. "ssb", "cw", "fm"
  std::string description;  // e.g. "conversational SSB, no speech processing"
  units::Fraction duty;     // average power / PEP, 0..1
  std::string source;       // e.g. "OET 65 Supplement B, Table 2" or "derived: (1+m²/2)/(1+m)², m = 1"
  bool derived = false;     // true when computed by a formula rather than read in a table
  std::vector<std::string> aliases;  // trade names mapped to this duty class, e.g. "ft8" → afsk
  int source_line = 0;      // line in the table file, for messages
};

struct DutyTable {
  std::string document;  // e.g. "FCC OET Bulletin 65, Supplement B (1997), Table 2"
  std::string file;      // e.g. "tables/duty.toml"
  std::vector<DutyMode> modes;

  // By name or trade name (alias), letter case ignored ("FT8", "ft8", "RTTY", "SSB").
  const DutyMode* find(const std::string& name) const;
  std::string names() const;  // "ssb, ssb-processed, cw, ..." for error messages
};

// AM with full carrier, sine modulation of index m (0 ≤ m ≤ 1) and PEP = Pc·(1+m)²:
// average = Pc·(1 + m²/2), so average/PEP = (1 + m²/2)/(1 + m)². Derived (textbook AM power
// relations), not a table value: m = 1 → 0.375, m = 0 → 1.
units::Fraction am_carrier_duty(double modulation_index);

}  // namespace standoff::power
