// Notation (MOM-NOTES §1): Z_mn = jωμ ∬ Λ_m Λ_n (t̂_m·t̂_n) G + (1/(jωε)) ∬ Λ'_m Λ'_n G, summed over
// segment pairs of the two triangles; V_m = feed voltage at the node of basis m; Z I = V.
#include "em/solve.hpp"

#include <cmath>

#include <Eigen/LU>

#include "core/error.hpp"
#include "core/parallel.hpp"
#include "em/kernel.hpp"
#include "em/mesh.hpp"
#include "em/pattern.hpp"

namespace standoff::em {
namespace {

using cd = std::complex<double>;

struct PieceRef {
  int basis;
  int shape;     // 0 falling, 1 rising
  double sign;
};

kernel::Line line_of(const Segment& s) { return {s.p0, s.t, s.length}; }
kernel::Line mirror(const kernel::Line& l) {
  return {Eigen::Vector3d(l.p0.x(), l.p0.y(), -l.p0.z()), Eigen::Vector3d(l.t.x(), l.t.y(), -l.t.z()), l.length};
}

// Node (index on its wire) at which a piece has its peak.
int piece_node(const Mesh& mesh, const BasisPiece& p) {
  return mesh.segments[p.segment].index_on_wire + (p.rising ? 1 : 0);
}

// For a node of a wire: each basis whose current passes through that node on that wire, with the
// orientation (+1 when the basis current flows from end a to b there).
std::vector<std::pair<int, double>> node_bases(const Mesh& mesh, std::size_t wire, int node) {
  std::vector<std::pair<int, double>> out;
  for (std::size_t b = 0; b < mesh.bases.size(); ++b) {
    const Basis& bs = mesh.bases[b];
    for (int i = 0; i < bs.count; ++i) {
      const BasisPiece& p = bs.pieces[i];
      if (mesh.segments[p.segment].wire == wire && piece_node(mesh, p) == node) {
        out.emplace_back(static_cast<int>(b), p.sign);
        break;
      }
    }
  }
  return out;
}

}  // namespace

std::vector<std::string> check_geometry(const Model& model, const SolveOptions& options) {
  return build_mesh(model, options.max_segment_wavelengths, options.max_unknowns).warnings;
}

std::vector<SegmentCurrent> segment_currents(const Solution& sol) {
  const Mesh& mesh = *sol.mesh;
  std::vector<SegmentCurrent> out(mesh.segments.size());
  for (std::size_t i = 0; i < mesh.segments.size(); ++i) {
    const Segment& s = mesh.segments[i];
    out[i] = {s.p0, s.p1(), s.wire, {0.0, 0.0}, {0.0, 0.0}};
  }
  for (std::size_t b = 0; b < mesh.bases.size(); ++b) {
    const Basis& bs = mesh.bases[b];
    for (int i = 0; i < bs.count; ++i) {
      const BasisPiece& p = bs.pieces[i];
      const cd c = p.sign * sol.currents[static_cast<Eigen::Index>(b)];
      if (p.rising) out[p.segment].i_end += c;
      else out[p.segment].i_start += c;
    }
  }
  return out;
}

System assemble(const Model& model, const SolveOptions& options) {
  System sys;
  auto mesh_ptr = std::make_shared<Mesh>(build_mesh(model, options.max_segment_wavelengths, options.max_unknowns));
  const Mesh& mesh = *mesh_ptr;
  sys.mesh = mesh_ptr;
  const std::size_t n = mesh.bases.size();
  if (n == 0) throw InputError(Where{"antenna model", 0, "wires"}, "no current can flow: every wire is too short or unconnected");

  const double k = mesh.k, w = mesh.omega;
  const cd jwmu(0.0, w * constants::mu0);
  const cd inv_jweps = 1.0 / cd(0.0, w * constants::eps0);

  const std::size_t ns = mesh.segments.size();
  std::vector<std::vector<PieceRef>> pieces(ns);
  for (std::size_t b = 0; b < n; ++b)
    for (int i = 0; i < mesh.bases[b].count; ++i) {
      const BasisPiece& p = mesh.bases[b].pieces[i];
      pieces[p.segment].push_back({static_cast<int>(b), p.rising ? 1 : 0, p.sign});
    }

  Eigen::MatrixXcd& z = sys.z;
  z = Eigen::MatrixXcd::Zero(static_cast<Eigen::Index>(n), static_cast<Eigen::Index>(n));
  const bool ground = model.ground.kind != GroundKind::free_space;
  const bool real = model.ground.kind == GroundKind::real;
  const cd eps_c = real ? detail::ground_eps_c(model) : cd(1.0, 0.0);

  // Adds the contribution of one segment pair, with vector-potential factor `tt` (t̂_p·t̂_q, or
  // its image counterpart) and scalar-potential factor `qq` (+1 direct, −1 perfect image).
  auto accumulate = [&](std::size_t p, std::size_t q, const kernel::PairIntegrals& in, cd tt, cd qq, bool both) {
    const double dp = mesh.segments[p].length, dq = mesh.segments[q].length;
    for (const PieceRef& m : pieces[p])
      for (const PieceRef& nn : pieces[q]) {
        const double dm = (m.shape == 1 ? 1.0 : -1.0) / dp;
        const double dn = (nn.shape == 1 ? 1.0 : -1.0) / dq;
        const cd v = m.sign * nn.sign * (jwmu * tt * in.s[m.shape][nn.shape] + qq * dm * dn * in.t * inv_jweps);
        z(m.basis, nn.basis) += v;
        if (both) z(nn.basis, m.basis) += v;
      }
  };

  // Segment-pair integrals of a block of rows p (all q ≥ p, direct and image) in parallel
  // (core/parallel.hpp), then added to Z in the serial order below, so Z does not depend on the
  // thread count.
  struct PairTerms {
    kernel::PairIntegrals direct, image;
    cd tt = 0.0, qq = 0.0;  // image factors
  };
  constexpr std::size_t kRowBlock = 32;
  std::vector<std::vector<PairTerms>> block(kRowBlock);
  auto pair_terms = [&](std::size_t p, std::size_t q) {
    PairTerms out;
    const Segment& sp = mesh.segments[p];
    const Segment& sq = mesh.segments[q];
    const double a2 = sp.radius * sq.radius;
    const kernel::Line lp = line_of(sp);
    const kernel::Line lq = line_of(sq);
    out.direct = kernel::pair_integrals(lp, lq, a2, k);
    if (ground) {
      // Image of q: mirrored geometry, current reversed (horizontal components reversed, vertical
      // kept, charge reversed; MOM-NOTES §4).
      const kernel::Line iq = mirror(lq);
      const Eigen::Vector3d u = -iq.t;  // direction of the perfect-image current
      cd tt = sp.t.dot(u);
      cd qq = -1.0;
      if (real) {
        const Eigen::Vector3d d = lp.centre() - iq.centre();
        const double cos_t = d.z() / d.norm();
        const auto [rv, rh] = kernel::reflection(eps_c, cos_t);
        Eigen::Vector3d rho(d.x(), d.y(), 0.0);
        Eigen::Vector3d phi = rho.norm() > 1e-12 * d.norm() ? Eigen::Vector3d(Eigen::Vector3d::UnitZ().cross(rho.normalized()))
                                                            : Eigen::Vector3d(sp.t.cross(Eigen::Vector3d::UnitZ()));
        if (phi.norm() < 1e-12) phi = Eigen::Vector3d::UnitX();
        phi.normalize();
        const Eigen::Vector3d u_te = u.dot(phi) * phi, u_tm = u - u_te;
        // Reflection-coefficient approximation: TE part weighted by −R_h, TM part by R_v.
        tt = -rh * sp.t.dot(u_te) + rv * sp.t.dot(u_tm);
        qq = -rv;
      }
      out.image = kernel::pair_integrals(lp, iq, a2, k);
      out.tt = tt;
      out.qq = qq;
    }
    return out;
  };

  for (std::size_t p0 = 0; p0 < ns; p0 += kRowBlock) {
    const std::size_t rows = std::min(kRowBlock, ns - p0);
    parallel::for_each_index(rows, 1, [&](std::size_t r) {
      const std::size_t p = p0 + r;
      block[r].assign(ns - p, PairTerms{});
      if (pieces[p].empty()) return;
      for (std::size_t q = p; q < ns; ++q)
        if (!pieces[q].empty()) block[r][q - p] = pair_terms(p, q);
    });
    for (std::size_t r = 0; r < rows; ++r) {
      const std::size_t p = p0 + r;
      const Segment& sp = mesh.segments[p];
      if (pieces[p].empty()) continue;
      for (std::size_t q = p; q < ns; ++q) {
        const Segment& sq = mesh.segments[q];
        if (pieces[q].empty()) continue;
        const PairTerms& pt = block[r][q - p];
        accumulate(p, q, pt.direct, sp.t.dot(sq.t), 1.0, p != q);
        if (ground) accumulate(p, q, pt.image, pt.tt, pt.qq, p != q);
      }
      // Conductor loss: ∫ Λ_m Λ_n z' dl on the shared segment (∫N_αN_β = Δ/3 or Δ/6).
      if (sp.z_per_m != cd(0.0, 0.0))
        for (const PieceRef& m : pieces[p])
          for (const PieceRef& nn : pieces[p])
            z(m.basis, nn.basis) += m.sign * nn.sign * sp.z_per_m * sp.length * (m.shape == nn.shape ? 1.0 / 3.0 : 1.0 / 6.0);
    }
  }

  return sys;
}

Solution solve(const Model& model, const SolveOptions& options) {
  Solution sol;
  System sys = assemble(model, options);
  Eigen::MatrixXcd& z = sys.z;
  const Mesh& mesh = *sys.mesh;
  sol.model = model;
  for (std::size_t w = 0; w < model.wires.size(); ++w) sol.model.wires[w].segments = mesh.segment_count[w];
  sol.mesh = sys.mesh;
  sol.warnings = mesh.warnings;
  sol.segments = mesh.segments.size();
  const std::size_t n = mesh.bases.size();
  sol.unknowns = n;
  const std::size_t ns = mesh.segments.size();
  const bool real = model.ground.kind == GroundKind::real;
  auto node_of = [&](std::size_t wire, double pos) {
    return static_cast<int>(std::lround(pos * mesh.segment_count[wire]));
  };
  for (std::size_t i = 0; i < model.loads.size(); ++i) {
    const Load& ld = model.loads[i];
    const auto nb = node_bases(mesh, ld.wire, node_of(ld.wire, ld.position));
    if (nb.empty()) throw InputError(Where{"antenna model", 0, "load " + std::to_string(i + 1)}, "load at a free wire end carries no current");
    for (const auto& [b1, o1] : nb)
      for (const auto& [b2, o2] : nb) z(b1, b2) += o1 * o2 * ld.z_ohm;
  }

  Eigen::VectorXcd v = Eigen::VectorXcd::Zero(static_cast<Eigen::Index>(n));
  std::vector<std::vector<std::pair<int, double>>> feed_bases;
  for (std::size_t i = 0; i < model.feeds.size(); ++i) {
    const Feed& fd = model.feeds[i];
    const int node = node_of(fd.wire, fd.position);
    auto nb = node_bases(mesh, fd.wire, node);
    if (nb.empty()) throw InputError(Where{"antenna model", 0, "feed " + std::to_string(i + 1)}, "feed at a free wire end carries no current");
    const double actual = static_cast<double>(node) / mesh.segment_count[fd.wire];
    if (std::abs(actual - fd.position) > 0.01)
      sol.warnings.push_back("feed " + std::to_string(i + 1) + " moved to the nearest segment node at " +
                             std::to_string(actual) + " of the wire");
    for (const auto& [b, o] : nb) v(b) += o * fd.voltage;
    feed_bases.push_back(std::move(nb));
    sol.feeds.push_back({fd.wire, actual, fd.voltage, {0.0, 0.0}, {0.0, 0.0}});
  }

  Eigen::PartialPivLU<Eigen::MatrixXcd> lu(z);
  sol.currents = lu.solve(v);
  if (!sol.currents.allFinite())
    throw InputError(Where{"antenna model", 0, "wires"}, "the moment-method matrix is singular for this geometry");

  for (std::size_t i = 0; i < sol.feeds.size(); ++i) {
    cd cur = 0.0;
    for (const auto& [b, o] : feed_bases[i]) cur += o * sol.currents(b);
    sol.feeds[i].current = cur;
    sol.feeds[i].impedance_ohm = sol.feeds[i].voltage / cur;
    sol.input_power_w += 0.5 * std::real(sol.feeds[i].voltage * std::conj(cur));
  }
  for (std::size_t i = 0; i < model.loads.size(); ++i) {
    const Load& ld = model.loads[i];
    cd cur = 0.0;
    for (const auto& [b, o] : node_bases(mesh, ld.wire, node_of(ld.wire, ld.position))) cur += o * sol.currents(b);
    sol.load_loss_w += 0.5 * std::real(ld.z_ohm) * std::norm(cur);
  }
  const auto sc = segment_currents(sol);
  for (std::size_t i = 0; i < ns; ++i) {
    const Segment& s = mesh.segments[i];
    // ∫|I|² over a linear current: Δ/3 (|Ia|² + |Ib|² + Re Ia Ib*).
    const double i2 = s.length / 3.0 * (std::norm(sc[i].i_start) + std::norm(sc[i].i_end) + std::real(sc[i].i_start * std::conj(sc[i].i_end)));
    sol.ohmic_loss_w += 0.5 * std::real(s.z_per_m) * i2;
  }
  if (options.integrate_pattern) {
    sol.radiated_power_w = detail::radiated_power(sol);
    sol.efficiency = sol.input_power_w > 0.0 ? sol.radiated_power_w / sol.input_power_w : 0.0;
    if (real) sol.ground_loss_w = std::max(0.0, sol.input_power_w - sol.radiated_power_w - sol.ohmic_loss_w - sol.load_loss_w);
  }
  if (!(sol.input_power_w > 0.0))
    sol.warnings.push_back("the feeds deliver no net power (check feed phases)");
  return sol;
}

}  // namespace standoff::em
