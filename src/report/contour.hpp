// Iso-lines of a scalar field sampled on a regular grid (used for the 100 % / 50 % exposure
// contours on the site map). Method: marching squares with linear interpolation along cell edges
// and the cell-centre average to resolve saddles (Lorensen & Cline 1987, 2-D form).
#pragma once

#include <cstddef>
#include <vector>

namespace standoff::report {

// Values at grid nodes: node (i, j) is at (x0 + i·dx, y0 + j·dy), value index j·nx + i.
// NaN marks a node that was not evaluated; cells touching one are skipped (no line is drawn there).
struct Grid {
  double x0_m = 0.0;
  double y0_m = 0.0;
  double dx_m = 1.0;
  double dy_m = 1.0;
  std::size_t nx = 0;
  std::size_t ny = 0;
  std::vector<double> values;

  double at(std::size_t i, std::size_t j) const { return values[j * nx + i]; }
};

struct PlanPoint {
  double x_m = 0.0;
  double y_m = 0.0;
};

// One connected iso-line; `closed` when its last point joins its first.
struct Polyline {
  std::vector<PlanPoint> points;
  bool closed = false;
};

// All iso-lines of `grid` at `level`. Nodes equal to the level count as above it.
// Throws std::invalid_argument if values.size() != nx·ny.
std::vector<Polyline> contour(const Grid& grid, double level);

// Signed area by the shoelace formula (counter-clockwise positive), for a closed polyline.
double enclosed_area(const Polyline& line);

}  // namespace standoff::report
