// Work estimates made from the input before any grid is allocated (issue 14): grid cells over every
// zone and floor at the evaluation's spacing. Method: bounding-box cell count (common practice (no source)).
#pragma once

#include <cstddef>
#include <vector>

#include "exposure/evaluate.hpp"

namespace standoff::exposure {

// Default cap on grid cells over all zones and floors (each cell holds body-line samples for every
// source; about 4 million cells is the most a 2-core machine evaluates in minutes). Raised with
// `--max-grid-cells`.
inline constexpr double kDefaultMaxGridCells = 4e6;

// Number of grid cells the evaluation would allocate: Σ over zones and floors of nx·ny of the
// zone's bounding box at `spacing_m` (an upper bound of the cells inside the zone), in double
// precision so that huge zones cannot overflow.
double estimated_grid_cells(const EvaluationInput& input, double spacing_m);
// The same, zone by zone (all floors), in the order of input.zones.
std::vector<double> estimated_grid_cells_per_zone(const EvaluationInput& input, double spacing_m);

}  // namespace standoff::exposure
