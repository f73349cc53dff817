#include "io/siting_toml.hpp"

#include <cmath>
#include <set>
#include <stdexcept>

#include <fmt/format.h>

#include "core/constants.hpp"
#include "core/quantity_parse.hpp"
#include "io/clearances_toml.hpp"
#include "siting/siting_units.hpp"
#include "io/toml_fields.hpp"

namespace standoff::siting {
namespace {

using detail::Fields;

units::Length coordinate(const toml::node& n, const Fields& f, const std::string& field) {
  if (!n.is_string()) throw InputError(f.where_node(n, field), "expected a length such as \"12 m\"");
  const auto v = parse_length(*n.value<std::string_view>(), f.where_node(n, field), Sign::any);
  bounds::check(v, f.where_node(n, field));
  return v;
}

const toml::array& point_array(const toml::node& n, const Fields& f, const std::string& field, std::size_t size) {
  const auto* arr = n.as_array();
  if (!arr || arr->size() != size)
    throw InputError(f.where_node(n, field), size == 2 ? "expected a plan point [\"x m\", \"y m\"]"
                                                       : "expected a point [\"x m\", \"y m\", \"z m\"]");
  return *arr;
}

PlanPoint plan_point(const toml::node& n, const Fields& f, const std::string& field) {
  const auto& a = point_array(n, f, field, 2);
  return PlanPoint{coordinate(a[0], f, field + "[0]"), coordinate(a[1], f, field + "[1]")};
}

Point3 point3(const toml::node& n, const Fields& f, const std::string& field) {
  const auto& a = point_array(n, f, field, 3);
  Point3 p{coordinate(a[0], f, field + "[0]"), coordinate(a[1], f, field + "[1]"), coordinate(a[2], f, field + "[2]")};
  if (p.z.value() < 0.0) throw InputError(f.where_node(a[2], field + "[2]"), "height must be zero or more");
  return p;
}

auto length_parser() {
  return [](const std::string& s, const Where& w) { return parse_length(s, w); };
}

units::Length positive_length(const Fields& f, std::string_view key) {
  const auto v = f.quantity(key, length_parser());
  if (!(v.value() > 0.0)) throw InputError(f.where(key), "must be above zero");
  return v;
}

template <class T>
T choice(const Fields& f, std::string_view key, std::initializer_list<std::pair<std::string_view, T>> options) {
  const std::string s = f.string(key);
  std::string list;
  for (const auto& [name, value] : options) {
    if (s == name) return value;
    list += (list.empty() ? "" : ", ") + std::string(name);
  }
  throw InputError(f.where(key), "expected one of " + list + ", got \"" + s + "\"");
}

// Iterates over the tables of a top-level array of tables, if present.
template <class Fn>
void each_table(const toml::table& root, std::string_view key, const std::string& file, Fn fn) {
  const auto* n = root.get(key);
  if (!n) return;
  const auto* arr = n->as_array();
  if (!arr) throw InputError(Where{file, static_cast<int>(n->source().begin.line), std::string(key)},
                             "expected an array of tables [[" + std::string(key) + "]]");
  int i = 0;
  for (const auto& e : *arr) {
    const std::string prefix = std::string(key) + "[" + std::to_string(i++) + "]";
    if (!e.is_table())
      throw InputError(Where{file, static_cast<int>(e.source().begin.line), prefix}, "expected a table");
    fn(Fields(*e.as_table(), file, prefix));
  }
}

void unique_name(std::set<std::string>& seen, const Fields& f, const std::string& what) {
  const std::string name = f.string("name");
  if (name.empty()) throw InputError(f.where("name"), "must not be empty");
  if (!seen.insert(name).second) throw InputError(f.where("name"), "duplicate " + what + " name \"" + name + "\"");
}

PowerLine parse_line(const Fields& f) {
  f.only({"name", "kind", "path", "height", "voltage", "voltage_reference"});
  PowerLine l;
  l.name = f.string("name");
  l.kind = choice<LineKind>(f, "kind", {{"service", LineKind::service}, {"distribution", LineKind::distribution},
                                        {"transmission", LineKind::transmission}});
  const auto& path = f.array("path");
  if (path.size() < 2) throw InputError(f.where("path"), "a line's path needs at least two plan points");
  int i = 0;
  for (const auto& p : path) l.path.push_back(plan_point(p, f, f.name("path") + "[" + std::to_string(i++) + "]"));
  for (std::size_t k = 0; k + 1 < l.path.size(); ++k)
    if (l.path[k].x == l.path[k + 1].x && l.path[k].y == l.path[k + 1].y)
      throw InputError(f.where("path"), "two consecutive points of the path are the same");
  if (f.string("height") != "unknown") l.height = positive_length(f, "height");
  const std::string v = f.string("voltage");
  if (v == "unknown") {
    if (f.has("voltage_reference"))
      throw InputError(f.where("voltage_reference"), "only allowed with a stated voltage");
  } else {
    LineVoltage lv;
    lv.value = parse_voltage(v, f.where("voltage"));
    if (!(lv.value.value() > 0.0)) throw InputError(f.where("voltage"), "must be above zero (or \"unknown\")");
    if (!f.has("voltage_reference"))
      throw InputError(f.where("voltage"), "say how the voltage is stated: voltage_reference = "
                                           "\"phase-to-ground\" or \"phase-to-phase\"");
    lv.reference = choice<VoltageReference>(f, "voltage_reference",
                                            {{"phase-to-ground", VoltageReference::phase_to_ground},
                                             {"phase-to-phase", VoltageReference::phase_to_phase}});
    l.voltage = lv;
  }
  return l;
}

Support parse_support(const Fields& f) {
  f.only({"name", "kind", "base", "height", "overhang", "tilt_pivot_height", "tilt_direction", "handled_length"});
  Support s;
  s.line = f.line_of(nullptr);
  s.name = f.string("name");
  s.kind = choice<SupportKind>(f, "kind", {{"mast", SupportKind::mast}, {"tower", SupportKind::tower},
                                           {"tree", SupportKind::tree}, {"pole", SupportKind::pole}});
  if (!f.has("base")) f.missing("base");
  s.base = plan_point(*f.get("base"), f, f.name("base"));
  s.height = positive_length(f, "height");
  if (auto o = f.opt_quantity("overhang", length_parser())) s.overhang = *o;
  const bool pivot = f.has("tilt_pivot_height");
  const bool dir = f.has("tilt_direction");
  if (pivot != dir)
    throw InputError(f.where(pivot ? "tilt_pivot_height" : "tilt_direction"),
                     "a tilt-up support needs both tilt_pivot_height and tilt_direction");
  if (pivot) {
    TiltUp t;
    t.pivot_height = f.quantity("tilt_pivot_height", length_parser());
    if (!(t.pivot_height.value() < s.height.value()))
      throw InputError(f.where("tilt_pivot_height"), "the pivot must be below the top of the support");
    t.direction = f.quantity("tilt_direction", [](const std::string& x, const Where& w) { return parse_angle(x, w); });
    s.tilt = t;
  }
  if (f.has("handled_length")) s.handled_length = positive_length(f, "handled_length");
  return s;
}

struct EndResult {
  Point3 point;
  std::optional<std::string> support;
};

EndResult span_end(const Fields& f, std::string_view key, std::string_view height_key,
                   const std::vector<Support>& supports) {
  const auto* n = f.get(key);
  if (!n) f.missing(key);
  EndResult r;
  if (n->is_string()) {
    const std::string name(*n->value<std::string_view>());
    const Support* s = nullptr;
    for (const auto& x : supports)
      if (x.name == name) s = &x;
    if (!s) throw InputError(f.where(key), "no [[support]] named \"" + name + "\"");
    r.support = name;
    r.point = Point3{s->base.x, s->base.y, s->height};
    if (f.has(height_key)) {
      const auto h = positive_length(f, height_key);
      if (h.value() > s->height.value())
        throw InputError(f.where(height_key), "above the top of support \"" + name + "\"");
      r.point.z = h;
    }
    return r;
  }
  if (f.has(height_key)) throw InputError(f.where(height_key), "only allowed when the end is a support's name");
  if (!n->is_array())
    throw InputError(f.where(key), "expected a support's name or a point [\"x m\", \"y m\", \"z m\"]");
  r.point = point3(*n, f, f.name(key));
  return r;
}

Span parse_span(const Fields& f, const std::vector<Support>& supports, const ClearanceTables& tables) {
  f.only({"name", "kind", "from", "from_height", "to", "to_height", "wire", "weight", "tension", "sag", "swing",
          "antenna", "feed_line"});
  Span s;
  s.line = f.line_of(nullptr);
  s.name = f.string("name");
  s.kind = choice<SpanKind>(f, "kind", {{"antenna", SpanKind::antenna}, {"feed_line", SpanKind::feed_line},
                                        {"halyard", SpanKind::halyard}});
  auto from = span_end(f, "from", "from_height", supports);
  auto to = span_end(f, "to", "to_height", supports);
  s.from = from.point;
  s.from_support = from.support;
  s.to = to.point;
  s.to_support = to.support;
  if (s.from.x == s.to.x && s.from.y == s.to.y && s.from.z == s.to.z)
    throw InputError(f.where("to"), "the span's two ends are the same point");
  // Which antenna or feed line this span belongs to (checked against the station by the station
  // loader: station/installation.cpp).
  s.antenna = f.opt_string("antenna");
  s.feed_line = f.opt_string("feed_line");
  if (s.antenna && s.kind != SpanKind::antenna)
    throw InputError(f.where("antenna"), "only allowed on a span of kind = \"antenna\"");
  if (s.feed_line && s.kind != SpanKind::feed_line)
    throw InputError(f.where("feed_line"), "only allowed on a span of kind = \"feed_line\"");
  if (auto w = f.opt_string("wire")) {
    const WireClass* wc = tables.find_wire(*w);
    if (!wc) {
      std::string list;
      for (const auto& x : tables.wires) list += (list.empty() ? "" : ", ") + x.name;
      throw InputError(f.where("wire"), "unknown wire class \"" + *w + "\" (known: " + list + ")");
    }
    s.wire = *wc;
    s.mass_per_length = wc->mass_per_length;
  }
  if (f.has("weight")) {
    s.mass_per_length = f.quantity("weight", [](const std::string& x, const Where& w) { return parse_linear_density(x, w); });
    if (!(s.mass_per_length->value() > 0.0)) throw InputError(f.where("weight"), "must be above zero");
  }
  const bool has_tension = f.has("tension");
  const bool has_sag = f.has("sag");
  if (has_tension == has_sag)
    throw InputError(f.where(has_sag ? "sag" : "name"), has_sag ? "give either tension or sag, not both"
                                                                : "give the horizontal tension or a measured sag");
  if (has_tension) {
    s.tension = f.quantity("tension", [](const std::string& x, const Where& w) { return parse_force(x, w); });
    bounds::tension(s.tension->value(), f.where("tension"));
    if (!s.mass_per_length)
      throw InputError(f.where("tension"), "a tension needs the wire's weight: give `weight` or a `wire` class with one");
  } else {
    s.sag = f.quantity("sag", length_parser());
  }
  if (f.has("swing")) {
    const auto a = f.quantity("swing", [](const std::string& x, const Where& w) { return parse_angle(x, w); });
    if (!(a.value() >= 0.0 && a.value() <= constants::pi / 2.0 + 1e-12))
      throw InputError(f.where("swing"), "expected a swing from 0 deg to 90 deg");
    s.swing = a;
  }
  try {
    (void)span_shape(s);
  } catch (const std::invalid_argument& e) {
    throw InputError(f.where(has_sag ? "sag" : "tension"), std::string("cannot shape the wire: ") + e.what());
  }
  return s;
}

}  // namespace

SiteElements parse_site_elements(const toml::table& root, const std::string& file) {
  return parse_site_elements(root, file, builtin_clearance_tables());
}

SiteElements parse_site_elements(const toml::table& root, const std::string& file, const ClearanceTables& tables) {
  SiteElements site;
  std::set<std::string> names;
  each_table(root, "power_line", file, [&](const Fields& f) {
    unique_name(names, f, "power line");
    site.power_lines.push_back(parse_line(f));
  });
  names.clear();
  each_table(root, "support", file, [&](const Fields& f) {
    unique_name(names, f, "support");
    site.supports.push_back(parse_support(f));
  });
  names.clear();
  each_table(root, "span", file, [&](const Fields& f) {
    unique_name(names, f, "span");
    site.spans.push_back(parse_span(f, site.supports, tables));
  });
  return site;
}

std::string to_string(CheckStatus s) {
  switch (s) {
    case CheckStatus::pass: return "pass";
    case CheckStatus::fail: return "fail";
    case CheckStatus::not_evaluated: return "not evaluated";
  }
  return "?";
}

nlohmann::json lines_report_json(const LinesReport& report) {
  nlohmann::json checks = nlohmann::json::array();
  for (const auto& c : report.checks) {
    nlohmann::json j;
    j["rule"] = c.rule;
    j["source"] = c.source;
    j["subject"] = c.subject;
    j["line"] = c.line;
    j["required_m"] = c.required ? nlohmann::json(c.required->value()) : nlohmann::json(nullptr);
    j["actual_m"] = c.actual ? nlohmann::json(c.actual->value()) : nlohmann::json(nullptr);
    j["pass"] = c.pass();
    j["status"] = to_string(c.status);
    j["note"] = c.note;
    j["quantity"] = c.diameter ? "diameter" : "distance";
    nlohmann::json rem = nlohmann::json::array();
    for (const auto& x : c.remedies)
      rem.push_back({{"kind", x.kind}, {"value", x.value ? nlohmann::json(*x.value) : nlohmann::json(nullptr)},
                     {"unit", x.unit}, {"text", x.text}});
    j["remedies"] = rem;
    checks.push_back(j);
  }
  return nlohmann::json{{"verdict", report.verdict()},
                        {"power_lines", report.power_lines},
                        {"checks", checks},
                        {"assumptions", report.assumptions},
                        {"cautions", report.cautions}};
}

std::string lines_report_text(const LinesReport& report) {
  std::string out = "Installation safety near power lines\n";
  if (report.power_lines == 0)
    out += "  (this station file describes no overhead power line: only the antennas' own checks were made)\n";
  else
    out += fmt::format("  checked against {} power line{}\n", report.power_lines, report.power_lines == 1 ? "" : "s");
  if (report.checks.empty()) out += "  (no antenna wire, feed-line route or support to check)\n";
  for (const auto& c : report.checks) {
    const std::string req = c.required ? fmt::format("{:.2f} m", c.required->value()) : std::string("—");
    const std::string act = c.actual ? fmt::format("{:.2f} m", c.actual->value()) : std::string("—");
    const std::string status = c.status == CheckStatus::pass ? "PASS" : c.status == CheckStatus::fail ? "FAIL" : "NOT EVALUATED";
    out += fmt::format("  [{}] {}: {}{}\n", status, c.rule, c.subject, c.line.empty() ? "" : " — " + c.line);
    if (c.rule == "antenna conductor size")
      out += fmt::format("      required diameter {}, actual {}\n",
                         c.required ? fmt::format("{:.2f} mm", c.required->value() * 1e3) : std::string("—"),
                         c.actual ? fmt::format("{:.2f} mm", c.actual->value() * 1e3) : std::string("—"));
    else if (c.rule == "no crossing")
      out += fmt::format("      plan distance {}\n", act);
    else
      out += fmt::format("      required {}, actual {}\n", req, act);
    out += fmt::format("      {}\n      source: {}\n", c.note, c.source);
    for (const auto& x : c.remedies) out += "      remedy: " + x.text + "\n";
  }
  if (!report.assumptions.empty()) {
    out += "Assumptions\n";
    for (const auto& a : report.assumptions) out += "  - " + a + "\n";
  }
  out += fmt::format("Verdict: {}\n", report.all_pass() ? "all checks pass" : "at least one check fails or was not evaluated");
  out += "Cautions\n";
  for (const auto& c : report.cautions) out += "  ! " + c + "\n";
  return out;
}

}  // namespace standoff::siting
