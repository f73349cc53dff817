#include "siting/clearances.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace standoff::siting {

const WireClass* ClearanceTables::find_wire(const std::string& name) const {
  for (const auto& w : wires)
    if (w.name == name) return &w;
  return nullptr;
}

units::Length osha_general_approach(Voltage to_ground, const ClearanceTables& t) {
  const double v = to_ground.value();
  const double over = v - t.general_threshold.value();
  if (over <= 0.0) return t.general_base;
  // "for every 10 kV over 50 kV": a partial step counts as a whole one (round toward the larger
  // distance); the small allowance keeps exact multiples from rounding up through float error.
  const double steps = std::ceil(over / t.general_step.value() - 1e-9);
  return t.general_base + steps * t.general_increment;
}

std::optional<units::Length> osha_table_a_approach(Voltage nominal, const ClearanceTables& t) {
  for (const auto& row : t.table_a)
    if (nominal.value() <= row.up_to.value()) return row.distance;
  return std::nullopt;
}

namespace {
std::string kv(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.4g kV", v / 1e3);
  return buf;
}
}  // namespace

Approach approach_distance(const PowerLine& line, const ClearanceTables& t) {
  Approach a;
  if (!line.voltage) {
    if (line.kind == LineKind::transmission) {
      a.source = t.table_a_source;
      a.note = "voltage unknown on a transmission line: not evaluated — ask the utility for the voltage";
      return a;
    }
    a.distance = t.unknown_voltage.value;
    a.source = t.unknown_voltage.source;
    a.note = "voltage unknown: 20 ft rule";
    return a;
  }
  const double v = line.voltage->value.value();
  const bool pg = line.voltage->reference == VoltageReference::phase_to_ground;
  const Voltage to_ground = volts(v);  // worst case for a phase-to-phase value
  const Voltage nominal = volts(pg ? v * std::sqrt(3.0) : v);
  const units::Length general = osha_general_approach(to_ground, t);
  const auto table = osha_table_a_approach(nominal, t);
  if (!table) {
    a.source = t.table_a_source;
    a.note = "nominal voltage " + kv(nominal.value()) +
             " is above 1926.1408 Table A: not evaluated — distance set by the utility or a registered engineer";
    return a;
  }
  if (general.value() > table->value()) {
    a.distance = general;
    a.source = t.general_source;
  } else {
    a.distance = *table;
    a.source = t.table_a_source;
  }
  a.note = pg ? "voltage " + kv(v) + " phase to ground (nominal " + kv(nominal.value()) + ")"
              : "voltage " + kv(v) + " phase to phase, also taken as the voltage to ground (worst case)";
  return a;
}

std::optional<TypicalHeight> assumed_line_height(LineKind kind, const ClearanceTables& t) {
  const LineKind look = kind == LineKind::transmission ? LineKind::distribution : kind;
  std::optional<TypicalHeight> best;
  for (const auto& h : t.typical_heights)
    if (h.kind == look && (!best || h.height.value() < best->height.value())) best = h;
  return best;
}

units::Length awg_diameter(int awg) {
  return units::metres(0.127e-3 * std::pow(92.0, (36.0 - awg) / 39.0));
}

}  // namespace standoff::siting
