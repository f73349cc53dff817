#include "siting/geometry.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace standoff::siting {


namespace {

double cross2(const Vec2& u, const Vec2& v) { return u.x() * v.y() - u.y() * v.x(); }

bool on_segment(const Vec2& p, const Vec2& a, const Vec2& b) {
  return std::min(a.x(), b.x()) <= p.x() && p.x() <= std::max(a.x(), b.x()) && std::min(a.y(), b.y()) <= p.y() &&
         p.y() <= std::max(a.y(), b.y());
}

}  // namespace

std::optional<Vec2> plan_crossing(const Vec2& a, const Vec2& b, const Vec2& c, const Vec2& d) {
  const double d1 = cross2(d - c, a - c);
  const double d2 = cross2(d - c, b - c);
  const double d3 = cross2(b - a, c - a);
  const double d4 = cross2(b - a, d - a);
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) {
    const double t = d1 / (d1 - d2);
    return a + t * (b - a);
  }
  // Touching or collinear overlap.
  if (d1 == 0 && on_segment(a, c, d)) return a;
  if (d2 == 0 && on_segment(b, c, d)) return b;
  if (d3 == 0 && on_segment(c, a, b)) return c;
  if (d4 == 0 && on_segment(d, a, b)) return d;
  return std::nullopt;
}

double plan_segment_distance(const Vec2& a, const Vec2& b, const Vec2& c, const Vec2& d) {
  if (plan_crossing(a, b, c, d)) return 0.0;
  auto lift = [](const Vec2& p) { return Vec3(p.x(), p.y(), 0.0); };
  return segment_segment_distance(lift(a), lift(b), lift(c), lift(d));
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
