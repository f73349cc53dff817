#include "siting/geometry.hpp"

#include "core/plan_geometry.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace standoff::siting {


namespace {
geometry::PlanPoint plan(const Vec2& v) { return {v.x(), v.y()}; }
}  // namespace

// Plan crossings and distances through the project's polygon module (core/plan_geometry.hpp,
// Boost.Geometry).
std::optional<Vec2> plan_crossing(const Vec2& a, const Vec2& b, const Vec2& c, const Vec2& d) {
  const auto p = geometry::segment_crossing(plan(a), plan(b), plan(c), plan(d));
  if (!p) return std::nullopt;
  return Vec2(p->x_m, p->y_m);
}

double plan_segment_distance(const Vec2& a, const Vec2& b, const Vec2& c, const Vec2& d) {
  return geometry::segment_distance(plan(a), plan(b), plan(c), plan(d));
}

double segment_conductor_distance(const Vec3& a, const Vec3& b, const ConductorGeometry& line) {
  double best = std::numeric_limits<double>::infinity();
  for (std::size_t i = 0; i + 1 < line.path.size(); ++i) {
    const Vec2& c2 = line.path[i];
    const Vec2& d2 = line.path[i + 1];
    auto at = [&](double z) {
      return segment_segment_distance(a, b, Vec3(c2.x(), c2.y(), z), Vec3(d2.x(), d2.y(), z));
    };
    double lo = line.z_low;
    double hi = line.height_known ? line.z_low : std::max({line.z_low, a.z(), b.z()});
    double d = std::min(at(lo), at(hi));
    if (hi > lo) {
      // Golden-section search: the distance from a fixed convex set (the Minkowski difference of
      // the two segments) to the point z·ẑ is convex in z.
      const double g = 0.5 * (std::sqrt(5.0) - 1.0);
      double x1 = hi - g * (hi - lo);
      double x2 = lo + g * (hi - lo);
      double f1 = at(x1);
      double f2 = at(x2);
      for (int it = 0; it < 80 && hi - lo > 1e-9; ++it) {
        if (f1 <= f2) {
          hi = x2;
          x2 = x1;
          f2 = f1;
          x1 = hi - g * (hi - lo);
          f1 = at(x1);
        } else {
          lo = x1;
          x1 = x2;
          f1 = f2;
          x2 = lo + g * (hi - lo);
          f2 = at(x2);
        }
      }
      d = std::min({d, f1, f2});
    }
    best = std::min(best, d);
  }
  return best;
}

double plan_conductor_distance(const Vec2& a, const Vec2& b, const ConductorGeometry& line) {
  double best = std::numeric_limits<double>::infinity();
  for (std::size_t i = 0; i + 1 < line.path.size(); ++i)
    best = std::min(best, plan_segment_distance(a, b, line.path[i], line.path[i + 1]));
  return best;
}

std::optional<Vec2> plan_conductor_crossing(const Vec2& a, const Vec2& b, const ConductorGeometry& line) {
  for (std::size_t i = 0; i + 1 < line.path.size(); ++i)
    if (auto p = plan_crossing(a, b, line.path[i], line.path[i + 1])) return p;
  return std::nullopt;
}

}  // namespace standoff::siting
