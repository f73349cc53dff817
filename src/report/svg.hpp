// Small helpers for writing SVG and HTML text by hand: XML escaping, compact numbers, the
// colour-blind-safe palette (Okabe & Ito, "Color Universal Design", 2008) and the drawings
// of the record: the site map and the exposure-ratio-versus-distance chart.
#pragma once

#include <string>
#include <string_view>

#include "report/record.hpp"

namespace standoff::report {

// Escapes & < > " ' for XML text and attribute values.
std::string xml_escape(std::string_view text);

// A coordinate for SVG: fixed point with up to 2 decimals, trailing zeros dropped ("12.5", "-3").
std::string svg_num(double v);

// Okabe–Ito palette (colour-blind safe) and the roles we give each colour.
namespace palette {
inline constexpr const char* black = "#000000";
inline constexpr const char* orange = "#E69F00";
inline constexpr const char* sky_blue = "#56B4E9";
inline constexpr const char* bluish_green = "#009E73";
inline constexpr const char* yellow = "#F0E442";
inline constexpr const char* blue = "#0072B2";
inline constexpr const char* vermillion = "#D55E00";
inline constexpr const char* reddish_purple = "#CC79A7";
inline constexpr const char* grey = "#999999";
// Roles: controlled tier → blue (solid marks), uncontrolled tier → vermillion; 100 % of the limit →
// solid line, 50 % → dashed line; antennas → reddish purple; fall zones → orange; power lines → black.
inline const char* tier_colour(limits::Tier t) { return t == limits::Tier::controlled ? blue : vermillion; }
}  // namespace palette

// The site map as a standalone SVG document (with XML declaration when `standalone`), or as an
// element to inline in HTML. The root <svg> has id="site-map".
std::string site_map_svg(const Record& r, bool standalone);

// Exposure ratio versus distance for one operation, log scale in percent of the limit, one line
// per tier, reference lines at 100 % and 50 %. The root <svg> has id="chart-<slug of operation>".
std::string ratio_chart_svg(const exposure::OperationResult& op, bool standalone);

// Contour polylines drawn on the map: the worst case over operations and group sums (sources in
// a group add up; operations in no common group do not transmit together), per zone grid, tier
// and level. Exposed for tests.
struct MapContour {
  std::string zone;
  limits::Tier tier = limits::Tier::uncontrolled;
  double level = 1.0;  // fraction of the limit (1.0 = 100 %)
  Polyline line;
};
std::vector<MapContour> map_contours(const exposure::StationEvaluation& ev);

// The worst-case ratio grid (nodes at cell centres; NaN where not evaluated or outside the zone).
Grid envelope_grid(const exposure::StationEvaluation& ev, const exposure::ZoneGrid& zg, limits::Tier tier);

}  // namespace standoff::report
