// Installation geometry implied by the station itself: every wire antenna's wires (from the same
// em builders the method of moments uses), every feed-line route and the supports the antennas
// need, merged with the [[power_line]], [[support]] and [[span]] entries the user wrote, so that
// the power-line checks (siting/checks.hpp: US CPSC, OSHA, NFPA 70 Article 810) never depend on the
// user repeating the antenna as spans.
#pragma once

#include <string>
#include <vector>

#include "siting/checks.hpp"
#include "station/station.hpp"

namespace standoff::assemble {

// Tolerances for a [[span]] that describes an antenna wire (common practice (no source): within
// the length of an end insulator and its rope loop).
inline constexpr double kSpanEndTolerance_m = 0.5;
inline constexpr double kSpanLengthTolerance = 0.03;  // 3 % of the wire, and at least the end tolerance
// Sag assumed for an antenna wire or feed-line leg when no [[span]] states it (common practice
// (no source): a wire strung by hand sags a few per cent of its span).
inline constexpr double kAssumedSagFraction = 0.05;

// Fills st.installation with the user's elements plus the implied ones, and
// st.installation_assumptions with what was assumed for them. InputError (file:line:field) when a
// [[span]] naming an antenna disagrees with its wires, a [[span]] or route is longer than its feed
// line, or a span names an antenna or feed line that does not exist. Called by load_station.
void derive_installation(station::Station& st);

// The installation-safety checks of a loaded station (every power line against every wire,
// route and support), with the implied elements' assumptions added.
siting::LinesReport check_installation(const station::Station& st);

}  // namespace standoff::assemble
