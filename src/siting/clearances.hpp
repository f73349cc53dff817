// The published clearance rules used by the siting checks, as loaded from tables/clearances.toml
// (each value keeps its source and confidence flag): OSHA approach distances (29 CFR
// 1910.333(c)(3)(i) and 1926.1408 Table A), NFPA 70 Art. 810 clearances and Table 810.52 sizes,
// the US CPSC fall-zone factor, NESC Table 232-1 typical line heights and wire weights.
#pragma once

#include <limits>
#include <optional>
#include <string>
#include <vector>

#include "core/units.hpp"
#include "siting/site.hpp"

namespace standoff::siting {

// A length with where it comes from.
struct SourcedLength {
  units::Length value = units::metres(0.0);
  std::string source;
};

// One row of 1926.1408 Table A: lines with nominal voltage above the previous row's bound and
// up to `up_to` keep at least `distance`.
struct ApproachRow {
  Voltage up_to = volts(0.0);
  units::Length distance = units::metres(0.0);
};

// NESC Table 232-1 style typical minimum height for a kind of line over one kind of place.
struct TypicalHeight {
  LineKind kind = LineKind::distribution;
  std::string place;
  units::Length height = units::metres(0.0);
  std::string source;
};

// NFPA 70 Table 810.52 row: for this material, spans up to `max_span` need at least `min_awg`
// (a smaller AWG number is a thicker wire).
struct SpanSizeRule {
  std::string material;
  units::Length max_span = units::metres(std::numeric_limits<double>::infinity());
  int max_awg = 0;  // the thinnest gauge allowed (largest AWG number)
};

struct ClearanceTables {
  // OSHA 29 CFR 1910.333(c)(3)(i): base distance up to `general_threshold` (to ground), then
  // `general_increment` per `general_step` (or part of it) above.
  Voltage general_threshold = volts(50e3);
  units::Length general_base = units::metres(0.0);
  units::Length general_increment = units::metres(0.0);
  Voltage general_step = volts(10e3);
  std::string general_source;

  // OSHA 29 CFR 1926.1408 Table A (nominal voltage), rows by increasing `up_to`.
  std::vector<ApproachRow> table_a;
  std::string table_a_source;

  SourcedLength unknown_voltage;  // 1926.1408(a)(2): 20 ft when the voltage is not known

  // NFPA 70 Art. 810: clearance from ≤ `nfpa_low_voltage` circuits and from higher voltages.
  Voltage nfpa_low_voltage = volts(250.0);
  units::Length nfpa_low_clearance = units::metres(0.0);
  units::Length nfpa_high_clearance = units::metres(0.0);
  std::string nfpa_source;
  std::string nfpa_crossing_source;  // 810.13: no crossing over or under power conductors

  double cpsc_factor = 1.5;  // US CPSC: distance ≥ factor × height
  std::string cpsc_source;
  SourcedLength fall_margin;     // common practice: height + 10 ft
  SourcedLength rf_burn_height;  // common practice: radiating wire's lowest point ≥ 3 m
  SourcedLength hand_reach;      // common practice: overhead reach of a standing adult

  std::vector<TypicalHeight> typical_heights;
  std::vector<SpanSizeRule> span_sizes;
  std::string span_size_source;
  std::vector<WireClass> wires;

  const WireClass* find_wire(const std::string& name) const;
};

// Approach distance for one voltage, with the rule that set it.
struct Approach {
  std::optional<units::Length> distance;  // nullopt: not set by the tables (ask the utility)
  std::string source;
  std::string note;
};

// 1910.333(c)(3)(i) for a voltage to ground (partial steps count as whole steps).
units::Length osha_general_approach(Voltage to_ground, const ClearanceTables& t);
// 1926.1408 Table A for a nominal voltage; nullopt above the last row.
std::optional<units::Length> osha_table_a_approach(Voltage nominal, const ClearanceTables& t);
// The larger of the two for a stated line voltage (phase-to-ground values are scaled by √3 to a
// nominal voltage; phase-to-phase values are taken as the voltage to ground, the worst case when
// the system grounding is not stated); unknown voltage → the 20 ft rule, except transmission
// lines, which are not evaluated without the voltage from the utility.
Approach approach_distance(const PowerLine& line, const ClearanceTables& t);

// The conductor height to assume when the height is unknown: the lowest typical height listed
// for that kind of line (transmission lines use the distribution rows as a lower bound).
std::optional<TypicalHeight> assumed_line_height(LineKind kind, const ClearanceTables& t);

// AWG diameter by the defining formula d = 0.127 mm × 92^((36 − n)/39) (ASTM B258).
units::Length awg_diameter(int awg);

}  // namespace standoff::siting
