#include "em/kernel.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <vector>

#include "core/constants.hpp"

namespace standoff::em::kernel {
namespace {

constexpr double pi = constants::pi;
constexpr int kMaxRule = 16;

struct Rules {
  std::array<std::vector<double>, kMaxRule + 1> x, w;
  Rules() {
    for (int n = 1; n <= kMaxRule; ++n) {
      x[n].resize(n);
      w[n].resize(n);
      for (int i = 0; i < n; ++i) {
        // Newton iteration on P_n from the Chebyshev-like initial guess (Abramowitz & Stegun 25.4.29).
        double z = std::cos(pi * (i + 0.75) / (n + 0.5));
        double dp = 1.0;
        for (int it = 0; it < 100; ++it) {
          double p0 = 1.0, p1 = 0.0;
          for (int j = 1; j <= n; ++j) {
            const double p2 = p1;
            p1 = p0;
            p0 = ((2.0 * j - 1.0) * z * p1 - (j - 1.0) * p2) / j;
          }
          dp = n * (z * p0 - p1) / (z * z - 1.0);
          const double dz = p0 / dp;
          z -= dz;
          if (std::abs(dz) < 1e-16) break;
        }
        x[n][i] = 0.5 * (1.0 - z);
        w[n][i] = 1.0 / ((1.0 - z * z) * dp * dp);  // 2/((1−z²)P'²) scaled to [0, 1]
      }
    }
  }
};

const Rules& rules() {
  static const Rules r;
  return r;
}

inline cd green(double r, double k) { return std::exp(cd(0.0, -k * r)) / (4.0 * pi * r); }

// Breakpoints on [0, len] graded geometrically (factor 2) around each critical point c with
// scale h: c ± h/2, c ± h, c ± 2h, ...
void graded(double len, std::span<const double> c, std::span<const double> h, std::vector<double>& out) {
  out.clear();
  out.push_back(0.0);
  out.push_back(len);
  for (std::size_t i = 0; i < c.size(); ++i) {
    const double hh = std::max(h[i], 1e-9 * len);
    for (double d = 0.5 * hh; d < len; d *= 2.0) {
      if (c[i] - d > 0.0) out.push_back(c[i] - d);
      if (c[i] + d < len) out.push_back(c[i] + d);
    }
    if (c[i] > 0.0 && c[i] < len) out.push_back(c[i]);
  }
  std::sort(out.begin(), out.end());
  std::vector<double> u;
  for (double v : out)
    if (u.empty() || v - u.back() > 1e-12 * len) u.push_back(v);
  out.swap(u);
}

double point_segment_distance(const Eigen::Vector3d& r, const Line& q, double& s_closest) {
  const double s = std::clamp((r - q.p0).dot(q.t), 0.0, q.length);
  s_closest = s;
  return (r - (q.p0 + s * q.t)).norm();
}

}  // namespace

Rule gauss_legendre(int n) {
  n = std::clamp(n, 1, kMaxRule);
  const Rules& r = rules();
  return Rule{r.x[n], r.w[n]};
}

std::pair<cd, cd> reflection(cd eps_c, double cos_theta) {
  const double c = std::clamp(cos_theta, 0.0, 1.0);
  const double s2 = 1.0 - c * c;
  const cd root = std::sqrt(eps_c - s2);  // principal root
  const cd rv = (eps_c * c - root) / (eps_c * c + root);
  const cd rh = (c - root) / (c + root);
  return {rv, rh};
}

PairIntegrals pair_integrals(const Line& p, const Line& q, double a2, double k) {
  PairIntegrals out{};
  const double dc = (p.centre() - q.centre()).norm();
  const double lmax = std::max(p.length, q.length);
  if (dc > 2.0 * lmax) {
    // Well separated: plain product Gauss–Legendre of the full kernel.
    const int n = dc > 5.0 * lmax ? 3 : 5;
    const Rule g = gauss_legendre(n);
    for (int i = 0; i < n; ++i) {
      const Eigen::Vector3d r = p.p0 + (g.x[i] * p.length) * p.t;
      cd j0 = 0.0, j1 = 0.0;
      for (int j = 0; j < n; ++j) {
        const Eigen::Vector3d rp = q.p0 + (g.x[j] * q.length) * q.t;
        const double rr = std::sqrt((r - rp).squaredNorm() + a2);
        const cd gw = green(rr, k) * g.w[j];
        j0 += gw * (1.0 - g.x[j]);
        j1 += gw * g.x[j];
      }
      const double wo = g.w[i] * p.length * q.length;
      const double n0 = 1.0 - g.x[i], n1 = g.x[i];
      out.s[0][0] += wo * n0 * j0;
      out.s[0][1] += wo * n0 * j1;
      out.s[1][0] += wo * n1 * j0;
      out.s[1][1] += wo * n1 * j1;
      out.t += wo * (j0 + j1);
    }
    return out;
  }
  // Near: the 1/R part of the inner integral analytically, the rest by Gauss–Legendre; the outer
  // integral on breakpoints graded toward where the source segment comes close.
  double sc = 0.0;
  std::array<double, 4> c{};
  std::array<double, 4> h{};
  int nc = 0;
  for (const Eigen::Vector3d& e : {q.p0, Eigen::Vector3d(q.p0 + q.length * q.t)}) {
    const double s = std::clamp((e - p.p0).dot(p.t), 0.0, p.length);
    const Eigen::Vector3d rp = p.p0 + s * p.t;
    const double d = point_segment_distance(rp, q, sc);
    c[nc] = s;
    h[nc++] = std::sqrt(d * d + a2);
  }
  for (double s : {0.0, p.length}) {
    const double d = point_segment_distance(Eigen::Vector3d(p.p0 + s * p.t), q, sc);
    c[nc] = s;
    h[nc++] = std::sqrt(d * d + a2);
  }
  static thread_local std::vector<double> bp;
  graded(p.length, std::span<const double>(c.data(), nc), std::span<const double>(h.data(), nc), bp);
  const Rule go = gauss_legendre(5);
  const Rule gi = gauss_legendre(6);
  const double dq = q.length;
  for (std::size_t iv = 0; iv + 1 < bp.size(); ++iv) {
    const double lo = bp[iv], width = bp[iv + 1] - bp[iv];
    for (std::size_t i = 0; i < go.x.size(); ++i) {
      const double s = lo + go.x[i] * width;
      const Eigen::Vector3d r = p.p0 + s * p.t;
      const Eigen::Vector3d d = r - q.p0;
      const double s0 = d.dot(q.t);
      const double rho2 = std::max(d.squaredNorm() - s0 * s0, 0.0) + a2;
      const double rho = std::sqrt(rho2);
      // MOM-NOTES §2: ∫ds'/R and ∫s'ds'/R in closed form.
      const double l0 = std::asinh((dq - s0) / rho) + std::asinh(s0 / rho);
      const double l1 = std::sqrt((dq - s0) * (dq - s0) + rho2) - std::sqrt(s0 * s0 + rho2) + s0 * l0;
      cd m0 = l0, m1 = l1 / dq;
      for (std::size_t j = 0; j < gi.x.size(); ++j) {
        const double sp = gi.x[j] * dq;
        const double rr = std::sqrt((s0 - sp) * (s0 - sp) + rho2);
        // (e^{−jkR} − 1)/R, written to keep accuracy for small kR.
        const double x = k * rr;
        const cd smooth = x < 1e-3 ? cd(-0.5 * k * x, -k * (1.0 - x * x / 6.0))
                                   : (std::exp(cd(0.0, -x)) - 1.0) / rr;
        const double wj = gi.w[j] * dq;
        m0 += wj * smooth;
        m1 += wj * gi.x[j] * smooth;
      }
      m0 /= 4.0 * pi;
      m1 /= 4.0 * pi;
      const cd j0 = m0 - m1, j1 = m1;
      const double wo = go.w[i] * width;
      const double n1 = s / p.length, n0 = 1.0 - n1;
      out.s[0][0] += wo * n0 * j0;
      out.s[0][1] += wo * n0 * j1;
      out.s[1][0] += wo * n1 * j0;
      out.s[1][1] += wo * n1 * j1;
      out.t += wo * m0;
    }
  }
  return out;
}

void segment_field(const Eigen::Vector3d& r, const Line& seg, cd ia, cd ib, double k, double omega,
                   Eigen::Vector3cd& e, Eigen::Vector3cd& h) {
  double sc = 0.0;
  const double dist = point_segment_distance(r, seg, sc);
  const cd charge = -(ib - ia) / (cd(0.0, omega) * seg.length);  // line charge density, C/m
  Eigen::Vector3cd a_int = Eigen::Vector3cd::Zero();   // ∫ I G t ds (times μ0 later)
  Eigen::Vector3cd grad_int = Eigen::Vector3cd::Zero();  // ∫ ∇G ds
  Eigen::Vector3cd h_int = Eigen::Vector3cd::Zero();
  auto add = [&](double s, double w) {
    const Eigen::Vector3d rv = r - (seg.p0 + s * seg.t);
    const double rr = rv.norm();
    const cd ex = std::exp(cd(0.0, -k * rr));
    const cd g = ex / (4.0 * pi * rr);
    const cd dg = -(1.0 + cd(0.0, k * rr)) * ex / (4.0 * pi * rr * rr);
    const cd cur = ia + (ib - ia) * (s / seg.length);
    const Eigen::Vector3cd grad = (dg / rr) * rv.cast<cd>();
    a_int += (w * cur * g) * seg.t.cast<cd>();
    grad_int += w * grad;
    // ∇G × t written out: Eigen 3.4's cross() conjugates complex operands.
    const Eigen::Vector3d& t = seg.t;
    h_int += (w * cur) * Eigen::Vector3cd(grad.y() * t.z() - grad.z() * t.y(), grad.z() * t.x() - grad.x() * t.z(),
                                          grad.x() * t.y() - grad.y() * t.x());
  };
  if (dist > 3.0 * seg.length) {
    const Rule g = gauss_legendre(dist > 10.0 * seg.length ? 2 : 4);
    for (std::size_t i = 0; i < g.x.size(); ++i) add(g.x[i] * seg.length, g.w[i] * seg.length);
  } else {
    static thread_local std::vector<double> bp;
    const double cc[1] = {sc};
    const double hh[1] = {std::max(dist, 1e-12)};
    graded(seg.length, cc, hh, bp);
    const Rule g = gauss_legendre(6);
    for (std::size_t iv = 0; iv + 1 < bp.size(); ++iv) {
      const double lo = bp[iv], width = bp[iv + 1] - bp[iv];
      for (std::size_t i = 0; i < g.x.size(); ++i) add(lo + g.x[i] * width, g.w[i] * width);
    }
  }
  e = cd(0.0, -omega * constants::mu0) * a_int - (charge / constants::eps0) * grad_int;
  h = h_int;
}

}  // namespace standoff::em::kernel
