// Work estimates made from the input before any grid is allocated (issue 14): grid cells over every
// zone and floor at the evaluation's spacing. Method: bounding-box cell count (common practice (no source)).
#pragma once

#include <cstddef>
#include <vector>

#include "exposure/evaluate.hpp"

namespace standoff::exposure {

// Default cap on grid cells over all zones and floors: 10 million, about 2.5 km² at 0.5 m. The
// coarse-first grids evaluate the demo plus a 1 km² zone (4 million cells) in about 6 s of CPU and
// 480 MB (docs/performance.md), so the cap keeps memory near 1.2 GB. Raised with `--max-grid-cells`.
inline constexpr double kDefaultMaxGridCells = 1e7;

// Number of grid cells the evaluation would allocate: Σ over zones and floors of nx·ny of the
// zone's bounding box at `spacing_m` (an upper bound of the cells inside the zone), in double
// precision so that huge zones cannot overflow.
double estimated_grid_cells(const EvaluationInput& input, double spacing_m);
// The same, zone by zone (all floors), in the order of input.zones.
std::vector<double> estimated_grid_cells_per_zone(const EvaluationInput& input, double spacing_m);

}  // namespace standoff::exposure
