// Outputs of the placement search (`standoff place`, `evaluate --place`): JSON (the issue-10
// contract), a terminal table, the SVG heat map of the best permitted PEP over the lot, an HTML section.
#pragma once

#include <string>

#include <nlohmann/json.hpp>

#include "siting/place.hpp"
#include "assemble/placement.hpp"
#include "station/station.hpp"

namespace standoff::report {

// `candidates[]` sorted by `permitted_pep_w` descending, each with x_m, y_m, azimuth_deg,
// feedline_length_m, feedline_loss_db, permitted_pep_w, clearance_ok, binding; and `current`.
nlohmann::json place_json(const station::Station& st, const assemble::PlaceInput& in, const siting::PlaceResult& r);

std::string place_text(const station::Station& st, const assemble::PlaceInput& in, const siting::PlaceResult& r);

// Heat map: one square per candidate position, coloured by the best permitted PEP over the
// azimuths that pass the power-line checks (hatched grey where none passes); the property,
// buildings, power lines, the current position (ring) and the best candidate (cross).
// The root <svg> has id="place-heatmap".
std::string place_heatmap_svg(const station::Station& st, const assemble::PlaceInput& in, const siting::PlaceResult& r,
                              bool standalone);

// A self-contained <section id="placement"> with the heat map inlined and the ranking table.
std::string place_html_section(const station::Station& st, const assemble::PlaceInput& in,
                               const siting::PlaceResult& r);

inline constexpr const char* kPlaceHeatmapFile = "place-heatmap.svg";
inline constexpr const char* kPlaceJsonFile = "place.json";

}  // namespace standoff::report
