#include "exposure/work_estimate.hpp"

#include <algorithm>
#include <cmath>

namespace standoff::exposure {

double estimated_grid_cells(const EvaluationInput& input, double spacing_m) {
  double total = 0.0;
  for (double n : estimated_grid_cells_per_zone(input, spacing_m)) total += n;
  return total;
}

std::vector<double> estimated_grid_cells_per_zone(const EvaluationInput& input, double spacing_m) {
  std::vector<double> out;
  for (const auto& z : input.zones) {
    out.push_back(0.0);
    if (z.polygon.empty()) continue;
    double x0 = z.polygon.front().x_m, x1 = x0, y0 = z.polygon.front().y_m, y1 = y0;
    for (const auto& p : z.polygon) {
      x0 = std::min(x0, p.x_m);
      x1 = std::max(x1, p.x_m);
      y0 = std::min(y0, p.y_m);
      y1 = std::max(y1, p.y_m);
    }
    const double nx = std::max(1.0, std::ceil((x1 - x0) / spacing_m - 1e-9));
    const double ny = std::max(1.0, std::ceil((y1 - y0) / spacing_m - 1e-9));
    out.back() = nx * ny * static_cast<double>(std::max<std::size_t>(1, z.floors_m.size()));
  }
  return out;
}

}  // namespace standoff::exposure
