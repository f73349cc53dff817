#include "assemble/installation.hpp"

#include <algorithm>
#include <cmath>
#include <optional>

#include <fmt/format.h>

#include "core/constants.hpp"
#include "core/error.hpp"
#include "em/builders.hpp"
#include "io/clearances_toml.hpp"
#include "assemble/antenna_model.hpp"

namespace standoff::assemble {

namespace {

using Vec3 = Eigen::Vector3d;

siting::Point3 site_point(const Vec3& v) {
  return siting::Point3{units::metres(v.x()), units::metres(v.y()), units::metres(v.z())};
}
Vec3 vec(const siting::Point3& p) { return Vec3(p.x.value(), p.y.value(), p.z.value()); }
double plan_length(const Vec3& a, const Vec3& b) { return std::hypot(b.x() - a.x(), b.y() - a.y()); }
std::string point_text(const Vec3& v) { return fmt::format("({:.2f}, {:.2f}, {:.2f}) m", v.x(), v.y(), v.z()); }

// A wire of an antenna's model, as a span.
siting::Span wire_span(const station::Antenna& a, const em::Wire& w, std::size_t index, bool rigid) {
  siting::Span s;
  s.name = a.name + ": " + (w.name.empty() ? "wire " + std::to_string(index + 1) : w.name);
  s.kind = siting::SpanKind::antenna;
  s.from = site_point(w.a);
  s.to = site_point(w.b);
  s.antenna = a.name;
  s.origin = "antenna \"" + a.name + "\" (" + (w.name.empty() ? "wire " + std::to_string(index + 1) : w.name) +
             ", from its model)";
  s.rigid = rigid;
  s.wire = a.wire;
  if (a.wire) s.mass_per_length = a.wire->mass_per_length;
  const double plan = plan_length(w.a, w.b);
  if (rigid) {
    s.sag = units::metres(0.0);
    s.swing = units::radians(0.0);
  } else {
    s.sag = units::metres(plan >= 0.01 ? kAssumedSagFraction * plan : 0.0);
    s.swing = units::radians(constants::pi / 2.0);  // not stated: any swing up to horizontal
  }
  return s;
}

// Whether a wire of this antenna kind is a rigid element rather than a hanging wire.
bool rigid_wire(const station::Antenna& a, const em::Wire& w) {
  if (a.kind == station::AntennaKind::yagi) return true;
  if (a.kind == station::AntennaKind::vertical) return w.name == "radiator";
  return false;
}

// The screening antennas (no wires): a rigid vertical piece for their radiating size.
std::optional<siting::Span> body_span(const station::Antenna& a) {
  double half = 0.005;  // size not stated: a point (1 cm)
  if (a.kind == station::AntennaKind::collinear && a.length_m) half = *a.length_m / 2.0;
  if (a.kind == station::AntennaKind::aperture && a.diameter_m) half = *a.diameter_m / 2.0;
  siting::Span s;
  s.name = a.name + ": antenna body";
  s.kind = siting::SpanKind::antenna;
  const Vec3 c(a.position.x_m, a.position.y_m, a.height_m);
  s.from = site_point(c - Vec3(0, 0, std::min(half, a.height_m)));
  s.to = site_point(c + Vec3(0, 0, half));
  s.antenna = a.name;
  s.origin = "antenna \"" + a.name + "\" (its radiating size, vertical at its position)";
  s.rigid = true;
  s.sag = units::metres(0.0);
  s.swing = units::radians(0.0);
  return s;
}

bool is_point_mounted(station::AntennaKind k) {
  return k == station::AntennaKind::vertical || k == station::AntennaKind::yagi || k == station::AntennaKind::collinear ||
         k == station::AntennaKind::gain_only || k == station::AntennaKind::aperture || k == station::AntennaKind::inverted_v;
}

const siting::Support* support_near(const std::vector<siting::Support>& supports, double x, double y) {
  for (const auto& s : supports)
    if (std::hypot(s.base.x.value() - x, s.base.y.value() - y) <= 1.0) return &s;
  return nullptr;
}

siting::Support implied_support(const std::string& name, double x, double y, double height, double overhang,
                                std::string origin) {
  siting::Support s;
  s.name = name;
  s.kind = siting::SupportKind::mast;
  s.base = siting::PlanPoint{units::metres(x), units::metres(y)};
  s.height = units::metres(height);
  s.overhang = units::metres(overhang);
  s.origin = std::move(origin);
  return s;
}

double span_length(const siting::Span& s) { return siting::span_shape(s).length_m(); }

Where span_where(const station::Station& st, std::size_t i, const siting::Span& s, const std::string& key) {
  return Where{st.file, s.line, "span[" + std::to_string(i) + "]." + key};
}

// Matches a user [[span]] of kind antenna to one of the antenna wires; index into `derived`, or
// nullopt. Both ends within the end tolerance, in either order.
std::optional<std::size_t> match_wire(const siting::Span& user, const std::vector<siting::Span>& derived,
                                      const std::optional<std::string>& antenna) {
  const Vec3 a = vec(user.from), b = vec(user.to);
  for (std::size_t k = 0; k < derived.size(); ++k) {
    const auto& d = derived[k];
    if (antenna && d.antenna != antenna) continue;
    const Vec3 p = vec(d.from), q = vec(d.to);
    const bool same = (a - p).norm() <= kSpanEndTolerance_m && (b - q).norm() <= kSpanEndTolerance_m;
    const bool reversed = (a - q).norm() <= kSpanEndTolerance_m && (b - p).norm() <= kSpanEndTolerance_m;
    if (same || reversed) return k;
  }
  return std::nullopt;
}

}  // namespace

void derive_installation(station::Station& st) {
  siting::SiteElements& inst = st.installation;
  std::vector<std::string>& notes = st.installation_assumptions;
  std::vector<siting::Span> derived;     // antenna wires
  std::vector<siting::Support> implied;  // supports the antennas need and the file does not describe

  for (std::size_t ai = 0; ai < st.antennas.size(); ++ai) {
    const station::Antenna& a = st.antennas[ai];
    std::vector<siting::Span> mine;
    if (station::is_wire(a.kind)) {
      std::vector<std::string> ignored;
      em::Model m;
      try {
        m = antenna_model(a, geometry_frequency_hz(st, a), em::perfect_ground(), ignored);
      } catch (const InputError& e) {
        // Never skip an antenna's clearance checks: a wire geometry that cannot be built is an error.
        throw InputError(Where{st.file, a.line, "antenna[" + std::to_string(ai) + "]." + antenna_key_for(a, e)},
                         "the antenna's wires cannot be built for the power-line checks: " + e.message());
      }
      for (std::size_t i = 0; i < m.wires.size(); ++i) mine.push_back(wire_span(a, m.wires[i], i, rigid_wire(a, m.wires[i])));
    } else if (auto s = body_span(a)) {
      mine.push_back(*s);
    }
    // The mast a point-mounted antenna stands on, and the supports at the wire ends.
    double top = a.height_m, reach = 0.0;
    for (const auto& s : mine) {
      top = std::max({top, s.from.z.value(), s.to.z.value()});
      for (const Vec3& e : {vec(s.from), vec(s.to)})
        reach = std::max(reach, std::hypot(e.x() - a.position.x_m, e.y() - a.position.y_m));
    }
    if (is_point_mounted(a.kind) && !support_near(inst.supports, a.position.x_m, a.position.y_m)) {
      const double overhang = a.kind == station::AntennaKind::inverted_v ? 0.0 : reach;
      implied.push_back(implied_support(a.name + ": mast (implied)", a.position.x_m, a.position.y_m, top, overhang,
                                        "the support antenna \"" + a.name + "\" stands on"));
    }
    for (const auto& s : mine) {
      if (s.rigid) continue;
      for (const Vec3& e : {vec(s.from), vec(s.to)}) {
        if (e.z() < 0.1) continue;  // tied off at ground level
        if (std::hypot(e.x() - a.position.x_m, e.y() - a.position.y_m) < 1.0 && is_point_mounted(a.kind)) continue;
        if (support_near(inst.supports, e.x(), e.y()) || support_near(implied, e.x(), e.y())) continue;
        implied.push_back(implied_support(fmt::format("{}: end support (implied) at ({:.1f}, {:.1f}) m", a.name, e.x(), e.y()),
                                          e.x(), e.y(), e.z(), 0.0,
                                          "a support holding a wire end of antenna \"" + a.name + "\""));
      }
    }
    for (auto& s : mine) derived.push_back(std::move(s));
  }

  // User spans: an antenna span must agree with the wire it describes and then replaces it.
  std::vector<bool> replaced(derived.size(), false);
  for (std::size_t i = 0; i < inst.spans.size(); ++i) {
    siting::Span& sp = inst.spans[i];
    if (sp.feed_line) {
      const station::FeedLine* fl = st.feed_line(*sp.feed_line);
      if (!fl) throw InputError(span_where(st, i, sp, "feed_line"), "unknown feed line \"" + *sp.feed_line + "\"");
      const double len = span_length(sp);
      if (len > fl->length.value() + 0.01)
        throw InputError(span_where(st, i, sp, "feed_line"),
                         fmt::format("the span is {:.2f} m of line but feed line \"{}\" is only {:.2f} m long: "
                                     "correct the feed line's length or the span",
                                     len, fl->name, fl->length.value()));
    }
    if (sp.kind != siting::SpanKind::antenna) continue;
    if (sp.antenna) {
      const station::Antenna* a = st.antenna(*sp.antenna);
      if (!a) throw InputError(span_where(st, i, sp, "antenna"), "unknown antenna \"" + *sp.antenna + "\"");
    }
    const auto k = match_wire(sp, derived, sp.antenna);
    if (!k) {
      if (sp.antenna) {
        std::string wires;
        for (const auto& d : derived)
          if (d.antenna == sp.antenna) wires += (wires.empty() ? "" : "; ") + point_text(vec(d.from)) + " to " + point_text(vec(d.to));
        throw InputError(span_where(st, i, sp, "from"),
                         "the span's ends " + point_text(vec(sp.from)) + " and " + point_text(vec(sp.to)) +
                             " do not meet the ends of any wire of antenna \"" + *sp.antenna + "\" (within " +
                             fmt::format("{:.1f}", kSpanEndTolerance_m) + " m): " +
                             (wires.empty() ? std::string("it has no wires") : "its wires run " + wires));
      }
      notes.push_back("span \"" + sp.name + "\": matches no wire of a modelled antenna; checked as written");
      continue;
    }
    const siting::Span& d = derived[*k];
    const double user_len = span_length(sp);
    const double wire_len = (vec(d.to) - vec(d.from)).norm();
    const double tol = std::max(kSpanEndTolerance_m, kSpanLengthTolerance * wire_len);
    if (std::abs(user_len - wire_len) > tol)
      throw InputError(span_where(st, i, sp, sp.sag ? "sag" : "tension"),
                       fmt::format("the span's wire is {:.2f} m long but the wire of antenna \"{}\" it describes is "
                                   "{:.2f} m (more than {:.2f} m apart): correct the sag/tension or the antenna",
                                   user_len, *d.antenna, wire_len, tol));
    replaced[*k] = true;
    sp.antenna = d.antenna;
    sp.rigid = d.rigid;
    if (!sp.wire && d.wire) {
      sp.wire = d.wire;
      if (!sp.mass_per_length) sp.mass_per_length = d.mass_per_length;
    }
    sp.origin = "[[span]] describing " + d.origin;
  }
  std::vector<std::string> assumed_sag;
  for (std::size_t k = 0; k < derived.size(); ++k) {
    if (replaced[k]) continue;
    if (!derived[k].rigid && derived[k].sag && derived[k].sag->value() > 0.0) assumed_sag.push_back(derived[k].name);
    inst.spans.push_back(std::move(derived[k]));
  }

  // Feed-line routes: each leg a span of kind feed_line.
  for (std::size_t i = 0; i < st.feed_lines.size(); ++i) {
    const station::FeedLine& fl = st.feed_lines[i];
    if (fl.route.empty()) continue;
    double total = 0.0;
    for (std::size_t k = 0; k + 1 < fl.route.size(); ++k) {
      const Vec3 p(fl.route[k].x_m, fl.route[k].y_m, fl.route[k].z_m);
      const Vec3 q(fl.route[k + 1].x_m, fl.route[k + 1].y_m, fl.route[k + 1].z_m);
      siting::Span s;
      s.name = fl.name + ": route leg " + std::to_string(k + 1);
      s.kind = siting::SpanKind::feed_line;
      s.from = site_point(p);
      s.to = site_point(q);
      s.feed_line = fl.name;
      s.origin = "feed line \"" + fl.name + "\" (its route)";
      const double plan = plan_length(p, q);
      s.sag = units::metres(plan >= 0.01 ? kAssumedSagFraction * plan : 0.0);
      s.swing = units::radians(constants::pi / 2.0);
      if (plan >= 0.01) assumed_sag.push_back(s.name);
      total += span_length(s);
      inst.spans.push_back(std::move(s));
    }
    if (total > fl.length.value() + 0.01)
      throw InputError(Where{st.file, fl.line, "feed_line[" + std::to_string(i) + "].route"},
                       fmt::format("the route is {:.2f} m long (with sag) but the line is only {:.2f} m: "
                                   "correct the length or the route",
                                   total, fl.length.value()));
  }
  if (!assumed_sag.empty()) {
    std::string list;
    for (const auto& n : assumed_sag) list += (list.empty() ? "" : ", ") + n;
    notes.push_back(fmt::format("sag not stated for {}: {:.0f} % of each span's plan length assumed, swinging up to "
                                "horizontal (describe a wire with a [[span]] to use its real sag)",
                                list, kAssumedSagFraction * 100.0));
  }
  for (auto& s : implied) {
    notes.push_back("support \"" + s.name + "\": " + s.origin + " is not described by a [[support]]; taken as a mast " +
                    fmt::format("{:.2f} m tall", s.height.value()) + " at its base (describe it to check it as it is)");
    inst.supports.push_back(std::move(s));
  }
}

siting::LinesReport check_installation(const station::Station& st) {
  siting::LinesReport r = siting::run_checks(st.installation, siting::builtin_clearance_tables());
  r.assumptions.insert(r.assumptions.end(), st.installation_assumptions.begin(), st.installation_assumptions.end());
  return r;
}

}  // namespace standoff::assemble
