// Antenna-frame field map (see place_map.hpp and docs/methods.md, "Placement search").
#include "siting/place_map.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>

#include "exposure/evaluate.hpp"
#include "siting/place_parallel.hpp"

namespace standoff::siting {

namespace {

int samples_of(const MapLayer& l) { return l.body_line ? exposure::kBodySamples : 1; }

}  // namespace

bool PlaceMap::needed(std::size_t level, int i, int j) const {
  if (level == 0) return true;
  // Nodes well inside the next finer level are never read (a margin of two nodes keeps every
  // node of the 2h cells used for the error estimate).
  return std::max(std::abs(i - n_), std::abs(j - n_)) >= n_ / 2 - 2;
}

PlaceMap::PlaceMap(const SiteFieldFunction& field, Eigen::Vector2d origin, std::vector<MapLayer> layers,
                   const PlaceMapOptions& o)
    : tolerance_(o.tolerance), origin_(origin), layers_(std::move(layers)) {
  if (!(o.half_width_m > 0.0) || o.nodes_per_half_width < 8)
    throw std::invalid_argument("PlaceMap: half width must be > 0 and at least 8 nodes per half width");
  n_ = (o.nodes_per_half_width + 3) / 4 * 4;
  const int side = 2 * n_ + 1;
  const std::size_t nodes = static_cast<std::size_t>(side) * static_cast<std::size_t>(side);
  double w = o.half_width_m;
  for (;;) {
    Level lv;
    lv.w = w;
    lv.h = w / n_;
    levels_.push_back(std::move(lv));
    if (w >= o.extent_m) break;
    w *= 2.0;
  }

  for (std::size_t k = 0; k < levels_.size(); ++k) {
    Level& lv = levels_[k];
    // Field points of every needed node and layer sample.
    std::vector<Eigen::Vector3d> pts;
    std::vector<std::size_t> node_of;  // node index per (node, layer) block start
    for (int j = 0; j < side; ++j)
      for (int i = 0; i < side; ++i) {
        if (!needed(k, i, j)) continue;
        node_of.push_back(static_cast<std::size_t>(j) * side + i);
        const double x = origin_.x() + (i - n_) * lv.h, y = origin_.y() + (j - n_) * lv.h;
        for (const auto& layer : layers_) {
          if (layer.body_line)
            for (int s = 0; s < exposure::kBodySamples; ++s)
              pts.emplace_back(x, y, layer.z_m + exposure::body_sample_height_m(s));
          else
            pts.emplace_back(x, y, layer.z_m);
        }
      }
    std::vector<em::FieldPoint> f(pts.size());
    const std::span<const Eigen::Vector3d> all(pts);
    parallel_blocks(pts.size(), std::max(1u, o.threads), 256, [&](std::size_t b, std::size_t e) {
      auto r = field(all.subspan(b, e - b));
      if (r.size() != e - b) throw std::logic_error("PlaceMap: field function returned the wrong number of points");
      std::copy(r.begin(), r.end(), f.begin() + static_cast<std::ptrdiff_t>(b));
    });
    points_computed_ += pts.size();

    const std::size_t nl = layers_.size();
    lv.e2.assign(nl, std::vector<float>(nodes, 0.0f));
    lv.h2.assign(nl, std::vector<float>(nodes, 0.0f));
    lv.valid.assign(nl, std::vector<unsigned char>(nodes, 0));
    std::size_t p = 0;
    for (std::size_t node : node_of)
      for (std::size_t l = 0; l < nl; ++l) {
        const int ns = samples_of(layers_[l]);
        double e2 = 0.0, h2 = 0.0;
        bool ok = true;
        for (int s = 0; s < ns; ++s, ++p) {
          if (!f[p].valid) {
            ok = false;
            continue;
          }
          const double a = f[p].e_v_per_m.squaredNorm(), b = f[p].h_a_per_m.squaredNorm();
          if (!std::isfinite(a) || !std::isfinite(b)) ok = false;
          e2 += a;
          h2 += b;
        }
        if (!ok) continue;
        lv.e2[l][node] = static_cast<float>(e2 / ns);
        lv.h2[l][node] = static_cast<float>(h2 / ns);
        lv.valid[l][node] = 1;
      }

    // Error estimate per cell: in each 2h cell, the 2h bilinear interpolant against the five
    // computed in-between nodes; the h interpolant's error is a quarter of that (second order).
    lv.cell_error.assign(nl, std::vector<float>(static_cast<std::size_t>(2 * n_) * (2 * n_), -1.0f));
    for (std::size_t l = 0; l < nl; ++l) {
      const auto& E = lv.e2[l];
      const auto& H = lv.h2[l];
      const auto& V = lv.valid[l];
      auto id = [&](int i, int j) { return static_cast<std::size_t>(j) * side + i; };
      for (int J = 0; J + 2 <= 2 * n_; J += 2)
        for (int I = 0; I + 2 <= 2 * n_; I += 2) {
          bool ok = true;
          for (int dj = 0; dj <= 2 && ok; ++dj)
            for (int di = 0; di <= 2 && ok; ++di)
              if (!needed(k, I + di, J + dj) || !V[id(I + di, J + dj)]) ok = false;
          if (!ok) continue;  // cells stay routed
          double worst = 0.0;
          for (const auto* A : {&E, &H}) {
            const double c00 = (*A)[id(I, J)], c20 = (*A)[id(I + 2, J)], c02 = (*A)[id(I, J + 2)],
                         c22 = (*A)[id(I + 2, J + 2)];
            double scale = std::max({c00, c20, c02, c22});
            const double mids[5][2] = {{0.5 * (c00 + c20), (*A)[id(I + 1, J)]},
                                       {0.5 * (c00 + c02), (*A)[id(I, J + 1)]},
                                       {0.25 * (c00 + c20 + c02 + c22), (*A)[id(I + 1, J + 1)]},
                                       {0.5 * (c20 + c22), (*A)[id(I + 2, J + 1)]},
                                       {0.5 * (c02 + c22), (*A)[id(I + 1, J + 2)]}};
            for (const auto& m : mids) scale = std::max(scale, m[1]);
            if (!(scale > 0.0)) continue;
            for (const auto& m : mids) worst = std::max(worst, std::abs(m[0] - m[1]) / scale);
          }
          const double est = worst / 4.0;  // above the tolerance: routed for accuracy (read_at)
          for (int dj = 0; dj < 2; ++dj)
            for (int di = 0; di < 2; ++di)
              lv.cell_error[l][static_cast<std::size_t>(J + dj) * (2 * n_) + (I + di)] = static_cast<float>(est);
        }
    }
  }
}

MapValue PlaceMap::at(std::size_t layer, double u, double v) const {
  MapValue out;
  for (const Level& lv : levels_) {
    if (!(std::abs(u) < lv.w && std::abs(v) < lv.w)) continue;
    const double fi = u / lv.h + n_, fj = v / lv.h + n_;
    const int i = std::clamp(static_cast<int>(std::floor(fi)), 0, 2 * n_ - 1);
    const int j = std::clamp(static_cast<int>(std::floor(fj)), 0, 2 * n_ - 1);
    const float err = lv.cell_error[layer][static_cast<std::size_t>(j) * (2 * n_) + i];
    if (err < 0.0f) break;  // next to an invalid node: routed, unbounded
    const double t = fi - i, s = fj - j;
    const int side = 2 * n_ + 1;
    const std::size_t a = static_cast<std::size_t>(j) * side + i;
    if (err > tolerance_) {
      out.routed = true;
      const double grow = 1.0 + 4.0 * err;
      for (const auto* A : {&lv.e2[layer], &lv.h2[layer]}) {
        const double m = std::max({(*A)[a], (*A)[a + 1], (*A)[a + side], (*A)[a + side + 1]}) * grow;
        (A == &lv.e2[layer] ? out.bound_e2 : out.bound_h2) = m;
      }
      return out;
    }
    auto lerp = [&](const std::vector<float>& A) {
      return (1 - t) * (1 - s) * A[a] + t * (1 - s) * A[a + 1] + (1 - t) * s * A[a + side] + t * s * A[a + side + 1];
    };
    out.error = err;
    // Inflated by the error estimate, so that the map errs on the side of more exposure.
    out.e2 = lerp(lv.e2[layer]) * (1.0 + err);
    out.h2 = lerp(lv.h2[layer]) * (1.0 + err);
    return out;
  }
  out.routed = true;
  out.bound_e2 = out.bound_h2 = std::numeric_limits<double>::infinity();
  return out;
}

std::vector<double> PlaceMap::envelope(std::size_t layer, const std::function<double(double, double)>& ratio,
                                       double bin_m) const {
  const double reach = reach_m() * std::sqrt(2.0);
  const std::size_t nb = static_cast<std::size_t>(std::ceil(reach / bin_m)) + 2;
  std::vector<double> arr(nb, 0.0);
  double routed_radius = -1.0;
  const int side = 2 * n_ + 1;
  for (std::size_t k = 0; k < levels_.size(); ++k) {
    const Level& lv = levels_[k];
    const double diag = std::sqrt(2.0) * lv.h;
    for (int j = 0; j < side; ++j)
      for (int i = 0; i < side; ++i) {
        if (!needed(k, i, j)) continue;
        const std::size_t id = static_cast<std::size_t>(j) * side + i;
        if (!lv.valid[layer][id]) continue;  // its cells are routed (below)
        // The largest growth of the cells around the node: 1 + tolerance for cells read from the
        // map, 1 + 4·estimate for cells routed for accuracy (their bound in at()).
        double grow = 1.0 + tolerance_;
        for (int dj = -1; dj <= 0; ++dj)
          for (int di = -1; di <= 0; ++di) {
            const int ci = i + di, cj = j + dj;
            if (ci < 0 || cj < 0 || ci >= 2 * n_ || cj >= 2 * n_) continue;
            const float e = lv.cell_error[layer][static_cast<std::size_t>(cj) * (2 * n_) + ci];
            if (e > tolerance_) grow = std::max(grow, 1.0 + 4.0 * e);
          }
        const double r = std::hypot((i - n_) * lv.h, (j - n_) * lv.h) + diag;
        const std::size_t b = std::min(nb - 1, static_cast<std::size_t>(r / bin_m));
        arr[b] = std::max(arr[b], ratio(lv.e2[layer][id], lv.h2[layer][id]) * grow);
      }
    // Routed cells that are read at this level: the envelope is unbounded inside them.
    for (int j = 0; j < 2 * n_; ++j)
      for (int i = 0; i < 2 * n_; ++i) {
        if (lv.cell_error[layer][static_cast<std::size_t>(j) * (2 * n_) + i] >= 0.0f) continue;
        if (k > 0) {
          const bool inner = i - n_ >= -n_ / 2 && i - n_ + 1 <= n_ / 2 && j - n_ >= -n_ / 2 && j - n_ + 1 <= n_ / 2;
          if (inner) continue;  // read from the finer level
        }
        const double r = std::hypot((i - n_ + 0.5) * lv.h, (j - n_ + 0.5) * lv.h) + diag;
        routed_radius = std::max(routed_radius, r);
      }
  }
  std::vector<double> env(nb, 0.0);
  double m = 0.0;
  for (std::size_t b = nb; b-- > 0;) {
    m = std::max(m, arr[b]);
    env[b] = m;
  }
  for (std::size_t b = 0; b < nb; ++b)
    if (static_cast<double>(b) * bin_m <= routed_radius) env[b] = std::numeric_limits<double>::infinity();
  return env;
}

double PlaceMap::spacing_m(std::size_t level) const { return levels_.at(level).h; }
double PlaceMap::reach_m() const { return levels_.empty() ? 0.0 : levels_.back().w; }

std::size_t PlaceMap::node_count() const { return points_computed_; }

std::size_t PlaceMap::cell_count() const {
  return levels_.size() * layers_.size() * static_cast<std::size_t>(2 * n_) * (2 * n_);
}

std::size_t PlaceMap::routed_cells() const {
  std::size_t c = 0;
  for (const auto& lv : levels_)
    for (const auto& ce : lv.cell_error)
      for (float e : ce) c += (e < 0.0f || e > tolerance_) ? 1 : 0;
  return c;
}

double PlaceMap::max_error_kept() const {
  double m = 0.0;
  for (const auto& lv : levels_)
    for (const auto& ce : lv.cell_error)
      for (float e : ce)
        if (e <= tolerance_) m = std::max(m, static_cast<double>(e));
  return m;
}

}  // namespace standoff::siting
