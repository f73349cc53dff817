// Marching-squares contours against closed-form iso-lines: exact for a linear field (linear
// interpolation is exact there), circles for a radial field with second-order convergence of the
// enclosed area, saddle and not-evaluated cells.
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>
#include <numbers>

#include "report/contour.hpp"

using namespace standoff::report;

namespace {
Grid sample(double x0, double y0, double h, std::size_t nx, std::size_t ny, auto f) {
  Grid g{x0, y0, h, h, nx, ny, {}};
  for (std::size_t j = 0; j < ny; ++j)
    for (std::size_t i = 0; i < nx; ++i) g.values.push_back(f(x0 + i * h, y0 + j * h));
  return g;
}
}  // namespace

TEST_CASE("contour of a linear field is the exact straight line", "[report][contour]") {
  // Closed form: f = 2x + 3y has the iso-line 2x + 3y = level; linear interpolation is exact for it.
  const double level = GENERATE(1.0, 7.3, 12.0);
  const Grid g = sample(-2.0, -1.0, 0.37, 20, 17, [](double x, double y) { return 2 * x + 3 * y; });
  const auto lines = contour(g, level);
  REQUIRE(lines.size() == 1);
  CHECK_FALSE(lines[0].closed);
  CHECK(lines[0].points.size() > 5);
  for (const auto& p : lines[0].points) CHECK(2 * p.x_m + 3 * p.y_m == Approx(level).margin(1e-12));  // rounding only
}

TEST_CASE("contour of a radial field is a closed circle", "[report][contour]") {
  // Closed form: f = (R/r)² equals 1 on the circle r = R. Vertices lie on grid edges, interpolated
  // linearly in f, so their radial error is O(h²/R); h²/R bounds it for h ≤ R/4 (Taylor remainder).
  const double R = 3.0, h = 0.25;
  const Grid g = sample(-6.0, -6.0, h, 49, 49, [&](double x, double y) { return R * R / (x * x + y * y + 1e-300); });
  const auto lines = contour(g, 1.0);
  REQUIRE(lines.size() == 1);
  CHECK(lines[0].closed);
  for (const auto& p : lines[0].points) CHECK(std::hypot(p.x_m, p.y_m) == Approx(R).margin(h * h / R));
}

TEST_CASE("enclosed area of the circle contour converges at second order", "[report][contour][convergence]") {
  // Closed form: area πR². The inscribed-polygon and interpolation errors are both O(h²), so halving
  // h should cut the error about fourfold; we require an observed order between 1.6 and 2.6.
  const double R = 2.0;
  auto area_error = [&](double h) {
    const std::size_t n = static_cast<std::size_t>(std::lround(8.0 / h)) + 1;
    const Grid g = sample(-4.0 + 0.123 * h, -4.0 + 0.071 * h, h, n, n,
                          [&](double x, double y) { return R * R / (x * x + y * y + 1e-300); });
    const auto lines = contour(g, 1.0);
    REQUIRE(lines.size() == 1);
    return std::abs(std::abs(enclosed_area(lines[0])) - std::numbers::pi * R * R);
  };
  const double e1 = area_error(0.2), e2 = area_error(0.1), e3 = area_error(0.05);
  const double order1 = std::log2(e1 / e2), order2 = std::log2(e2 / e3);
  INFO("errors " << e1 << " " << e2 << " " << e3);
  CHECK(order1 > 1.6);
  CHECK(order1 < 2.6);
  CHECK(order2 > 1.6);
  CHECK(order2 < 2.6);
}

TEST_CASE("cells touching a not-evaluated node draw no line", "[report][contour]") {
  // f = x on a 5×2 grid crosses 1.5 in the middle cell; with a NaN at that cell's corner nothing is drawn.
  Grid g = sample(0, 0, 1.0, 5, 2, [](double x, double) { return x; });
  REQUIRE(contour(g, 1.5).size() == 1);
  g.values[1] = std::numeric_limits<double>::quiet_NaN();
  CHECK(contour(g, 1.5).empty());
}

TEST_CASE("saddle cells are resolved by the centre average", "[report][contour]") {
  // One cell, corners (0,0)=1, (1,0)=0, (1,1)=1, (0,1)=0: two segments either way. With centre average
  // 0.5 ≥ level 0.4 the high corners join, so the segments cut off the low corners (1,0) and (0,1).
  const Grid g{0, 0, 1, 1, 2, 2, {1, 0, 0, 1}};
  // values index j·nx+i: (0,0)=1, (1,0)=0, (0,1)=0, (1,1)=1
  const auto lines = contour(g, 0.4);
  REQUIRE(lines.size() == 2);
  for (const auto& l : lines) {
    REQUIRE(l.points.size() == 2);
    const double mx = 0.5 * (l.points[0].x_m + l.points[1].x_m), my = 0.5 * (l.points[0].y_m + l.points[1].y_m);
    // Each segment's midpoint lies near a low corner: (1,0) or (0,1), not near (0,0) or (1,1).
    const bool near_low = (mx > 0.5 && my < 0.5) || (mx < 0.5 && my > 0.5);
    CHECK(near_low);
  }
  // At level 0.6 the centre (0.5) is low: the high corners are cut off instead.
  for (const auto& l : contour(g, 0.6)) {
    const double mx = 0.5 * (l.points[0].x_m + l.points[1].x_m), my = 0.5 * (l.points[0].y_m + l.points[1].y_m);
    const bool near_high = (mx < 0.5 && my < 0.5) || (mx > 0.5 && my > 0.5);
    CHECK(near_high);
  }
}

TEST_CASE("a grid whose size does not match its values is refused", "[report][contour]") {
  const Grid g{0, 0, 1, 1, 3, 3, {1, 2, 3}};
  CHECK_THROWS_AS(contour(g, 1.0), std::invalid_argument);
}
