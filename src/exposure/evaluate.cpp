// Station evaluation over zone grids. Notation: E², H² are squared RMS field magnitudes
// (|E|² = Σ|E_i|² over the three phasor components), η0 the free-space impedance (CODATA 2018),
// r a power ratio ((E/E_lim)², (H/H_lim)², S_eq/S_lim). See docs/methods.md, "Station evaluation".
#include "exposure/evaluate.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <exception>
#include <map>
#include <thread>

#include "core/constants.hpp"
#include "core/parallel.hpp"

namespace standoff::exposure {

namespace {

constexpr std::size_t kMaxNotEvaluatedListed = 20;
constexpr int kRays = 36;  // directions for the detailed compliance distance (every 10°)

unsigned thread_count(unsigned requested) { return parallel::thread_count(requested); }

// Fields at all points, in chunks handed to the threads (core/parallel.hpp). Each point is
// computed independently and stored by index, so the result does not depend on the thread count.
std::vector<em::FieldPoint> compute_fields(const FieldFunction& field, const std::vector<Eigen::Vector3d>& pts,
                                           unsigned threads) {
  std::vector<em::FieldPoint> out(pts.size());
  if (pts.empty()) return out;
  constexpr std::size_t kChunk = 200;  // 40 body lines: small enough to balance, large enough to amortise
  const std::span<const Eigen::Vector3d> all(pts);
  parallel::for_chunks(
      pts.size(), kChunk,
      [&](std::size_t begin, std::size_t end) {
        auto r = field(all.subspan(begin, end - begin));
        if (r.size() != end - begin) throw std::logic_error("field function returned the wrong number of points");
        std::copy(r.begin(), r.end(), out.begin() + static_cast<std::ptrdiff_t>(begin));
      },
      threads);
  return out;
}

int tier_index(limits::Tier t) { return t == limits::Tier::controlled ? 0 : 1; }

// Ratio for tier index t (0 controlled, 1 uncontrolled), scaled to that tier's average power.
Ratio tier_ratio(double e2, double h2, const SourceLimits& lim, int t) {
  const limits::Tier tier = t == 0 ? limits::Tier::controlled : limits::Tier::uncontrolled;
  const double k = lim.scale(tier);
  return exposure_ratio(e2 * k, h2 * k, lim[tier]);
}

// One body line reduced to ratios for both tiers.
struct BodyResult {
  bool valid = false;
  Ratio avg[2];
  double peak[2] = {0.0, 0.0};
  int peak_sample[2] = {0, 0};
  double e_at_peak[2] = {0.0, 0.0};
  double h_at_peak[2] = {0.0, 0.0};
};

BodyResult reduce_body(const em::FieldPoint* f, const SourceLimits& lim) {
  BodyResult r;
  double e2_sum = 0.0, h2_sum = 0.0;
  for (int k = 0; k < kBodySamples; ++k) {
    if (!f[k].valid) return r;  // one sample outside the model: the body line is not evaluated
    const double e2 = f[k].e_v_per_m.squaredNorm();
    const double h2 = f[k].h_a_per_m.squaredNorm();
    if (!std::isfinite(e2) || !std::isfinite(h2)) return r;
    e2_sum += e2;
    h2_sum += h2;
    for (int t = 0; t < 2; ++t) {
      const Ratio pr = tier_ratio(e2, h2, lim, t);
      if (k == 0 || pr.value > r.peak[t]) {
        r.peak[t] = pr.value;
        r.peak_sample[t] = k;
        r.e_at_peak[t] = std::sqrt(e2);
        r.h_at_peak[t] = std::sqrt(h2);
      }
    }
  }
  r.valid = true;
  for (int t = 0; t < 2; ++t)
    r.avg[t] = tier_ratio(e2_sum / kBodySamples, h2_sum / kBodySamples, lim, t);
  return r;
}

void add_body_line(std::vector<Eigen::Vector3d>& pts, double x, double y, double floor) {
  for (int k = 0; k < kBodySamples; ++k) pts.emplace_back(x, y, floor + body_sample_height_m(k));
}

double plan_distance_to_antenna(const SourceInput& s, PlanPoint p) {
  double d = std::hypot(p.x_m - s.centre.x_m, p.y_m - s.centre.y_m);
  for (const auto& seg : s.footprint) d = std::min(d, distance_to_segment(p, seg.a, seg.b));
  return d;
}

struct GridSpec {
  std::size_t zone = 0;
  double floor = 0.0;
  ZoneGrid grid;
};

std::vector<GridSpec> make_grids(const EvaluationInput& in, double spacing) {
  std::vector<GridSpec> out;
  for (std::size_t z = 0; z < in.zones.size(); ++z) {
    const auto& zone = in.zones[z];
    const auto [lo, hi] = bounds(zone.polygon);
    for (double floor : zone.floors_m) {
      GridSpec g;
      g.zone = z;
      g.floor = floor;
      g.grid.zone = zone.name;
      g.grid.tier = zone.tier;
      g.grid.floor_z_m = floor;
      g.grid.spacing_m = spacing;
      g.grid.origin_x_m = lo.x_m + spacing / 2;
      g.grid.origin_y_m = lo.y_m + spacing / 2;
      g.grid.nx = std::max(1, static_cast<int>(std::ceil((hi.x_m - lo.x_m) / spacing - 1e-9)));
      g.grid.ny = std::max(1, static_cast<int>(std::ceil((hi.y_m - lo.y_m) / spacing - 1e-9)));
      g.grid.state.assign(static_cast<std::size_t>(g.grid.nx) * g.grid.ny, CellState::outside);
      for (int j = 0; j < g.grid.ny; ++j)
        for (int i = 0; i < g.grid.nx; ++i) {
          const PlanPoint c{g.grid.origin_x_m + i * spacing, g.grid.origin_y_m + j * spacing};
          if (in_zone(zone, c)) g.grid.state[static_cast<std::size_t>(j) * g.grid.nx + i] = CellState::evaluated;
        }
      out.push_back(std::move(g));
    }
  }
  return out;
}

void note_not_evaluated(OperationResult& op, SitePoint at, const std::string& zone, const std::string& reason) {
  ++op.not_evaluated_count;
  if (op.not_evaluated.size() < kMaxNotEvaluatedListed) op.not_evaluated.push_back({at, zone, reason});
}

// Ratios within kTieRelative of each other count as equal, so that the place reported for
// symmetric maxima does not depend on the last bits of the arithmetic (e.g. the AVX2 or the
// baseline build of the near-field kernel): the first one considered stays.
constexpr double kTieRelative = 1e-12;

bool clearly_greater(double a, double b) { return a > b + kTieRelative * std::abs(b); }

void consider_worst(PlaceExposure& worst, bool& any, const PlaceExposure& candidate) {
  if (!any || clearly_greater(candidate.ratio, worst.ratio)) {
    worst = candidate;
    any = true;
  }
}

std::vector<double> search_radii(double max_m) {
  std::vector<double> r;
  for (double x = 0.25; x <= std::min(10.0, max_m) + 1e-9; x += 0.25) r.push_back(x);
  for (double x = 10.5; x <= std::min(30.0, max_m) + 1e-9; x += 0.5) r.push_back(x);
  for (double x = 31.0; x <= max_m + 1e-9; x += 1.0) r.push_back(x);
  return r;
}

// Detailed compliance distance per tier: over kRays directions from the antenna centre, the body
// line over open ground (floor 0) is sampled outward; the distance is the first sample beyond the
// outermost one that exceeds (or cannot be evaluated), in the worst direction.
void detailed_distances(const SourceInput& s, const SourceLimits& lim, unsigned threads, OperationResult& op) {
  const std::vector<double> radii = search_radii(s.max_search_distance_m);
  if (radii.empty()) return;
  std::vector<Eigen::Vector3d> pts;
  pts.reserve(radii.size() * kRays * kBodySamples);
  for (int a = 0; a < kRays; ++a) {
    const double az = 2.0 * constants::pi * a / kRays;  // clockwise from north
    for (double r : radii) add_body_line(pts, s.centre.x_m + r * std::sin(az), s.centre.y_m + r * std::cos(az), 0.0);
  }
  const auto f = compute_fields(s.field, pts, threads);
  const std::size_t nr = radii.size();
  std::vector<BodyResult> body(nr * kRays);
  parallel::for_each_index(
      body.size(), 256, [&](std::size_t i) { body[i] = reduce_body(&f[i * kBodySamples], lim); }, threads);

  std::optional<double> dist[2];
  bool beyond[2] = {false, false};
  bool none[2] = {true, true};  // no sample exceeds (or fails to evaluate) in any direction
  bool any_invalid = false;
  for (int t = 0; t < 2; ++t) {
    double worst = 0.0;
    for (int a = 0; a < kRays; ++a) {
      std::ptrdiff_t last_bad = -1;
      for (std::size_t k = 0; k < nr; ++k) {
        const BodyResult& b = body[a * nr + k];
        if (!b.valid) any_invalid = true;
        if (!b.valid || b.avg[t].value > 1.0) last_bad = static_cast<std::ptrdiff_t>(k);
      }
      if (last_bad >= 0) none[t] = false;
      if (last_bad + 1 >= static_cast<std::ptrdiff_t>(nr)) beyond[t] = true;
      else if (last_bad >= 0) worst = std::max(worst, radii[static_cast<std::size_t>(last_bad) + 1]);
    }
    if (!beyond[t] && !none[t]) dist[t] = round_up_distance(worst);
  }
  op.detailed_distance.controlled_m = dist[0];
  op.detailed_distance.uncontrolled_m = dist[1];
  op.detailed_distance.controlled_none = none[0];
  op.detailed_distance.uncontrolled_none = none[1];
  for (int t = 0; t < 2; ++t)
    if (beyond[t])
      op.notes.push_back(std::string("detailed ") + (t == 0 ? "controlled" : "uncontrolled") +
                         " distance not evaluated: the limit is still exceeded (or the model not valid) at the "
                         "end of the search, " + std::to_string(static_cast<int>(radii.back())) +
                         " m — measure or use another method");
  if (any_invalid)
    op.notes.push_back("detailed distance: body-line places the model cannot evaluate are counted as exceeding");

  op.ratio_vs_distance.clear();
  for (std::size_t k = 0; k < nr; ++k) {
    DistanceSample d;
    d.distance_m = radii[k];
    bool all_valid = true;
    double m[2] = {0.0, 0.0};
    for (int a = 0; a < kRays; ++a) {
      const BodyResult& b = body[a * nr + k];
      if (!b.valid) {
        all_valid = false;
        break;
      }
      for (int t = 0; t < 2; ++t) m[t] = std::max(m[t], b.avg[t].value);
    }
    if (all_valid) {
      d.ratio_controlled = m[0];
      d.ratio_uncontrolled = m[1];
    }
    op.ratio_vs_distance.push_back(d);
  }
}

std::string body_rule_text(limits::Standard s) {
  const std::string rule =
      "spatial average of E² and H² over a vertical line 0–2 m above the floor or ground (5 samples at "
      "0.2, 0.6, 1.0, 1.4, 1.8 m, midpoint rule), the single-sample peak recorded beside it; ";
  switch (s) {
    case limits::Standard::fcc:
      return rule + "FCC OET Bulletin 65 (1997) allows spatial averaging over the body's vertical extent "
                    "(from memory, verify against OET 65 Section 1, 'spatial averaging')";
    case limits::Standard::icnirp2020:
      return rule + "ICNIRP 2020 whole-body reference levels are averaged over the body's projected space "
                    "(from memory, verify against ICNIRP 2020 Appendix A, spatial averaging)";
    case limits::Standard::icnirp1998:
      return rule + "ICNIRP 1998 reference levels are spatially averaged over the entire body "
                    "(from memory, verify against ICNIRP 1998, reference levels, note on spatial averaging)";
    case limits::Standard::sc6:
      return rule + "Safety Code 6 (2015) reference levels are spatially averaged over the body "
                    "(from memory, verify against SC6 2015 §2.2)";
  }
  return rule;
}

// Coarse-first grids (docs/methods.md): below this frequency (λ ≥ 4 m, four times the 1 m coarse
// spacing) the grid is computed from coarse to fine in blocks of 8, 4, 2 and 1 m. A cell more than
// kNearAntenna_m from every antenna wire in plan, inside a block whose four computed corners are
// valid and so low that kEstimateFactor × their largest ratio is below kCoarseThreshold of both
// tiers' limits (blocks above 1 m also keep kNearAntenna_m + their size from every wire), takes
// that estimate instead of being computed. Everything else is computed at full resolution.
// kEstimateFactor: the largest ratio of a computed cell to the largest of its block's corners,
// measured on the test stations (tests/exposure, "coarse-first grids": HF dipoles, 64 m zone), is
// 1.0005; the factor 2 keeps every estimate above the computed value with a wide margin.
constexpr double kCoarseMaxFrequency_hz = 75e6;
constexpr double kNearAntenna_m = 3.0;
constexpr double kCoarseThreshold = 0.05;
constexpr double kCoarseMaxBlock_m = 8.0;
constexpr double kEstimateFactor = 2.0;

void evaluate_grid(GridSpec& g, const SourceInput& src, const SourceLimits& lim, const EvaluationOptions& opt,
                   unsigned threads, OperationResult& op, bool& any) {
  const ZoneGrid& zg = g.grid;
  const double s = zg.spacing_m;
  const int ti = tier_index(zg.tier);
  const std::size_t nx = static_cast<std::size_t>(zg.nx), ny = static_cast<std::size_t>(zg.ny);
  const std::size_t ncell = nx * ny;
  ZoneGrid::OperationLayer layer;
  layer.operation = src.name;
  layer.state.assign(ncell, CellState::outside);
  layer.ratio_controlled.assign(ncell, 0.0);
  layer.ratio_uncontrolled.assign(ncell, 0.0);

  auto centre_of = [&](std::size_t c) {
    return PlanPoint{zg.origin_x_m + static_cast<double>(c % nx) * s, zg.origin_y_m + static_cast<double>(c / nx) * s};
  };
  // Per cell: computed?, valid?, ratio per tier (max over its body lines), the zone-tier worst.
  std::vector<char> computed(ncell, 0), valid(ncell, 0);
  std::vector<double> rc(ncell, 0.0), ru(ncell, 0.0);
  // The grid's worst computed place so far: the first cell in index order with the largest ratio of
  // the zone's tier (per-cell bests are kept only for the batch being computed, so memory does not
  // grow with the zone's area).
  bool have_best = false;
  std::size_t best_cell = 0;
  PlaceExposure grid_best;

  // Cells are computed in batches so that the points and fields held at once stay bounded.
  constexpr std::size_t kBatchCells = 8192;
  auto compute_batch = [&](std::span<const std::size_t> cells) {
    std::vector<Eigen::Vector3d> pts;
    std::vector<std::size_t> owner;
    for (std::size_t c : cells) {
      const PlanPoint centre = centre_of(c);
      add_body_line(pts, centre.x_m, centre.y_m, g.floor);
      owner.push_back(c);
      // Finer near the antenna: 2×2 sub-points in cells of the zone within the refine radius.
      if (zg.state[c] != CellState::outside && plan_distance_to_antenna(src, centre) <= opt.refine_radius_m)
        for (int q = 0; q < 4; ++q) {
          add_body_line(pts, centre.x_m + (q % 2 == 0 ? -0.25 : 0.25) * s, centre.y_m + (q / 2 == 0 ? -0.25 : 0.25) * s,
                        g.floor);
          owner.push_back(c);
        }
    }
    const auto f = compute_fields(src.field, pts, threads);
    for (std::size_t c : cells) {
      computed[c] = 1;
      valid[c] = 1;
    }
    // Body lines reduced to ratios on the pool, then merged in body-line order.
    std::vector<BodyResult> reduced(owner.size());
    parallel::for_each_index(
        owner.size(), 256, [&](std::size_t b) { reduced[b] = reduce_body(&f[b * kBodySamples], lim); }, threads);
    std::map<std::size_t, PlaceExposure> best;  // this batch's cells
    for (std::size_t b = 0; b < owner.size(); ++b) {
      const std::size_t c = owner[b];
      const BodyResult& r = reduced[b];
      if (!r.valid) {
        if (valid[c] && zg.state[c] != CellState::outside) {
          const auto& p = pts[b * kBodySamples];
          note_not_evaluated(op, SitePoint{p.x(), p.y(), g.floor}, zg.zone,
                             "within the model's validity limit (e.g. closer than 3 wire radii to a wire, or in "
                             "the reactive near field of a screening model) — not evaluated, measure or use "
                             "another method");
        }
        valid[c] = 0;
        continue;
      }
      rc[c] = std::max(rc[c], r.avg[0].value);
      ru[c] = std::max(ru[c], r.avg[1].value);
      auto it = best.find(c);
      if (it == best.end() || r.avg[ti].value > it->second.ratio) {
        const auto& p = pts[b * kBodySamples + static_cast<std::size_t>(r.peak_sample[ti])];
        best[c] = PlaceExposure{SitePoint{p.x(), p.y(), p.z()}, zg.zone, zg.tier, r.avg[ti].value, r.peak[ti],
                                r.avg[ti].quantity, r.e_at_peak[ti], r.h_at_peak[ti]};
      }
    }
    for (const auto& [c, pe] : best) {
      if (zg.state[c] == CellState::outside || !valid[c]) continue;
      if (!have_best || clearly_greater(pe.ratio, grid_best.ratio) ||
          (!clearly_greater(grid_best.ratio, pe.ratio) && c < best_cell)) {
        have_best = true;
        best_cell = c;
        grid_best = pe;
      }
    }
  };
  auto compute = [&](const std::vector<std::size_t>& cells) {
    for (std::size_t b = 0; b < cells.size(); b += kBatchCells)
      compute_batch(std::span<const std::size_t>(cells).subspan(b, std::min(kBatchCells, cells.size() - b)));
  };

  const bool coarse_first = opt.coarse_first && src.frequency_hz <= kCoarseMaxFrequency_hz && s < 1.0;
  // Block sizes (in cells) of the coarse levels: level 0 is the 1 m block, each further level
  // doubles it, up to kCoarseMaxBlock_m.
  std::vector<std::size_t> steps;
  if (coarse_first) {
    steps.push_back(static_cast<std::size_t>(std::max(2.0, std::round(1.0 / s))));
    while (static_cast<double>(steps.back() * 2) * s <= kCoarseMaxBlock_m + 1e-9 && steps.back() * 2 < std::max(nx, ny))
      steps.push_back(steps.back() * 2);
  } else {
    steps.push_back(1);
  }
  const std::size_t top_level = steps.size() - 1;
  auto is_node = [&](std::size_t level, std::size_t i, std::size_t j) {
    const std::size_t st = steps[level];
    return (i % st == 0 || i == nx - 1) && (j % st == 0 || j == ny - 1);
  };
  // Plan distance from each block's centre to the antenna, per level above 0 (computed once).
  std::vector<std::vector<double>> block_distance(steps.size());
  std::vector<std::size_t> blocks_x(steps.size(), 0);
  for (std::size_t l = 1; l < steps.size(); ++l) {
    const std::size_t st = steps[l], bx = (nx + st - 1) / st, by = (ny + st - 1) / st;
    blocks_x[l] = bx;
    block_distance[l].resize(bx * by);
    parallel::for_each_index(
        bx * by, 256,
        [&, st, bx](std::size_t b) {
          const std::size_t i0 = (b % bx) * st, j0 = (b / bx) * st;
          const std::size_t i1 = std::min(i0 + st, nx - 1), j1 = std::min(j0 + st, ny - 1);
          const PlanPoint a = centre_of(j0 * nx + i0), d = centre_of(j1 * nx + i1);
          block_distance[l][b] = plan_distance_to_antenna(src, PlanPoint{0.5 * (a.x_m + d.x_m), 0.5 * (a.y_m + d.y_m)});
        },
        threads);
  }
  auto corners = [&](std::size_t level, std::size_t c) {
    const std::size_t st = steps[level], i = c % nx, j = c / nx;
    const std::size_t i0 = i - i % st, j0 = j - j % st;
    const std::size_t i1 = std::min(i0 + st, nx - 1), j1 = std::min(j0 + st, ny - 1);
    return std::array<std::size_t, 4>{j0 * nx + i0, j0 * nx + i1, j1 * nx + i0, j1 * nx + i1};
  };
  // A block allows estimates inside it when its four corners are computed and valid, the estimate
  // (kEstimateFactor × their largest ratio) stays below kCoarseThreshold of both tiers' limits, and,
  // above level 0, the block's centre is at least kNearAntenna_m + its size from every antenna wire.
  auto settled = [&](std::size_t level, std::size_t c) {
    const auto k = corners(level, c);
    for (std::size_t n : k)
      if (!computed[n] || !valid[n] || kEstimateFactor * std::max(rc[n], ru[n]) >= kCoarseThreshold) return false;
    if (level == 0) return true;
    const std::size_t st = steps[level];
    const double size_m = static_cast<double>(st) * s;
    return block_distance[level][(c / nx / st) * blocks_x[level] + (c % nx) / st] >= kNearAntenna_m + size_m;
  };
  // The finest level at or above `from` whose block around c allows an estimate (or none).
  auto settled_level = [&](std::size_t from, std::size_t c) -> std::optional<std::size_t> {
    for (std::size_t l = from; l <= top_level; ++l)
      if (settled(l, c)) return l;
    return std::nullopt;
  };

  // First pass: the nodes of the coarsest level and every cell near the antenna.
  std::vector<std::size_t> pass;
  std::vector<char> near(coarse_first ? ncell : 0, 0);
  if (coarse_first)
    parallel::for_each_index(
        ncell, 4096,
        [&](std::size_t c) {
          near[c] = zg.state[c] != CellState::outside && plan_distance_to_antenna(src, centre_of(c)) <= kNearAntenna_m;
        },
        threads);
  for (std::size_t c = 0; c < ncell; ++c) {
    const bool inside_zone = zg.state[c] != CellState::outside;
    if (!coarse_first) {
      if (inside_zone) pass.push_back(c);
      continue;
    }
    if (is_node(top_level, c % nx, c / nx) || near[c]) pass.push_back(c);
  }
  compute(pass);
  if (coarse_first) {
    // Finer levels: the nodes of level l − 1 inside blocks of level ≥ l that allow no estimate.
    for (std::size_t l = top_level; l >= 1; --l) {
      pass.clear();
      for (std::size_t c = 0; c < ncell; ++c)
        if (!computed[c] && is_node(l - 1, c % nx, c / nx) && !settled_level(l, c)) pass.push_back(c);
      compute(pass);
    }
    // Zone cells that no block allows to estimate are computed.
    pass.clear();
    for (std::size_t c = 0; c < ncell; ++c)
      if (zg.state[c] != CellState::outside && !computed[c] && !settled_level(0, c)) pass.push_back(c);
    compute(pass);
    // Last pass: an estimated cell that could exceed the largest computed ratio of the zone's tier
    // (kEstimateFactor × its corners' largest) is computed too, so the grid's worst place is always a
    // computed cell and never lower than the full grid's.
    double worst_computed = 0.0;
    for (std::size_t c = 0; c < ncell; ++c)
      if (zg.state[c] != CellState::outside && computed[c] && valid[c]) worst_computed = std::max(worst_computed, ti == 0 ? rc[c] : ru[c]);
    pass.clear();
    for (std::size_t c = 0; c < ncell; ++c) {
      if (zg.state[c] == CellState::outside || computed[c]) continue;
      const auto level = settled_level(0, c);
      double corner = 0.0;
      if (level)
        for (std::size_t n : corners(*level, c)) corner = std::max(corner, ti == 0 ? rc[n] : ru[n]);
      if (!level || kEstimateFactor * corner > worst_computed) pass.push_back(c);
    }
    compute(pass);
  }

  for (std::size_t c = 0; c < ncell; ++c) {
    if (zg.state[c] == CellState::outside) continue;
    if (computed[c]) {
      if (!valid[c]) {
        layer.state[c] = CellState::not_evaluated;
        g.grid.state[c] = CellState::not_evaluated;
        continue;
      }
      layer.state[c] = CellState::evaluated;
      layer.ratio_controlled[c] = rc[c];
      layer.ratio_uncontrolled[c] = ru[c];
      continue;
    }
    // Estimated from the finest block allowing it: kEstimateFactor × the largest ratio of its corners
    // (below the computed worst of the grid by the last pass, so it never becomes the worst place).
    const auto level = settled_level(0, c);
    if (!level) throw std::logic_error("coarse-first grid: a cell was neither computed nor estimated");
    layer.state[c] = CellState::evaluated;
    for (std::size_t n : corners(*level, c)) {
      layer.ratio_controlled[c] = std::max(layer.ratio_controlled[c], kEstimateFactor * rc[n]);
      layer.ratio_uncontrolled[c] = std::max(layer.ratio_uncontrolled[c], kEstimateFactor * ru[n]);
    }
  }
  if (have_best) consider_worst(op.worst, any, grid_best);
  g.grid.layers.push_back(std::move(layer));
}

}  // namespace

double body_sample_height_m(int k) { return kBodyHeight_m * (k + 0.5) / kBodySamples; }

Ratio exposure_ratio(double e2, double h2, const limits::LimitValues& v) {
  Ratio r{0.0, "E"};
  auto take = [&](double value, const char* q) {
    if (value > r.value) r = Ratio{value, q};
  };
  if (v.e) {
    const double el = v.e->value();
    take(e2 / (el * el), "E");
  }
  if (v.h) {
    const double hl = v.h->value();
    take(h2 / (hl * hl), "H");
  }
  if (v.s && !v.s_is_equivalent) {
    const double s_eq = std::max(e2 / constants::eta0, constants::eta0 * h2);
    take(s_eq / v.s->value(), "S");
  }
  if (!v.e && !v.h && v.s && v.s_is_equivalent) {  // only an equivalent density given: use it
    const double s_eq = std::max(e2 / constants::eta0, constants::eta0 * h2);
    take(s_eq / v.s->value(), "S");
  }
  return r;
}

double round_up_distance(double metres) {
  // Distances round UP to 0.1 m; the small guard keeps exact decimals (e.g. 12.3) from moving up.
  return std::ceil(metres * 10.0 - 1e-9) / 10.0;
}

double round_down_power(double watts) {
  if (!(watts > 0.0) || !std::isfinite(watts)) return 0.0;
  const double mag = std::pow(10.0, std::floor(std::log10(watts)) - 2.0);  // 3 significant figures
  return std::floor(watts / mag + 1e-9) * mag;
}

PointFields fields_at(const SourceInput& source, const SourceLimits& lim, SitePoint at) {
  PointFields p;
  const std::vector<Eigen::Vector3d> pts{Eigen::Vector3d(at.x_m, at.y_m, at.z_m)};
  const auto f = source.field(pts);
  if (f.empty() || !f[0].valid) return p;
  const double e2 = f[0].e_v_per_m.squaredNorm();
  const double h2 = f[0].h_a_per_m.squaredNorm();
  if (!std::isfinite(e2) || !std::isfinite(h2)) return p;
  p.valid = true;
  p.e_v_per_m = std::sqrt(e2);
  p.h_a_per_m = std::sqrt(h2);
  p.controlled = tier_ratio(e2, h2, lim, 0);
  p.uncontrolled = tier_ratio(e2, h2, lim, 1);
  return p;
}

StationEvaluation evaluate(const EvaluationInput& in, const EvaluationOptions& opt) {
  if (in.limits.size() != in.sources.size()) throw std::logic_error("evaluate: one SourceLimits per source");
  const unsigned threads = thread_count(opt.threads);
  const double s = opt.grid_spacing_m;

  StationEvaluation ev;
  ev.station = in.station;
  ev.standard = in.standard;
  ev.body_rule = body_rule_text(in.standard);
  ev.grid_spacing_m = s;

  std::vector<GridSpec> grids = make_grids(in, s);
  const std::size_t total_steps = in.sources.size() * (grids.size() + 2);
  std::size_t done_steps = 0;
  auto tick = [&] {
    ++done_steps;
    if (opt.progress) opt.progress(static_cast<double>(done_steps) / static_cast<double>(total_steps));
  };

  for (std::size_t si = 0; si < in.sources.size(); ++si) {
    const SourceInput& src = in.sources[si];
    const SourceLimits& lim = in.limits[si];
    OperationResult op;
    op.name = src.name;
    op.transmitter = src.transmitter;
    op.feed_line = src.feed_line;
    op.antenna = src.antenna;
    op.group = src.group;
    op.frequency_hz = src.frequency_hz;
    op.pep_w = src.pep_w;
    op.chain = src.chain;
    op.average_power_w = src.average_power_w;
    op.method = src.method;
    op.standard = in.standard;
    op.limits_source = in.limits_source;
    op.screening_distance = src.screening_distance;
    op.notes = src.notes;
    bool any = false;

    for (auto& g : grids) {
      evaluate_grid(g, src, lim, opt, threads, op, any);
      tick();
    }

    // Points of interest: the field at the point itself (no body averaging).
    for (const auto& poi : in.points) {
      PointResult pr;
      pr.name = poi.name;
      pr.tier = poi.tier;
      pr.at = poi.at;
      const PointFields pf = fields_at(src, lim, poi.at);
      if (!pf.valid) {
        pr.reason = "within the model's validity limit — not evaluated, measure or use another method";
        note_not_evaluated(op, poi.at, poi.name, pr.reason);
      } else {
        pr.evaluated = true;
        const Ratio& r = poi.tier == limits::Tier::controlled ? pf.controlled : pf.uncontrolled;
        pr.ratio = r.value;
        pr.quantity = r.quantity;
        pr.e_v_per_m = pf.e_v_per_m;
        pr.h_a_per_m = pf.h_a_per_m;
        PlaceExposure pe{poi.at, poi.name, poi.tier, r.value, r.value, r.quantity, pf.e_v_per_m, pf.h_a_per_m};
        consider_worst(op.worst, any, pe);
      }
      op.points.push_back(pr);
    }
    tick();

    detailed_distances(src, lim, threads, op);
    tick();

    op.evaluated_anywhere = any;
    if (any && op.worst.ratio > 0.0) {
      op.permitted_pep_w = round_down_power(op.pep_w / op.worst.ratio);
      if (*op.permitted_pep_w > op.pep_w)
        op.notes.push_back("permitted PEP is the exposure limit alone, with the same mode, pattern, line and "
                           "antenna; the licence, the equipment ratings and feed-line and antenna power ratings may "
                           "limit the power far below it");
    }
    if (any && op.worst.ratio > 1.0) op.verdict = Verdict::exceeds;
    else if (!any || op.not_evaluated_count > 0) op.verdict = Verdict::not_evaluated;
    else op.verdict = Verdict::within;
    if (op.not_evaluated_count > 0)
      op.notes.push_back(std::to_string(op.not_evaluated_count) +
                         " place(s) not evaluated (inside the model's validity limit) — measure or use another method");
    ev.operations.push_back(std::move(op));
  }

  for (auto& g : grids) ev.grids.push_back(std::move(g.grid));

  // Groups: Σ ratios ≤ 1 at every place (47 CFR 1.1307(b)(5)), each ratio against its own limit.
  std::map<std::string, std::vector<std::size_t>> groups;
  for (std::size_t i = 0; i < ev.operations.size(); ++i)
    if (!ev.operations[i].group.empty()) groups[ev.operations[i].group].push_back(i);
  for (const auto& [name, members] : groups) {
    GroupResult gr;
    gr.name = name;
    for (auto i : members) gr.operations.push_back(ev.operations[i].name);
    bool any = false;
    std::size_t skipped = 0;
    for (const auto& zg : ev.grids) {
      const std::size_t ncell = static_cast<std::size_t>(zg.nx) * zg.ny;
      for (std::size_t c = 0; c < ncell; ++c) {
        if (zg.state[c] == CellState::outside) continue;
        double sum = 0.0;
        bool ok = true;
        for (auto i : members) {
          const auto& layer = zg.layers[i];
          if (layer.state[c] != CellState::evaluated) {
            ok = false;
            break;
          }
          sum += zg.tier == limits::Tier::controlled ? layer.ratio_controlled[c] : layer.ratio_uncontrolled[c];
        }
        if (!ok) {
          ++skipped;
          continue;
        }
        const int i = static_cast<int>(c % static_cast<std::size_t>(zg.nx));
        const int j = static_cast<int>(c / static_cast<std::size_t>(zg.nx));
        PlaceExposure pe;
        pe.at = SitePoint{zg.origin_x_m + i * zg.spacing_m, zg.origin_y_m + j * zg.spacing_m, zg.floor_z_m};
        pe.zone = zg.zone;
        pe.tier = zg.tier;
        pe.ratio = sum;
        pe.peak_ratio = sum;
        pe.quantity = "sum";
        consider_worst(gr.worst, any, pe);
      }
    }
    for (std::size_t p = 0; p < in.points.size(); ++p) {
      double sum = 0.0;
      bool ok = true;
      for (auto i : members) {
        const auto& pr = ev.operations[i].points[p];
        if (!pr.evaluated) {
          ok = false;
          break;
        }
        sum += pr.ratio;
      }
      if (!ok) {
        ++skipped;
        continue;
      }
      PlaceExposure pe{in.points[p].at, in.points[p].name, in.points[p].tier, sum, sum, "sum", 0.0, 0.0};
      consider_worst(gr.worst, any, pe);
    }
    gr.evaluated_anywhere = any;
    if (any && gr.worst.ratio > 1.0) gr.verdict = Verdict::exceeds;
    else if (!any || skipped > 0) gr.verdict = Verdict::not_evaluated;
    else gr.verdict = Verdict::within;
    gr.notes.push_back("sources in a group transmit at the same time: at every place the sum of their exposure "
                       "ratios must not exceed 1 (47 CFR 1.1307(b)(5))");
    if (skipped > 0)
      gr.notes.push_back(std::to_string(skipped) + " place(s) not evaluated for the sum — measure or use another method");
    ev.groups.push_back(std::move(gr));
  }

  // Overall verdict: any exceedance wins; otherwise anything not evaluated.
  bool exceeds = false, unevaluated = false;
  for (const auto& op : ev.operations) {
    exceeds |= op.verdict == Verdict::exceeds;
    unevaluated |= op.verdict == Verdict::not_evaluated;
  }
  for (const auto& g : ev.groups) {
    exceeds |= g.verdict == Verdict::exceeds;
    unevaluated |= g.verdict == Verdict::not_evaluated;
  }
  ev.verdict = exceeds ? Verdict::exceeds : unevaluated ? Verdict::not_evaluated : Verdict::within;

  ev.cautions = {
      "This evaluation is a model, not a measurement: where a result is close to a limit, or not evaluated, "
      "measure or use another method.",
      "Fields are computed without buildings, fences, vehicles or people in them (no shielding assumed).",
  };
  return ev;
}

}  // namespace standoff::exposure
