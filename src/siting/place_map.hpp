// Antenna-frame field map for the placement search: body-line mean |E|² and |H|² of one solved
// antenna on nested square grids, read by bilinear interpolation (Press et al., Numerical Recipes, §3.6).
#pragma once

// Over a ground that is the same everywhere in plan, moving the antenna in plan and turning it
// about a vertical axis moves and turns its field with it: the field of the antenna at plan
// position c and azimuth az, at a site point p, is the field of the antenna as solved (at c0, az0)
// at c0 + R(az0 − az)(p − c). The magnitudes |E|², |H|² (all the exposure ratio needs) are
// unchanged by the rotation, so one map in the antenna's own frame serves every candidate.
//
// Map layout (docs/methods.md, "Placement search"): level k has spacing h0·2^k and half-width
// W0·2^k (the same (2n+1)² nodes, n = W0/h0); a plan offset q is read from the finest level that
// holds it. The interpolation error of each cell is estimated from the level's own nodes
// (Richardson: the 2h interpolant's error at the in-between nodes, divided by 4); cells whose
// estimate exceeds the tolerance, cells touching a node the thin-wire model cannot evaluate and
// offsets beyond the outermost level are ROUTED to direct near-field evaluation.

#include <cstddef>
#include <functional>
#include <span>
#include <vector>

#include <Eigen/Core>

#include "em/fields.hpp"

namespace standoff::siting {

// Fields at site points (RMS phasors at 1 W into the antenna), thread-safe.
using SiteFieldFunction = std::function<std::vector<em::FieldPoint>(std::span<const Eigen::Vector3d>)>;

// A horizontal layer of the map: a body line (five samples between z and z + 2 m, mean of E²
// and H², as `evaluate`) or a single point at height z (points of interest).
struct MapLayer {
  double z_m = 0.0;
  bool body_line = true;
};

struct PlaceMapOptions {
  double half_width_m = 30.0;  // W0: level 0 covers |u|, |v| ≤ W0 around the feed point
  int nodes_per_half_width = 60;  // n (a multiple of 4)
  double extent_m = 100.0;     // the outermost level reaches at least this plan offset
  double tolerance = 0.005;    // relative interpolation error above which a cell is routed
  unsigned threads = 1;
};

// One value read from the map.
struct MapValue {
  bool routed = false;  // true: evaluate directly (outside the map, low accuracy or invalid node)
  // When routed for accuracy only: a bound of the values in the cell (largest corner × (1 + the
  // 2h error seen there)), so that a routed place that cannot be the worst need not be computed.
  // +∞ when outside the map or next to a node the model cannot evaluate.
  double bound_e2 = 0.0;
  double bound_h2 = 0.0;
  double e2 = 0.0;      // body-line mean |E|² (V²/m²) at 1 W, inflated by the cell's error estimate
  double h2 = 0.0;      // body-line mean |H|² (A²/m²)
  double error = 0.0;   // the cell's estimated relative interpolation error
};

class PlaceMap {
 public:
  PlaceMap() = default;
  // `origin` is the plan position of the solved antenna's feed point (c0); offsets q are from it.
  PlaceMap(const SiteFieldFunction& field, Eigen::Vector2d origin, std::vector<MapLayer> layers,
           const PlaceMapOptions& options);

  MapValue at(std::size_t layer, double u, double v) const;

  // Largest value of `ratio(e2, h2)` that interpolation can give at any plan offset of norm ≥ ρ,
  // for each ρ bin of `bin_m` (monotone non-increasing in ρ; +∞ inside the radius of any routed
  // cell). Used to skip zone blocks that cannot hold the worst place.
  std::vector<double> envelope(std::size_t layer, const std::function<double(double, double)>& ratio,
                               double bin_m) const;

  std::size_t levels() const { return levels_.size(); }
  double spacing_m(std::size_t level) const;
  double reach_m() const;             // half-width of the outermost level
  std::size_t node_count() const;     // field points computed = nodes × samples
  std::size_t point_count() const { return points_computed_; }
  std::size_t routed_cells() const;   // cells routed for accuracy or validity (all layers)
  std::size_t cell_count() const;
  double max_error_kept() const;      // largest error estimate of a cell that is not routed
  const std::vector<MapLayer>& layers() const { return layers_; }

 private:
  struct Level {
    double h = 0.0;
    double w = 0.0;
    // Per layer: node values and validity, (2n+1)² row-major (j·(2n+1) + i); cell error (2n)².
    std::vector<std::vector<float>> e2, h2;
    std::vector<std::vector<unsigned char>> valid;
    std::vector<std::vector<float>> cell_error;  // < 0: invalid node; > tolerance: routed for accuracy
  };
  int n_ = 0;
  double tolerance_ = 0.005;
  Eigen::Vector2d origin_{0, 0};
  std::vector<MapLayer> layers_;
  std::vector<Level> levels_;
  std::size_t points_computed_ = 0;
  bool needed(std::size_t level, int i, int j) const;
};

}  // namespace standoff::siting
