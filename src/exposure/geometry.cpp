#include "exposure/geometry.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace standoff::exposure {

bool inside(const Polygon& poly, PlanPoint p) {
  bool in = false;
  const std::size_t n = poly.size();
  for (std::size_t i = 0, j = n - 1; i < n; j = i++) {
    const PlanPoint& a = poly[i];
    const PlanPoint& b = poly[j];
    if ((a.y_m > p.y_m) != (b.y_m > p.y_m)) {
      const double x = a.x_m + (p.y_m - a.y_m) * (b.x_m - a.x_m) / (b.y_m - a.y_m);
      if (p.x_m < x) in = !in;
    }
  }
  return in;
}

double signed_area(const Polygon& poly) {
  double s = 0.0;
  const std::size_t n = poly.size();
  for (std::size_t i = 0; i < n; ++i) {
    const PlanPoint& a = poly[i];
    const PlanPoint& b = poly[(i + 1) % n];
    s += a.x_m * b.y_m - b.x_m * a.y_m;
  }
  return 0.5 * s;
}

namespace {
double orient(PlanPoint a, PlanPoint b, PlanPoint c) {
  return (b.x_m - a.x_m) * (c.y_m - a.y_m) - (b.y_m - a.y_m) * (c.x_m - a.x_m);
}
bool on_segment(PlanPoint a, PlanPoint b, PlanPoint p) {
  return std::min(a.x_m, b.x_m) <= p.x_m && p.x_m <= std::max(a.x_m, b.x_m) &&
         std::min(a.y_m, b.y_m) <= p.y_m && p.y_m <= std::max(a.y_m, b.y_m);
}
int sign(double v) { return (v > 0.0) - (v < 0.0); }
}  // namespace

bool segments_intersect(PlanPoint a, PlanPoint b, PlanPoint c, PlanPoint d) {
  const int o1 = sign(orient(a, b, c));
  const int o2 = sign(orient(a, b, d));
  const int o3 = sign(orient(c, d, a));
  const int o4 = sign(orient(c, d, b));
  if (o1 != o2 && o3 != o4) return true;
  if (o1 == 0 && on_segment(a, b, c)) return true;
  if (o2 == 0 && on_segment(a, b, d)) return true;
  if (o3 == 0 && on_segment(c, d, a)) return true;
  if (o4 == 0 && on_segment(c, d, b)) return true;
  return false;
}

std::optional<std::pair<std::size_t, std::size_t>> self_intersection(const Polygon& poly) {
  const std::size_t n = poly.size();
  for (std::size_t i = 0; i < n; ++i)
    for (std::size_t j = i + 1; j < n; ++j)
      if (poly[i].x_m == poly[j].x_m && poly[i].y_m == poly[j].y_m) return std::make_pair(i, j);
  for (std::size_t i = 0; i < n; ++i) {
    for (std::size_t j = i + 1; j < n; ++j) {
      const bool adjacent = (j == i + 1) || (i == 0 && j == n - 1);
      if (adjacent) continue;
      if (segments_intersect(poly[i], poly[(i + 1) % n], poly[j], poly[(j + 1) % n]))
        return std::make_pair(i, j);
    }
  }
  return std::nullopt;
}

double distance_to_segment(PlanPoint p, PlanPoint a, PlanPoint b) {
  const double dx = b.x_m - a.x_m, dy = b.y_m - a.y_m;
  const double len2 = dx * dx + dy * dy;
  double t = len2 > 0.0 ? ((p.x_m - a.x_m) * dx + (p.y_m - a.y_m) * dy) / len2 : 0.0;
  t = std::clamp(t, 0.0, 1.0);
  return std::hypot(p.x_m - (a.x_m + t * dx), p.y_m - (a.y_m + t * dy));
}

std::pair<PlanPoint, PlanPoint> bounds(const Polygon& poly) {
  PlanPoint lo{std::numeric_limits<double>::infinity(), std::numeric_limits<double>::infinity()};
  PlanPoint hi{-lo.x_m, -lo.y_m};
  for (const auto& p : poly) {
    lo.x_m = std::min(lo.x_m, p.x_m);
    lo.y_m = std::min(lo.y_m, p.y_m);
    hi.x_m = std::max(hi.x_m, p.x_m);
    hi.y_m = std::max(hi.y_m, p.y_m);
  }
  return {lo, hi};
}

}  // namespace standoff::exposure
