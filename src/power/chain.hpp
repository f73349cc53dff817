// The power chain of one operation: transmitter PEP → mode duty factor → worst-case on-air
// fraction in the averaging window → feed-line loss (with mismatch) → average power at the
// antenna → EIRP = P·G and ERP = EIRP/1.64 (FCC OET Bulletin 65 Eq. 5; Supplement B averaging).
// Every step is recorded so that a report can show the chain.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "core/units.hpp"
#include "power/averaging.hpp"
#include "power/feedline.hpp"

namespace standoff::power {

// A run of feed line between the transmitter and the antenna.
struct LineSpec {
  FeedLine line;
  units::Length length;
  LoadSpec load;
};

struct ChainInput {
  units::Power pep;                // transmitter peak envelope power at its output
  units::Fraction duty{1.0};       // mode duty factor
  std::string duty_source;         // e.g. "mode ssb (OET 65 Supplement B, Table 2)" or "given"
  OperatingPattern pattern = OperatingPattern::continuous();
  std::optional<LineSpec> line;    // none: the antenna is fed without loss
  units::Frequency frequency;
  units::Gain gain;                // antenna gain (isotropic), main beam unless stated
};

struct ChainStep {
  std::string name;    // "transmitter PEP", "duty factor", "time window", "feed line", "antenna"
  units::Power power;  // power after this step
  std::string detail;  // e.g. "× 20 % (mode ssb ...)"
};

struct PowerChain {
  units::Time window;                   // averaging time used
  units::Power pep;
  units::Fraction duty;
  std::string duty_source;
  units::Fraction on_air;               // worst-case on-air fraction in the window
  std::string pattern;                  // description of the operating pattern
  units::Power average_at_transmitter;  // PEP × duty × on-air
  std::optional<LineRun> line;
  double line_loss_db = 0.0;            // total (matched + mismatch), 0 without a line
  units::Power average_at_antenna;
  units::Gain gain;
  units::Power eirp;
  units::Power erp;
  bool evaluated = true;                // false if the line model is outside its validity
  std::vector<ChainStep> steps;
  std::vector<std::string> notes;
};

// Throws InputError for a frequency outside the line's data.
PowerChain power_chain(const ChainInput& input, units::Time averaging_window);

// EIRP = P·G (OET 65 Eq. 3 numerator); ERP = EIRP/1.64 (OET 65 Eq. 5).
units::Power eirp(units::Power p, units::Gain g);
units::Power erp(units::Power p, units::Gain g);

}  // namespace standoff::power
