#include "em/builders.hpp"

#include <algorithm>
#include <cmath>

#include "core/error.hpp"

namespace standoff::em {
namespace {

constexpr double pi = constants::pi;

[[noreturn]] void fail(const std::string& field, const std::string& message) {
  throw InputError(Where{"antenna model", 0, field}, message);
}

// Horizontal unit vector at an azimuth clockwise from north (+y).
Eigen::Vector3d horizontal(double az) { return {std::sin(az), std::cos(az), 0.0}; }

Wire make_wire(const Eigen::Vector3d& a, const Eigen::Vector3d& b, const Conductor& c, std::string name) {
  Wire w;
  w.a = a;
  w.b = b;
  w.radius_m = c.radius_m;
  w.conductivity_s_per_m = c.conductivity_s_per_m;
  w.name = std::move(name);
  return w;
}

void check_positive(double v, const std::string& field) {
  if (!(std::isfinite(v) && v > 0.0)) fail(field, "must be positive");
}

Model base_model(double f, const Ground& g) {
  check_positive(f, "frequency");
  Model m;
  m.frequency_hz = f;
  m.ground = g;
  return m;
}

}  // namespace

double awg_radius_m(int gauge) {
  if (gauge < -3 || gauge > 40) fail("gauge", "AWG gauge must be within 0000 (-3) .. 40");
  // ASTM B258 definition of the American Wire Gauge.
  return 0.5 * 0.127e-3 * std::pow(92.0, (36.0 - gauge) / 39.0);
}

Model dipole(double f, double length_m, const Placement& at, const Conductor& wire, const Ground& ground) {
  Model m = base_model(f, ground);
  check_positive(length_m, "length");
  const Eigen::Vector3d c(at.x_m, at.y_m, at.height_m), u = horizontal(at.azimuth_rad);
  m.wires.push_back(make_wire(c - 0.5 * length_m * u, c + 0.5 * length_m * u, wire, "dipole"));
  m.feeds.push_back({0, 0.5, {1.0, 0.0}});
  return m;
}

Model folded_dipole(double f, double length_m, double spacing_m, const Placement& at, const Conductor& wire,
                    const Conductor& wire2, const Ground& ground) {
  Model m = base_model(f, ground);
  check_positive(length_m, "length");
  check_positive(spacing_m, "spacing");
  const Eigen::Vector3d c(at.x_m, at.y_m, at.height_m), u = horizontal(at.azimuth_rad), up(0, 0, spacing_m);
  const Eigen::Vector3d a = c - 0.5 * length_m * u, b = c + 0.5 * length_m * u;
  Conductor stub = wire;
  stub.radius_m = std::min(wire.radius_m, wire2.radius_m);
  m.wires.push_back(make_wire(a, b, wire, "fed conductor"));
  m.wires.push_back(make_wire(b + up, a + up, wire2, "second conductor"));
  m.wires.push_back(make_wire(b, b + up, stub, "end link 1"));
  m.wires.push_back(make_wire(a + up, a, stub, "end link 2"));
  m.feeds.push_back({0, 0.5, {1.0, 0.0}});
  return m;
}

Model inverted_v(double f, double length_m, double droop_rad, const Placement& at, const Conductor& wire,
                 const Ground& ground) {
  Model m = base_model(f, ground);
  check_positive(length_m, "length");
  if (!(droop_rad >= 0.0 && droop_rad < 0.5 * pi)) fail("droop", "leg droop must be within 0..90 degrees");
  const Eigen::Vector3d apex(at.x_m, at.y_m, at.height_m), u = horizontal(at.azimuth_rad);
  const Eigen::Vector3d down(0, 0, -std::sin(droop_rad));
  const double leg = 0.5 * length_m;
  const Eigen::Vector3d e1 = apex + leg * (-std::cos(droop_rad) * u + down);
  const Eigen::Vector3d e2 = apex + leg * (std::cos(droop_rad) * u + down);
  m.wires.push_back(make_wire(e1, apex, wire, "leg 1"));
  m.wires.push_back(make_wire(apex, e2, wire, "leg 2"));
  m.feeds.push_back({0, 1.0, {1.0, 0.0}});
  return m;
}

Model monopole(double f, double length_m, const Placement& at, const Conductor& wire, const Ground& ground,
               int radials, double radial_length_m, double radial_droop_rad) {
  Model m = base_model(f, ground);
  check_positive(length_m, "length");
  const Eigen::Vector3d base(at.x_m, at.y_m, std::max(0.0, at.height_m));
  m.wires.push_back(make_wire(base, base + Eigen::Vector3d(0, 0, length_m), wire, "radiator"));
  if (at.height_m <= 0.0) {
    if (ground.kind == GroundKind::free_space)
      fail("ground", "a monopole fed against the ground needs a ground (perfect or a soil class)");
  } else {
    if (radials < 1) fail("radials", "an elevated monopole needs at least one radial");
    check_positive(radial_length_m, "radial length");
    for (int i = 0; i < radials; ++i) {
      const double az = at.azimuth_rad + 2.0 * pi * i / radials;
      const Eigen::Vector3d dir = std::cos(radial_droop_rad) * horizontal(az) - std::sin(radial_droop_rad) * Eigen::Vector3d::UnitZ();
      m.wires.push_back(make_wire(base, base + radial_length_m * dir, wire, "radial " + std::to_string(i + 1)));
    }
  }
  m.feeds.push_back({0, 0.0, {1.0, 0.0}});
  return m;
}

Model horizontal_loop(double f, double circumference_m, int sides, const Placement& at, const Conductor& wire,
                      const Ground& ground) {
  Model m = base_model(f, ground);
  check_positive(circumference_m, "length");
  if (sides < 3) fail("sides", "a loop needs at least 3 sides");
  const double side = circumference_m / sides;
  const double r = side / (2.0 * std::sin(pi / sides));
  const Eigen::Vector3d c(at.x_m, at.y_m, at.height_m);
  std::vector<Eigen::Vector3d> v;
  for (int i = 0; i < sides; ++i) v.push_back(c + r * horizontal(at.azimuth_rad + 2.0 * pi * (i - 0.5) / sides));
  for (int i = 0; i < sides; ++i) m.wires.push_back(make_wire(v[i], v[(i + 1) % sides], wire, "side " + std::to_string(i + 1)));
  m.feeds.push_back({0, 0.5, {1.0, 0.0}});
  return m;
}

YagiSpec default_yagi(double f, int elements) {
  check_positive(f, "frequency");
  const double lam = constants::c0 / f;
  // Common practice (no source): starting dimensions, to be trimmed with --resonate.
  YagiSpec s;
  s.driven_length_m = 0.47 * lam;
  s.reflector_length_m = 0.50 * lam;
  s.reflector_spacing_m = 0.20 * lam;
  if (elements >= 3) {
    s.director_length_m = 0.44 * lam;
    s.director_spacing_m = 0.15 * lam;
  }
  return s;
}

Model yagi(double f, int elements, const YagiSpec& given, const Placement& at, const Conductor& wire, const Ground& ground) {
  Model m = base_model(f, ground);
  if (elements != 2 && elements != 3) fail("elements", "a Yagi here has 2 or 3 elements");
  YagiSpec s = default_yagi(f, elements);
  if (given.driven_length_m > 0) s.driven_length_m = given.driven_length_m;
  if (given.reflector_length_m > 0) s.reflector_length_m = given.reflector_length_m;
  if (given.reflector_spacing_m > 0) s.reflector_spacing_m = given.reflector_spacing_m;
  if (given.director_length_m > 0) s.director_length_m = given.director_length_m;
  if (given.director_spacing_m > 0) s.director_spacing_m = given.director_spacing_m;
  const Eigen::Vector3d c(at.x_m, at.y_m, at.height_m), d = horizontal(at.azimuth_rad);
  const Eigen::Vector3d u = horizontal(at.azimuth_rad + 0.5 * pi);
  auto element = [&](const Eigen::Vector3d& centre, double len, const char* name) {
    m.wires.push_back(make_wire(centre - 0.5 * len * u, centre + 0.5 * len * u, wire, name));
  };
  element(c, s.driven_length_m, "driven element");
  element(c - s.reflector_spacing_m * d, s.reflector_length_m, "reflector");
  if (elements == 3) element(c + s.director_spacing_m * d, s.director_length_m, "director");
  m.feeds.push_back({0, 0.5, {1.0, 0.0}});
  return m;
}

Model free_form(double f, std::vector<Wire> wires, std::vector<Feed> feeds, const Ground& ground, std::vector<Load> loads) {
  Model m = base_model(f, ground);
  m.wires = std::move(wires);
  m.feeds = std::move(feeds);
  m.loads = std::move(loads);
  return m;
}

Resonance resonate(const std::function<Model(double)>& build, double l0, const SolveOptions& options) {
  check_positive(l0, "length");
  // Keep the segment counts of the first model so that X(L) is smooth.
  Model first = build(l0);
  Solution s0 = solve(first, options);
  std::vector<int> counts;
  for (const Wire& w : s0.model.wires) counts.push_back(w.segments);
  auto run = [&](double len) {
    Model m = build(len);
    if (m.wires.size() == counts.size())
      for (std::size_t i = 0; i < counts.size(); ++i) m.wires[i].segments = counts[i];
    return solve(m, options);
  };
  double la = l0, lb = 1.03 * l0;
  double xa = s0.impedance().imag();
  Solution sb = run(lb);
  double xb = sb.impedance().imag();
  for (int it = 1; it <= 40; ++it) {
    if (std::abs(xb) < 1e-3 || std::abs(lb - la) < 1e-9 * l0) return {lb, sb.impedance(), sb, it};
    if (xb == xa) break;
    double ln = lb - xb * (lb - la) / (xb - xa);
    ln = std::clamp(ln, 0.5 * l0, 1.5 * l0);
    la = lb;
    xa = xb;
    lb = ln;
    sb = run(lb);
    xb = sb.impedance().imag();
  }
  fail("--resonate", "no length between 0.5 and 1.5 times the starting length gives zero feed reactance");
}

}  // namespace standoff::em
