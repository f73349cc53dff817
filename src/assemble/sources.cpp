#include "assemble/sources.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>

#include <fmt/format.h>

#include "core/number_text.hpp"
#include "core/constants.hpp"
#include "core/suggest.hpp"
#include "em/builders.hpp"
#include "em/fields.hpp"
#include "io/grounds_toml.hpp"
#include "em/near_field.hpp"
#include "exposure/aperture.hpp"
#include "exposure/screening.hpp"
#include "io/limits_toml.hpp"
#include "power/chain.hpp"
#include "io/power_tables_toml.hpp"
#include "assemble/antenna_model.hpp"

namespace standoff::assemble {

namespace {

constexpr double kEpaFactor = 2.56;  // EPA ground-reflection factor 1.6², FCC OET Bulletin 65 Eq. 7


template <class T>
std::size_t index_of(const std::vector<T>& v, const T* p) {
  return static_cast<std::size_t>(p - v.data());
}

Where where_in(const station::Station& st, const std::string& table, std::size_t index, int line, const std::string& key) {
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

double max_extent(const em::Model& m) {
  double d = 0.0;
  for (const auto& w1 : m.wires)
    for (const auto& w2 : m.wires)
      d = std::max({d, (w1.a - w2.a).norm(), (w1.a - w2.b).norm(), (w1.b - w2.b).norm()});
  return d;
}


// The impedance the feed line sees: the antenna's, through an end-fed antenna's n:1 matching unit
// (an ideal transformer: Z/n). An end-fed wire without a stated ratio is taken with the usual
// 49:1 unit (common practice (no source)) rather than unmatched, which would over-state the line
// loss and so under-state the power radiated.
std::complex<double> line_side_impedance(const station::Antenna& a, std::complex<double> z, std::vector<std::string>& notes) {
  if (a.kind != station::AntennaKind::end_fed_half_wave) return z;
  const double n = a.matching_ratio.value_or(49.0);
  notes.push_back("end-fed matching unit " + significant(n) + ":1" + (a.matching_ratio ? "" : " assumed (not stated)") +
                  ": the line sees the wire's feed impedance / " + significant(n) +
                  "; the unit's own loss is not counted (more power reaches the wire)");
  return z / n;
}

struct Solved {
  std::shared_ptr<const em::Solution> solution;
  std::shared_ptr<const em::NearFieldEvaluator> near;  // built once, shared by its operations
  double gain = 1.0;
  double size_m = 0.0;
  std::vector<std::string> notes;
};

// The zones where people can be, each without its holes and without the keep-out areas that
// keep its tier out (a keep-out area is not evaluated for the people it keeps out).
void add_people_zones(const station::Station& st, exposure::EvaluationInput& in) {
  for (const auto& z : st.site.zones) {
    if (z.kind != station::ZoneKind::people) continue;
    exposure::ZoneInput zi{z.name, z.tier, z.polygon, z.floors_m, z.holes};
    for (const auto& k : st.site.zones) {
      if (k.kind != station::ZoneKind::keep_out) continue;
      if (k.keeps_out == station::KeepsOut::uncontrolled && z.tier != limits::Tier::uncontrolled) continue;
      if (geometry::rings_overlap(k.polygon, z.polygon)) zi.holes.push_back(k.polygon);
    }
    in.zones.push_back(std::move(zi));
  }
}

// The parts of the property (its boundary) that no zone and no keep-out area covers: reported as
// not evaluated, or evaluated at ground level with [site] default_tier. Slivers under 0.5 m² (a
// grid cell's share of rounding) are ignored.
void add_unzoned(const station::Station& st, exposure::EvaluationInput& in, std::vector<std::string>& notes) {
  std::vector<geometry::Area> covered;
  for (const auto& z : st.site.zones) covered.push_back(geometry::Area{z.polygon, z.kind == station::ZoneKind::people ? z.holes : std::vector<exposure::Polygon>{}});
  int n = 0;
  for (const auto& part : geometry::difference(st.site.boundary, covered)) {
    const double a = geometry::area(part);
    if (a < 0.5) continue;
    ++n;
    const auto [lo, hi] = geometry::bounds(part.outer);
    const std::string m2 = fmt::format("{:.0f}", std::ceil(a - 1e-9));  // rounded up: at least this much
    const std::string where = "x " + significant(lo.x_m, 3) + " to " + significant(hi.x_m, 3) + " m, y " + significant(lo.y_m, 3) + " to " +
                              significant(hi.y_m, 3) + " m";
    if (st.site.default_tier) {
      const std::string name = "unzoned part " + std::to_string(n);
      in.zones.push_back({name, *st.site.default_tier, part.outer, {0.0}, part.holes});
      notes.push_back("no zone covers " + m2 + " m² of the property (" + where + "): evaluated as \"" + name +
                      "\" with [site] default_tier = " + limits::to_string(*st.site.default_tier));
    } else {
      notes.push_back("not evaluated: no zone covers " + m2 + " m² of the property (" + where +
                      ") — add a [[zone]] there or give [site] default_tier");
    }
  }
}

// An attic or indoor antenna: the building does not shield, so its floors are evaluated. When no
// zone covers the building's floors, they are added as an uncontrolled zone (the most protective
// tier: anyone may be indoors).
void add_indoor_zones(const station::Station& st, exposure::EvaluationInput& in) {
  std::set<std::string> done;
  for (const auto& a : st.antennas) {
    if (a.inside_building.empty() || !done.insert(a.inside_building).second) continue;
    bool covered = false;
    for (const auto& z : st.site.zones) covered |= z.building == a.inside_building;
    if (covered) continue;
    for (const auto& b : st.site.buildings)
      if (b.name == a.inside_building)
        in.zones.push_back({b.name + " (floors, antenna inside)", limits::Tier::uncontrolled, b.footprint, b.floors_m});
  }
}

}  // namespace

em::Ground em_ground(const std::string& name) {
  // One ground table for the station file and the command line: tables/grounds.toml (ITU-R P.527
  // classes, from memory, verify against ITU-R P.527 Fig. 1; "average" is the antenna literature's
  // convention, MOM-NOTES §4), plus perfect and free-space.
  return em::ground_by_name(name, Where{"station file", 0, "site.ground"});
}

UserTables load_user_tables(const std::string& dir) {
  namespace fs = std::filesystem;
  const Where w{"command line", 0, "--tables"};
  std::error_code ec;
  if (!fs::is_directory(dir, ec)) throw InputError(w, "\"" + dir + "\" is not a directory");
  auto read = [&](const fs::path& p) -> std::optional<std::string> {
    if (!fs::is_regular_file(p, ec)) return std::nullopt;
    std::ifstream in(p, std::ios::binary);
    if (!in) throw InputError(Where{p.string(), 0, ""}, "cannot read the table file");
    std::ostringstream ss;
    ss << in.rdbuf();
    return ss.str();
  };
  UserTables t;
  const fs::path fl = fs::path(dir) / "feedlines.toml";
  const fs::path du = fs::path(dir) / "duty.toml";
  if (auto text = read(fl)) {
    t.feedlines = power::load_feedline_table(*text, fl.string());
    for (const auto& l : t.feedlines->lines)
      if (power::builtin_feedline_table().find(l.name))
        throw InputError(Where{fl.string(), l.source_line, "name"},
                         "line class \"" + l.name + "\" is built in: give the user class another name");
  }
  if (auto text = read(du)) {
    t.duties = power::load_duty_table(*text, du.string());
    for (const auto& m : t.duties->modes)
      if (power::builtin_duty_table().find(m.name))
        throw InputError(Where{du.string(), 0, "name"}, "mode \"" + m.name + "\" is built in: give the user mode another name");
  }
  if (!t.feedlines && !t.duties)
    throw InputError(w, "\"" + dir + "\" holds neither feedlines.toml nor duty.toml");
  return t;
}

Built build(const station::Station& st, const BuildOptions& options) {
  Built out;
  out.standard = options.standard ? *options.standard : st.standard.value_or(limits::Standard::fcc);
  const limits::LimitTable& table = limits::builtin_limit_table_ref(out.standard);
  out.table = &table;
  exposure::EvaluationInput& in = out.input;
  in.station = st.name;
  in.standard = out.standard;
  in.limits_source = table.source();
  add_people_zones(st, in);
  add_unzoned(st, in, out.unzoned);
  add_indoor_zones(st, in);
  for (const auto& p : st.site.points) in.points.push_back({p.name, p.tier, {p.at.x_m, p.at.y_m, p.at.z_m}});

  const power::DutyTable& duties = power::builtin_duty_table();
  const power::FeedLineTable& line_classes = power::builtin_feedline_table();
  const em::Ground site_ground = em_ground(st.site.ground);
  std::map<std::pair<std::string, double>, Solved> solved;  // per antenna and frequency

  bool found = !options.only_operation;
  for (std::size_t oi = 0; oi < st.operations.size(); ++oi) {
    const station::Operation& op = st.operations[oi];
    if (options.only_operation && op.name != *options.only_operation) continue;
    found = true;
    const station::Transmitter& tx = *st.transmitter(op.transmitter);
    const station::Antenna& ant = *st.antenna(op.antenna);
    const station::FeedLine* fl = op.feed_line.empty() ? nullptr : st.feed_line(op.feed_line);
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
    if (!ant.inside_building.empty())
      src.notes.push_back("caution: antenna inside building \"" + ant.inside_building +
                          "\" (attic or indoor): walls and roof do not shield, so the building's floors are "
                          "evaluated; keep people away from the wires and follow local codes and licensed practice");

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
      if (!m && options.user_duties) m = options.user_duties->find(op.mode);
      if (!m)
        throw InputError(where_in(st, "operation", oi, op.line, "mode"),
                         "unknown mode \"" + op.mode + "\"" + did_you_mean(op.mode, split_names(duties.names())) +
                             ": expected one of " + duties.names() +
                             (options.user_duties ? ", " + options.user_duties->names() : std::string()));
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
    std::shared_ptr<const em::Solution> solution;
    std::shared_ptr<const em::NearFieldEvaluator> near;
    double gain = 1.0;
    double size_m = 0.0;
    std::optional<exposure::ApertureRegions> dish;
    std::vector<std::pair<Eigen::Vector3d, Eigen::Vector3d>> wires;
    if (station::is_wire(ant.kind)) {
      auto key = std::make_pair(ant.name, f_hz);
      auto it = solved.find(key);
      if (it == solved.end()) {
        Solved s;
        try {
          em::Model model = antenna_model(ant, f_hz, site_ground, s.notes);
          em::SolveOptions so;
          so.integrate_pattern = false;
          so.max_unknowns = options.max_unknowns;
          auto sol = std::make_shared<em::Solution>(em::solve(model, so));
          s.gain = em::peak_gain(*sol).gain;
          s.size_m = max_extent(sol->model);
          for (const auto& w : sol->warnings) s.notes.push_back("antenna model: " + w);
          s.near = std::make_shared<const em::NearFieldEvaluator>(*sol);
          s.solution = std::move(sol);
        } catch (const InputError& e) {
          const std::string key = antenna_key_for(ant, e);
          const Where wk = where_in(st, "antenna", index_of(st.antennas, &ant), ant.line, key);
          throw InputError(wk, "the antenna cannot be modelled at " + significant(f_hz / 1e6) + " MHz: " + e.what());
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
    } else if (ant.kind == station::AntennaKind::aperture) {
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
      const power::FeedLine* cls = fl->inline_line ? &*fl->inline_line : line_classes.find(fl->line_class);
      if (!cls && options.user_feedlines) cls = options.user_feedlines->find(fl->line_class);
      const Where wl = where_in(st, "feed_line", index_of(st.feed_lines, fl), fl->line, "class");
      if (!cls)
        throw InputError(wl, "unknown feed-line class \"" + fl->line_class + "\"" +
                                 did_you_mean(fl->line_class, split_names(line_classes.names())) + ": expected one of " +
                                 line_classes.names() +
                                 (options.user_feedlines ? ", " + options.user_feedlines->names() : std::string()));
      power::LoadSpec load = power::LoadSpec::matched_load();
      if (fl->swr) load = power::LoadSpec::from_swr(*fl->swr);
      else if (solution) load = power::LoadSpec::from_impedance(line_side_impedance(ant, solution->impedance(), src.notes));
      else src.notes.push_back("SWR at the antenna not stated: a matched line assumed (least loss, most power)");
      ci.line = power::LineSpec{*cls, fl->length, load};
    }

    // Power chain for each tier's averaging window; the field is computed at the larger power.
    power::PowerChain chain_c, chain_u;
    try {
      chain_c = power::power_chain(ci, lim.controlled.averaging);
      chain_u = power::power_chain(ci, lim.uncontrolled.averaging);
    } catch (const InputError& e) {
      const std::string key = e.where().field == "load" ? (fl && fl->swr ? "swr" : "class") : "class";
      const Where wl = fl ? where_in(st, "feed_line", index_of(st.feed_lines, fl), fl->line, key) : wf;
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
      src.notes.push_back("average power " + significant(other.average_at_antenna.value()) + " W over the " +
                          significant(other.window.value() / 60.0) + " min window of the other tier (ratios use each tier's own window)");
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
      src.notes.push_back("points closer than λ/2π = " + significant(lambda / (2.0 * constants::pi), 3) +
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
    out.details.push_back({solution, {chain_c.average_at_transmitter.value(), chain_u.average_at_transmitter.value()},
                           ci.line});
  }
  if (!found)
    throw InputError(Where{"command line", 0, "--operation"},
                     "no operation named \"" + *options.only_operation + "\" in " + st.file);
  return out;
}

}  // namespace standoff::assemble
