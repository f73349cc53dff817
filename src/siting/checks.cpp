#include "siting/checks.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <stdexcept>

#include <Eigen/Geometry>

#include "core/constants.hpp"

namespace standoff::siting {

namespace {

constexpr double kCm = 0.01;            // rounding step of reported distances
constexpr double kDiameterStep = 1e-5;  // rounding step of wire diameters (0.01 mm)
constexpr int kWirePieces = 64;         // straight pieces per wire span
constexpr double kSwingStep = 2.5 * constants::pi / 180.0;  // swing sampling step
constexpr int kTiltSteps = 360;         // tilt-up arc sampling over 90°

std::string metres(double v) {
  char buf[48];
  std::snprintf(buf, sizeof buf, "%.2f m", v);
  return buf;
}

// Whole steps, then divided by the (integral) steps per metre so 51.66 prints as 51.66.
double round_up(double v, double step) {
  const double per = std::round(1.0 / step);
  return std::ceil(v * per - 1e-9) / per;
}
double round_down(double v, double step) {
  const double per = std::round(1.0 / step);
  return std::max(0.0, std::floor(v * per + 1e-9) / per);
}

// A measured check: the requirement rounded up, the measurement rounded down, then compared.
Check measured(std::string rule, std::string source, std::string subject, std::string line, double required_m,
               double actual_m, std::string note, double step = kCm) {
  Check c;
  c.rule = std::move(rule);
  c.source = std::move(source);
  c.subject = std::move(subject);
  c.line = std::move(line);
  const double req = round_up(required_m, step);
  const double act = round_down(actual_m, step);
  c.required = units::metres(req);
  c.actual = units::metres(act);
  c.status = act >= req ? CheckStatus::pass : CheckStatus::fail;
  c.note = std::move(note);
  return c;
}

Check not_evaluated(std::string rule, std::string source, std::string subject, std::string line,
                    std::optional<double> actual_m, std::string note) {
  Check c;
  c.rule = std::move(rule);
  c.source = std::move(source);
  c.subject = std::move(subject);
  c.line = std::move(line);
  if (actual_m) c.actual = units::metres(round_down(*actual_m, kCm));
  c.status = CheckStatus::not_evaluated;
  c.note = "not evaluated — " + note;
  return c;
}

Vec3 vec(const Point3& p) { return Vec3(p.x.value(), p.y.value(), p.z.value()); }
Vec2 vec(const PlanPoint& p) { return Vec2(p.x.value(), p.y.value()); }
Vec3 ground(const PlanPoint& p) { return Vec3(p.x.value(), p.y.value(), 0.0); }

double point_conductor_distance(const Vec3& p, const ConductorGeometry& g) { return segment_conductor_distance(p, p, g); }

// Swing angles sampled for a shape, and the sampling error they bring.
std::vector<double> swing_samples(const SpanShape& s, double& step) {
  if (s.swing_rad <= 0.0 || !s.catenary) {
    step = 0.0;
    return {0.0};
  }
  const int per_side = std::max(1, static_cast<int>(std::ceil(s.swing_rad / kSwingStep)));
  step = s.swing_rad / per_side;
  std::vector<double> out;
  for (int k = -per_side; k <= per_side; ++k) out.push_back(k * step);
  return out;
}

// Largest distance between the wire and the straight pieces that sample it: a curve of
// curvature ≤ 1/c deviates from a chord of length Δs by at most Δs²/(8c).
double piece_deviation(const SpanShape& s) {
  if (!s.catenary) return 0.0;
  const Catenary& c = *s.catenary;
  double worst = 0.0;
  for (int i = 0; i < kWirePieces; ++i) {
    const double x1 = c.span() * i / kWirePieces;
    const double x2 = c.span() * (i + 1) / kWirePieces;
    const double arc = c.parameter() * (std::sinh((x2 - c.vertex_x()) / c.parameter()) -
                                        std::sinh((x1 - c.vertex_x()) / c.parameter()));
    worst = std::max(worst, arc);
  }
  return worst * worst / (8.0 * c.parameter());
}

template <class Distance>
double swept_minimum(const SpanShape& s, Distance distance) {
  double step = 0.0;
  const auto psis = swing_samples(s, step);
  const int pieces = s.catenary ? kWirePieces : 1;
  double best = std::numeric_limits<double>::infinity();
  for (double psi : psis) {
    Vec3 prev = s.point(0.0, psi);
    for (int i = 1; i <= pieces; ++i) {
      const Vec3 next = s.point(static_cast<double>(i) / pieces, psi);
      best = std::min(best, distance(prev, next));
      prev = next;
    }
  }
  const double error = s.max_sag_m() * step / 2.0 + piece_deviation(s);
  return std::max(0.0, best - error);
}

// The geometry change that would make a failed check pass: the distance to move (the shortfall,
// rounded up), or the largest support, handled piece or free wire length that would pass
// (rounded down). An unevaluated check gets what to state or measure.
void add_remedies(Check& c, const ClearanceTables& t) {
  if (c.pass()) return;
  if (c.status == CheckStatus::not_evaluated) {
    c.remedies.push_back({"state_input", std::nullopt, "",
                          c.rule == "antenna conductor size"
                              ? "state the wire class (`wire`, tables/clearances.toml) so the size can be checked"
                              : "measure or ask the utility for the line's voltage and height, then re-run"});
    return;
  }
  if (!c.required || !c.actual) return;
  const double req = c.required->value(), act = c.actual->value();
  const double shortfall = round_up(std::max(0.0, req - act), kCm);
  auto move = [&](const std::string& what) {
    c.remedies.push_back({"move_away", shortfall, "m",
                          "move " + what + " at least " + metres(shortfall) + " further from " +
                              (c.line.empty() ? std::string("where people reach") : """ + c.line + """)});
  };
  if (c.rule == "fall zone") {
    move("the support's base");
    // Largest height H (with the overhang) whose fall zone fits: max(1.5 H, H + 10 ft) <= plan distance.
    const double h = round_down(std::min(act / t.cpsc_factor, act - t.fall_margin.value.value()), kCm);
    if (h > 0.0)
      c.remedies.push_back({"max_height", h, "m",
                            "or use a support whose height plus overhang is at most " + metres(h) + " here"});
  } else if (c.rule == "fall reach") {
    move("the support's base");
    const double h = round_down(c.size_m - shortfall, kCm);
    if (h > 0.0) c.remedies.push_back({"max_height", h, "m", "or keep its height plus overhang to at most " + metres(h)});
  } else if (c.rule == "raising: hand-held object") {
    move("the place where it is raised");
    const double l = round_down(c.size_m - shortfall, kCm);
    if (l > 0.0)
      c.remedies.push_back({"max_handled_length", l, "m",
                            "or raise it in conductive pieces of at most " + metres(l) + " (handled_length)"});
  } else if (c.rule == "raising: tilt-up arc") {
    move("the pivot");
    c.remedies.push_back({"tilt_direction", std::nullopt, "", "or lay the mast down pointing away from the line"});
  } else if (c.rule == "standing clearance") {
    move("the wire's closest point");
    c.remedies.push_back({"tension", std::nullopt, "",
                          "or shorten the span, tension it harder or add an anchor so that sag and swing stay clear"});
  } else if (c.rule == "failed-support swing") {
    const double l = round_down(c.size_m - shortfall, kCm);
    if (l > 0.0)
      c.remedies.push_back({"max_free_length", l, "m",
                            "anchor the wire so that no free length exceeds " + metres(l) +
                                " (an anchor point or an extra support), or move its attachment " + metres(shortfall) +
                                " further from \"" + c.line + "\""});
    else
      move("the attachment");
  } else if (c.rule == "no crossing") {
    c.remedies.push_back({"reroute", std::nullopt, "", "re-route the wire so that it does not cross \"" + c.line + "\" in plan"});
  } else if (c.rule == "antenna conductor size") {
    if (c.size_m > 0.0)
      c.remedies.push_back({"min_awg", c.size_m, "AWG",
                            "use " + std::to_string(static_cast<int>(c.size_m)) + " AWG or heavier of a listed material"});
  } else if (c.rule == "radiating wire height") {
    c.remedies.push_back({"raise", shortfall, "m",
                          "raise the lowest point at least " + metres(shortfall) +
                              ", or fence it off (a [[zone]] of kind = \"keep_out\" around it)"});
  }
}

}  // namespace

bool LinesReport::all_pass() const {
  return std::all_of(checks.begin(), checks.end(), [](const Check& c) { return c.pass(); });
}

std::string LinesReport::verdict() const { return all_pass() ? "pass" : "fail"; }

std::vector<std::string> line_cautions() {
  return {
      "Call the utility before any work near overhead lines: have them confirm the voltage and height, "
      "and cover or de-energise the line where needed.",
      "Never raise, lower or climb a mast, tower or antenna near a power line; plan the work so that nothing "
      "can come within the approach distance, even if it slips or falls.",
      "Assume every overhead line is energised and uninsulated, including service drops and lines that look dead.",
      "Sag grows with heat, ice and wind, and wires stretch with age: these checks use the still-air sag stated "
      "and the wind swing given; keep a margin.",
      "These checks are a planning aid, not an approval: local codes, the utility and licensed practice take "
      "precedence wherever they ask for more.",
  };
}

units::Length fall_zone_radius(const Support& s, const ClearanceTables& t) {
  const double h = s.height.value() + s.overhang.value();
  return units::metres(round_up(std::max(t.cpsc_factor * h, h + t.fall_margin.value.value()), kCm));
}

ConductorGeometry conductor_geometry(const PowerLine& line, const ClearanceTables& t) {
  ConductorGeometry g;
  for (const auto& p : line.path) g.path.push_back(vec(p));
  if (line.height) {
    g.z_low = line.height->value();
    g.height_known = true;
  } else {
    const auto assumed = assumed_line_height(line.kind, t);
    g.z_low = assumed ? assumed->height.value() : 0.0;
    g.height_known = false;
  }
  return g;
}

Vec3 SpanShape::point(double t, double psi) const {
  const Vec3 chord = from + t * (to - from);
  if (!catenary) return chord;
  Vec3 offset(0.0, 0.0, -catenary->sag_below_chord(t * catenary->span()));
  if (psi != 0.0) offset = Eigen::AngleAxisd(psi, (to - from).normalized()) * offset;
  return chord + offset;
}

double SpanShape::length_m() const { return catenary ? catenary->length() : (to - from).norm(); }

double SpanShape::lowest_z_m() const {
  if (!catenary) return std::min(from.z(), to.z());
  return from.z() + catenary->lowest_z();
}

double SpanShape::max_sag_m() const { return catenary ? catenary->max_sag() : 0.0; }

SpanShape span_shape(const Span& span) {
  SpanShape s;
  s.from = vec(span.from);
  s.to = vec(span.to);
  s.swing_rad = span.swing ? std::abs(span.swing->value()) : constants::pi / 2.0;
  const double L = Vec2(s.to.x() - s.from.x(), s.to.y() - s.from.y()).norm();
  const double dz = s.to.z() - s.from.z();
  if (L < kCm) return s;  // one end above the other: the wire hangs straight
  if (span.sag) {
    if (span.sag->value() > 0.0) s.catenary = Catenary::from_midspan_sag(L, dz, span.sag->value());
  } else if (span.tension && span.mass_per_length) {
    s.catenary = Catenary::from_tension(L, dz, span.tension->value(),
                                        span.mass_per_length->value() * constants::standard_gravity);
  } else {
    throw std::invalid_argument("span " + span.name + ": neither a sag nor a tension with a weight");
  }
  return s;
}

double swept_wire_distance(const SpanShape& shape, const ConductorGeometry& line) {
  return swept_minimum(shape, [&](const Vec3& a, const Vec3& b) { return segment_conductor_distance(a, b, line); });
}

double swept_wire_plan_distance(const SpanShape& shape, const ConductorGeometry& line) {
  return swept_minimum(shape, [&](const Vec3& a, const Vec3& b) {
    return plan_conductor_distance(Vec2(a.x(), a.y()), Vec2(b.x(), b.y()), line);
  });
}

double tilt_sweep_distance(const Support& s, const ConductorGeometry& line) {
  if (!s.tilt) return std::numeric_limits<double>::infinity();
  const double pivot_z = s.tilt->pivot_height.value();
  const double length = s.height.value() - pivot_z;
  const Vec3 pivot(s.base.x.value(), s.base.y.value(), pivot_z);
  const double az = s.tilt->direction.value();
  const Vec3 along(std::sin(az), std::cos(az), 0.0);  // azimuth clockwise from north (+y)
  double best = std::numeric_limits<double>::infinity();
  const double step = (constants::pi / 2.0) / kTiltSteps;
  for (int k = 0; k <= kTiltSteps; ++k) {
    const double th = k * step;
    const Vec3 tip = pivot + length * (std::cos(th) * along + std::sin(th) * Vec3::UnitZ());
    best = std::min(best, segment_conductor_distance(pivot, tip, line));
  }
  // A point of the swept quarter disc lies within length·step/2 of a sampled position; the
  // antenna at the top may reach `overhang` beyond the tip in any direction.
  return std::max(0.0, best - length * step / 2.0 - s.overhang.value());
}

LinesReport run_checks(const SiteElements& site, const ClearanceTables& t) {
  LinesReport r;
  r.cautions = line_cautions();
  r.power_lines = site.power_lines.size();

  struct LineInfo {
    const PowerLine* line;
    ConductorGeometry geometry;
    Approach approach;
    std::optional<double> standing_m;  // NFPA 810 / approach, the larger
    std::string standing_source;
  };
  std::vector<LineInfo> lines;
  for (const auto& pl : site.power_lines) {
    LineInfo info{&pl, conductor_geometry(pl, t), approach_distance(pl, t), std::nullopt, ""};
    if (!pl.height) {
      const auto assumed = assumed_line_height(pl.kind, t);
      if (assumed)
        r.assumptions.push_back("power line \"" + pl.name + "\": conductor height unknown — taken as anywhere from " +
                                metres(assumed->height.value()) + " upward (lowest typical height for a " +
                                to_string(assumed->kind) + " line over " + assumed->place + ", " + assumed->source +
                                "; local rules may differ: measure or ask the utility)");
      else
        r.assumptions.push_back("power line \"" + pl.name +
                                "\": conductor height unknown and no typical height listed — taken as anywhere "
                                "from ground level upward");
      if (pl.kind == LineKind::transmission)
        r.assumptions.push_back("power line \"" + pl.name +
                                "\": transmission lines are higher than the distribution heights assumed; the "
                                "assumption only errs on the safe side");
    }
    if (!pl.voltage) r.assumptions.push_back("power line \"" + pl.name + "\": " + info.approach.note);
    if (info.approach.distance) {
      const bool low = pl.voltage && pl.voltage->value.value() <= t.nfpa_low_voltage.value();
      const double nfpa = (low ? t.nfpa_low_clearance : t.nfpa_high_clearance).value();
      const double osha = info.approach.distance->value();
      info.standing_m = std::max(nfpa, osha);
      info.standing_source = osha >= nfpa ? info.approach.source : t.nfpa_source;
    }
    lines.push_back(std::move(info));
  }

  std::vector<SpanShape> shapes;
  for (const auto& sp : site.spans) {
    shapes.push_back(span_shape(sp));
    if (!sp.swing && shapes.back().catenary)
      r.assumptions.push_back("span \"" + sp.name + "\": wind swing not stated — any swing up to horizontal assumed");
  }

  // 1. Fall zone: plan distance from each support's base, and the 3-D reach of the falling support.
  for (const auto& s : site.supports) {
    const double reach = s.height.value() + s.overhang.value();
    for (const auto& li : lines) {
      const double plan = point_conductor_distance(ground(s.base), ConductorGeometry{li.geometry.path, 0.0, true});
      const double cpsc = t.cpsc_factor * reach;
      const double margin = reach + t.fall_margin.value.value();
      char note[200];
      std::snprintf(note, sizeof note, "plan distance from the base; 1.5 x %.2f m = %.2f m, %.2f m + 10 ft = %.2f m",
                    reach, cpsc, reach, margin);
      r.checks.push_back(measured("fall zone", cpsc >= margin ? t.cpsc_source : t.fall_margin.source, s.name,
                                  li.line->name, std::max(cpsc, margin), plan, note));
      r.checks.back().size_m = reach;
    }
  }
  for (const auto& s : site.supports) {
    const double reach = s.height.value() + s.overhang.value();
    for (const auto& li : lines) {
      const double d = std::max(0.0, point_conductor_distance(ground(s.base), li.geometry) - reach);
      const std::string note = "closest approach of the support falling in any direction about its base (reach " +
                               metres(reach) + "); " + li.approach.note;
      if (!li.approach.distance)
        r.checks.push_back(not_evaluated("fall reach", li.approach.source, s.name, li.line->name, d, li.approach.note));
      else
        r.checks.push_back(measured("fall reach", li.approach.source, s.name, li.line->name,
                                    li.approach.distance->value(), d, note));
      r.checks.back().size_m = reach;
    }
  }

  // 2. Raising: the tilt-up arc, and a conductive object handled by a person at the base.
  for (const auto& s : site.supports) {
    for (const auto& li : lines) {
      if (s.tilt) {
        const double d = tilt_sweep_distance(s, li.geometry);
        if (!li.approach.distance)
          r.checks.push_back(
              not_evaluated("raising: tilt-up arc", li.approach.source, s.name, li.line->name, d, li.approach.note));
        else
          r.checks.push_back(measured("raising: tilt-up arc", li.approach.source, s.name, li.line->name,
                                      li.approach.distance->value(), d,
                                      "quarter circle swept about the pivot from lying to upright"));
      }
      const double held = s.handled_length ? s.handled_length->value() : s.height.value();
      const Vec3 hands(s.base.x.value(), s.base.y.value(), t.hand_reach.value.value());
      const double d = std::max(0.0, point_conductor_distance(hands, li.geometry) - held);
      const std::string what = s.handled_length ? "a " + metres(held) + " conductive piece"
                                                : "the whole support (" + metres(held) + ", no handled length given)";
      if (!li.approach.distance)
        r.checks.push_back(not_evaluated("raising: hand-held object", li.approach.source, s.name, li.line->name, d,
                                         li.approach.note));
      else
        r.checks.push_back(measured("raising: hand-held object", li.approach.source, s.name, li.line->name,
                                    li.approach.distance->value(), d,
                                    what + " held at the base, hands up to " + metres(t.hand_reach.value.value()) +
                                        " (" + t.hand_reach.source + ")"));
      r.checks.back().size_m = held;
    }
  }

  // 3. Standing clearance of each wire (sag and swing), and its reach when a support fails.
  for (std::size_t i = 0; i < site.spans.size(); ++i) {
    const Span& sp = site.spans[i];
    const SpanShape& shape = shapes[i];
    for (const auto& li : lines) {
      const double d = swept_wire_distance(shape, li.geometry);
      char swing[64];
      std::snprintf(swing, sizeof swing, "swing up to %.0f deg", shape.swing_rad * 180.0 / constants::pi);
      const std::string note = to_string(sp.kind) + ", max sag " + metres(shape.max_sag_m()) + ", " + swing;
      if (!li.standing_m)
        r.checks.push_back(not_evaluated("standing clearance", li.approach.source, sp.name, li.line->name, d,
                                         li.approach.note));
      else
        r.checks.push_back(measured("standing clearance", li.standing_source + "; " + t.nfpa_source, sp.name,
                                    li.line->name, *li.standing_m, d, note));
    }
  }
  for (std::size_t i = 0; i < site.spans.size(); ++i) {
    const Span& sp = site.spans[i];
    if (sp.rigid) continue;  // a rigid element falls with its support (fall reach of that support)
    const SpanShape& shape = shapes[i];
    const double length = shape.length_m();
    for (const auto& li : lines) {
      // Either end may let go: the wire then swings about the other end, reaching up to its length.
      const double about_from = point_conductor_distance(shape.from, li.geometry) - length;
      const double about_to = point_conductor_distance(shape.to, li.geometry) - length;
      const bool from_worse = about_from <= about_to;
      const auto& name = from_worse ? sp.from_support : sp.to_support;
      const Vec3& at = from_worse ? shape.from : shape.to;
      char where[96];
      std::snprintf(where, sizeof where, "the attachment at (%.2f, %.2f, %.2f) m", at.x(), at.y(), at.z());
      const std::string pivot = name ? *name : std::string(where);
      const double d = std::max(0.0, std::min(about_from, about_to));
      const std::string note = "wire of length " + metres(length) + " swinging about " + pivot + " if the other end fails";
      if (!li.approach.distance)
        r.checks.push_back(
            not_evaluated("failed-support swing", li.approach.source, sp.name, li.line->name, d, li.approach.note));
      else
        r.checks.push_back(measured("failed-support swing", li.approach.source, sp.name, li.line->name,
                                    li.approach.distance->value(), d, note));
      r.checks.back().size_m = length;
    }
  }

  // 4. No antenna or feed line crosses over or under a power line in plan.
  for (std::size_t i = 0; i < site.spans.size(); ++i) {
    const Span& sp = site.spans[i];
    if (sp.kind == SpanKind::halyard) continue;
    for (const auto& li : lines) {
      const double d = swept_wire_plan_distance(shapes[i], li.geometry);
      Check c = measured("no crossing", t.nfpa_crossing_source, sp.name, li.line->name, 0.0, d,
                         "plan distance between the swinging wire and the line's route");
      c.status = c.actual->value() > 0.0 ? CheckStatus::pass : CheckStatus::fail;
      if (!c.pass()) c.note = "crosses the line in plan (or comes within 1 cm of it when swinging)";
      r.checks.push_back(c);
    }
  }

  // 5. Antenna conductor size (NFPA 70 Table 810.52).
  for (std::size_t i = 0; i < site.spans.size(); ++i) {
    const Span& sp = site.spans[i];
    if (sp.kind != SpanKind::antenna || sp.rigid) continue;  // Table 810.52 sizes wire spans, not tubes
    const double span_len = (shapes[i].to - shapes[i].from).norm();
    if (!sp.wire) {
      Check c = not_evaluated("antenna conductor size", t.span_size_source, sp.name, "", std::nullopt,
                              sp.antenna ? "no wire class stated (give `wire` on antenna \"" + *sp.antenna +
                                               "\", a class from tables/clearances.toml)"
                                         : "no wire class stated (give `wire` from tables/clearances.toml)");
      c.diameter = true;
      r.checks.push_back(c);
      continue;
    }
    const SpanSizeRule* rule = nullptr;
    for (const auto& row : t.span_sizes)
      if (row.material == sp.wire->material && span_len <= row.max_span.value() &&
          (!rule || row.max_span.value() < rule->max_span.value()))
        rule = &row;
    if (!rule) {
      Check c;
      c.rule = "antenna conductor size";
      c.source = t.span_size_source;
      c.subject = sp.name;
      c.actual = units::metres(std::round(sp.wire->diameter.value() * 1e5) / 1e5);
      c.status = CheckStatus::fail;
      c.diameter = true;
      c.note = "material \"" + sp.wire->material +
               "\" is not listed for antenna spans: use hard-drawn copper, copper-clad steel or bronze";
      r.checks.push_back(c);
      continue;
    }
    Check c = measured("antenna conductor size", t.span_size_source, sp.name, "", awg_diameter(rule->max_awg).value(),
                       sp.wire->diameter.value(),
                       std::to_string(sp.wire->awg) + " AWG " + sp.wire->material + " over a " + metres(span_len) +
                           " span; at least " + std::to_string(rule->max_awg) + " AWG required",
                       kDiameterStep);
    // Sizes, not clearances: both diameters to the nearest 0.01 mm, the verdict by AWG number.
    c.required = units::metres(std::round(awg_diameter(rule->max_awg).value() * 1e5) / 1e5);
    c.actual = units::metres(std::round(sp.wire->diameter.value() * 1e5) / 1e5);
    c.status = sp.wire->awg <= rule->max_awg ? CheckStatus::pass : CheckStatus::fail;
    c.diameter = true;
    c.size_m = rule->max_awg;  // the AWG number required (for the remedy)
    r.checks.push_back(c);
  }

  // 6. Lowest point of each radiating wire above where people reach.
  for (std::size_t i = 0; i < site.spans.size(); ++i) {
    const Span& sp = site.spans[i];
    if (sp.kind != SpanKind::antenna) continue;
    Check c = measured("radiating wire height", t.rf_burn_height.source, sp.name, "",
                       t.rf_burn_height.value.value(), shapes[i].lowest_z_m(),
                       "lowest point in still air above level ground");
    if (!c.pass())
      c.note = "warning: RF burn risk — the wire comes down to " + metres(c.actual->value()) +
               " where people can touch it; raise it or fence it off";
    r.checks.push_back(c);
  }
  for (auto& c : r.checks) add_remedies(c, t);
  return r;
}

}  // namespace standoff::siting
