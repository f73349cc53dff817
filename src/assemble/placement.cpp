#include "assemble/placement.hpp"

#include "assemble/installation.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <memory>
#include <set>
#include <sstream>

#include "core/number_text.hpp"
#include "core/constants.hpp"
#include "em/fields.hpp"
#include "io/power_tables_toml.hpp"
#include "io/clearances_toml.hpp"
#include "siting/place_parallel.hpp"
#include "assemble/sources.hpp"

namespace standoff::assemble {

namespace {

constexpr double kAttachRadius_m = 2.0;  // a support within this plan distance of a wire end holds it
constexpr double kGridSpacing_m = 0.5;   // zone grids as `evaluate` (EvaluationOptions default)


exposure::PlanPoint centroid(const exposure::Polygon& p) {
  double a = 0, cx = 0, cy = 0;
  for (std::size_t i = 0; i < p.size(); ++i) {
    const auto& u = p[i];
    const auto& v = p[(i + 1) % p.size()];
    const double cr = u.x_m * v.y_m - v.x_m * u.y_m;
    a += cr;
    cx += (u.x_m + v.x_m) * cr;
    cy += (u.y_m + v.y_m) * cr;
  }
  if (std::abs(a) < 1e-12) return p.empty() ? exposure::PlanPoint{} : p.front();
  return {cx / (3 * a), cy / (3 * a)};
}

// Zone cells: the grid of `evaluate` (cell centres from the zone's bounds, inside the polygon).
std::vector<exposure::PlanPoint> zone_cells(const exposure::Polygon& poly, double s) {
  const auto [lo, hi] = exposure::bounds(poly);
  const int nx = std::max(1, static_cast<int>(std::ceil((hi.x_m - lo.x_m) / s - 1e-9)));
  const int ny = std::max(1, static_cast<int>(std::ceil((hi.y_m - lo.y_m) / s - 1e-9)));
  std::vector<exposure::PlanPoint> out;
  for (int j = 0; j < ny; ++j)
    for (int i = 0; i < nx; ++i) {
      const exposure::PlanPoint c{lo.x_m + s / 2 + i * s, lo.y_m + s / 2 + j * s};
      if (exposure::inside(poly, c)) out.push_back(c);
    }
  return out;
}

bool half_turn_symmetric(const std::vector<std::pair<Eigen::Vector3d, Eigen::Vector3d>>& wires, Eigen::Vector2d c) {
  auto turn = [&](const Eigen::Vector3d& p) { return Eigen::Vector3d(2 * c.x() - p.x(), 2 * c.y() - p.y(), p.z()); };
  for (const auto& [a, b] : wires) {
    const Eigen::Vector3d ta = turn(a), tb = turn(b);
    bool found = false;
    for (const auto& [u, v] : wires)
      if (((u - ta).norm() < 1e-3 && (v - tb).norm() < 1e-3) || ((u - tb).norm() < 1e-3 && (v - ta).norm() < 1e-3))
        found = true;
    if (!found) return false;
  }
  return !wires.empty();
}

}  // namespace

PlaceInput place_input(const station::Station& st, const PlaceOptions& o) {
  PlaceInput pi;
  siting::PlaceSetup& s = pi.setup;

  // The antenna.
  const station::Antenna* ant = nullptr;
  if (o.antenna) {
    ant = st.antenna(*o.antenna);
    if (!ant) throw InputError(Where{"command line", 0, "--antenna"}, "no antenna named \"" + *o.antenna + "\" in " + st.file);
    if (!station::is_wire(ant->kind))
      throw InputError(Where{"command line", 0, "--antenna"},
                       "\"" + ant->name + "\" is a " + to_string(ant->kind) +
                           " (a screening model): the placement search needs a wire antenna modelled by the method of moments");
  } else {
    for (const auto& a : st.antennas)
      if (station::is_wire(a.kind) && std::any_of(st.operations.begin(), st.operations.end(),
                                         [&](const station::Operation& op) { return op.antenna == a.name; })) {
        ant = &a;
        break;
      }
    if (!ant) throw InputError(Where{st.file, 0, "antenna"}, "no wire antenna with an operation to place");
  }
  s.antenna = ant->name;
  pi.antenna = ant->name;
  s.origin = Eigen::Vector2d(ant->position.x_m, ant->position.y_m);
  s.azimuth0_rad = ant->azimuth_rad;
  s.feed_height_m = ant->height_m;

  // Line class to compare (--line).
  const power::FeedLineTable& classes = power::builtin_feedline_table();
  const power::FeedLine* override_line = nullptr;
  if (o.line_class) {
    override_line = classes.find(*o.line_class);
    if (!override_line)
      throw InputError(Where{"command line", 0, "--line"},
                       "unknown feed-line class \"" + *o.line_class + "\": expected one of " + classes.names());
  }

  // Sources of the antenna's operations, one at a time (only this antenna is solved).
  std::map<double, std::shared_ptr<const siting::PlaceMap>> maps;  // by frequency
  std::vector<siting::MapLayer> layers;
  auto layer_of = [&](double z, bool body) {
    for (std::size_t i = 0; i < layers.size(); ++i)
      if (std::abs(layers[i].z_m - z) < 1e-9 && layers[i].body_line == body) return i;
    layers.push_back({z, body});
    return layers.size() - 1;
  };
  bool first = true;
  std::vector<std::pair<Built, std::size_t>> builts;
  for (const auto& op : st.operations) {
    if (op.antenna != ant->name) continue;
    BuildOptions bo;
    bo.standard = o.standard;
    bo.only_operation = op.name;
    Built b = build(st, bo);
    if (first) {
      for (const auto& z : b.input.zones) {
        siting::PlaceZone pz;
        pz.name = z.name;
        pz.tier = z.tier;
        pz.spacing_m = kGridSpacing_m;
        pz.cells = zone_cells(z.polygon, kGridSpacing_m);
        for (double f : z.floors_m) {
          pz.layer = layer_of(f, true);
          s.zones.push_back(pz);
        }
      }
      for (const auto& p : b.input.points)
        s.points.push_back({p.name, p.tier, {p.at.x_m, p.at.y_m}, layer_of(p.at.z_m, false)});
      pi.wires = b.wires.front();
      for (const auto& [a, c] : pi.wires) s.footprint.emplace_back(a.head<2>(), c.head<2>());
      s.half_turn_symmetric = half_turn_symmetric(pi.wires, s.origin);
      first = false;
    }
    builts.emplace_back(std::move(b), 0);
  }
  if (builts.empty()) throw InputError(Where{st.file, ant->line, "antenna"}, "antenna \"" + ant->name + "\" has no operation");

  // Region, routing, supports (needed for the map extent).
  s.region = st.site.boundary;
  for (const auto& b : st.site.buildings) s.keep_out.push_back(b.footprint);
  s.margin_m = o.margin_m;
  s.step_m = o.step_m;
  s.slack = o.slack;
  s.threads = o.threads;
  s.top = o.top;
  s.azimuths_rad = o.azimuths_rad;
  if (s.azimuths_rad.empty())
    for (int k = 0; k < 24; ++k) s.azimuths_rad.push_back(k * constants::pi / 12.0);
  if (st.operating_position) {
    s.operating_position = Eigen::Vector3d(st.operating_position->x_m, st.operating_position->y_m, st.operating_position->z_m);
    pi.operating_position_source = "station file ([station] operating_position, line " +
                                   std::to_string(st.operating_position_line) + ")";
  } else if (!st.site.buildings.empty()) {
    const auto c = centroid(st.site.buildings.front().footprint);
    s.operating_position = Eigen::Vector3d(c.x_m, c.y_m, 0.0);
    pi.operating_position_source = "default: the centre of the first building (\"" + st.site.buildings.front().name +
                                   "\") at ground level — set [station] operating_position";
  } else {
    const auto c = centroid(st.site.boundary);
    s.operating_position = Eigen::Vector3d(c.x_m, c.y_m, 0.0);
    pi.operating_position_source = "default: the centre of the property at ground level — set [station] operating_position";
  }

  // Supports holding the antenna: those standing within 2 m of a wire end or the feed point.
  s.installation.power_lines = st.installation.power_lines;
  s.tables = &siting::builtin_clearance_tables();
  std::vector<Eigen::Vector2d> ends{s.origin};
  for (const auto& [a, b] : s.footprint) {
    ends.push_back(a);
    ends.push_back(b);
  }
  auto near_end = [&](double x, double y) {
    for (const auto& e : ends)
      if (std::hypot(e.x() - x, e.y() - y) <= kAttachRadius_m) return true;
    return false;
  };
  for (const auto& sp : st.installation.supports)
    if (near_end(sp.base.x.value(), sp.base.y.value())) s.supports.push_back(sp);
  for (const auto& sp : st.installation.spans) {
    if (sp.kind != siting::SpanKind::antenna) continue;
    if (near_end(sp.from.x.value(), sp.from.y.value()) && near_end(sp.to.x.value(), sp.to.y.value())) s.spans.push_back(sp);
  }
  if (s.supports.empty()) {
    // None stated: a mast at each wire end (or at the feed point of a single-point antenna) as
    // high as the highest wire point there.
    double top = ant->height_m;
    for (const auto& [a, b] : pi.wires) top = std::max({top, a.z(), b.z()});
    std::vector<Eigen::Vector2d> at;
    if (ant->kind == station::AntennaKind::dipole || ant->kind == station::AntennaKind::inverted_v) {
      for (const auto& [a, b] : s.footprint) {
        for (const auto& e : {a, b}) {
          bool dup = false;
          for (const auto& u : at) dup |= (u - e).norm() < 0.5;
          if (!dup && (e - s.origin).norm() > 0.5) at.push_back(e);
        }
      }
      if (ant->kind == station::AntennaKind::inverted_v) at = {s.origin};
    } else {
      at = {s.origin};
    }
    for (std::size_t k = 0; k < at.size(); ++k) {
      siting::Support sp;
      sp.name = "assumed mast " + std::to_string(k + 1);
      sp.kind = siting::SupportKind::mast;
      sp.base = {units::metres(at[k].x()), units::metres(at[k].y())};
      sp.height = units::metres(top);
      s.supports.push_back(sp);
    }
    pi.notes.push_back("no support of the antenna found in the station file (none within 2 m of a wire end): " +
                       std::to_string(at.size()) + " mast(s) of " + significant(top) + " m assumed at its ends for the "
                       "power-line checks");
  } else {
    std::string names;
    for (const auto& sp : s.supports) names += (names.empty() ? "" : ", ") + sp.name;
    pi.notes.push_back("supports moved with the antenna for the power-line checks: " + names +
                       " (at each candidate they stand for whatever holds the antenna there, of the same height)");
  }
  pi.notes.push_back("the feed-line route itself is not checked against the power lines at the candidates; where the "
                     "antenna stands now (`current`) every check of `standoff lines` on it, its supports and its feed "
                     "lines applies");

  // Maps: one per frequency, covering every plan offset any candidate needs.
  const double extent = siting::required_map_extent(s);
  double half = 4.0;
  for (const auto& [a, b] : s.footprint) half = std::max({half, 2.0 * (a - s.origin).norm(), 2.0 * (b - s.origin).norm()});
  std::string line_name;
  for (auto& [b, _] : builts) {
    const auto& src = b.input.sources.front();
    const auto& lim = b.input.limits.front();
    const auto& det = b.details.front();
    if (!det.solution) throw std::logic_error("place_input: a wire antenna without a MoM solution");
    siting::PlaceOperation op;
    op.name = src.name;
    op.frequency_hz = src.frequency_hz;
    op.pep_w = src.pep_w;
    op.limit[0] = lim.controlled;
    op.limit[1] = lim.uncontrolled;
    for (int t = 0; t < 2; ++t) op.tx_fraction[t] = src.pep_w > 0 ? det.tx_average_w[t] / src.pep_w : 0.0;
    const station::FeedLine* fl = st.operation(src.name)->feed_line.empty() ? nullptr : st.feed_line(st.operation(src.name)->feed_line);
    if (override_line) op.line = *override_line;
    else if (det.line) op.line = det.line->line;
    if (fl) op.current_length_m = fl->length.value();
    if (fl && std::find(pi.feed_lines.begin(), pi.feed_lines.end(), fl->name) == pi.feed_lines.end())
      pi.feed_lines.push_back(fl->name);
    if (fl && fl->swr) op.load = power::LoadSpec::from_swr(*fl->swr);
    else op.load = power::LoadSpec::from_impedance(det.solution->impedance());
    if (op.line) {
      // Refuse up front a class without data at this frequency (the error names the class).
      (void)power::characteristics(*op.line, units::hertz(op.frequency_hz));
      line_name = op.line->name;
    } else {
      pi.notes.push_back(op.name + ": no feed line in the station file and no --line: the antenna is fed without loss");
    }
    auto sol = det.solution;
    op.direct = [sol](std::span<const Eigen::Vector3d> pts) { return em::near_fields(*sol, pts, 1.0); };
    auto it = maps.find(op.frequency_hz);
    if (it == maps.end()) {
      siting::PlaceMapOptions mo;
      mo.half_width_m = half;
      mo.nodes_per_half_width = o.map_nodes_per_half_width;
      mo.extent_m = extent;
      mo.threads = siting::place_thread_count(o.threads);
      it = maps.emplace(op.frequency_hz,
                        std::make_shared<const siting::PlaceMap>(op.direct, s.origin, layers, mo)).first;
    }
    op.map = it->second;
    s.operations.push_back(std::move(op));
  }
  pi.line_class = line_name;
  return pi;
}

void apply_current_installation(const station::Station& st, const PlaceInput& in, siting::PlaceResult& res) {
  // The names of what belongs to the antenna: its own wires, the spans that describe them or its
  // feed lines, and the supports those spans hang from.
  std::set<std::string> subjects;
  for (const auto& sp : st.installation.spans) {
    const bool mine = (sp.antenna && *sp.antenna == in.antenna) ||
                      (sp.feed_line && std::find(in.feed_lines.begin(), in.feed_lines.end(), *sp.feed_line) != in.feed_lines.end());
    if (!mine) continue;
    subjects.insert(sp.name);
    if (sp.from_support) subjects.insert(*sp.from_support);
    if (sp.to_support) subjects.insert(*sp.to_support);
  }
  const auto report = check_installation(st);
  siting::Candidate& cur = res.current;
  for (const auto& c : report.checks) {
    if (c.pass() || c.line.empty()) continue;  // only power-line checks rank (as in the search)
    const bool mine = subjects.count(c.subject) > 0 || c.subject.rfind(in.antenna + ":", 0) == 0;
    if (!mine) continue;
    const std::string text = c.rule + ": " + c.subject + " vs " + c.line;
    if (std::find(cur.failed_checks.begin(), cur.failed_checks.end(), text) != cur.failed_checks.end()) continue;
    cur.failed_checks.push_back(text);
    if (cur.clearance_ok) {
      cur.clearance_ok = false;
      cur.permitted_pep_w = 0.0;
      cur.binding = siting::Binding{};
      cur.binding.kind = "line check";
      cur.binding.rule = c.rule;
      cur.binding.subject = c.subject;
      cur.binding.line = c.line;
      cur.binding.text = "line check: " + text + " (standoff lines, as the station stands)";
    }
  }
}

}  // namespace standoff::assemble
