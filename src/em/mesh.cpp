#include "em/mesh.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>
#include <sstream>

#include "core/error.hpp"
#include "core/segment_distance.hpp"

namespace standoff::em {
namespace {

std::string wire_name(const Model& m, std::size_t w) {
  if (!m.wires[w].name.empty()) return m.wires[w].name;
  return "wire " + std::to_string(w + 1);
}

[[noreturn]] void fail(const std::string& field, const std::string& message) {
  throw InputError(Where{"antenna model", 0, field}, message);
}

std::string fmt_m(double v) {
  std::ostringstream s;
  s.precision(4);
  s << v << " m";
  return s.str();
}


// Segment count that puts a node as close as possible to every fractional position in `pos`.
int fit_nodes(int n, const std::vector<double>& pos) {
  if (pos.empty()) return n;
  int best = n;
  double best_err = 1e300;
  for (int m = n; m <= 2 * n + 1; ++m) {
    double err = 0.0;
    for (double p : pos) err = std::max(err, std::abs(p * m - std::round(p * m)) / m);
    if (err < best_err - 1e-12) {
      best_err = err;
      best = m;
    }
    if (err < 1e-9) break;
  }
  return best;
}

}  // namespace

Mesh build_mesh(const Model& model, double max_segment_wavelengths, std::size_t max_unknowns) {
  Mesh mesh;
  const double f = model.frequency_hz;
  if (!(std::isfinite(f) && f > 0.0)) fail("frequency", "must be a positive, finite frequency");
  const double lambda = constants::c0 / f;
  mesh.k = 2.0 * constants::pi / lambda;
  mesh.omega = 2.0 * constants::pi * f;
  if (model.wires.empty()) fail("wires", "the antenna has no wires");
  const bool has_ground = model.ground.kind != GroundKind::free_space;
  if (model.ground.kind == GroundKind::real &&
      !(std::isfinite(model.ground.eps_r) && model.ground.eps_r >= 1.0 && std::isfinite(model.ground.sigma_s_per_m) &&
        model.ground.sigma_s_per_m >= 0.0))
    fail("ground", "relative permittivity must be >= 1 and conductivity >= 0");

  const std::size_t nw = model.wires.size();
  // Positions of feeds and loads per wire, for choosing node positions.
  std::vector<std::vector<double>> marks(nw);
  auto check_mark = [&](std::size_t wire, double pos, const std::string& what) {
    if (wire >= nw) fail(what, "refers to wire " + std::to_string(wire + 1) + " but the model has " + std::to_string(nw));
    if (!(std::isfinite(pos) && pos >= 0.0 && pos <= 1.0)) fail(what, "position along the wire must be within 0..1");
    marks[wire].push_back(pos);
  };
  for (std::size_t i = 0; i < model.feeds.size(); ++i) check_mark(model.feeds[i].wire, model.feeds[i].position, "feed " + std::to_string(i + 1));
  for (std::size_t i = 0; i < model.loads.size(); ++i) check_mark(model.loads[i].wire, model.loads[i].position, "load " + std::to_string(i + 1));
  if (model.feeds.empty()) fail("feeds", "the antenna has no feed");

  // Per-wire checks and segmentation.
  mesh.first_segment.resize(nw);
  mesh.segment_count.resize(nw);
  for (std::size_t w = 0; w < nw; ++w) {
    const Wire& wi = model.wires[w];
    const std::string name = wire_name(model, w);
    if (!(wi.a.allFinite() && wi.b.allFinite())) fail(name, "end points must be finite");
    const double len = (wi.b - wi.a).norm();
    if (!(std::isfinite(wi.radius_m) && wi.radius_m > 0.0)) fail(name, "radius must be positive");
    if (len <= 1e-9 * lambda) fail(name, "zero-length wire");
    if (wi.radius_m > 0.5 * len)
      fail(name, "radius " + fmt_m(wi.radius_m) + " is larger than half the wire length " + fmt_m(len));
    if (!(wi.conductivity_s_per_m > 0.0)) fail(name, "conductivity must be positive (infinity = perfect conductor)");
    if (has_ground) {
      const double tol = std::max(1e-6, 0.5 * wi.radius_m);
      if (std::min(wi.a.z(), wi.b.z()) < -tol) fail(name, "wire below ground (z < 0)");
      if (std::abs(wi.a.z()) < tol && std::abs(wi.b.z()) < tol)
        fail(name, "wire lies on the ground surface: radials on or in the soil are not modelled");
    }
    int n = wi.segments;
    if (n < 0) fail(name, "segment count must be positive (0 = automatic)");
    // Work estimated before anything is allocated (issue 14): the automatic count in double
    // precision, refused against the cap before the cast and before the segments are built.
    const double n_auto = std::ceil(len / (max_segment_wavelengths * lambda) - 1e-9);
    const double n_est = n > 0 ? double(n) : n_auto;
    if (!(double(mesh.segments.size()) + n_est <= double(max_unknowns) + double(nw)))
      fail(name, "the antenna needs about " + std::to_string(static_cast<long long>(std::min(
                           double(mesh.segments.size()) + n_est, 9e18))) +
                           " segments (wire length " + fmt_m(len) + "), more than the cap of " +
                           std::to_string(max_unknowns) + " unknowns (16 N^2 bytes of matrix memory; raise it with "
                           "--max-unknowns)");
    if (n == 0) {
      n = std::max(1, static_cast<int>(n_auto));
      // Keep segment/radius >= 8 where the lambda/10 rule allows it.
      if (len / n < 8.0 * wi.radius_m) {
        const int n8 = std::max(1, static_cast<int>(std::floor(len / (8.0 * wi.radius_m))));
        if (len / n8 <= 0.1 * lambda) n = n8;
      }
      std::vector<double> interior;
      for (double p : marks[w]) interior.push_back(p);
      n = fit_nodes(n, interior);
      if (!marks[w].empty() && n < 2) {
        for (double p : marks[w])
          if (p > 0.0 && p < 1.0) n = 2;
      }
    }
    const double delta = len / n;
    if (delta > 0.1 * lambda * (1 + 1e-9))
      fail(name, "segments of " + fmt_m(delta) + " are longer than lambda/10 = " + fmt_m(0.1 * lambda) + ": use more segments");
    if (delta < 4.0 * wi.radius_m)
      fail(name, "segment length " + fmt_m(delta) + " is less than 4 wire radii (thin-wire kernel invalid): use fewer segments or a thinner wire");
    if (delta < 8.0 * wi.radius_m)
      mesh.warnings.push_back(name + ": segment length is less than 8 wire radii; thin-wire kernel error may exceed 1 %");
    mesh.first_segment[w] = static_cast<int>(mesh.segments.size());
    mesh.segment_count[w] = n;
    const Eigen::Vector3d t = (wi.b - wi.a) / len;
    std::complex<double> zpm{0.0, 0.0};
    if (std::isfinite(wi.conductivity_s_per_m)) {
      // Surface impedance Zs = (1 + j) sqrt(ωμ0/(2σ)) over the circumference (Ramo, Whinnery &
      // Van Duzer, Fields and Waves, §5.16); never below the d.c. resistance 1/(σπa²).
      const double rs = std::sqrt(mesh.omega * constants::mu0 / (2.0 * wi.conductivity_s_per_m));
      const double r_ac = rs / (2.0 * constants::pi * wi.radius_m);
      const double r_dc = 1.0 / (wi.conductivity_s_per_m * constants::pi * wi.radius_m * wi.radius_m);
      zpm = {std::max(r_ac, r_dc), r_ac};
    }
    for (int j = 0; j < n; ++j) {
      Segment s;
      s.p0 = wi.a + (len * j / n) * t;
      s.t = t;
      s.length = delta;
      s.radius = wi.radius_m;
      s.wire = w;
      s.index_on_wire = j;
      s.z_per_m = zpm;
      mesh.segments.push_back(s);
    }
  }

  // Wire ends, clustered into junctions.
  struct End {
    std::size_t wire;
    int which;  // 0 = a, 1 = b
    Eigen::Vector3d p;
  };
  std::vector<End> ends;
  for (std::size_t w = 0; w < nw; ++w) {
    ends.push_back({w, 0, model.wires[w].a});
    ends.push_back({w, 1, model.wires[w].b});
  }
  std::vector<int> parent(ends.size());
  std::iota(parent.begin(), parent.end(), 0);
  auto find = [&](int i) {
    while (parent[i] != i) i = parent[i] = parent[parent[i]];
    return i;
  };
  for (std::size_t i = 0; i < ends.size(); ++i)
    for (std::size_t j = i + 1; j < ends.size(); ++j) {
      if (ends[i].wire == ends[j].wire) continue;
      const double tol = std::max(1e-6, 0.5 * std::min(model.wires[ends[i].wire].radius_m, model.wires[ends[j].wire].radius_m));
      if ((ends[i].p - ends[j].p).norm() < tol) parent[find(static_cast<int>(i))] = find(static_cast<int>(j));
    }
  auto connected = [&](std::size_t w1, std::size_t w2) {
    for (int e1 = 0; e1 < 2; ++e1)
      for (int e2 = 0; e2 < 2; ++e2)
        if (find(static_cast<int>(2 * w1 + e1)) == find(static_cast<int>(2 * w2 + e2))) return true;
    return false;
  };

  // Pairwise checks: overlapping, crossing, too close.
  for (std::size_t i = 0; i < nw; ++i)
    for (std::size_t j = i + 1; j < nw; ++j) {
      const Wire &wi = model.wires[i], &wj = model.wires[j];
      const Eigen::Vector3d ti = (wi.b - wi.a).normalized(), tj = (wj.b - wj.a).normalized();
      const double rsum = wi.radius_m + wj.radius_m;
      const std::string pair = wire_name(model, i) + " and " + wire_name(model, j);
      if (connected(i, j)) {
        // Directions away from each shared junction must not fold back onto each other.
        for (int e1 = 0; e1 < 2; ++e1)
          for (int e2 = 0; e2 < 2; ++e2)
            if (find(static_cast<int>(2 * i + e1)) == find(static_cast<int>(2 * j + e2))) {
              const Eigen::Vector3d ui = e1 == 0 ? ti : Eigen::Vector3d(-ti);
              const Eigen::Vector3d uj = e2 == 0 ? tj : Eigen::Vector3d(-tj);
              if (ui.dot(uj) > 0.999) fail(pair, "overlapping wires (they leave a junction in the same direction)");
            }
        continue;
      }
      const double d = geometry::segment_segment_distance(wi.a, wi.b, wj.a, wj.b);
      const bool parallel = std::abs(ti.dot(tj)) > 0.99;
      if (d < rsum) fail(pair, "overlapping or crossing wires without a junction (join them at a common end point)");
      if (parallel && d < 2.0 * rsum)
        fail(pair, "parallel wires closer than 4 radii (" + fmt_m(d) + " apart): the thin-wire model does not hold");
    }

  // Basis functions on interior nodes.
  for (std::size_t w = 0; w < nw; ++w) {
    const int s0 = mesh.first_segment[w], n = mesh.segment_count[w];
    for (int j = 1; j < n; ++j) {
      Basis b;
      b.pieces[0] = {s0 + j - 1, true, 1.0};
      b.pieces[1] = {s0 + j, false, 1.0};
      b.count = 2;
      mesh.bases.push_back(b);
    }
  }
  // Junctions and ground connections.
  auto end_piece = [&](const End& e, double into_junction) {
    // Piece on the end segment with current `into_junction` (+1 = flowing into the junction).
    const int s0 = mesh.first_segment[e.wire], n = mesh.segment_count[e.wire];
    if (e.which == 1) return BasisPiece{s0 + n - 1, true, into_junction};
    return BasisPiece{s0, false, -into_junction};
  };
  std::vector<std::vector<int>> clusters(ends.size());
  for (std::size_t i = 0; i < ends.size(); ++i) clusters[find(static_cast<int>(i))].push_back(static_cast<int>(i));
  for (const auto& cl : clusters) {
    if (cl.empty()) continue;
    bool grounded = false;
    if (has_ground)
      for (int e : cl)
        if (std::abs(ends[e].p.z()) < std::max(1e-6, 0.5 * model.wires[ends[e].wire].radius_m)) grounded = true;
    if (grounded) {
      for (int e : cl) {
        Basis b;
        b.pieces[0] = end_piece(ends[e], -1.0);  // current flows out of the ground into the wire
        b.count = 1;
        b.grounded = true;
        mesh.bases.push_back(b);
      }
      if (model.ground.kind == GroundKind::real)
        mesh.warnings.push_back(wire_name(model, ends[cl.front()].wire) +
                                " is connected to real ground: the connection is modelled as a perfect ground "
                                "system; ground-return loss is not included (reflection-coefficient approximation)");
      continue;
    }
    for (std::size_t k = 1; k < cl.size(); ++k) {
      Basis b;
      b.pieces[0] = end_piece(ends[cl[0]], +1.0);
      b.pieces[1] = end_piece(ends[cl[k]], -1.0);
      b.count = 2;
      mesh.bases.push_back(b);
    }
  }
  if (mesh.bases.size() > max_unknowns)
    fail("segments", std::to_string(mesh.bases.size()) + " unknowns exceed the memory cap of " +
                         std::to_string(max_unknowns) + " (16 N^2 bytes): use fewer segments or raise the cap with "
                         "--max-unknowns");

  if (model.ground.kind == GroundKind::real) {
    double zmin = 1e300;
    for (std::size_t w = 0; w < nw; ++w) {
      const Wire& wi = model.wires[w];
      const double lo = std::min(wi.a.z(), wi.b.z()), hi = std::max(wi.a.z(), wi.b.z());
      // Ground-connected vertical wires are judged by their upper part.
      zmin = std::min(zmin, lo < 1e-6 ? hi : lo);
    }
    if (zmin < 0.1 * lambda)
      mesh.warnings.push_back("a wire is lower than 0.1 lambda (" + fmt_m(zmin) +
                              ") above real ground: the reflection-coefficient approximation is not reliable there; "
                              "compare with the perfect-ground result");
  }
  if (has_ground)
    for (std::size_t w = 0; w < nw; ++w) {
      const Wire& wi = model.wires[w];
      const double lo = std::min(wi.a.z(), wi.b.z());
      if (lo > 1e-6 && lo < 2.0 * wi.radius_m) fail(wire_name(model, w), "wire closer to the ground than 2 radii");
    }
  return mesh;
}

}  // namespace standoff::em
