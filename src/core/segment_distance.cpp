#include "core/segment_distance.hpp"

#include <algorithm>

namespace standoff::geometry {

using Vec3 = Eigen::Vector3d;

double point_segment_distance(const Vec3& p, const Vec3& a, const Vec3& b) {
  const Vec3 ab = b - a;
  const double len2 = ab.squaredNorm();
  if (len2 == 0.0) return (p - a).norm();
  const double t = std::clamp((p - a).dot(ab) / len2, 0.0, 1.0);
  return (p - (a + t * ab)).norm();
}

// Ericson §5.1.9 (ClosestPtSegmentSegment): minimise |p1 + s d1 − p2 − t d2| over s, t in [0, 1].
double segment_segment_distance(const Vec3& p1, const Vec3& q1, const Vec3& p2, const Vec3& q2) {
  const Vec3 d1 = q1 - p1;
  const Vec3 d2 = q2 - p2;
  const Vec3 r = p1 - p2;
  const double a = d1.squaredNorm();
  const double e = d2.squaredNorm();
  const double f = d2.dot(r);
  if (a == 0.0 && e == 0.0) return r.norm();
  double s = 0.0;
  double t = 0.0;
  if (a == 0.0) {
    t = std::clamp(f / e, 0.0, 1.0);
  } else {
    const double c = d1.dot(r);
    if (e == 0.0) {
      s = std::clamp(-c / a, 0.0, 1.0);
    } else {
      const double b = d1.dot(d2);
      const double denom = a * e - b * b;
      // Non-parallel: closest point of the infinite lines, clamped to segment 1; parallel: s = 0.
      s = denom > 1e-14 * a * e ? std::clamp((b * f - c * e) / denom, 0.0, 1.0) : 0.0;
      t = (b * s + f) / e;
      if (t < 0.0) {
        t = 0.0;
        s = std::clamp(-c / a, 0.0, 1.0);
      } else if (t > 1.0) {
        t = 1.0;
        s = std::clamp((b - c) / a, 0.0, 1.0);
      }
    }
  }
  return ((p1 + s * d1) - (p2 + t * d2)).norm();
}

}  // namespace standoff::geometry
