// Placement search (see place.hpp and docs/methods.md, "Placement search"). Notation: c0, az0 the
// antenna as solved; c, az a candidate; Δ = az − az0; R(θ) the clockwise plan rotation by θ;
// q = R(−Δ)(p − c) the antenna-frame offset of site point p (map coordinates).
#include "siting/place.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>
#include <map>
#include <tuple>
#include <sstream>

#include "core/constants.hpp"
#include "siting/checks.hpp"
#include "siting/place_parallel.hpp"

namespace standoff::siting {

namespace {

constexpr double kEnvelopeBin_m = 0.25;
constexpr int kBlockCells = 8;  // zone blocks of 8 × 8 cells for the pruning

Eigen::Vector2d rot_cw(Eigen::Vector2d v, double theta) {
  const double c = std::cos(theta), s = std::sin(theta);
  return {v.x() * c + v.y() * s, -v.x() * s + v.y() * c};
}

int tier_index(limits::Tier t) { return t == limits::Tier::controlled ? 0 : 1; }
const char* tier_name(int t) { return t == 0 ? "controlled" : "uncontrolled"; }

double distance_to_polygon_edge(const exposure::Polygon& poly, exposure::PlanPoint p) {
  double d = std::numeric_limits<double>::infinity();
  for (std::size_t i = 0; i < poly.size(); ++i)
    d = std::min(d, exposure::distance_to_segment(p, poly[i], poly[(i + 1) % poly.size()]));
  return d;
}

double seg_distance(Eigen::Vector2d p, Eigen::Vector2d a, Eigen::Vector2d b) {
  return exposure::distance_to_segment({p.x(), p.y()}, {a.x(), a.y()}, {b.x(), b.y()});
}

std::string fmt_num(double v, int precision = 3) {
  std::ostringstream o;
  o.precision(precision);
  o << v;
  return o.str();
}

}  // namespace

// Precomputed once per search: zone blocks and the envelopes of every operation, layer and tier.
struct PlaceEngine::Impl {
  explicit Impl(const PlaceSetup& s) : s_(s) {
    for (std::size_t z = 0; z < s.zones.size(); ++z) {
      const auto& zone = s.zones[z];
      if (zone.cells.empty()) continue;
      double minx = zone.cells[0].x_m, miny = zone.cells[0].y_m;
      for (const auto& c : zone.cells) {
        minx = std::min(minx, c.x_m);
        miny = std::min(miny, c.y_m);
      }
      const double bs = kBlockCells * zone.spacing_m;
      std::map<std::pair<long, long>, std::size_t> index;
      for (std::size_t c = 0; c < zone.cells.size(); ++c) {
        const auto& p = zone.cells[c];
        const auto key = std::make_pair(static_cast<long>(std::floor((p.x_m - minx) / bs + 1e-9)),
                                        static_cast<long>(std::floor((p.y_m - miny) / bs + 1e-9)));
        auto it = index.find(key);
        if (it == index.end()) {
          Block b;
          b.zone = static_cast<int>(z);
          b.layer = zone.layer;
          b.tier = tier_index(zone.tier);
          b.lo = b.hi = Eigen::Vector2d(p.x_m, p.y_m);
          it = index.emplace(key, blocks_.size()).first;
          blocks_.push_back(b);
        }
        Block& b = blocks_[it->second];
        b.cells.push_back(c);
        b.lo = b.lo.cwiseMin(Eigen::Vector2d(p.x_m, p.y_m));
        b.hi = b.hi.cwiseMax(Eigen::Vector2d(p.x_m, p.y_m));
      }
    }
    // Sub-points reach a quarter cell beyond the centres.
    for (auto& b : blocks_) {
      const double e = 0.25 * s.zones[static_cast<std::size_t>(b.zone)].spacing_m;
      b.lo.array() -= e;
      b.hi.array() += e;
    }
    for (std::size_t p = 0; p < s.points.size(); ++p) {
      Block b;
      b.zone = -1 - static_cast<int>(p);
      b.layer = s.points[p].layer;
      b.tier = tier_index(s.points[p].tier);
      b.lo = b.hi = Eigen::Vector2d(s.points[p].at.x_m, s.points[p].at.y_m);
      b.cells.push_back(p);
      blocks_.push_back(b);
    }
    for (const auto& [a, b] : s.footprint) frame_footprint_.emplace_back(a - s.origin, b - s.origin);
    for (const auto& sp : s.supports)
      reach_ = std::max(reach_, std::hypot(sp.base.x.value() - s.origin.x(), sp.base.y.value() - s.origin.y()) +
                                    sp.height.value() + sp.overhang.value());
    for (const auto& sp : s.spans) {
      const double ra = std::hypot(sp.from.x.value() - s.origin.x(), sp.from.y.value() - s.origin.y());
      const double rb = std::hypot(sp.to.x.value() - s.origin.x(), sp.to.y.value() - s.origin.y());
      const double chord = std::hypot(std::hypot(sp.to.x.value() - sp.from.x.value(), sp.to.y.value() - sp.from.y.value()),
                                      sp.to.z.value() - sp.from.z.value());
      // The wire and its sag plane stay near the chord; a wire whose support fails swings about
      // the other end within its length (the sag adds less than the chord to the length here).
      reach_ = std::max(reach_, std::max(ra, rb) + 1.5 * chord);
    }
    // Envelopes per operation, layer and tier.
    const std::size_t nl = s.operations.empty() || !s.operations[0].map ? 0 : s.operations[0].map->layers().size();
    env_.resize(s.operations.size());
    for (std::size_t o = 0; o < s.operations.size(); ++o) {
      const auto& op = s.operations[o];
      env_[o].resize(nl);
      for (std::size_t l = 0; l < nl; ++l)
        for (int t = 0; t < 2; ++t) {
          const double k = op.tx_fraction[t];
          const limits::LimitValues& lim = op.limit[t];
          env_[o][l][static_cast<std::size_t>(t)] = op.map->envelope(
              l, [k, &lim](double e2, double h2) { return k * exposure::exposure_ratio(e2, h2, lim).value; },
              kEnvelopeBin_m);
        }
    }
  }

  std::vector<Candidate> evaluate_position(double x, double y, const std::vector<double>& azimuths,
                                           const std::vector<double>& lengths, PlaceMode mode,
                                           bool check_lines) const;
  double apply_line_checks(Candidate& cand) const;
  // Largest plan displacement of any point of the installation (supports, their fall and tilt
  // reach, spans and their swing) between two placements.
  double displacement_bound(const Candidate& a, const Candidate& b) const {
    return std::hypot(a.x_m - b.x_m, a.y_m - b.y_m) + 2.0 * std::abs(std::sin(0.5 * (a.azimuth_rad - b.azimuth_rad))) * reach_;
  }
  double reach_ = 0.0;

  struct Block {
    int zone = 0;  // ≥ 0 zone index; < 0: point of interest −1 − index
    std::size_t layer = 0;
    int tier = 1;
    Eigen::Vector2d lo, hi;
    std::vector<std::size_t> cells;
  };
  struct Routed {
    Eigen::Vector2d q;  // antenna-frame offset
    std::size_t layer;
    int tier;
    int block;
    double bound;       // largest ratio the place can have (+∞: unknown)
  };

  double envelope_at(std::size_t o, const Block& b, double dmin) const {
    if (env_.empty() || env_[o].empty()) return std::numeric_limits<double>::infinity();
    const auto& e = env_[o][b.layer][static_cast<std::size_t>(b.tier)];
    const std::size_t bin = static_cast<std::size_t>(std::max(0.0, dmin) / kEnvelopeBin_m);
    if (bin >= e.size()) return std::numeric_limits<double>::infinity();  // beyond the map: unknown
    return e[bin];
  }

  bool near_antenna(Eigen::Vector2d q) const {
    double d = q.norm();
    for (const auto& [a, b] : frame_footprint_) d = std::min(d, seg_distance(q, a, b));
    return d <= s_.refine_radius_m;
  }

  const PlaceSetup& s_;
  std::vector<Block> blocks_;
  std::vector<std::pair<Eigen::Vector2d, Eigen::Vector2d>> frame_footprint_;
  std::vector<std::vector<std::array<std::vector<double>, 2>>> env_;
};

PlaceEngine::PlaceEngine(const PlaceSetup& setup) : impl_(std::make_unique<Impl>(setup)) {}
PlaceEngine::~PlaceEngine() = default;

std::vector<Candidate> PlaceEngine::evaluate_position(double x, double y, const std::vector<double>& azimuths,
                                                      const std::vector<double>& lengths, PlaceMode mode,
                                                      bool check_lines) const {
  return impl_->evaluate_position(x, y, azimuths, lengths, mode, check_lines);
}

void PlaceEngine::apply_line_checks(Candidate& cand) const { (void)impl_->apply_line_checks(cand); }

Candidate PlaceEngine::evaluate(double x, double y, double az, double len, PlaceMode mode, bool check_lines) const {
  return impl_->evaluate_position(x, y, {az}, {len}, mode, check_lines).front();
}

namespace {

struct Worst {
  double ratio = 0.0;  // per W of PEP at the transmitter, before the line factor
  int block = -1;
  const char* quantity = "E";
  int tier = 1;
};

// Moves the antenna's supports and spans rigidly with it and runs the checks of `standoff lines`.
std::vector<Check> line_checks(const PlaceSetup& s, Eigen::Vector2d c, double delta) {
  SiteElements el;
  el.power_lines = s.installation.power_lines;
  auto move = [&](units::Length x, units::Length y) {
    const Eigen::Vector2d p = c + rot_cw(Eigen::Vector2d(x.value(), y.value()) - s.origin, delta);
    return std::make_pair(units::metres(p.x()), units::metres(p.y()));
  };
  for (Support sp : s.supports) {
    std::tie(sp.base.x, sp.base.y) = move(sp.base.x, sp.base.y);
    if (sp.tilt) sp.tilt->direction = units::radians(sp.tilt->direction.value() + delta);
    el.supports.push_back(sp);
  }
  for (Span sp : s.spans) {
    std::tie(sp.from.x, sp.from.y) = move(sp.from.x, sp.from.y);
    std::tie(sp.to.x, sp.to.y) = move(sp.to.x, sp.to.y);
    el.spans.push_back(sp);
  }
  if (el.supports.empty() && el.spans.empty()) return {};
  return run_checks(el, *s.tables).checks;
}

}  // namespace

std::vector<Candidate> PlaceEngine::Impl::evaluate_position(double x, double y, const std::vector<double>& azimuths,
                                                            const std::vector<double>& lengths, PlaceMode mode,
                                                            bool check_lines) const {
  const Eigen::Vector2d c(x, y);
  const std::size_t nops = s_.operations.size();
  // Block order per operation by upper bound (independent of the azimuth: |q| = |p − c|).
  std::vector<std::vector<std::pair<double, int>>> order(nops);
  for (std::size_t o = 0; o < nops; ++o) {
    order[o].reserve(blocks_.size());
    for (std::size_t b = 0; b < blocks_.size(); ++b) {
      const Block& blk = blocks_[b];
      const Eigen::Vector2d d = (blk.lo - c).cwiseMax(c - blk.hi).cwiseMax(Eigen::Vector2d::Zero());
      const double ub = mode == PlaceMode::direct ? std::numeric_limits<double>::infinity() : envelope_at(o, blk, d.norm());
      order[o].emplace_back(ub, static_cast<int>(b));
    }
    std::stable_sort(order[o].begin(), order[o].end(), [](auto& a, auto& b) { return a.first > b.first; });
  }

  std::vector<Candidate> out;
  out.reserve(azimuths.size());
  for (std::size_t ai = 0; ai < azimuths.size(); ++ai) {
    const double az = azimuths[ai];
    const double delta = az - s_.azimuth0_rad;
    const double cd = std::cos(delta), sd = std::sin(delta);
    auto to_frame = [&](double px, double py) {  // q = R(−Δ)(p − c)
      const double dx = px - x, dy = py - y;
      return Eigen::Vector2d(dx * cd - dy * sd, dx * sd + dy * cd);
    };
    Candidate cand;
    cand.x_m = x;
    cand.y_m = y;
    cand.azimuth_rad = az;
    cand.feedline_length_m = lengths[ai];
    double least = std::numeric_limits<double>::infinity();
    for (std::size_t o = 0; o < nops; ++o) {
      const PlaceOperation& op = s_.operations[o];
      OperationScore sc;
      sc.name = op.name;
      sc.frequency_hz = op.frequency_hz;
      double g = 1.0;  // power into the antenna per W into the line
      if (op.line) {
        const auto run = power::run_line(*op.line, units::metres(cand.feedline_length_m), units::hertz(op.frequency_hz),
                                         op.load, units::watts(1.0));
        sc.swr = run.swr_load;
        if (run.evaluated) {
          sc.feedline_loss_db = run.total_loss_db;
          sc.mismatch_loss_db = run.mismatch_loss_db;
          g = std::pow(10.0, -run.total_loss_db / 10.0);
        } else {
          sc.line_evaluated = false;
          sc.line_note = run.note + " (counted as lossless: more power reaches the antenna)";
        }
      }
      Worst w;
      std::vector<Routed> routed;
      auto consider = [&](double e2, double h2, int tier, int block) {
        const exposure::Ratio r = exposure::exposure_ratio(e2, h2, op.limit[tier]);
        const double v = op.tx_fraction[tier] * r.value;
        if (v > w.ratio) w = Worst{v, block, r.quantity, tier};
      };
      auto visit = [&](const Block& blk, int bi, Eigen::Vector2d q) {
        double bound = std::numeric_limits<double>::infinity();
        if (mode == PlaceMode::map) {
          const MapValue mv = op.map->at(blk.layer, q.x(), q.y());
          if (!mv.routed) {
            ++cand.map_points;
            consider(mv.e2, mv.h2, blk.tier, bi);
            return;
          }
          if (std::isfinite(mv.bound_e2) && std::isfinite(mv.bound_h2))
            bound = op.tx_fraction[blk.tier] * exposure::exposure_ratio(mv.bound_e2, mv.bound_h2, op.limit[blk.tier]).value;
        }
        routed.push_back(Routed{q, blk.layer, blk.tier, bi, bound});
      };
      for (const auto& [ub, bi] : order[o]) {
        if (ub <= w.ratio) break;  // no place of this or any later block can be worse
        const Block& blk = blocks_[static_cast<std::size_t>(bi)];
        if (blk.zone < 0) {
          visit(blk, bi, to_frame(blk.lo.x(), blk.lo.y()));
          continue;
        }
        const PlaceZone& zone = s_.zones[static_cast<std::size_t>(blk.zone)];
        for (std::size_t ci : blk.cells) {
          const auto& p = zone.cells[ci];
          const Eigen::Vector2d q = to_frame(p.x_m, p.y_m);
          visit(blk, bi, q);
          if (near_antenna(q)) {  // 2×2 sub-points in the site axes, as `evaluate`
            const double d = 0.25 * zone.spacing_m;
            for (int k = 0; k < 4; ++k)
              visit(blk, bi, to_frame(p.x_m + (k % 2 == 0 ? -d : d), p.y_m + (k / 2 == 0 ? -d : d)));
          }
        }
      }
      // Direct evaluation of the routed places, at the antenna as solved (c0 + q): those that
      // could be the worst, largest bound first, in batches, until the bound falls below the worst.
      std::stable_sort(routed.begin(), routed.end(), [](const Routed& a, const Routed& b) { return a.bound > b.bound; });
      constexpr std::size_t kBatch = 32;
      for (std::size_t start = 0; start < routed.size(); start += kBatch) {
        if (routed[start].bound <= w.ratio) break;
        const std::vector<Routed> batch(routed.begin() + static_cast<std::ptrdiff_t>(start),
                                        routed.begin() + static_cast<std::ptrdiff_t>(std::min(routed.size(), start + kBatch)));
        const auto& layers = op.map->layers();
        std::vector<Eigen::Vector3d> pts;
        for (const auto& r : batch) {
          const MapLayer& L = layers[r.layer];
          const Eigen::Vector2d p = s_.origin + r.q;
          if (L.body_line)
            for (int k = 0; k < exposure::kBodySamples; ++k)
              pts.emplace_back(p.x(), p.y(), L.z_m + exposure::body_sample_height_m(k));
          else
            pts.emplace_back(p.x(), p.y(), L.z_m);
        }
        const auto f = op.direct(pts);
        std::size_t at = 0;
        for (const auto& r : batch) {
          const int ns = layers[r.layer].body_line ? exposure::kBodySamples : 1;
          double e2 = 0.0, h2 = 0.0;
          bool ok = true;
          for (int k = 0; k < ns; ++k, ++at) {
            if (!f[at].valid) {
              ok = false;
              continue;
            }
            e2 += f[at].e_v_per_m.squaredNorm();
            h2 += f[at].h_a_per_m.squaredNorm();
          }
          ++cand.direct_points;
          if (!ok || !std::isfinite(e2) || !std::isfinite(h2)) {
            ++cand.not_evaluated_places;
            continue;
          }
          consider(e2 / ns, h2 / ns, r.tier, r.block);
        }
      }
      sc.worst_ratio_per_w = w.ratio * g;
      if (w.ratio > 0.0 && w.block >= 0) {
        sc.permitted_pep_w = exposure::round_down_power(1.0 / (w.ratio * g));
        const Block& blk = blocks_[static_cast<std::size_t>(w.block)];
        sc.binding.kind = "exposure";
        sc.binding.operation = op.name;
        sc.binding.zone = blk.zone >= 0 ? s_.zones[static_cast<std::size_t>(blk.zone)].name
                                        : s_.points[static_cast<std::size_t>(-1 - blk.zone)].name;
        sc.binding.tier = tier_name(w.tier);
        sc.binding.quantity = w.quantity;
        sc.binding.text = "exposure: " + op.name + " — " + sc.binding.zone + " (" + sc.binding.tier + ", " +
                          w.quantity + ")";
      } else {
        sc.binding.kind = "none";
        sc.binding.text = "not evaluated: no place could be evaluated";
      }
      const double p = sc.permitted_pep_w.value_or(0.0);
      if (p < least) {
        least = p;
        cand.binding = sc.binding;
        cand.feedline_loss_db = sc.feedline_loss_db;
      }
      cand.operations.push_back(std::move(sc));
    }
    cand.exposure_permitted_pep_w = std::isfinite(least) ? least : 0.0;
    cand.permitted_pep_w = cand.exposure_permitted_pep_w;
    cand.lines_checked = false;
    cand.exposure_binding = cand.binding;
    if (check_lines) apply_line_checks(cand);
    out.push_back(std::move(cand));
  }
  return out;
}

double PlaceEngine::Impl::apply_line_checks(Candidate& cand) const {
  cand.lines_checked = true;
  if (!s_.tables) return std::numeric_limits<double>::infinity();
  const auto checks = line_checks(s_, Eigen::Vector2d(cand.x_m, cand.y_m), cand.azimuth_rad - s_.azimuth0_rad);
  const Check* first = nullptr;
  double slack = std::numeric_limits<double>::infinity();
  double deficit = -std::numeric_limits<double>::infinity();
  for (const auto& ch : checks) {
    // Checks against no power line (conductor size, radiating-wire height) do not depend on where
    // the antenna stands on level ground: `standoff lines` and `evaluate` report them; they do not rank.
    if (ch.line.empty()) continue;
    if (ch.pass()) {
      if (ch.required && ch.actual) slack = std::min(slack, ch.actual->value() - ch.required->value());
      else slack = -std::numeric_limits<double>::infinity();
    }
    if (ch.pass()) continue;
    cand.failed_checks.push_back(ch.rule + ": " + ch.subject + (ch.line.empty() ? "" : " vs " + ch.line));
    // Binding: the measured power-line check that misses by most, else the first failing one.
    if (ch.status == CheckStatus::fail && !ch.line.empty() && ch.required && ch.actual) {
      const double d = ch.required->value() - ch.actual->value();
      if (d > deficit) {
        deficit = d;
        first = &ch;
      }
    } else if (!first || (first->line.empty() && !ch.line.empty())) {
      if (!std::isfinite(deficit)) first = &ch;
    }
  }
  if (!first) return slack;
  cand.clearance_ok = false;
  cand.permitted_pep_w = 0.0;
  cand.binding = Binding{};
  cand.binding.kind = "line check";
  cand.binding.rule = first->rule;
  cand.binding.subject = first->subject;
  cand.binding.line = first->line;
  cand.binding.text = "line check: " + first->rule + " — " + first->subject +
                      (first->line.empty() ? "" : " vs " + first->line) +
                      (first->status == CheckStatus::not_evaluated ? " (not evaluated)" : " fails");
  return -deficit;  // negative: by how much the worst measured failure misses
}

double routed_feed_length_m(const PlaceSetup& s, double x, double y) {
  const double plan = std::hypot(x - s.operating_position.x(), y - s.operating_position.y());
  return s.slack * plan + std::abs(s.feed_height_m - s.operating_position.z());
}

double required_map_extent(const PlaceSetup& s) {
  // Not a structured binding: clang 14 (the fuzz build) refuses lambdas that capture one.
  const auto box = exposure::bounds(s.region);
  const exposure::PlanPoint lo = box.first, hi = box.second;
  double reach = 0.0;
  auto far_corner = [&](double px, double py) {
    const double dx = std::max(std::abs(px - lo.x_m), std::abs(px - hi.x_m));
    const double dy = std::max(std::abs(py - lo.y_m), std::abs(py - hi.y_m));
    reach = std::max(reach, std::hypot(dx, dy));
  };
  for (const auto& z : s.zones)
    for (const auto& c : z.cells) far_corner(c.x_m, c.y_m);
  for (const auto& p : s.points) far_corner(p.at.x_m, p.at.y_m);
  // Also the current placement, which may lie outside the region.
  for (const auto& z : s.zones)
    for (const auto& c : z.cells) reach = std::max(reach, std::hypot(c.x_m - s.origin.x(), c.y_m - s.origin.y()));
  return reach + 1.0;
}

std::vector<exposure::PlanPoint> candidate_positions(const PlaceSetup& s, int* nx_out, int* ny_out,
                                                     exposure::PlanPoint* origin_out) {
  std::vector<exposure::PlanPoint> out;
  const auto [lo, hi] = exposure::bounds(s.region);
  const double st = s.step_m;
  const int nx = std::max(1, static_cast<int>(std::floor((hi.x_m - lo.x_m) / st + 1e-9)));
  const int ny = std::max(1, static_cast<int>(std::floor((hi.y_m - lo.y_m) / st + 1e-9)));
  // Centred in the bounds, so that a symmetric site gives a symmetric grid.
  const double ox = 0.5 * (lo.x_m + hi.x_m) - 0.5 * (nx - 1) * st;
  const double oy = 0.5 * (lo.y_m + hi.y_m) - 0.5 * (ny - 1) * st;
  if (nx_out) *nx_out = nx;
  if (ny_out) *ny_out = ny;
  if (origin_out) *origin_out = {ox, oy};
  for (int j = 0; j < ny; ++j)
    for (int i = 0; i < nx; ++i) {
      const exposure::PlanPoint p{ox + i * st, oy + j * st};
      if (!exposure::inside(s.region, p) || distance_to_polygon_edge(s.region, p) < s.margin_m - 1e-9) continue;
      bool blocked = false;
      for (const auto& b : s.keep_out)
        if (exposure::inside(b, p) || distance_to_polygon_edge(b, p) < s.margin_m - 1e-9) blocked = true;
      if (!blocked) out.push_back(p);
    }
  return out;
}

namespace {

// Every wire end of the antenna, moved to (c, az), lies on the property.
bool fits(const PlaceSetup& s, Eigen::Vector2d c, double az) {
  const double delta = az - s.azimuth0_rad;
  for (const auto& [a, b] : s.footprint)
    for (const auto& e : {a, b}) {
      const Eigen::Vector2d p = c + rot_cw(e - s.origin, delta);
      if (!exposure::inside(s.region, {p.x(), p.y()}) && distance_to_polygon_edge(s.region, {p.x(), p.y()}) > 1e-6)
        return false;
    }
  return true;
}

bool better(const Candidate& a, const Candidate& b) {
  if (a.permitted_pep_w != b.permitted_pep_w) return a.permitted_pep_w > b.permitted_pep_w;
  if (a.clearance_ok != b.clearance_ok) return a.clearance_ok;
  if (a.exposure_permitted_pep_w != b.exposure_permitted_pep_w)
    return a.exposure_permitted_pep_w > b.exposure_permitted_pep_w;
  if (a.y_m != b.y_m) return a.y_m < b.y_m;
  if (a.x_m != b.x_m) return a.x_m < b.x_m;
  return a.azimuth_rad < b.azimuth_rad;
}

}  // namespace

Candidate evaluate_placement(const PlaceSetup& s, double x, double y, double az, double len, PlaceMode mode,
                             bool check_lines) {
  const PlaceEngine engine(s);
  return engine.evaluate(x, y, az, len, mode, check_lines);
}

PlaceResult place(const PlaceSetup& s) {
  PlaceResult res;
  const PlaceEngine engine(s);
  // Azimuths: a 180° turn leaves a symmetric antenna unchanged, so those are searched once.
  std::vector<double> az;
  for (double a : s.azimuths_rad) {
    double v = std::fmod(a, 2.0 * constants::pi);
    if (v < 0) v += 2.0 * constants::pi;
    if (s.half_turn_symmetric) v = std::fmod(v, constants::pi);
    if (std::abs(v - (s.half_turn_symmetric ? constants::pi : 2.0 * constants::pi)) < 1e-9) v = 0.0;
    bool dup = false;
    for (double u : az) dup |= std::abs(u - v) < 1e-9;
    if (!dup) az.push_back(v);
  }
  std::sort(az.begin(), az.end());
  // An antenna whose wires all stand on its feed point in plan (a vertical) is the same at every
  // azimuth: one is searched.
  bool point_like = true;
  for (const auto& [a, b] : s.footprint) point_like &= (a - s.origin).norm() < 1e-3 && (b - s.origin).norm() < 1e-3;
  if (point_like && !az.empty()) {
    az = {s.azimuth0_rad};
    res.notes.push_back("the antenna looks the same from every azimuth in plan (its wires stand on the feed point): "
                        "one azimuth is searched");
  }
  res.azimuths_rad = az;
  int nx = 0, ny = 0;
  exposure::PlanPoint org;
  const auto positions = candidate_positions(s, &nx, &ny, &org);
  res.positions = positions.size();
  res.heat_origin_x_m = org.x_m;
  res.heat_origin_y_m = org.y_m;
  res.heat_step_m = s.step_m;
  res.heat_nx = nx;
  res.heat_ny = ny;
  res.heat.resize(static_cast<std::size_t>(nx) * static_cast<std::size_t>(ny));
  for (int j = 0; j < ny; ++j)
    for (int i = 0; i < nx; ++i) {
      auto& h = res.heat[static_cast<std::size_t>(j) * nx + i];
      h.x_m = org.x_m + i * s.step_m;
      h.y_m = org.y_m + j * s.step_m;
    }

  const unsigned threads = place_thread_count(s.threads);
  std::vector<std::vector<Candidate>> per_position(positions.size());
  // Positions in fixed groups, each group in order on one thread, so that the results (including
  // the reuse of line checks below) do not depend on the thread count.
  constexpr std::size_t kGroup = 64;
  const std::size_t groups = (positions.size() + kGroup - 1) / kGroup;
  const std::size_t chunk = 4;  // groups between progress reports
  for (std::size_t start = 0; start < groups; start += chunk) {
    const std::size_t end = std::min(groups, start + chunk);
    parallel_blocks(end - start, threads, 1, [&](std::size_t gb, std::size_t ge) {
      for (std::size_t g = start + gb; g < start + ge; ++g) {
      // Reuse of a passed check (docs/methods.md): every distance the line checks measure moves by
      // at most the installation's displacement, and the required distances do not move, so a
      // placement within (slack − 0.1 m) of a fully checked one passes too.
      // One reference per azimuth (positions in a group are neighbours, so the displacement is small).
      std::vector<std::optional<Candidate>> ref(az.size()), ref_fail(az.size());
      std::vector<double> ref_slack(az.size(), -1.0), ref_deficit(az.size(), -1.0);
      for (std::size_t k = g * kGroup; k < std::min(positions.size(), (g + 1) * kGroup); ++k) {
        const Eigen::Vector2d c(positions[k].x_m, positions[k].y_m);
        std::vector<double> fit_az, lens;
        for (double a : az)
          if (fits(s, c, a)) {
            fit_az.push_back(a);
            lens.push_back(routed_feed_length_m(s, c.x(), c.y()));
          }
        if (fit_az.empty()) continue;
        auto cands = engine.evaluate_position(c.x(), c.y(), fit_az, lens, PlaceMode::map, false);
        // Power-line checks, lazily: in order of exposure-permitted power until one azimuth passes
        // (that one is the position's best); the others are checked only if ranked (below).
        std::stable_sort(cands.begin(), cands.end(), [](const Candidate& a, const Candidate& b) {
          return a.exposure_permitted_pep_w > b.exposure_permitted_pep_w;
        });
        for (auto& cnd : cands) {
          const std::size_t ai = static_cast<std::size_t>(
              std::lower_bound(az.begin(), az.end(), cnd.azimuth_rad - 1e-12) - az.begin());
          if (ai < az.size() && ref[ai] && ref_slack[ai] - engine.impl_->displacement_bound(cnd, *ref[ai]) > 0.1) {
            cnd.lines_checked = true;  // passes: within the slack of a checked placement
            cnd.lines_inferred = true;
            break;
          }
          // And a failure: a check that misses by more than the displacement (plus a cushion for
          // the sampling of the swept checks) misses here too — an error here only lowers the rank.
          if (ai < az.size() && ref_fail[ai] &&
              ref_deficit[ai] - engine.impl_->displacement_bound(cnd, *ref_fail[ai]) > 0.25) {
            cnd.lines_checked = true;
            cnd.lines_inferred = true;
            cnd.clearance_ok = false;
            cnd.permitted_pep_w = 0.0;
            cnd.binding = ref_fail[ai]->binding;  // the check that misses by most there
            cnd.failed_checks = {ref_fail[ai]->binding.rule + ": " + ref_fail[ai]->binding.subject + " vs " +
                                 ref_fail[ai]->binding.line};
            continue;
          }
          const double slack = engine.impl_->apply_line_checks(cnd);
          if (ai >= az.size()) {
            if (cnd.clearance_ok) break;
            continue;
          }
          if (cnd.clearance_ok) {
            ref[ai] = cnd;
            ref_slack[ai] = slack;
            break;
          }
          if (-slack > 0.0 && std::isfinite(slack)) {
            ref_fail[ai] = cnd;
            ref_deficit[ai] = -slack;
          }
        }
        per_position[k] = std::move(cands);
      }
      }
    });
    if (s.progress) s.progress(static_cast<double>(end) / static_cast<double>(groups));
  }

  std::vector<Candidate> all;
  for (std::size_t k = 0; k < positions.size(); ++k) {
    const int i = static_cast<int>(std::lround((positions[k].x_m - org.x_m) / s.step_m));
    const int j = static_cast<int>(std::lround((positions[k].y_m - org.y_m) / s.step_m));
    HeatCell& h = res.heat[static_cast<std::size_t>(j) * nx + i];
    for (auto& cnd : per_position[k]) {
      h.candidate = true;
      ++res.placements;
      res.direct_points += cnd.direct_points;
      res.read_points += cnd.map_points;
      if (cnd.lines_checked && cnd.clearance_ok) {
        if (!h.any_clear || cnd.permitted_pep_w > h.best_pep_w) {
          h.best_pep_w = cnd.permitted_pep_w;
          h.best_azimuth_rad = cnd.azimuth_rad;
        }
        h.any_clear = true;
      }
      all.push_back(std::move(cnd));
    }
  }
  // Ranking: clear candidates by permitted PEP; every listed candidate has been checked. A
  // candidate failing a check has 0 W and comes after every clear one.
  std::sort(all.begin(), all.end(), [](const Candidate& a, const Candidate& b) {
    if (a.exposure_permitted_pep_w != b.exposure_permitted_pep_w)
      return a.exposure_permitted_pep_w > b.exposure_permitted_pep_w;
    return better(a, b);
  });
  std::vector<Candidate> clear, failing;
  for (auto& cnd : all) {
    if (clear.size() >= s.top) break;
    if (!cnd.lines_checked || cnd.lines_inferred) {  // listed candidates are checked in full
      cnd.clearance_ok = true;
      cnd.permitted_pep_w = cnd.exposure_permitted_pep_w;
      cnd.binding = cnd.exposure_binding;
      cnd.failed_checks.clear();
      cnd.lines_inferred = false;
      engine.apply_line_checks(cnd);
    }
    (cnd.clearance_ok ? clear : failing).push_back(std::move(cnd));
  }
  std::sort(clear.begin(), clear.end(), better);
  std::sort(failing.begin(), failing.end(), better);
  for (auto& f : failing) {
    if (clear.size() >= s.top) break;
    clear.push_back(std::move(f));
  }
  res.candidates = std::move(clear);

  // Where the station file puts it, with the lines as stated there.
  {
    Candidate c;
    // Per-operation stated lengths differ; evaluate each operation with its own length.
    std::vector<OperationScore> ops;
    for (std::size_t o = 0; o < s.operations.size(); ++o) {
      PlaceSetup one = s;
      one.operations = {s.operations[o]};
      const PlaceEngine e1(one);
      const double len = s.operations[o].current_length_m.value_or(
          routed_feed_length_m(s, s.origin.x(), s.origin.y()));
      Candidate part = e1.evaluate_position(s.origin.x(), s.origin.y(), {s.azimuth0_rad}, {len}, PlaceMode::map,
                                            o == 0)
                           .front();
      if (o == 0) c = part;
      else {
        c.direct_points += part.direct_points;
        c.map_points += part.map_points;
        c.not_evaluated_places += part.not_evaluated_places;
      }
      ops.push_back(part.operations.front());
      if (o == 0 || part.feedline_length_m > c.feedline_length_m) c.feedline_length_m = part.feedline_length_m;
    }
    c.operations = ops;
    double least = std::numeric_limits<double>::infinity();
    for (const auto& sc : ops) {
      const double p = sc.permitted_pep_w.value_or(0.0);
      if (p < least) {
        least = p;
        c.feedline_loss_db = sc.feedline_loss_db;
        if (c.clearance_ok) c.binding = sc.binding;
      }
    }
    c.exposure_permitted_pep_w = std::isfinite(least) ? least : 0.0;
    c.permitted_pep_w = c.clearance_ok ? c.exposure_permitted_pep_w : 0.0;
    res.current = std::move(c);
  }

  const PlaceMap& m = *s.operations.front().map;
  res.map_levels = m.levels();
  res.map_spacing_m = m.spacing_m(0);
  res.map_reach_m = m.reach_m();
  for (std::size_t o = 0; o < s.operations.size(); ++o) {
    bool shared = false;
    for (std::size_t p = 0; p < o; ++p) shared |= s.operations[p].map == s.operations[o].map;
    if (!shared) res.map_points += s.operations[o].map->point_count();
    res.map_max_error = std::max(res.map_max_error, s.operations[o].map->max_error_kept());
  }
  if (s.half_turn_symmetric)
    res.notes.push_back("the antenna is unchanged by a half turn about its feed point: azimuths are searched over "
                        "0°–180° only (" + fmt_num(static_cast<double>(az.size())) + " directions)");
  return res;
}

}  // namespace standoff::siting
