// Plan (2-D) geometry of the site, through Boost.Geometry (OGC simple-feature predicates): polygons
// with holes (zones, keep-out areas, footprints), point in polygon (boundary included), area,
// self-intersection, envelope, and plan crossings and distances of segments. The one polygon
// module of the project (zones in exposure/, plan crossings in siting/).
#pragma once

#include <cstddef>
#include <optional>
#include <utility>
#include <vector>

namespace standoff::geometry {

struct PlanPoint {
  double x_m = 0.0;
  double y_m = 0.0;
};
using Polygon = std::vector<PlanPoint>;  // a ring, closed implicitly (last vertex joins the first)

// A polygon with holes (e.g. a garden with a fenced-off area around an antenna).
struct Area {
  Polygon outer;
  std::vector<Polygon> holes;
};

// Whether p lies in the polygon or on its boundary (either orientation). A point on an edge
// shared by two zones belongs to both (each is then evaluated: the conservative choice).
bool inside(const Polygon& poly, PlanPoint p);
// In the outer ring and not strictly inside any hole (a hole's edge still belongs to the area).
bool inside(const Area& area, PlanPoint p);

// Signed area (positive when counter-clockwise).
double signed_area(const Polygon& poly);

// Do segments ab and cd intersect (touching counts)?
bool segments_intersect(PlanPoint a, PlanPoint b, PlanPoint c, PlanPoint d);

// The first pair of non-adjacent edges (i, j) that intersect, edge i joining vertex i and i+1;
// or the pair of a repeated vertex. Empty for a simple polygon.
std::optional<std::pair<std::size_t, std::size_t>> self_intersection(const Polygon& poly);

// Whether the ring `inner` lies within `outer` (boundaries may touch).
bool ring_within(const Polygon& inner, const Polygon& outer);
// Whether two rings share interior area.
bool rings_overlap(const Polygon& a, const Polygon& b);

// Distance in plan from p to the segment ab; between the segments ab and cd (0 if they cross).
double distance_to_segment(PlanPoint p, PlanPoint a, PlanPoint b);
double segment_distance(PlanPoint a, PlanPoint b, PlanPoint c, PlanPoint d);
// A common point of the segments ab and cd, if they cross or touch.
std::optional<PlanPoint> segment_crossing(PlanPoint a, PlanPoint b, PlanPoint c, PlanPoint d);

// The parts of `outer` covered by none of `cut` (each an area with holes): outer − ∪ cut.
std::vector<Area> difference(const Polygon& outer, const std::vector<Area>& cut);
// Area of an area with holes (positive).
double area(const Area& a);

// Axis-aligned bounds of a polygon: {min, max}.
std::pair<PlanPoint, PlanPoint> bounds(const Polygon& poly);

}  // namespace standoff::geometry
