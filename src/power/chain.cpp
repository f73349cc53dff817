#include "power/chain.hpp"

#include <sstream>

#include "core/number_text.hpp"
#include "core/constants.hpp"

namespace standoff::power {
namespace {
}  // namespace

units::Power eirp(units::Power p, units::Gain g) { return p * g.ratio; }
units::Power erp(units::Power p, units::Gain g) { return p * (g.ratio / constants::dipole_gain); }

PowerChain power_chain(const ChainInput& in, units::Time window) {
  PowerChain c;
  c.window = window;
  c.pep = in.pep;
  c.duty = in.duty;
  c.duty_source = in.duty_source;
  c.pattern = in.pattern.describe();
  c.on_air = worst_case_on_air_fraction(in.pattern, window);
  c.gain = in.gain;
  c.steps.push_back({"transmitter PEP", in.pep, "peak envelope power at the transmitter output"});
  const units::Power after_duty = in.pep * in.duty.value;
  c.steps.push_back({"duty factor", after_duty,
                     "× " + significant(in.duty.percent()) + " % (" + (in.duty_source.empty() ? "given" : in.duty_source) + ")"});
  c.average_at_transmitter = after_duty * c.on_air.value;
  c.steps.push_back({"time window", c.average_at_transmitter,
                     "× " + significant(c.on_air.percent()) + " % worst-case on-air share of any " + significant(window.value() / 60.0) +
                         " min window (" + c.pattern + ")"});
  c.average_at_antenna = c.average_at_transmitter;
  if (in.line) {
    c.line = run_line(in.line->line, in.line->length, in.frequency, in.line->load, c.average_at_transmitter);
    c.line_loss_db = c.line->total_loss_db;
    c.average_at_antenna = c.line->delivered;
    if (!c.line->evaluated) {
      c.evaluated = false;
      c.notes.push_back(c.line->note);
    }
    c.steps.push_back({"feed line", c.average_at_antenna,
                       "− " + significant(c.line->total_loss_db, 3) + " dB (" + in.line->line.name + ", " +
                           significant(in.line->length.value()) + " m: matched " + significant(c.line->matched_loss_db, 3) +
                           " dB + mismatch " + significant(c.line->mismatch_loss_db, 3) + " dB at SWR " +
                           significant(c.line->swr_load, 3) + ")"});
  }
  c.eirp = eirp(c.average_at_antenna, in.gain);
  c.erp = erp(c.average_at_antenna, in.gain);
  c.steps.push_back({"antenna", c.eirp,
                     "EIRP = P × " + significant(in.gain.ratio) + " (" + significant(in.gain.dbi(), 3) + " dBi); ERP = EIRP/1.64 = " +
                         significant(c.erp.value()) + " W"});
  return c;
}

}  // namespace standoff::power
