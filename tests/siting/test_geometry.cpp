// Segment/segment 3-D distances and plan crossings against hand-computed geometry, and against a
// brute-force dense sampling (an independent numerical reference).
#include <catch2/catch.hpp>

#include <cmath>
#include <random>

#include "siting/geometry.hpp"

using namespace standoff::siting;

TEST_CASE("segment/segment distances by hand", "[closed_form]") {
  struct Case { Vec3 p1, q1, p2, q2; double d; const char* what; };
  auto c = GENERATE(
      // Crossed at right angles, 2 m apart vertically: the common perpendicular.
      Case{{-1, 0, 0}, {1, 0, 0}, {0, -1, 2}, {0, 1, 2}, 2.0, "skew, perpendicular"},
      // Parallel, 1 m apart and overlapping.
      Case{{0, 0, 0}, {1, 0, 0}, {0, 1, 0}, {1, 1, 0}, 1.0, "parallel overlapping"},
      // Collinear with a 2 m gap.
      Case{{0, 0, 0}, {1, 0, 0}, {3, 0, 0}, {4, 0, 0}, 2.0, "collinear gap"},
      // End of a vertical segment to the middle of a horizontal one: √(2² + 4²).
      Case{{0, 0, 0}, {0, 0, 1}, {2, -1, 5}, {2, 1, 5}, std::sqrt(20.0), "endpoint to interior"},
      // Closest points at both ends: (1,0,0) to (2,1,0) → √2.
      Case{{0, 0, 0}, {1, 0, 0}, {2, 1, 0}, {3, 5, 0}, std::sqrt(2.0), "endpoint to endpoint"},
      // A point (degenerate segment) above a segment's interior.
      Case{{0.5, 0, 3}, {0.5, 0, 3}, {0, 0, 0}, {1, 0, 0}, 3.0, "point to segment"},
      // Intersecting segments.
      Case{{0, 0, 0}, {2, 2, 2}, {2, 0, 0}, {0, 2, 2}, 0.0, "intersecting"});
  CAPTURE(c.what);
  CHECK(segment_segment_distance(c.p1, c.q1, c.p2, c.q2) == Approx(c.d).margin(1e-12));
  CHECK(segment_segment_distance(c.p2, c.q2, c.p1, c.q1) == Approx(c.d).margin(1e-12));  // symmetric
}

TEST_CASE("segment/segment distance matches dense sampling", "[closed_form]") {
  std::mt19937 rng(6);
  std::uniform_real_distribution<double> u(-5.0, 5.0);
  for (int trial = 0; trial < 40; ++trial) {
    const Vec3 p1(u(rng), u(rng), u(rng)), q1(u(rng), u(rng), u(rng));
    const Vec3 p2(u(rng), u(rng), u(rng)), q2(u(rng), u(rng), u(rng));
    double brute = 1e300;
    const int n = 400;
    for (int i = 0; i <= n; ++i)
      brute = std::min(brute, point_segment_distance(p1 + (q1 - p1) * (double(i) / n), p2, q2));
    // Sampling one segment at n points over-estimates by at most |q1 − p1|/(2n).
    const double d = segment_segment_distance(p1, q1, p2, q2);
    CHECK(d <= brute + 1e-12);
    CHECK(d >= brute - (q1 - p1).norm() / (2.0 * n) - 1e-12);
  }
}

TEST_CASE("plan crossings by hand", "[closed_form]") {
  // An X crossing at (1, 1).
  auto x = plan_crossing({0, 0}, {2, 2}, {0, 2}, {2, 0});
  REQUIRE(x);
  CHECK(x->x() == Approx(1.0));
  CHECK(x->y() == Approx(1.0));
  // A T: one segment ends on the other.
  CHECK(plan_crossing({0, 0}, {2, 0}, {1, 0}, {1, 3}));
  // Parallel and apart; and in line but not overlapping.
  CHECK_FALSE(plan_crossing({0, 0}, {2, 0}, {0, 1}, {2, 1}));
  CHECK_FALSE(plan_crossing({0, 0}, {1, 0}, {2, 0}, {3, 0}));
  // Would cross if extended, but the segments stop short: 1 m apart in plan.
  CHECK_FALSE(plan_crossing({0, 0}, {1, 0}, {2, -1}, {2, 1}));
  CHECK(plan_segment_distance({0, 0}, {1, 0}, {2, -1}, {2, 1}) == Approx(1.0));
}

TEST_CASE("distance to a conductor of known or unknown height", "[closed_form]") {
  ConductorGeometry line;
  line.path = {{-50, 3}, {50, 3}};  // along x, 3 m north of the origin
  line.z_low = 5.0;
  // A horizontal wire at 12 m along x through the origin: 3 m in plan, 7 m in height.
  const Vec3 a(-10, 0, 12), b(10, 0, 12);
  line.height_known = true;
  CHECK(segment_conductor_distance(a, b, line) == Approx(std::sqrt(9.0 + 49.0)).epsilon(1e-12));
  // Unknown height, at least 5 m: the conductor could be at 12 m too → the plan distance.
  line.height_known = false;
  CHECK(segment_conductor_distance(a, b, line) == Approx(3.0).epsilon(1e-9));
  // A point on the ground: the lowest possible height is the worst case, √(3² + 5²).
  const Vec3 g(0, 0, 0);
  CHECK(segment_conductor_distance(g, g, line) == Approx(std::sqrt(34.0)).epsilon(1e-9));
  // Plan distance and crossing of a north-south segment.
  CHECK(plan_conductor_distance({0, -2}, {0, 1}, line) == Approx(2.0));
  const auto x = plan_conductor_crossing({0, -2}, {0, 8}, line);
  REQUIRE(x);
  CHECK(x->y() == Approx(3.0));
}
