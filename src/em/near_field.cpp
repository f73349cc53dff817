// Near-field evaluator: the far-rule loop over segments is written so that GCC vectorises it
// (no calls, no branches, structure-of-arrays data; checked with -fopt-info-vec, see
// docs/performance.md). Image segments over real ground get the reflection-coefficient split of
// MOM-NOTES §4 (Balanis §4.8) per segment, in a second vectorised loop.
#include "em/near_field.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "core/constants.hpp"
#include "em/fast_math.hpp"
#include "em/kernel.hpp"
#include "em/mesh.hpp"
#include "em/pattern.hpp"

namespace standoff::em {
namespace {

using cd = std::complex<double>;
constexpr double kInv4Pi = 1.0 / (4.0 * constants::pi);
// The switch distances of kernel::segment_field (in segment lengths): beyond kFar the 2-point rule.
constexpr double kFar = 10.0;
constexpr double kMid = 3.0;  // between kMid and kFar the 4-point rule, closer the graded rule

}  // namespace

NearFieldEvaluator::NearFieldEvaluator(const Solution& sol) {
  const Mesh& mesh = *sol.mesh;
  k_ = mesh.k;
  omega_ = mesh.omega;
  input_power_w_ = sol.input_power_w;
  const GroundKind g = sol.model.ground.kind;
  ground_ = g == GroundKind::free_space ? 0 : g == GroundKind::perfect ? 1 : 2;
  if (ground_ == 2) eps_c_ = detail::ground_eps_c(sol.model);
  const auto sc = segment_currents(sol);
  n_direct_ = sc.size();
  const kernel::Rule rule2 = kernel::gauss_legendre(2), rule4 = kernel::gauss_legendre(4);
  auto add = [&](const Eigen::Vector3d& p0, const Eigen::Vector3d& t, double len, double radius, cd ia, cd ib) {
    x0_.push_back(p0.x());
    y0_.push_back(p0.y());
    z0_.push_back(p0.z());
    tx_.push_back(t.x());
    ty_.push_back(t.y());
    tz_.push_back(t.z());
    len_.push_back(len);
    rad3_.push_back(3.0 * radius);
    const Eigen::Vector3d c = p0 + 0.5 * len * t;
    cx_.push_back(c.x());
    cy_.push_back(c.y());
    cz_.push_back(c.z());
    ia_.push_back(ia);
    ib_.push_back(ib);
    const cd charge = -(ib - ia) / (cd(0.0, omega_) * len);  // line charge density, C/m
    for (int q = 0; q < kNodeSets; ++q) {
      const kernel::Rule& rule = q < 2 ? rule2 : rule4;
      const auto i = static_cast<std::size_t>(q < 2 ? q : q - 2);
      const double u = rule.x[i], w = rule.w[i] * len;
      const Eigen::Vector3d n = p0 + (u * len) * t;
      nx_[q].push_back(n.x());
      ny_[q].push_back(n.y());
      nz_[q].push_back(n.z());
      const cd a = w * (ia + (ib - ia) * u);
      const cd b = w * charge / constants::eps0;
      are_[q].push_back(a.real());
      aim_[q].push_back(a.imag());
      bre_[q].push_back(b.real());
      bim_[q].push_back(b.imag());
    }
  };
  for (std::size_t i = 0; i < sc.size(); ++i) {
    const Segment& s = mesh.segments[i];
    add(s.p0, s.t, s.length, s.radius, sc[i].i_start, sc[i].i_end);
  }
  if (ground_ != 0)
    for (std::size_t i = 0; i < sc.size(); ++i) {
      const Segment& s = mesh.segments[i];
      // Perfect-ground image: mirrored geometry, current reversed along the mirrored direction.
      add(Eigen::Vector3d(s.p0.x(), s.p0.y(), -s.p0.z()), Eigen::Vector3d(s.t.x(), s.t.y(), -s.t.z()), s.length,
          s.radius, -sc[i].i_start, -sc[i].i_end);
    }
}

std::vector<FieldPoint> NearFieldEvaluator::evaluate(std::span<const Eigen::Vector3d> points,
                                                     double input_power_w) const {
  std::vector<FieldPoint> out(points.size());
  evaluate(points, input_power_w, out);
  return out;
}

void NearFieldEvaluator::evaluate(std::span<const Eigen::Vector3d> points, double input_power_w,
                                  std::span<FieldPoint> out) const {
  const double scale = input_power_w_ > 0.0 ? std::sqrt(input_power_w / (2.0 * input_power_w_)) : 0.0;
  std::vector<double> work;  // per-segment scratch, reused across the points of this call
  for (std::size_t i = 0; i < points.size(); ++i) point_field(points[i], scale, out[i], work);
}

// Compiled twice on x86-64 with GCC (AVX2/FMA and the baseline), chosen at load time (ifunc);
// kept out of the sanitizer build as a precaution (ifunc resolvers run before the sanitizer
// runtime is set up; not tried there).
#if defined(__x86_64__) && defined(__GNUC__) && !defined(__clang__) && !defined(__SANITIZE_ADDRESS__)
__attribute__((target_clones("arch=x86-64-v3", "default")))
#endif
void NearFieldEvaluator::point_field(const Eigen::Vector3d& p, double scale, FieldPoint& fp,
                                     std::vector<double>& work) const {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  const std::size_t n = x0_.size();
  auto invalid = [&] {
    fp.e_v_per_m = Eigen::Vector3cd::Constant(cd(nan, nan));
    fp.h_a_per_m = Eigen::Vector3cd::Constant(cd(nan, nan));
    fp.valid = false;
  };
  if (!p.allFinite() || (ground_ != 0 && p.z() < 0.0)) return invalid();
  // Scratch: 12 field components + the class per segment.
  work.resize(13 * n);
  double* exr = work.data();
  double* exi = exr + n;
  double* eyr = exi + n;
  double* eyi = eyr + n;
  double* ezr = eyi + n;
  double* ezi = ezr + n;
  double* hxr = ezi + n;
  double* hxi = hxr + n;
  double* hyr = hxi + n;
  double* hyi = hyr + n;
  double* hzr = hyi + n;
  double* hzi = hzr + n;
  double* cls = hzi + n;  // 0: 2-point rule, 1: 4-point rule, 2: graded rule, 3: too close (invalid)
  const double px = p.x(), py = p.y(), pz = p.z();
  const double k = k_, wmu = omega_ * constants::mu0;

  // Pass 1 (vectorised): distance to each segment and its class.
  const double* x0 = x0_.data();
  const double* y0 = y0_.data();
  const double* z0 = z0_.data();
  const double* tx = tx_.data();
  const double* ty = ty_.data();
  const double* tz = tz_.data();
  const double* len = len_.data();
  const double* rad3 = rad3_.data();
  double n_mid = 0.0;
#pragma omp simd reduction(+ : n_mid)
  for (std::size_t j = 0; j < n; ++j) {
    const double dx = px - x0[j], dy = py - y0[j], dz = pz - z0[j];
    const double proj = dx * tx[j] + dy * ty[j] + dz * tz[j];
    const double along = proj < 0.0 ? 0.0 : proj > len[j] ? len[j] : proj;
    const double qx = dx - along * tx[j], qy = dy - along * ty[j], qz = dz - along * tz[j];
    const double d2 = qx * qx + qy * qy + qz * qz;
    const double l10 = kFar * len[j], l3 = kMid * len[j];
    const double too_close = d2 < rad3[j] * rad3[j] ? 3.0 : 0.0;
    const double near = d2 > l3 * l3 ? 0.0 : 2.0;
    const double mid = d2 > l10 * l10 ? 0.0 : 1.0;
    const double c = too_close > near ? too_close : near;
    cls[j] = c > mid ? c : mid;
    n_mid += cls[j] == 1.0 ? 1.0 : 0.0;
  }
  // Pass 2 (vectorised): the 2-point and (where any segment needs it) 4-point rules, node by node;
  // zero where another rule applies.
  for (int q = 0; q < kNodeSets; ++q) {
    if (q >= 2 && n_mid == 0.0) break;
    const double* nx = nx_[q].data();
    const double* ny = ny_[q].data();
    const double* nz = nz_[q].data();
    const double* are = are_[q].data();
    const double* aim = aim_[q].data();
    const double* bre = bre_[q].data();
    const double* bim = bim_[q].data();
    const double keep = q == 0 ? 0.0 : 1.0;  // the first node overwrites (scratch values are finite)
    const double rule_class = q < 2 ? 0.0 : 1.0;
#pragma omp simd
    for (std::size_t j = 0; j < n; ++j) {
      const double rx = px - nx[j], ry = py - ny[j], rz = pz - nz[j];
      const double r = std::sqrt(rx * rx + ry * ry + rz * rz);
      const double inv = 1.0 / r;
      const double kr = k * r;
      double sn, cs;
      fast_math::sincos(kr, sn, cs);
      // G = (cs − j sn)/(4πr); (dG/dr)/r = −(1 + jkr)(cs − j sn)/(4πr³).
      const double gi4 = inv * kInv4Pi;
      const double gre = cs * gi4, gim = -sn * gi4;
      const double g3 = gi4 * inv * inv;
      const double grr = -(cs + kr * sn) * g3, gri = -(kr * cs - sn) * g3;
      const double ar = are[j], ai = aim[j], br = bre[j], bi = bim[j];
      // −jωμ0·A·G along t; −B·(dG/dr)/r·r⃗; A·(dG/dr)/r·(r⃗ × t).
      const double ur = ar * gre - ai * gim, ui = ar * gim + ai * gre;
      const double etr = wmu * ui, eti = -wmu * ur;
      const double bgr = br * grr - bi * gri, bgi = br * gri + bi * grr;
      const double agr = ar * grr - ai * gri, agi = ar * gri + ai * grr;
      const double cxv = ry * tz[j] - rz * ty[j], cyv = rz * tx[j] - rx * tz[j], czv = rx * ty[j] - ry * tx[j];
      // Selected (not multiplied: 0·∞ would be NaN) and summed over the rule's nodes.
      const bool far = cls[j] == rule_class;
      const double v_exr = etr * tx[j] - bgr * rx;
      const double v_exi = eti * tx[j] - bgi * rx;
      const double v_eyr = etr * ty[j] - bgr * ry;
      const double v_eyi = eti * ty[j] - bgi * ry;
      const double v_ezr = etr * tz[j] - bgr * rz;
      const double v_ezi = eti * tz[j] - bgi * rz;
      const double v_hxr = agr * cxv;
      const double v_hxi = agi * cxv;
      const double v_hyr = agr * cyv;
      const double v_hyi = agi * cyv;
      const double v_hzr = agr * czv;
      const double v_hzi = agi * czv;
      exr[j] = exr[j] * keep + (far ? v_exr : 0.0);
      exi[j] = exi[j] * keep + (far ? v_exi : 0.0);
      eyr[j] = eyr[j] * keep + (far ? v_eyr : 0.0);
      eyi[j] = eyi[j] * keep + (far ? v_eyi : 0.0);
      ezr[j] = ezr[j] * keep + (far ? v_ezr : 0.0);
      ezi[j] = ezi[j] * keep + (far ? v_ezi : 0.0);
      hxr[j] = hxr[j] * keep + (far ? v_hxr : 0.0);
      hxi[j] = hxi[j] * keep + (far ? v_hxi : 0.0);
      hyr[j] = hyr[j] * keep + (far ? v_hyr : 0.0);
      hyi[j] = hyi[j] * keep + (far ? v_hyi : 0.0);
      hzr[j] = hzr[j] * keep + (far ? v_hzr : 0.0);
      hzi[j] = hzi[j] * keep + (far ? v_hzi : 0.0);
    }
  }

  // Pass 3 (scalar, few segments): the graded rule of kernel::segment_field.
  for (std::size_t j = 0; j < n; ++j) {
    if (cls[j] < 2.0) continue;
    if (cls[j] == 3.0) return invalid();
    const kernel::Line line{Eigen::Vector3d(x0_[j], y0_[j], z0_[j]), Eigen::Vector3d(tx_[j], ty_[j], tz_[j]), len_[j]};
    Eigen::Vector3cd es, hs;
    kernel::segment_field(p, line, ia_[j], ib_[j], k_, omega_, es, hs);
    exr[j] = es.x().real();
    exi[j] = es.x().imag();
    eyr[j] = es.y().real();
    eyi[j] = es.y().imag();
    ezr[j] = es.z().real();
    ezi[j] = es.z().imag();
    hxr[j] = hs.x().real();
    hxi[j] = hs.x().imag();
    hyr[j] = hs.y().real();
    hyi[j] = hs.y().imag();
    hzr[j] = hs.z().real();
    hzi[j] = hs.z().imag();
  }

  // Pass 4 (vectorised, real ground only): reflection-coefficient weighting of each image segment's
  // field. The plane of incidence goes through the image segment's centre and the point; E: TE part
  // × (−R_h), TM part × R_v; H: the component normal to the plane belongs to TM (MOM-NOTES §4).
  if (ground_ == 2) {
    const double er = eps_c_.real(), ei = eps_c_.imag();
    const double* cx = cx_.data();
    const double* cy = cy_.data();
    const double* cz = cz_.data();
#pragma omp simd
    for (std::size_t j = n_direct_; j < n; ++j) {
      const double dx = px - cx[j], dy = py - cy[j], dz = pz - cz[j];
      const double dn = std::sqrt(dx * dx + dy * dy + dz * dz);
      const double c = std::clamp(dz / dn, 0.0, 1.0);
      // Principal root of εc − sin²θ = wr + j wi (wr > 0 for εr ≥ 1).
      const double wr = er - (1.0 - c * c), wi = ei;
      const double m = std::sqrt(wr * wr + wi * wi);
      const double sr = std::sqrt(0.5 * (m + wr));
      const double si = wi / (2.0 * sr);
      // R_v = (εc c − √)/(εc c + √), R_h = (c − √)/(c + √).
      const double nvr = er * c - sr, nvi = ei * c - si, dvr = er * c + sr, dvi = ei * c + si;
      const double dv = 1.0 / (dvr * dvr + dvi * dvi);
      const double rvr = (nvr * dvr + nvi * dvi) * dv, rvi = (nvi * dvr - nvr * dvi) * dv;
      const double nhr = c - sr, nhi = -si, dhr = c + sr, dhi = si;
      const double dh = 1.0 / (dhr * dhr + dhi * dhi);
      const double rhr = (nhr * dhr + nhi * dhi) * dh, rhi = (nhi * dhr - nhr * dhi) * dh;
      // φ̂ = ẑ × (dx, dy, 0), or ẑ × t when the point is above the centre, or x̂.
      double fx = -dy, fy = dx;
      double fn = std::sqrt(fx * fx + fy * fy);
      const bool vertical = fn < 1e-12 * dn;
      fx = vertical ? -ty[j] : fx;
      fy = vertical ? tx[j] : fy;
      fn = vertical ? std::sqrt(fx * fx + fy * fy) : fn;
      const bool degenerate = fn < 1e-12;
      fx = degenerate ? 1.0 : fx / fn;
      fy = degenerate ? 0.0 : fy / fn;
      // TE (along φ̂) and TM parts.
      const double ter = fx * exr[j] + fy * eyr[j], tei = fx * exi[j] + fy * eyi[j];
      const double etx_r = ter * fx, etx_i = tei * fx, ety_r = ter * fy, ety_i = tei * fy;
      const double mx_r = exr[j] - etx_r, mx_i = exi[j] - etx_i, my_r = eyr[j] - ety_r, my_i = eyi[j] - ety_i;
      const double mz_r = ezr[j], mz_i = ezi[j];
      // E' = −R_h·E_te + R_v·(E − E_te).
      exr[j] = -(rhr * etx_r - rhi * etx_i) + (rvr * mx_r - rvi * mx_i);
      exi[j] = -(rhr * etx_i + rhi * etx_r) + (rvr * mx_i + rvi * mx_r);
      eyr[j] = -(rhr * ety_r - rhi * ety_i) + (rvr * my_r - rvi * my_i);
      eyi[j] = -(rhr * ety_i + rhi * ety_r) + (rvr * my_i + rvi * my_r);
      ezr[j] = rvr * mz_r - rvi * mz_i;
      ezi[j] = rvr * mz_i + rvi * mz_r;
      // H' = R_v·H_tm − R_h·(H − H_tm), H_tm along φ̂.
      const double thr = fx * hxr[j] + fy * hyr[j], thi = fx * hxi[j] + fy * hyi[j];
      const double htx_r = thr * fx, htx_i = thi * fx, hty_r = thr * fy, hty_i = thi * fy;
      const double gx_r = hxr[j] - htx_r, gx_i = hxi[j] - htx_i, gy_r = hyr[j] - hty_r, gy_i = hyi[j] - hty_i;
      const double gz_r = hzr[j], gz_i = hzi[j];
      hxr[j] = (rvr * htx_r - rvi * htx_i) - (rhr * gx_r - rhi * gx_i);
      hxi[j] = (rvr * htx_i + rvi * htx_r) - (rhr * gx_i + rhi * gx_r);
      hyr[j] = (rvr * hty_r - rvi * hty_i) - (rhr * gy_r - rhi * gy_i);
      hyi[j] = (rvr * hty_i + rvi * hty_r) - (rhr * gy_i + rhi * gy_r);
      hzr[j] = -(rhr * gz_r - rhi * gz_i);
      hzi[j] = -(rhr * gz_i + rhi * gz_r);
    }
  }

  // Pass 5: the sum over segments, in an order fixed by the segment count alone (the same result
  // for any split of the points across threads).
  double a0 = 0, a1 = 0, a2 = 0, a3 = 0, a4 = 0, a5 = 0, a6 = 0, a7 = 0, a8 = 0, a9 = 0, a10 = 0, a11 = 0;
#pragma omp simd reduction(+ : a0, a1, a2, a3, a4, a5, a6, a7, a8, a9, a10, a11)
  for (std::size_t j = 0; j < n; ++j) {
    a0 += exr[j];
    a1 += exi[j];
    a2 += eyr[j];
    a3 += eyi[j];
    a4 += ezr[j];
    a5 += ezi[j];
    a6 += hxr[j];
    a7 += hxi[j];
    a8 += hyr[j];
    a9 += hyi[j];
    a10 += hzr[j];
    a11 += hzi[j];
  }
  const double acc[12] = {a0, a1, a2, a3, a4, a5, a6, a7, a8, a9, a10, a11};
  fp.e_v_per_m = scale * Eigen::Vector3cd(cd(acc[0], acc[1]), cd(acc[2], acc[3]), cd(acc[4], acc[5]));
  fp.h_a_per_m = scale * Eigen::Vector3cd(cd(acc[6], acc[7]), cd(acc[8], acc[9]), cd(acc[10], acc[11]));
  fp.valid = true;
}

}  // namespace standoff::em
