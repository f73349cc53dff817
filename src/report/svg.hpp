// Small helpers for writing SVG and HTML text by hand: XML escaping, compact numbers, the
// colour-blind-safe palette (Okabe & Ito, "Color Universal Design", 2008) and the drawings
// of the record: the site map and the exposure-ratio-versus-distance chart.
#pragma once

#include <optional>
#include <string>
#include <vector>
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

// The site map as a standalone SVG document (with XML declaration and a title block when
// `standalone`), or as an element to inline in HTML. The root <svg> has id="site-map" (or
// "site-map-overview" when `compact`: no legend or keys, for the first page).
std::string site_map_svg(const Record& r, bool standalone, bool compact = false);

// Distances marked on an operation's chart (horizontal, from the antenna), absent when unknown.
struct ChartMarks {
  std::optional<double> property_line_m;    // nearest point of the property boundary
  std::optional<double> neighbour_m;        // nearest uncontrolled point of interest
  std::string neighbour_name;
  exposure::TierDistances keep_away;        // the detailed (else screening) keep-away distance per tier
  UnitSystem units = UnitSystem::both;      // a feet axis unless metric
};
ChartMarks chart_marks(const Record& r, const exposure::OperationResult& op);

// Exposure ratio versus distance for one operation, log scale in percent of the limit, one line
// per tier, reference lines at 100 % and 50 %, the marks above, a metre axis (and a feet axis
// along the top). The root <svg> has id="chart-<slug of operation>".
std::string ratio_chart_svg(const exposure::OperationResult& op, bool standalone, const ChartMarks& marks = {});

// Simple label placement without overlap: each label takes the first of its candidate positions
// whose box (estimated from the character count) meets no box placed before. Exposed for tests.
struct LabelBox {
  double x0 = 0, y0 = 0, x1 = 0, y1 = 0;
  bool overlaps(const LabelBox& o) const { return x0 < o.x1 && o.x0 < x1 && y0 < o.y1 && o.y0 < y1; }
};
class LabelPlacer {
 public:
  // Returns the index of the candidate taken and records its box. When every candidate overlaps,
  // a `required` label takes the first one anyway; an optional one is left out (returns npos).
  // Candidates are (x, y, anchor) with anchor "start", "middle" or "end"; y is the text baseline.
  struct Candidate {
    double x, y;
    const char* anchor;
  };
  std::size_t place(const std::string& text, double font_px, const std::vector<Candidate>& candidates,
                    bool required = true);
  void block(const LabelBox& b) { boxes_.push_back(b); }
  const std::vector<LabelBox>& boxes() const { return boxes_; }
  static LabelBox box_of(const std::string& text, double font_px, const Candidate& c);

 private:
  std::vector<LabelBox> boxes_;
};

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
