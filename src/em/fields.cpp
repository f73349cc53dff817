// Fields of the solved currents. Near fields: E = −jωA − ∇φ and H = ∇×A/μ0 summed over segments
// (kernel::segment_field) plus their ground images; far field: radiation vector
// N = Σ t̂ ∫ I(s) e^{jk r̂·r'} ds, rE = −jωμ0/(4π)(N − (N·r̂)r̂) (Balanis §3.6, §4.8).
#include "em/fields.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "core/parallel.hpp"
#include "em/fast_math.hpp"
#include "em/kernel.hpp"
#include "em/mesh.hpp"
#include "em/near_field.hpp"
#include "em/pattern.hpp"

namespace standoff::em {
namespace {

using cd = std::complex<double>;
constexpr double pi = constants::pi;

struct Source {
  kernel::Line line;
  cd ia, ib;
  double radius;
};

// Direct segments and (over ground) the perfect-ground image segments: mirrored geometry with
// the current reversed along the mirrored direction.
// Quadrature nodes of the radiation-vector integral (4-point Gauss–Legendre per segment), relative
// to the centroid, with their weights w·Δ·I(s) and the segment direction, as structure of arrays.
struct FarNodes {
  std::vector<double> x, y, z, wr, wi, tx, ty, tz;
};

struct Radiator {
  std::vector<Source> direct, image;
  FarNodes direct_nodes, image_nodes;
  GroundKind ground = GroundKind::free_space;
  cd eps_c{1.0, 0.0};
  double k = 0.0, omega = 0.0;
  Eigen::Vector3d centroid = Eigen::Vector3d::Zero();
  double extent = 0.0;  // radius about the centroid, including images
};

Radiator make_radiator(const Solution& sol) {
  Radiator r;
  const Mesh& mesh = *sol.mesh;
  r.k = mesh.k;
  r.omega = mesh.omega;
  r.ground = sol.model.ground.kind;
  if (r.ground == GroundKind::real) r.eps_c = detail::ground_eps_c(sol.model);
  const auto sc = segment_currents(sol);
  for (std::size_t i = 0; i < sc.size(); ++i) {
    const Segment& s = mesh.segments[i];
    r.direct.push_back({{s.p0, s.t, s.length}, sc[i].i_start, sc[i].i_end, s.radius});
    if (r.ground != GroundKind::free_space) {
      const Eigen::Vector3d p0(s.p0.x(), s.p0.y(), -s.p0.z()), t(s.t.x(), s.t.y(), -s.t.z());
      r.image.push_back({{p0, t, s.length}, -sc[i].i_start, -sc[i].i_end, s.radius});
    }
  }
  for (const auto& s : r.direct) r.centroid += s.line.centre();
  r.centroid /= static_cast<double>(std::max<std::size_t>(1, r.direct.size()));
  for (const auto* v : {&r.direct, &r.image})
    for (const auto& s : *v)
      r.extent = std::max({r.extent, (s.line.p0 - r.centroid).norm(), (s.line.p0 + s.line.length * s.line.t - r.centroid).norm()});
  const kernel::Rule g = kernel::gauss_legendre(4);
  for (auto [v, nodes] : {std::pair{&r.direct, &r.direct_nodes}, std::pair{&r.image, &r.image_nodes}})
    for (const Source& s : *v)
      for (std::size_t i = 0; i < g.x.size(); ++i) {
        const Eigen::Vector3d q = s.line.p0 + (g.x[i] * s.line.length) * s.line.t - r.centroid;
        const cd w = g.w[i] * (s.ia + (s.ib - s.ia) * g.x[i]) * s.line.length;
        nodes->x.push_back(q.x());
        nodes->y.push_back(q.y());
        nodes->z.push_back(q.z());
        nodes->wr.push_back(w.real());
        nodes->wi.push_back(w.imag());
        nodes->tx.push_back(s.line.t.x());
        nodes->ty.push_back(s.line.t.y());
        nodes->tz.push_back(s.line.t.z());
      }
  return r;
}

// N = Σ t̂ ∫ I(s) e^{jk r̂·r'} ds over the nodes (one vectorised loop; compiled twice on x86-64
// with GCC, AVX2/FMA and the baseline, chosen at load time; not under the sanitizers).
#if defined(__x86_64__) && defined(__GNUC__) && !defined(__clang__) && !defined(__SANITIZE_ADDRESS__)
__attribute__((target_clones("arch=x86-64-v3", "default")))
#endif
Eigen::Vector3cd radiation_vector(const FarNodes& nd, const Eigen::Vector3d& dir, double k) {
  const double kx = k * dir.x(), ky = k * dir.y(), kz = k * dir.z();
  const std::size_t n = nd.x.size();
  const double *x = nd.x.data(), *y = nd.y.data(), *z = nd.z.data(), *wr = nd.wr.data(), *wi = nd.wi.data(),
               *tx = nd.tx.data(), *ty = nd.ty.data(), *tz = nd.tz.data();
  double nxr = 0, nxi = 0, nyr = 0, nyi = 0, nzr = 0, nzi = 0;
#pragma omp simd reduction(+ : nxr, nxi, nyr, nyi, nzr, nzi)
  for (std::size_t i = 0; i < n; ++i) {
    double sn, cs;
    fast_math::sincos(kx * x[i] + ky * y[i] + kz * z[i], sn, cs);
    const double ar = wr[i] * cs - wi[i] * sn, ai = wr[i] * sn + wi[i] * cs;
    nxr += ar * tx[i];
    nxi += ai * tx[i];
    nyr += ar * ty[i];
    nyi += ai * ty[i];
    nzr += ar * tz[i];
    nzi += ai * tz[i];
  }
  return Eigen::Vector3cd(cd(nxr, nxi), cd(nyr, nyi), cd(nzr, nzi));
}

// rE (peak, V) with phase reference at `origin`.
Eigen::Vector3cd far_e(const Radiator& r, const Eigen::Vector3d& dir) {
  const cd factor(0.0, -r.omega * constants::mu0 / (4.0 * pi));
  auto perp = [&](const Eigen::Vector3cd& n) { return Eigen::Vector3cd(n - dir.cast<cd>().dot(n) * dir.cast<cd>()); };
  Eigen::Vector3cd e = factor * perp(radiation_vector(r.direct_nodes, dir, r.k));
  if (r.ground == GroundKind::free_space) return e;
  if (dir.z() < 0.0) return Eigen::Vector3cd::Zero();
  Eigen::Vector3cd ei = factor * perp(radiation_vector(r.image_nodes, dir, r.k));
  if (r.ground == GroundKind::real) {
    const auto [rv, rh] = kernel::reflection(r.eps_c, dir.z());
    Eigen::Vector3d phi = Eigen::Vector3d::UnitZ().cross(dir);
    if (phi.norm() < 1e-12) phi = Eigen::Vector3d::UnitX();
    phi.normalize();
    const Eigen::Vector3cd te = phi.cast<cd>().dot(ei) * phi.cast<cd>();
    ei = -rh * te + rv * (ei - te);
  }
  return e + ei;
}

Eigen::Vector3d direction(const Direction& d) {
  return {std::sin(d.azimuth_rad) * std::cos(d.elevation_rad), std::cos(d.azimuth_rad) * std::cos(d.elevation_rad),
          std::sin(d.elevation_rad)};
}

double gain_of(const Radiator& r, const Solution& sol, const Eigen::Vector3d& dir) {
  if (!(sol.input_power_w > 0.0)) return 0.0;
  const double u = far_e(r, dir).squaredNorm() / (2.0 * constants::eta0);
  return 4.0 * pi * u / sol.input_power_w;
}

}  // namespace

namespace detail {

std::complex<double> ground_eps_c(const Model& model) {
  const double w = 2.0 * pi * model.frequency_hz;
  return {model.ground.eps_r, -model.ground.sigma_s_per_m / (w * constants::eps0)};
}

Eigen::Vector3cd far_field(const Solution& solution, const Eigen::Vector3d& dir) {
  const Radiator r = make_radiator(solution);
  return far_e(r, dir.normalized());
}

double radiated_power(const Solution& solution) {
  const Radiator r = make_radiator(solution);
  const double kd = r.k * r.extent;
  const bool half = r.ground != GroundKind::free_space;
  // Angular resolution from the electrical size (|rE|² has harmonics up to 2kD).
  const int n_theta = 16 + 2 * static_cast<int>(std::ceil(kd));
  const int n_phi = 12 + 4 * static_cast<int>(std::ceil(kd));
  const int panels = (n_theta + 7) / 8;
  const kernel::Rule g = kernel::gauss_legendre(8);
  const double mu_lo = half ? 0.0 : -1.0, mu_hi = 1.0;
  // Rings in parallel (core/parallel.hpp), summed afterwards in a fixed order.
  const std::size_t nodes = g.x.size();
  std::vector<double> rings(static_cast<std::size_t>(panels) * nodes);
  parallel::for_each_index(rings.size(), 1, [&](std::size_t idx) {
    const int pnl = static_cast<int>(idx / nodes);
    const std::size_t i = idx % nodes;
    const double a = mu_lo + (mu_hi - mu_lo) * pnl / panels, b = mu_lo + (mu_hi - mu_lo) * (pnl + 1) / panels;
    const double mu = a + (b - a) * g.x[i];
    const double st = std::sqrt(std::max(0.0, 1.0 - mu * mu));
    double ring = 0.0;
    for (int j = 0; j < n_phi; ++j) {
      const double ph = 2.0 * pi * (j + 0.5) / n_phi;
      ring += far_e(r, Eigen::Vector3d(st * std::cos(ph), st * std::sin(ph), mu)).squaredNorm();
    }
    rings[idx] = ring;
  });
  double sum = 0.0;
  for (int pnl = 0; pnl < panels; ++pnl) {
    const double a = mu_lo + (mu_hi - mu_lo) * pnl / panels, b = mu_lo + (mu_hi - mu_lo) * (pnl + 1) / panels;
    for (std::size_t i = 0; i < nodes; ++i)
      sum += g.w[i] * (b - a) * rings[static_cast<std::size_t>(pnl) * nodes + i] * (2.0 * pi / n_phi);
  }
  return sum / (2.0 * constants::eta0);
}

}  // namespace detail

std::vector<FieldPoint> near_fields(const Solution& solution, std::span<const Eigen::Vector3d> points,
                                    double input_power_w) {
  return NearFieldEvaluator(solution).evaluate(points, input_power_w);
}

double gain(const Solution& solution, const Direction& d) {
  const Radiator r = make_radiator(solution);
  return gain_of(r, solution, direction(d));
}

PatternPeak peak_gain(const Solution& solution, double step_rad) {
  const Radiator r = make_radiator(solution);
  const bool half = r.ground != GroundKind::free_space;
  step_rad = std::clamp(step_rad, 1e-3, 0.2);
  PatternPeak best;
  best.gain = -1.0;
  const double el_lo = half ? 0.0 : -pi / 2;
  const int n_el = static_cast<int>(std::ceil((pi / 2 - el_lo) / step_rad));
  const int n_az = static_cast<int>(std::ceil(2 * pi / step_rad));
  // Rows of the grid in parallel (core/parallel.hpp); the first maximum in row order wins, as in
  // a serial scan, whatever the thread count.
  std::vector<PatternPeak> rows(static_cast<std::size_t>(n_el) + 1);
  parallel::for_each_index(rows.size(), 1, [&](std::size_t i) {
    PatternPeak row;
    row.gain = -1.0;
    for (int j = 0; j < n_az; ++j) {
      const Direction d{el_lo + (pi / 2 - el_lo) * static_cast<int>(i) / n_el, 2 * pi * j / n_az};
      const double gv = gain_of(r, solution, direction(d));
      if (gv > row.gain) row = {gv, 0.0, d};
    }
    rows[i] = row;
  });
  for (const PatternPeak& row : rows)
    if (row.gain > best.gain) best = row;
  // Local refinement by pattern search with halving steps.
  double st = step_rad;
  while (st > 1e-4) {
    bool moved = false;
    for (const auto& [de, da] : {std::pair{1, 0}, {-1, 0}, {0, 1}, {0, -1}}) {
      Direction d{std::clamp(best.direction.elevation_rad + de * st, el_lo, pi / 2), best.direction.azimuth_rad + da * st};
      const double gv = gain_of(r, solution, direction(d));
      if (gv > best.gain) {
        best = {gv, 0.0, d};
        moved = true;
      }
    }
    if (!moved) st *= 0.5;
  }
  best.direction.azimuth_rad = std::fmod(std::fmod(best.direction.azimuth_rad, 2 * pi) + 2 * pi, 2 * pi);
  best.gain_dbi = 10.0 * std::log10(std::max(best.gain, 1e-30));
  return best;
}

}  // namespace standoff::em
