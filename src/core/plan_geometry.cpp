#include "core/plan_geometry.hpp"

#include <algorithm>
#include <cmath>

// GCC 12 reports a false maybe-uninitialized inside Boost.Geometry's rescale policy (instantiated
// here by the areal predicates); the library code is not ours to change.
#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Wmaybe-uninitialized"
#include <boost/geometry.hpp>
#include <boost/geometry/geometries/register/point.hpp>
#include <boost/geometry/geometries/register/ring.hpp>
#include <boost/geometry/geometries/segment.hpp>

BOOST_GEOMETRY_REGISTER_POINT_2D(standoff::geometry::PlanPoint, double, boost::geometry::cs::cartesian, x_m, y_m)
BOOST_GEOMETRY_REGISTER_RING(standoff::geometry::Polygon)

namespace boost::geometry::traits {
template <>
struct closure<standoff::geometry::Polygon> {
  static const closure_selector value = open;
};
template <>
struct point_order<standoff::geometry::Polygon> {
  static const order_selector value = counterclockwise;
};
}  // namespace boost::geometry::traits

namespace standoff::geometry {

namespace bg = boost::geometry;
using Segment = bg::model::segment<PlanPoint>;

namespace {
// A ring in counter-clockwise order (Boost's area-based predicates expect the declared order).
Polygon oriented(const Polygon& p) {
  Polygon r = p;
  if (bg::area(r) < 0.0) std::reverse(r.begin(), r.end());
  return r;
}
}  // namespace

bool inside(const Polygon& poly, PlanPoint p) { return poly.size() >= 3 && bg::covered_by(p, poly); }

bool inside(const Area& area, PlanPoint p) {
  if (!inside(area.outer, p)) return false;
  for (const auto& h : area.holes)
    if (h.size() >= 3 && bg::within(p, h)) return false;
  return true;
}

double signed_area(const Polygon& poly) { return poly.size() >= 3 ? bg::area(poly) : 0.0; }

bool segments_intersect(PlanPoint a, PlanPoint b, PlanPoint c, PlanPoint d) {
  return bg::intersects(Segment(a, b), Segment(c, d));
}

std::optional<std::pair<std::size_t, std::size_t>> self_intersection(const Polygon& poly) {
  const std::size_t n = poly.size();
  for (std::size_t i = 0; i < n; ++i)
    for (std::size_t j = i + 1; j < n; ++j)
      if (bg::equals(poly[i], poly[j])) return std::make_pair(i, j);
  for (std::size_t i = 0; i < n; ++i) {
    const Segment e(poly[i], poly[(i + 1) % n]);
    for (std::size_t j = i + 2; j < n; ++j) {
      if (i == 0 && j == n - 1) continue;  // adjacent through the closing vertex
      if (bg::intersects(e, Segment(poly[j], poly[(j + 1) % n]))) return std::make_pair(i, j);
    }
  }
  return std::nullopt;
}

bool ring_within(const Polygon& inner, const Polygon& outer) { return bg::covered_by(oriented(inner), oriented(outer)); }

bool rings_overlap(const Polygon& a, const Polygon& b) {
  const Polygon ra = oriented(a), rb = oriented(b);
  return bg::intersects(ra, rb) && !bg::touches(ra, rb);
}

double distance_to_segment(PlanPoint p, PlanPoint a, PlanPoint b) { return bg::distance(p, Segment(a, b)); }

double segment_distance(PlanPoint a, PlanPoint b, PlanPoint c, PlanPoint d) {
  return bg::distance(Segment(a, b), Segment(c, d));
}

std::optional<PlanPoint> segment_crossing(PlanPoint a, PlanPoint b, PlanPoint c, PlanPoint d) {
  std::vector<PlanPoint> out;
  bg::intersection(Segment(a, b), Segment(c, d), out);
  if (out.empty()) return std::nullopt;
  return out.front();
}

namespace {
using BgPolygon = bg::model::polygon<PlanPoint, false, false>;  // counter-clockwise, open
using BgMulti = bg::model::multi_polygon<BgPolygon>;

BgPolygon to_bg(const Area& a) {
  BgPolygon p;
  p.outer().assign(a.outer.begin(), a.outer.end());
  for (const auto& h : a.holes) p.inners().emplace_back(h.begin(), h.end());
  bg::correct(p);
  return p;
}
}  // namespace

std::vector<Area> difference(const Polygon& outer, const std::vector<Area>& cut) {
  BgMulti rest;
  rest.push_back(to_bg(Area{outer, {}}));
  for (const auto& c : cut) {
    BgMulti next;
    bg::difference(rest, to_bg(c), next);
    rest = std::move(next);
  }
  std::vector<Area> out;
  for (const auto& p : rest) {
    Area a;
    a.outer.assign(p.outer().begin(), p.outer().end());
    for (const auto& h : p.inners()) a.holes.emplace_back(h.begin(), h.end());
    out.push_back(std::move(a));
  }
  return out;
}

double area(const Area& a) { return std::abs(bg::area(to_bg(a))); }

std::pair<PlanPoint, PlanPoint> bounds(const Polygon& poly) {
  bg::model::box<PlanPoint> box;
  bg::envelope(poly, box);
  return {box.min_corner(), box.max_corner()};
}

}  // namespace standoff::geometry

#pragma GCC diagnostic pop
