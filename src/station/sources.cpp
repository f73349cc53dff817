#include "station/sources.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <sstream>

#include "core/constants.hpp"
#include "em/builders.hpp"
#include "em/fields.hpp"
#include "em/near_field.hpp"
#include "exposure/aperture.hpp"
#include "exposure/screening.hpp"
#include "limits/limits_toml.hpp"
#include "power/chain.hpp"
#include "power/power_tables_toml.hpp"

namespace standoff::station {

namespace {

constexpr double kEpaFactor = 2.56;  // EPA ground-reflection factor 1.6², FCC OET Bulletin 65 Eq. 7

std::string num(double v, int precision = 4) {
  std::ostringstream o;
  o.precision(precision);
  o << v;
  return o.str();
}

template <class T>
std::size_t index_of(const std::vector<T>& v, const T* p) {
  return static_cast<std::size_t>(p - v.data());
}

Where where_in(const Station& st, const std::string& table, std::size_t index, int line, const std::string& key) {
  return Where{st.file, line, table + "[" + std::to_string(index) + "]." + key};
}

// Plane-wave fields of a power density S: |E| = √(S·η0), |H| = √(S/η0), E ⟂ H.
em::FieldPoint plane_wave(double s) {
  em::FieldPoint f;
  f.e_v_per_m = Eigen::Vector3cd(std::sqrt(s * constants::eta0), 0.0, 0.0);
  f.h_a_per_m = Eigen::Vector3cd(0.0, std::sqrt(s / constants::eta0), 0.0);
  f.valid = true;
  return f;
}

em::FieldPoint invalid_point() {
  em::FieldPoint f;
  const double nan = std::numeric_limits<double>::quiet_NaN();
  f.e_v_per_m = Eigen::Vector3cd::Constant(nan);
  f.h_a_per_m = Eigen::Vector3cd::Constant(nan);
  f.valid = false;
  return f;
}

// Point source with the main-beam gain in every direction and the EPA ground factor (OET 65
// Eq. 7); points inside r_min (the reactive near field, λ/2π) are not evaluated.
exposure::FieldFunction point_source(Eigen::Vector3d c, double p_w, double gain, double r_min) {
  return [=](std::span<const Eigen::Vector3d> pts) {
    std::vector<em::FieldPoint> out;
    out.reserve(pts.size());
    for (const auto& p : pts) {
      const double r = (p - c).norm();
      if (r < r_min) {
        out.push_back(invalid_point());
        continue;
      }
      out.push_back(plane_wave(kEpaFactor * p_w * gain / (4.0 * constants::pi * r * r)));
    }
    return out;
  };
}

// Aperture antenna: the on-axis density at the point's distance, in every direction (OET 65 §2).
exposure::FieldFunction aperture_source(Eigen::Vector3d c, exposure::ApertureRegions regions, double p_w) {
  return [=](std::span<const Eigen::Vector3d> pts) {
    std::vector<em::FieldPoint> out;
    out.reserve(pts.size());
    for (const auto& p : pts) {
      const double r = (p - c).norm();
      out.push_back(plane_wave(exposure::aperture_density(regions, units::watts(p_w), units::metres(r)).value()));
    }
    return out;
  };
}

em::Model wire_model(const Antenna& a, double f_hz, const em::Ground& ground, std::vector<std::string>& notes) {
  em::Placement at{a.position.x_m, a.position.y_m, a.height_m, a.azimuth_rad};
  em::Conductor wire;
  wire.radius_m = a.wire_diameter_m.value_or(0.002) / 2.0;
  if (!a.wire_diameter_m) notes.push_back("wire diameter not stated: 2 mm assumed");
  switch (a.kind) {
    case AntennaKind::dipole: return em::dipole(f_hz, *a.length_m, at, wire, ground);
    case AntennaKind::inverted_v:
      return em::inverted_v(f_hz, *a.length_m, (constants::pi - *a.apex_angle_rad) / 2.0, at, wire, ground);
    case AntennaKind::vertical:
      if (a.height_m <= 0.0) {
        notes.push_back("ground-mounted vertical: its radial system is modelled as a perfect ground plane "
                        "(usually conservative above ground)");
        return em::monopole(f_hz, *a.length_m, at, wire, em::perfect_ground());
      }
      return em::monopole(f_hz, *a.length_m, at, wire, ground, a.radials, a.radial_length_m.value_or(0.0), 0.0);
    case AntennaKind::yagi: {
      const em::YagiSpec spec = em::default_yagi(*a.band_centre_hz, *a.elements);
      notes.push_back("Yagi element lengths and spacings scaled from the design frequency " +
                      num(*a.band_centre_hz / 1e6) + " MHz (common practice)");
      return em::yagi(f_hz, *a.elements, spec, at, wire, ground);
    }
    default: break;
  }
  throw std::logic_error("wire_model: not a wire antenna");
}

double max_extent(const em::Model& m) {
  double d = 0.0;
  for (const auto& w1 : m.wires)
    for (const auto& w2 : m.wires)
      d = std::max({d, (w1.a - w2.a).norm(), (w1.a - w2.b).norm(), (w1.b - w2.b).norm()});
  return d;
}

struct Solved {
  std::shared_ptr<const em::Solution> solution;
  std::shared_ptr<const em::NearFieldEvaluator> near;  // built once, shared by its operations
  double gain = 1.0;
  double size_m = 0.0;
  std::vector<std::string> notes;
};

}  // namespace

em::Ground em_ground(GroundKind g) {
  // Ground constants: REFERENCES.md §6 after ITU-R P.527 (from memory, verify against ITU-R P.527
  // Figure 1 rows); "average" is the antenna literature's convention (MOM-NOTES §4).
  switch (g) {
    case GroundKind::free_space: return em::free_space();
    case GroundKind::perfect: return em::perfect_ground();
    case GroundKind::average: return em::real_ground(15.0, 0.005, "average ground (εr 15, 0.005 S/m)");
    case GroundKind::poor: return em::real_ground(4.0, 0.001, "poor ground (εr 4, 0.001 S/m)");
    case GroundKind::good: return em::real_ground(25.0, 0.02, "good ground (εr 25, 0.02 S/m)");
    case GroundKind::sea_water: return em::real_ground(70.0, 5.0, "sea water (εr 70, 5 S/m)");
  }
  return em::free_space();
}

Built build(const Station& st, const BuildOptions& options) {
  Built out;
  out.standard = options.standard ? *options.standard : st.standard.value_or(limits::Standard::fcc);
  const limits::LimitTable& table = limits::builtin_limit_table_ref(out.standard);
  out.table = &table;
  exposure::EvaluationInput& in = out.input;
  in.station = st.name;
  in.standard = out.standard;
  in.limits_source = table.source();
  for (const auto& z : st.site.zones) in.zones.push_back({z.name, z.tier, z.polygon, z.floors_m});
  for (const auto& p : st.site.points) in.points.push_back({p.name, p.tier, {p.at.x_m, p.at.y_m, p.at.z_m}});

  const power::DutyTable& duties = power::builtin_duty_table();
  const power::FeedLineTable& line_classes = power::builtin_feedline_table();
  const em::Ground site_ground = em_ground(st.site.ground);
  std::map<std::pair<std::string, double>, Solved> solved;  // per antenna and frequency

  bool found = !options.only_operation;
  for (std::size_t oi = 0; oi < st.operations.size(); ++oi) {
    const Operation& op = st.operations[oi];
    if (options.only_operation && op.name != *options.only_operation) continue;
    found = true;
    const Transmitter& tx = *st.transmitter(op.transmitter);
    const Antenna& ant = *st.antenna(op.antenna);
    const FeedLine* fl = op.feed_line.empty() ? nullptr : st.feed_line(op.feed_line);
    const double f_hz = op.frequency.value();
    const double lambda = constants::c0 / f_hz;

    exposure::SourceInput src;
    src.name = op.name;
    src.transmitter = op.transmitter;
    src.feed_line = op.feed_line;
    src.antenna = op.antenna;
    src.group = op.group;
    src.frequency_hz = f_hz;
    src.pep_w = tx.pep.value();
    src.centre = {ant.position.x_m, ant.position.y_m};

    // Limits at this frequency for both tiers (outside the table: an error, never extrapolated).
    exposure::SourceLimits lim;
    const Where wf = where_in(st, "operation", oi, op.line, "frequency");
    // A table without one tier (e.g. Safety Code 6 here: uncontrolled only) evaluates that tier's
    // zones against the other tier's limits, choosing the stricter (uncontrolled) whenever present.
    const bool has_c = table.find(limits::Tier::controlled) != nullptr;
    const bool has_u = table.find(limits::Tier::uncontrolled) != nullptr;
    if (!has_u)
      throw InputError(Where{st.file, 0, "station.standard"},
                       "the " + limits::to_string(out.standard) +
                           " table has no uncontrolled tier: the public cannot be evaluated with it");
    lim.uncontrolled = limits::lookup(table, limits::Tier::uncontrolled, op.frequency, wf);
    lim.controlled = has_c ? limits::lookup(table, limits::Tier::controlled, op.frequency, wf) : lim.uncontrolled;
    if (!has_c)
      src.notes.push_back("the " + limits::to_string(out.standard) +
                          " table has no controlled tier: controlled zones are evaluated against the uncontrolled "
                          "limits (more protective)");


    // Duty and operating pattern.
    power::ChainInput ci;
    ci.pep = tx.pep;
    ci.frequency = op.frequency;
    if (!op.mode.empty()) {
      const power::DutyMode* m = duties.find(op.mode);
      if (!m)
        throw InputError(where_in(st, "operation", oi, op.line, "mode"),
                         "unknown mode \"" + op.mode + "\": expected one of " + duties.names());
      ci.duty = m->duty;
      ci.duty_source = "mode " + m->name + ", " + m->source;
    } else {
      ci.duty = units::Fraction{*op.duty};
      ci.duty_source = "given";
    }
    if (op.on && op.off && op.off->value() > 0.0)
      ci.pattern = power::OperatingPattern::repeating({{*op.on, true}, {*op.off, false}});
    else {
      ci.pattern = power::OperatingPattern::continuous();
      if (!op.on) src.notes.push_back("no operating pattern given: continuous transmission assumed");
    }

    // Antenna model.
    const Where wa = where_in(st, "antenna", index_of(st.antennas, &ant), ant.line, "kind");
    std::shared_ptr<const em::Solution> solution;
    std::shared_ptr<const em::NearFieldEvaluator> near;
    double gain = 1.0;
    double size_m = 0.0;
    std::optional<exposure::ApertureRegions> dish;
    std::vector<std::pair<Eigen::Vector3d, Eigen::Vector3d>> wires;
    if (is_wire(ant.kind)) {
      auto key = std::make_pair(ant.name, f_hz);
      auto it = solved.find(key);
      if (it == solved.end()) {
        Solved s;
        try {
          em::Model model = wire_model(ant, f_hz, site_ground, s.notes);
          em::SolveOptions so;
          so.integrate_pattern = false;
          auto sol = std::make_shared<em::Solution>(em::solve(model, so));
          s.gain = em::peak_gain(*sol).gain;
          s.size_m = max_extent(sol->model);
          for (const auto& w : sol->warnings) s.notes.push_back("antenna model: " + w);
          s.near = std::make_shared<const em::NearFieldEvaluator>(*sol);
          s.solution = std::move(sol);
        } catch (const InputError& e) {
          throw InputError(wa, "the antenna cannot be modelled at " + num(f_hz / 1e6) + " MHz: " + e.what());
        }
        it = solved.emplace(key, std::move(s)).first;
      }
      solution = it->second.solution;
      near = it->second.near;
      gain = it->second.gain;
      size_m = it->second.size_m;
      for (const auto& n : it->second.notes) src.notes.push_back(n);
      for (const auto& w : solution->model.wires) {
        wires.emplace_back(w.a, w.b);
        src.footprint.push_back({{w.a.x(), w.a.y()}, {w.b.x(), w.b.y()}});
      }
      src.method = "detailed (MoM)";
    } else if (ant.kind == AntennaKind::aperture) {
      exposure::Aperture ap{units::metres(*ant.diameter_m), units::Fraction{ant.efficiency.value_or(0.55)}};
      if (!ant.efficiency) src.notes.push_back("aperture efficiency not stated: 55 % assumed");
      size_m = *ant.diameter_m;
      src.method = "screening (aperture antenna, on-axis values in every direction, OET 65 Section 2)";
      src.notes.push_back(exposure::kApertureVerifyNote);
      dish = exposure::aperture_regions(ap, units::watts(1.0), op.frequency);
      gain = ant.gain ? ant.gain->ratio : dish->gain.ratio;
    } else {
      gain = ant.gain->ratio;
      size_m = ant.length_m.value_or(0.0);
      src.method = "screening (point source, main-beam gain in every direction, EPA ground factor 2.56, OET 65 Eq. 7)";
      src.notes.push_back("screening model over-predicts in the antenna's near field (OET 65 Section 2)");
    }
    if (src.footprint.empty()) src.footprint.push_back({src.centre, src.centre});
    ci.gain = units::Gain{gain};

    // Feed line, with the antenna's own impedance when it is modelled.
    if (fl) {
      const power::FeedLine* cls = line_classes.find(fl->line_class);
      const Where wl = where_in(st, "feed_line", index_of(st.feed_lines, fl), fl->line, "class");
      if (!cls)
        throw InputError(wl, "unknown feed-line class \"" + fl->line_class + "\": expected one of " + line_classes.names());
      power::LoadSpec load = power::LoadSpec::matched_load();
      if (fl->swr) load = power::LoadSpec::from_swr(*fl->swr);
      else if (solution) load = power::LoadSpec::from_impedance(solution->impedance());
      else src.notes.push_back("SWR at the antenna not stated: a matched line assumed (least loss, most power)");
      ci.line = power::LineSpec{*cls, fl->length, load};
    }

    // Power chain for each tier's averaging window; the field is computed at the larger power.
    power::PowerChain chain_c, chain_u;
    try {
      chain_c = power::power_chain(ci, lim.controlled.averaging);
      chain_u = power::power_chain(ci, lim.uncontrolled.averaging);
    } catch (const InputError& e) {
      const Where wl = fl ? where_in(st, "feed_line", index_of(st.feed_lines, fl), fl->line, "class") : wf;
      throw InputError(wl, e.message());
    }
    const double p_c = chain_c.average_at_antenna.value();
    const double p_u = chain_u.average_at_antenna.value();
    const double p = std::max(p_c, p_u);
    const power::PowerChain& chain = p_c >= p_u ? chain_c : chain_u;
    const power::PowerChain& other = p_c >= p_u ? chain_u : chain_c;
    lim.scale_controlled = p > 0.0 ? p_c / p : 1.0;
    lim.scale_uncontrolled = p > 0.0 ? p_u / p : 1.0;
    for (const auto& s : chain.steps) src.chain.push_back({s.name, s.power.value(), s.detail});
    src.average_power_w = p;
    if (std::abs(p_c - p_u) > 1e-12 * p)
      src.notes.push_back("average power " + num(other.average_at_antenna.value()) + " W over the " +
                          num(other.window.value() / 60.0) + " min window of the other tier (ratios use each tier's own window)");
    if (!chain.evaluated)
      for (const auto& n : chain.notes) src.notes.push_back(n);

    // Field function at power p.
    const Eigen::Vector3d phase_centre(ant.position.x_m, ant.position.y_m, ant.height_m);
    if (solution) {
      src.field = [near, p](std::span<const Eigen::Vector3d> pts) { return near->evaluate(pts, p); };
    } else if (dish) {
      exposure::Aperture ap{units::metres(*ant.diameter_m), units::Fraction{ant.efficiency.value_or(0.55)}};
      src.field = aperture_source(phase_centre, exposure::aperture_regions(ap, units::watts(p), op.frequency), p);
    } else {
      src.field = point_source(phase_centre, p, gain, lambda / (2.0 * constants::pi));
      src.notes.push_back("points closer than λ/2π = " + num(lambda / (2.0 * constants::pi), 3) +
                          " m to the antenna are not evaluated (reactive near field)");
    }

    // Screening distances (OET 65 Eq. 7 with the EPA ground factor; aperture formulas for dishes).
    double max_screen = 0.0;
    for (int t = 0; t < 2; ++t) {
      const limits::Tier tier = t == 0 ? limits::Tier::controlled : limits::Tier::uncontrolled;
      const double pt = t == 0 ? p_c : p_u;
      double d = 0.0;
      if (dish) {
        exposure::Aperture ap{units::metres(*ant.diameter_m), units::Fraction{ant.efficiency.value_or(0.55)}};
        const auto regions = exposure::aperture_regions(ap, units::watts(pt), op.frequency);
        const auto lim_s = exposure::screening_density_limit(lim[tier]).s;
        d = exposure::aperture_compliance_distance(regions, units::watts(pt), lim_s).distance.value();
      } else {
        std::optional<units::Length> size;
        if (size_m > 0.0) size = units::metres(size_m);
        const auto sd = exposure::screening_distance(units::watts(pt), units::Gain{gain}, exposure::GroundFactor::epa,
                                                     lim[tier], size);
        d = sd.distance.value();
      }
      d = exposure::ceil_to(d, 0.1);
      max_screen = std::max(max_screen, d);
      if (t == 0) src.screening_distance.controlled_m = d;
      else src.screening_distance.uncontrolled_m = d;
    }
    src.max_search_distance_m = std::min(300.0, std::max(20.0, std::ceil(1.5 * max_screen)));

    in.sources.push_back(std::move(src));
    in.limits.push_back(lim);
    out.wires.push_back(std::move(wires));
  }
  if (!found)
    throw InputError(Where{"command line", 0, "--operation"},
                     "no operation named \"" + *options.only_operation + "\" in " + st.file);
  return out;
}

}  // namespace standoff::station
