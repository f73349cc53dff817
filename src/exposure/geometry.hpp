// Plan geometry for the site: polygons (boundary, footprints, zones), point-in-polygon by the
// crossing-number rule and self-intersection by orientation tests (O'Rourke, Computational Geometry in C, ch. 1 and 7).
#pragma once

#include <cstddef>
#include <optional>
#include <utility>
#include <vector>

namespace standoff::exposure {

struct PlanPoint {
  double x_m = 0.0;
  double y_m = 0.0;
};
using Polygon = std::vector<PlanPoint>;  // closed implicitly (last vertex joins the first)

// Crossing-number test (half-open rule, so a point on a shared edge belongs to exactly one of two
// adjacent polygons).
bool inside(const Polygon& poly, PlanPoint p);

// Signed area (positive when counter-clockwise), shoelace formula.
double signed_area(const Polygon& poly);

// Do segments ab and cd intersect (touching counts)?
bool segments_intersect(PlanPoint a, PlanPoint b, PlanPoint c, PlanPoint d);

// The first pair of non-adjacent edges (i, j) that intersect, edge i joining vertex i and i+1;
// or the pair of a repeated vertex. Empty for a simple polygon.
std::optional<std::pair<std::size_t, std::size_t>> self_intersection(const Polygon& poly);

// Distance in plan from p to the segment ab.
double distance_to_segment(PlanPoint p, PlanPoint a, PlanPoint b);

// Axis-aligned bounds of a polygon: {min, max}.
std::pair<PlanPoint, PlanPoint> bounds(const Polygon& poly);

}  // namespace standoff::exposure
