#include "io/station_toml.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>

#include <toml++/toml.h>

#include "core/bounds.hpp"
#include "core/constants.hpp"
#include "core/error_list.hpp"
#include "core/suggest.hpp"
#include "core/quantity_parse.hpp"
#include "io/grounds_toml.hpp"
#include "io/embedded.hpp"
#include "io/clearances_toml.hpp"
#include "io/siting_toml.hpp"
#include "assemble/installation.hpp"

namespace standoff::station {
namespace {

int line_of(const toml::node& n) { return static_cast<int>(n.source().begin.line); }

// Reads one table with a fixed set of keys; every access names file:line:field.
class Reader {
 public:
  Reader(const toml::table& t, std::string file, std::string path, std::set<std::string> allowed)
      : t_(t), file_(std::move(file)), path_(std::move(path)) {
    for (const auto& [k, v] : t_) {
      const std::string key(k.str());
      if (!allowed.contains(key)) {
        std::string list;
        for (const auto& a : allowed) list += (list.empty() ? "" : ", ") + a;
        const std::string hint = did_you_mean(key, std::vector<std::string>(allowed.begin(), allowed.end()));
        throw InputError(where(key, line_of(v)), "unknown key" + (hint.empty() ? std::string(" (typo?)") : hint) +
                                                     "; allowed here: " + list);
      }
    }
  }

  Where where(const std::string& key, int line = 0) const {
    if (line == 0) {
      if (const toml::node* n = t_.get(key)) line = line_of(*n);
      else line = line_of(t_);
    }
    return Where{file_, line, path_.empty() ? key : path_ + "." + key};
  }
  Where where_table() const { return Where{file_, line_of(t_), path_}; }
  int line() const { return line_of(t_); }
  bool has(const std::string& key) const { return t_.contains(key); }
  const toml::node* node(const std::string& key) const { return t_.get(key); }

  std::optional<std::string> opt_string(const std::string& key) const {
    const toml::node* n = t_.get(key);
    if (!n) return std::nullopt;
    // Control characters are escaped (issue 14): a name can never fake a line of the output.
    if (const auto* s = n->as_string()) return printable(s->get());
    throw InputError(where(key), "expected a string in quotes");
  }
  std::string string(const std::string& key) const {
    auto s = opt_string(key);
    if (!s) throw InputError(where_table_key(key), "missing (required)");
    return *s;
  }
  std::string name() const {
    std::string s = string("name");
    if (s.empty()) throw InputError(where("name"), "must not be empty");
    return s;
  }
  // Range-checked on the 64-bit TOML value before the cast (issue 14).
  std::optional<int> opt_int(const std::string& key, std::int64_t lo, std::int64_t hi) const {
    const toml::node* n = t_.get(key);
    if (!n) return std::nullopt;
    if (const auto* i = n->as_integer()) return bounds::integer(i->get(), lo, hi, where(key));
    throw InputError(where(key), "expected a whole number");
  }
  // A quantity string parsed by `parse`, e.g. parse_length.
  template <class F>
  auto opt_quantity(const std::string& key, F parse) const -> std::optional<decltype(parse(std::string_view{}, Where{}))> {
    auto s = opt_quantity_text(key);
    if (!s) return std::nullopt;
    auto q = parse(*s, where(key));
    bounds::check(q, where(key));  // plausibility bounds by dimension (core/bounds.hpp)
    return q;
  }
  template <class F>
  auto quantity(const std::string& key, F parse) const {
    auto q = opt_quantity(key, parse);
    if (!q) throw InputError(where_table_key(key), "missing (required)");
    return *q;
  }
  std::optional<std::string> opt_quantity_text(const std::string& key) const {
    const toml::node* n = t_.get(key);
    if (!n) return std::nullopt;
    if (const auto* s = n->as_string()) return s->get();
    throw InputError(where(key), "expected a quantity with its unit in quotes, e.g. \"12 m\"");
  }
  Where where_table_key(const std::string& key) const {
    return Where{file_, line_of(t_), path_.empty() ? key : path_ + "." + key};
  }
  const std::string& file() const { return file_; }
  const std::string& path() const { return path_; }

 private:
  const toml::table& t_;
  std::string file_;
  std::string path_;
};

double len(std::string_view text, const Where& w) {
  const double v = parse_length(text, w, Sign::any).value();
  bounds::length(v, w, true);
  return v;
}

// ["12 m", "-4 m"]
PlanPoint plan_point(const toml::node& n, const Where& w) {
  const auto* a = n.as_array();
  if (!a || a->size() != 2)
    throw InputError(w, "expected a plan point [\"x m\", \"y m\"]");
  PlanPoint p;
  double v[2];
  for (std::size_t i = 0; i < 2; ++i) {
    const auto* s = (*a)[i].as_string();
    if (!s) throw InputError(w, "expected a plan point [\"x m\", \"y m\"] of quantities in quotes");
    v[i] = len(s->get(), w);
  }
  p.x_m = v[0];
  p.y_m = v[1];
  return p;
}

Point3 point3(const toml::node& n, const Where& w) {
  const auto* a = n.as_array();
  if (!a || a->size() != 3) throw InputError(w, "expected a point [\"x m\", \"y m\", \"z m\"]");
  double v[3];
  for (std::size_t i = 0; i < 3; ++i) {
    const auto* s = (*a)[i].as_string();
    if (!s) throw InputError(w, "expected a point [\"x m\", \"y m\", \"z m\"] of quantities in quotes");
    v[i] = len(s->get(), w);
  }
  return Point3{v[0], v[1], v[2]};
}

Polygon polygon(const Reader& r, const std::string& key) {
  const toml::node* n = r.node(key);
  if (!n) throw InputError(r.where_table_key(key), "missing (required)");
  const Where w = r.where(key);
  const auto* a = n->as_array();
  if (!a) throw InputError(w, "expected a polygon: an array of plan points [[\"x m\", \"y m\"], ...]");
  // Work estimated before it is done (issue 14): the self-intersection check is O(n²).
  constexpr std::size_t kMaxPolygonVertices = 10000;
  if (a->size() > kMaxPolygonVertices)
    throw InputError(w, "a polygon of " + std::to_string(a->size()) + " vertices is more than the cap of " +
                            std::to_string(kMaxPolygonVertices) + ": simplify it or split the zone");
  Polygon poly;
  for (const auto& v : *a) poly.push_back(plan_point(v, Where{w.file, line_of(v), w.field}));
  if (poly.size() < 3) throw InputError(w, "a polygon needs at least 3 vertices");
  if (auto bad = exposure::self_intersection(poly))
    throw InputError(w, "polygon is self-intersecting (edges " + std::to_string(bad->first + 1) + " and " +
                            std::to_string(bad->second + 1) + " cross or a vertex repeats)");
  if (std::abs(exposure::signed_area(poly)) <= 0.0) throw InputError(w, "polygon has no area");
  return poly;
}

// `kind = "keep_out"` (fenced or no access; `keeps_out = "everyone"` (default) or
// "uncontrolled", `barrier` = a note of the fence) or the default "people".
void read_zone_kind(const Reader& r, Zone& z) {
  const std::string kind = r.opt_string("kind").value_or("people");
  if (kind == "people") {
    z.kind = ZoneKind::people;
    for (const char* key : {"barrier", "keeps_out"})
      if (r.has(key)) throw InputError(r.where(key), "only allowed for kind = \"keep_out\"");
    return;
  }
  if (kind != "keep_out") throw InputError(r.where("kind"), "unknown zone kind \"" + kind + "\": expected people or keep_out");
  z.kind = ZoneKind::keep_out;
  if (r.has("tier"))
    throw InputError(r.where("tier"), "a keep_out zone has no tier: say whom it keeps out with keeps_out = "
                                      "\"everyone\" or \"uncontrolled\"");
  if (r.has("floors")) throw InputError(r.where("floors"), "a keep_out zone has no floors");
  const std::string who = r.opt_string("keeps_out").value_or("everyone");
  if (who == "everyone") z.keeps_out = KeepsOut::everyone;
  else if (who == "uncontrolled") z.keeps_out = KeepsOut::uncontrolled;
  else throw InputError(r.where("keeps_out"), "expected everyone or uncontrolled");
  z.barrier = r.opt_string("barrier").value_or("");
}

// `holes = [[["x m", "y m"], ...], ...]`: parts of the zone's polygon that are not in the zone;
// each hole lies within the polygon.
std::vector<Polygon> zone_holes(const Reader& r, const Polygon& outer) {
  std::vector<Polygon> out;
  const toml::node* n = r.node("holes");
  if (!n) return out;
  const auto* a = n->as_array();
  const Where w = r.where("holes");
  if (!a) throw InputError(w, "expected an array of polygons [[[\"x m\", \"y m\"], ...], ...]");
  for (const auto& h : *a) {
    const Where wh{w.file, line_of(h), w.field};
    const auto* pts = h.as_array();
    if (!pts) throw InputError(wh, "expected a polygon: an array of plan points");
    Polygon poly;
    for (const auto& v : *pts) poly.push_back(plan_point(v, Where{w.file, line_of(v), w.field}));
    if (poly.size() < 3) throw InputError(wh, "a hole needs at least 3 vertices");
    if (exposure::self_intersection(poly)) throw InputError(wh, "the hole is self-intersecting");
    if (std::abs(exposure::signed_area(poly)) <= 0.0) throw InputError(wh, "the hole has no area");
    if (!geometry::ring_within(poly, outer)) throw InputError(wh, "the hole is not inside the zone's polygon");
    out.push_back(std::move(poly));
  }
  return out;
}

std::vector<double> heights(const Reader& r, const std::string& key) {
  const toml::node* n = r.node(key);
  const Where w = r.where(key);
  const auto* a = n ? n->as_array() : nullptr;
  if (!a || a->empty()) throw InputError(w, "expected an array of heights, e.g. [\"0 m\", \"2.8 m\"]");
  std::vector<double> out;
  for (const auto& v : *a) {
    const auto* s = v.as_string();
    if (!s) throw InputError(w, "expected heights in quotes with their unit, e.g. \"2.8 m\"");
    out.push_back(parse_length(s->get(), w).value());
    bounds::length(out.back(), w);
  }
  return out;
}

limits::Tier tier(const Reader& r) {
  const std::string s = r.string("tier");
  auto t = limits::tier_from_string(s);
  if (!t)
    throw InputError(r.where("tier"), "unknown tier \"" + s + "\"" + did_you_mean(s, {"controlled", "uncontrolled"}) +
                                          ": expected controlled or uncontrolled");
  return *t;
}

const toml::array* array_of_tables(const toml::table& root, const std::string& key, const std::string& file) {
  const toml::node* n = root.get(key);
  if (!n) return nullptr;
  const auto* a = n->as_array();
  if (!a || !a->is_array_of_tables())
    throw InputError(Where{file, line_of(*n), key}, "expected an array of tables written [[" + key + "]]");
  return a;
}

template <class T>
void check_unique(const std::vector<T>& items, const std::string& what, const std::string& file) {
  std::set<std::string> seen;
  for (const auto& it : items)
    if (!seen.insert(it.name).second)
      throw InputError(Where{file, it.line, what + ".name"}, "duplicate name \"" + it.name + "\"");
}

std::optional<AntennaKind> antenna_kind(const std::string& s) {
  if (s == "dipole") return AntennaKind::dipole;
  if (s == "inverted_v") return AntennaKind::inverted_v;
  if (s == "vertical") return AntennaKind::vertical;
  if (s == "yagi") return AntennaKind::yagi;
  if (s == "gain") return AntennaKind::gain_only;
  if (s == "collinear") return AntennaKind::collinear;
  if (s == "aperture") return AntennaKind::aperture;
  if (s == "folded_dipole") return AntennaKind::folded_dipole;
  if (s == "loop") return AntennaKind::loop;
  if (s == "end_fed_half_wave") return AntennaKind::end_fed_half_wave;
  if (s == "ocf_dipole") return AntennaKind::ocf_dipole;
  if (s == "wires") return AntennaKind::wires;
  return std::nullopt;
}

std::string indexed(const std::string& key, std::size_t i) { return key + "[" + std::to_string(i) + "]"; }

// `wire = "14-awg-hard-drawn-copper"`: the conductor, a class of tables/clearances.toml (used by the
// NFPA 70 Table 810.52 size check of the antenna's wires).
std::optional<siting::WireClass> antenna_wire_class(const Reader& r) {
  const auto name = r.opt_string("wire");
  if (!name) return std::nullopt;
  const auto& tables = siting::builtin_clearance_tables();
  if (const siting::WireClass* w = tables.find_wire(*name)) return *w;
  std::string list;
  for (const auto& x : tables.wires) list += (list.empty() ? "" : ", ") + x.name;
  throw InputError(r.where("wire"), "unknown wire class \"" + *name + "\" (known: " + list + ")");
}

// "0.6 dB/100 ft" or "2 dB per 100 m": a matched loss per length, returned in dB per 100 m.
double loss_per_100m(const std::string& text, const Where& w) {
  std::size_t db = text.find("dB");
  if (db == std::string::npos) throw InputError(w, "expected a loss per length such as \"0.6 dB/100 ft\"");
  double value = 0.0;
  try {
    std::size_t used = 0;
    value = std::stod(text.substr(0, db), &used);
    if (text.substr(0, db).find_first_not_of(" \t", used) != std::string::npos) throw std::invalid_argument("");
  } catch (const std::exception&) {
    throw InputError(w, "expected a loss per length such as \"0.6 dB/100 ft\", got \"" + text + "\"");
  }
  std::string rest = text.substr(db + 2);
  const auto start = rest.find_first_not_of(" \t");
  rest = start == std::string::npos ? "" : rest.substr(start);
  if (rest.rfind("/", 0) == 0) rest = rest.substr(1);
  else if (rest.rfind("per ", 0) == 0) rest = rest.substr(4);
  else throw InputError(w, "expected a loss per length such as \"0.6 dB/100 ft\", got \"" + text + "\"");
  const double per = parse_length(rest, w).value();
  if (!(per > 0.0) || !(value >= 0.0) || !std::isfinite(value))
    throw InputError(w, "expected a positive loss per positive length, got \"" + text + "\"");
  return value * 100.0 / per;
}

// A feed line defined inline: `z0` + `velocity_factor` + `matched_loss = [["14 MHz",
// "0.3 dB/100 ft"], ...]` (one point: scaled by the smaller of the √f and f laws; two or more:
// fitted k1·√f + k2·f and refused outside the points), or parallel-wire geometry
// `conductor_diameter` + `spacing` + `velocity_factor` + `material` (power/feedline.hpp).
std::optional<power::FeedLine> inline_feed_line(const Reader& r, const std::string& name) {
  const bool loss_form = r.has("z0") || r.has("matched_loss");
  const bool wire_form = r.has("conductor_diameter") || r.has("spacing") || r.has("material");
  const bool has_class = r.has("class");
  if (has_class && (loss_form || wire_form || r.has("velocity_factor")))
    throw InputError(r.where("class"), "give either class or an inline line (z0 + velocity_factor + matched_loss, "
                                       "or conductor_diameter + spacing + velocity_factor + material), not both");
  if (loss_form && wire_form)
    throw InputError(r.where("z0"), "give either z0 + matched_loss or parallel-wire geometry, not both");
  if (!has_class && !loss_form && !wire_form)
    throw InputError(r.where_table_key("class"), "missing: give a class from tables/feedlines.toml (or --tables) or "
                                                 "define the line inline (z0 + matched_loss, or conductor_diameter + spacing)");
  if (has_class) return std::nullopt;
  double vf = 1.0;
  if (const toml::node* n = r.node("velocity_factor")) {
    const auto v = n->value<double>();
    if (!v || !(*v > 0.0 && *v <= 1.0)) throw InputError(r.where("velocity_factor"), "expected a number above 0, at most 1");
    vf = *v;
  } else {
    throw InputError(r.where_table_key("velocity_factor"), "missing (required for an inline line)");
  }
  if (wire_form) {
    power::ParallelWireGeometry g;
    g.conductor_diameter = r.quantity("conductor_diameter", [](std::string_view t, const Where& w) { return parse_length(t, w); });
    g.spacing = r.quantity("spacing", [](std::string_view t, const Where& w) { return parse_length(t, w); });
    if (!(g.conductor_diameter.value() > 0.0)) throw InputError(r.where("conductor_diameter"), "must be greater than zero");
    if (!(g.spacing.value() > g.conductor_diameter.value()))
      throw InputError(r.where("spacing"), "centre-to-centre spacing must exceed the conductor diameter");
    g.velocity_factor = vf;
    const std::string mat = r.string("material");
    if (mat == "copper") g.material = power::ConductorMaterial::copper;
    else if (mat == "copper-clad-steel") g.material = power::ConductorMaterial::copper_clad_steel;
    else throw InputError(r.where("material"), "unknown material \"" + mat + "\"; expected copper or copper-clad-steel");
    power::FeedLine l = power::parallel_wire_line(name + " (inline)", g);
    l.description = "parallel-wire line defined in the station file";
    l.source_line = r.line();
    return l;
  }
  const auto z0 = r.quantity("z0", parse_impedance);
  if (!(z0.value() > 0.0)) throw InputError(r.where("z0"), "must be greater than zero");
  const toml::node* n = r.node("matched_loss");
  const auto* arr = n ? n->as_array() : nullptr;
  const Where wl = n ? r.where("matched_loss") : r.where_table_key("matched_loss");
  if (!arr || arr->empty())
    throw InputError(wl, "expected matched_loss = [[\"14 MHz\", \"0.3 dB/100 ft\"], ...] (at least one point)");
  std::vector<power::AttenuationPoint> pts;
  for (const auto& p : *arr) {
    const Where w{wl.file, line_of(p), wl.field};
    const auto* pair = p.as_array();
    if (!pair || pair->size() != 2 || !(*pair)[0].is_string() || !(*pair)[1].is_string())
      throw InputError(w, "expected a point [\"frequency\", \"loss per length\"], e.g. [\"14 MHz\", \"0.3 dB/100 ft\"]");
    const double f = parse_frequency(*(*pair)[0].value<std::string>(), w).value();
    if (!(f > 0.0)) throw InputError(w, "the frequency must be greater than zero");
    pts.push_back({f / 1e6, loss_per_100m(*(*pair)[1].value<std::string>(), w)});
  }
  for (std::size_t k = 1; k < pts.size(); ++k)
    if (!(pts[k].f_mhz > pts[k - 1].f_mhz)) throw InputError(wl, "frequencies must rise strictly");
  power::FeedLine l;
  if (pts.size() == 1) {
    l = power::user_line(name + " (inline)", power::UserLineData{z0, pts[0].db_per_100m,
                                                                  units::hertz(pts[0].f_mhz * 1e6), vf});
  } else {
    l.name = name + " (inline)";
    l.kind = power::LineKind::coax;
    l.z0 = z0;
    l.velocity_factor = vf;
    l.coax = power::fit_coax(std::move(pts));
    l.confidence = "confirmed";  // the user's own data, as stated
  }
  l.description = "line defined in the station file";
  l.source = "the station file (" + r.file() + ")";
  l.source_line = r.line();
  return l;
}

// `route = [["x m", "y m", "z m"], ...]`: where a feed line runs, at least two points.
std::vector<Point3> feed_line_route(const Reader& r) {
  std::vector<Point3> route;
  const toml::node* n = r.node("route");
  if (!n) return route;
  const auto* a = n->as_array();
  const Where w = r.where("route");
  if (!a || a->size() < 2)
    throw InputError(w, "expected a route of at least two points [[\"x m\", \"y m\", \"z m\"], ...]");
  for (const auto& v : *a) {
    route.push_back(point3(v, Where{w.file, line_of(v), w.field}));
    if (route.back().z_m < 0.0) throw InputError(Where{w.file, line_of(v), w.field}, "a route point is below ground");
  }
  for (std::size_t k = 0; k + 1 < route.size(); ++k)
    if (route[k].x_m == route[k + 1].x_m && route[k].y_m == route[k + 1].y_m && route[k].z_m == route[k + 1].z_m)
      throw InputError(w, "two consecutive points of the route are the same");
  return route;
}

double length_value(const Reader& r, const std::string& key) {
  return r.quantity(key, [](std::string_view t, const Where& w) { return parse_length(t, w); }).value();
}

// The keys that shape the wire of the newer kinds: `end_heights` (sloping dipole), `end_height`,
// `counterpoise`, `matching_ratio` (end-fed), `spacing`, `second_wire_diameter` (folded dipole),
// `sides` (loop), `feed_position` (OCF, wires) and `wires` + `feed_wire` (free-form).
void read_wire_shape(const Reader& r, Antenna& a) {
  const bool dipole_like = a.kind == AntennaKind::dipole || a.kind == AntennaKind::ocf_dipole;
  auto only_for = [&](const std::string& key, bool allowed, const std::string& kinds) {
    if (r.has(key) && !allowed) throw InputError(r.where(key), "only allowed for kind = " + kinds);
  };
  only_for("end_heights", dipole_like, "\"dipole\" or \"ocf_dipole\"");
  only_for("end_height", a.kind == AntennaKind::end_fed_half_wave, "\"end_fed_half_wave\"");
  only_for("counterpoise", a.kind == AntennaKind::end_fed_half_wave, "\"end_fed_half_wave\"");
  only_for("matching_ratio", a.kind == AntennaKind::end_fed_half_wave, "\"end_fed_half_wave\"");
  only_for("spacing", a.kind == AntennaKind::folded_dipole, "\"folded_dipole\"");
  only_for("second_wire_diameter", a.kind == AntennaKind::folded_dipole, "\"folded_dipole\"");
  only_for("sides", a.kind == AntennaKind::loop, "\"loop\"");
  only_for("feed_position", a.kind == AntennaKind::ocf_dipole || a.kind == AntennaKind::wires,
           "\"ocf_dipole\" or \"wires\"");
  only_for("wires", a.kind == AntennaKind::wires, "\"wires\"");
  only_for("feed_wire", a.kind == AntennaKind::wires, "\"wires\"");

  if (r.has("end_heights")) {
    if (r.has("height"))
      throw InputError(r.where("height"), "give either height or end_heights (a sloping wire), not both");
    const auto hs = heights(r, "end_heights");
    if (hs.size() != 2) throw InputError(r.where("end_heights"), "expected two heights: [\"end 1\", \"end 2\"]");
    a.end_heights_m = std::make_pair(hs[0], hs[1]);
    a.height_m = 0.5 * (hs[0] + hs[1]);
  }
  if (r.has("end_height")) a.end_height_m = length_value(r, "end_height");
  if (r.has("counterpoise")) {
    a.counterpoise_m = length_value(r, "counterpoise");
    if (!(*a.counterpoise_m > 0.0)) throw InputError(r.where("counterpoise"), "must be greater than zero");
  }
  if (const toml::node* n = r.node("matching_ratio")) {
    const auto* t = n->as_string();
    double ratio = 0.0;
    if (t) {
      const std::string v = t->get();
      const auto colon = v.find(':');
      try {
        if (colon != std::string::npos && v.substr(colon + 1) == "1") ratio = std::stod(v.substr(0, colon));
      } catch (const std::exception&) {
        ratio = 0.0;
      }
    }
    if (!(ratio >= 1.0 && ratio <= 1000.0))
      throw InputError(r.where("matching_ratio"), "expected an impedance ratio such as \"49:1\" (1:1 to 1000:1)");
    a.matching_ratio = ratio;
  }
  if (r.has("spacing")) {
    a.spacing_m = length_value(r, "spacing");
    if (!(*a.spacing_m > 0.0)) throw InputError(r.where("spacing"), "must be greater than zero");
  }
  if (r.has("second_wire_diameter")) {
    a.second_wire_diameter_m = length_value(r, "second_wire_diameter");
    if (!(*a.second_wire_diameter_m > 0.0))
      throw InputError(r.where("second_wire_diameter"), "must be greater than zero");
  }
  if (auto n = r.opt_int("sides", 3, 64)) {
    if (*n < 3 || *n > 64) throw InputError(r.where("sides"), "must be 3 to 64");
    a.sides = *n;
  }
  if (auto f = r.opt_quantity("feed_position", parse_fraction)) {
    if (!(f->value > 0.0 && f->value < 1.0)) throw InputError(r.where("feed_position"), "must be between 0 % and 100 %");
    a.feed_fraction = f->value;
  }
  if (a.kind != AntennaKind::wires) return;
  for (const char* key : {"position", "height", "azimuth", "length"})
    if (r.has(key))
      throw InputError(r.where(key), "not used with kind = \"wires\": the wires give the geometry (site frame)");
  const toml::node* n = r.node("wires");
  const auto* arr = n ? n->as_array() : nullptr;
  if (!arr || arr->empty())
    throw InputError(n ? r.where("wires") : r.where_table_key("wires"),
                     "expected wires = [{ from = [\"x m\", \"y m\", \"z m\"], to = [...] }, ...]");
  std::size_t i = 0;
  for (const auto& w : *arr) {
    const std::string field = r.path() + ".wires[" + std::to_string(i++) + "]";
    const auto* t = w.as_table();
    if (!t) throw InputError(Where{r.file(), line_of(w), field}, "expected a table { from = [...], to = [...] }");
    Reader wr(*t, r.file(), field, {"from", "to", "diameter"});
    FreeWire fw;
    if (!wr.has("from")) throw InputError(wr.where_table_key("from"), "missing (required)");
    if (!wr.has("to")) throw InputError(wr.where_table_key("to"), "missing (required)");
    fw.from = point3(*wr.node("from"), wr.where("from"));
    fw.to = point3(*wr.node("to"), wr.where("to"));
    if (fw.from.z_m < 0.0 || fw.to.z_m < 0.0) throw InputError(wr.where("from"), "a wire end is below ground");
    const double dx = fw.to.x_m - fw.from.x_m, dy = fw.to.y_m - fw.from.y_m, dz = fw.to.z_m - fw.from.z_m;
    if (std::sqrt(dx * dx + dy * dy + dz * dz) < 1e-3) throw InputError(wr.where("to"), "the wire has no length");
    if (wr.has("diameter")) {
      fw.diameter_m = length_value(wr, "diameter");
      if (!(*fw.diameter_m > 0.0)) throw InputError(wr.where("diameter"), "must be greater than zero");
    }
    a.free_wires.push_back(fw);
  }
  const auto fw = r.opt_int("feed_wire", 1, 1000);
  if (!fw) throw InputError(r.where_table_key("feed_wire"), "missing (required for kind = \"wires\"): the fed wire, 1 = the first");
  if (*fw < 1 || static_cast<std::size_t>(*fw) > a.free_wires.size())
    throw InputError(r.where("feed_wire"), "must be 1 to " + std::to_string(a.free_wires.size()) + " (a wire of the list)");
  a.feed_wire = *fw - 1;
  const FreeWire& fed = a.free_wires[static_cast<std::size_t>(a.feed_wire)];
  const double t = a.feed_fraction.value_or(0.5);
  a.position.x_m = fed.from.x_m + t * (fed.to.x_m - fed.from.x_m);
  a.position.y_m = fed.from.y_m + t * (fed.to.y_m - fed.from.y_m);
  a.height_m = fed.from.z_m + t * (fed.to.z_m - fed.from.z_m);
}

Antenna read_antenna(const Reader& r) {
  Antenna a;
  a.line = r.line();
  a.name = r.name();
  const std::string kind = r.string("kind");
  auto k = antenna_kind(kind);
  if (!k)
    throw InputError(r.where("kind"),
                     "unknown antenna kind \"" + kind + "\"" +
                         did_you_mean(kind, {"dipole", "inverted_v", "vertical", "yagi", "gain", "collinear", "aperture",
                                             "folded_dipole", "loop", "end_fed_half_wave", "ocf_dipole", "wires"}) +
                         ": expected dipole, inverted_v, vertical, yagi, gain, "
                     "collinear, aperture, folded_dipole, loop, end_fed_half_wave, ocf_dipole or wires");
  a.kind = *k;
  read_wire_shape(r, a);  // end heights, free-form wires (may set the position and height)
  if (a.kind != AntennaKind::wires) {
    a.position = plan_point(*[&]() -> const toml::node* {
      if (!r.has("position")) throw InputError(r.where_table_key("position"), "missing (required)");
      return r.node("position");
    }(), r.where("position"));
  }
  if (a.kind != AntennaKind::wires && !a.end_heights_m) {
    const double h = r.quantity("height", [](std::string_view t, const Where& w) { return len(t, w); });
    if (h < 0.0) throw InputError(r.where("height"), "antenna is below ground (height " + std::to_string(h) + " m)");
    a.height_m = h;
  }
  if (auto az = r.opt_quantity("azimuth", parse_angle)) a.azimuth_rad = az->value();
  if (auto l = r.opt_quantity("length", [](std::string_view t, const Where& w) { return parse_length(t, w); }))
    a.length_m = l->value();
  if (auto d = r.opt_quantity("wire_diameter", [](std::string_view t, const Where& w) { return parse_length(t, w); }))
    a.wire_diameter_m = d->value();
  if (auto ang = r.opt_quantity("apex_angle", parse_angle)) a.apex_angle_rad = ang->value();
  a.elements = r.opt_int("elements", 2, 8);
  if (auto n = r.opt_int("radials", 0, 64)) a.radials = *n;
  if (auto l = r.opt_quantity("radial_length", [](std::string_view t, const Where& w) { return parse_length(t, w); }))
    a.radial_length_m = l->value();
  if (auto f = r.opt_quantity("band_centre", parse_frequency)) a.band_centre_hz = f->value();
  a.gain = r.opt_quantity("gain", parse_gain);
  if (auto d = r.opt_quantity("diameter", [](std::string_view t, const Where& w) { return parse_length(t, w); }))
    a.diameter_m = d->value();
  if (auto e = r.opt_quantity("efficiency", parse_fraction)) a.efficiency = e->value;
  if (auto b = r.opt_quantity("beamwidth", parse_angle)) a.beamwidth_rad = b->value();
  a.wire = antenna_wire_class(r);

  auto need = [&](bool present, const std::string& key) {
    if (!present) throw InputError(r.where_table_key(key), "missing (required for kind = \"" + kind + "\")");
  };
  auto positive = [&](const std::optional<double>& v, const std::string& key) {
    if (v && !(*v > 0.0)) throw InputError(r.where(key), "must be greater than zero");
  };
  positive(a.length_m, "length");
  positive(a.wire_diameter_m, "wire_diameter");
  positive(a.diameter_m, "diameter");
  switch (a.kind) {
    case AntennaKind::dipole:
    case AntennaKind::ocf_dipole:
      need(a.length_m.has_value(), "length");
      if (a.kind == AntennaKind::ocf_dipole) need(a.feed_fraction.has_value(), "feed_position");
      if (a.end_heights_m && !(std::abs(a.end_heights_m->second - a.end_heights_m->first) < *a.length_m))
        throw InputError(r.where("end_heights"), "the ends differ in height by more than the wire's length");
      break;
    case AntennaKind::folded_dipole:
      need(a.length_m.has_value(), "length");
      need(a.spacing_m.has_value(), "spacing");
      if (!(*a.spacing_m < 0.1 * *a.length_m))
        throw InputError(r.where("spacing"), "must be less than a tenth of the length (a folded dipole, not a loop)");
      break;
    case AntennaKind::loop: need(a.length_m.has_value(), "length"); break;
    case AntennaKind::end_fed_half_wave:
      need(a.length_m.has_value(), "length");
      if (a.end_height_m && !(std::abs(*a.end_height_m - a.height_m) < *a.length_m))
        throw InputError(r.where("end_height"), "the ends differ in height by more than the wire's length");
      if (a.end_height_m && *a.end_height_m < 0.0) throw InputError(r.where("end_height"), "below ground");
      break;
    case AntennaKind::wires: break;
    case AntennaKind::vertical:
      need(a.length_m.has_value(), "length");
      if (a.height_m > 0.0 && a.radials > 0) need(a.radial_length_m.has_value(), "radial_length");
      if (a.height_m > 0.0 && a.radials == 0)
        throw InputError(r.where_table_key("radials"),
                         "an elevated vertical (height above 0 m) needs radials and radial_length");
      break;
    case AntennaKind::inverted_v:
      need(a.length_m.has_value(), "length");
      need(a.apex_angle_rad.has_value(), "apex_angle");
      if (!(*a.apex_angle_rad > 0.0 && *a.apex_angle_rad < constants::pi))
        throw InputError(r.where("apex_angle"), "must be between 0 and 180 deg");
      break;
    case AntennaKind::yagi:
      need(a.elements.has_value(), "elements");
      need(a.band_centre_hz.has_value(), "band_centre");
      if (*a.elements < 2 || *a.elements > 8) throw InputError(r.where("elements"), "must be 2 to 8");
      break;
    case AntennaKind::gain_only: need(a.gain.has_value(), "gain"); break;
    case AntennaKind::collinear:
      need(a.gain.has_value(), "gain");
      need(a.length_m.has_value(), "length");
      break;
    case AntennaKind::aperture:
      need(a.diameter_m.has_value(), "diameter");
      if (!a.gain && !a.efficiency) throw InputError(r.where_table_key("efficiency"), "give efficiency or gain");
      break;
  }
  return a;
}


Operation read_operation(const Reader& r) {
  Operation o;
  o.line = r.line();
  o.name = r.name();
  o.transmitter = r.string("transmitter");
  o.feed_line = r.opt_string("feed_line").value_or("");
  o.antenna = r.string("antenna");
  o.frequency = r.quantity("frequency", parse_frequency);
  if (!(o.frequency.value() > 0.0)) throw InputError(r.where("frequency"), "must be greater than zero");
  o.mode = r.opt_string("mode").value_or("");
  if (auto d = r.opt_quantity("duty", parse_fraction)) {
    bounds::duty(d->value, r.where("duty"));
    o.duty = d->value;
  }
  if (o.mode.empty() == !o.duty.has_value())
    throw InputError(r.where_table_key("mode"), "give exactly one of mode (e.g. \"ssb\") or duty (e.g. \"40 %\")");
  o.on = r.opt_quantity("on", parse_time);
  o.off = r.opt_quantity("off", parse_time);
  if (o.on.has_value() != o.off.has_value())
    throw InputError(r.where_table_key(o.on ? "off" : "on"), "give both on and off (the operating pattern), or neither");
  if (o.on && !(o.on->value() > 0.0)) throw InputError(r.where("on"), "must be greater than zero");
  o.group = r.opt_string("group").value_or("");
  return o;
}

}  // namespace

std::string_view demo_station_text() {
  auto t = io::embedded_file(kDemoStationPath);
  return t ? *t : std::string_view{};
}

std::string read_station_text(const std::string& path) {
  std::error_code ec;
  if (std::filesystem::is_directory(path, ec))
    throw InputError(Where{path, 0, ""}, "is a directory, not a station file");
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(Where{path, 0, ""}, "cannot read the station file");
  std::ostringstream ss;
  ss << in.rdbuf();
  if (in.bad()) throw InputError(Where{path, 0, ""}, "cannot read the station file");
  std::string text = ss.str();
  if (text.find_first_not_of(" \t\r\n") == std::string::npos)
    throw InputError(Where{path, 1, ""}, "the station file is empty");
  return text;
}

Station load_station_file(const std::string& path) { return load_station(read_station_text(path), path); }

Station load_station(std::string_view toml_text, const std::string& file) {
  if (toml_text.find_first_not_of(" \t\r\n") == std::string_view::npos)
    throw InputError(Where{file, 0, ""}, "the station file is empty");
  toml::table root;
  try {
    root = toml::parse(toml_text, file);
  } catch (const toml::parse_error& e) {
    throw InputError(Where{file, static_cast<int>(e.source().begin.line), ""},
                     "not valid TOML: " + std::string(e.description()));
  }
  // Every error is collected per table entry and the loading goes on (up to kMaxErrors), so that
  // one run reports them all (issue 14). References to a table that had errors are not checked.
  ErrorCollector errs;
  errs.run([&] {
    Reader top(root, file, "",
               {"station", "site", "building", "zone", "point", "transmitter", "feed_line", "antenna", "operation",
                "power_line", "support", "span"});
  });
  Station st;
  st.file = file;
  std::set<std::string> failed;  // tables with an entry that could not be read
  auto entry = [&](const std::string& table, auto&& f) {
    if (!errs.run(f)) failed.insert(table);
  };
  auto tables = [&](const std::string& key) {
    const toml::array* a = nullptr;
    entry(key, [&] { a = array_of_tables(root, key, file); });
    return a;
  };

  // [station]
  const toml::table* station_t = root["station"].as_table();
  if (!station_t) errs.add(InputError(Where{file, 1, "station"}, "missing the [station] table"));
  if (station_t) entry("station", [&] {
    Reader r(*station_t, file, "station", {"name", "standard", "evaluator", "operating_position"});
    st.name = r.name();
    if (auto s = r.opt_string("standard")) {
      auto id = limits::standard_from_string(*s);
      if (!id)
        throw InputError(r.where("standard"), "unknown standard \"" + *s + "\"" +
                                                  did_you_mean(*s, {"fcc", "icnirp2020", "icnirp1998", "sc6"}) +
                                                  ": expected fcc, icnirp2020, icnirp1998 or sc6");
      st.standard = *id;
    }
    st.evaluator = r.opt_string("evaluator").value_or("");
    // Where the transmitter stands (feed-line routing of `standoff place`): [x, y] or [x, y, z].
    if (const toml::node* n = r.node("operating_position")) {
      const auto* a = n->as_array();
      if (a && a->size() == 2) {
        const PlanPoint p = plan_point(*n, r.where("operating_position"));
        st.operating_position = Point3{p.x_m, p.y_m, 0.0};
      } else {
        st.operating_position = point3(*n, r.where("operating_position"));
      }
      if (st.operating_position->z_m < 0.0)
        throw InputError(r.where("operating_position"), "the operating position is below ground");
      st.operating_position_line = r.where("operating_position").line;
    }
  });

  // [site]
  const toml::table* site_t = root["site"].as_table();
  if (!site_t) errs.add(InputError(Where{file, 1, "site"}, "missing the [site] table"));
  if (site_t) entry("site", [&] {
    Reader r(*site_t, file, "site", {"ground", "boundary", "default_tier"});
    if (auto t = r.opt_string("default_tier")) {
      auto tt = limits::tier_from_string(*t);
      if (!tt) throw InputError(r.where("default_tier"), "unknown tier \"" + *t + "\": expected controlled or uncontrolled");
      st.site.default_tier = *tt;
    }
    if (auto g = r.opt_string("ground")) {
      em::ground_by_name(*g, r.where("ground"));  // the names of `wire --ground` (tables/grounds.toml)
      st.site.ground = *g;
    }
    st.site.boundary = polygon(r, "boundary");
  });

  if (const auto* a = tables("building")) {
    std::size_t i = 0;
    for (const auto& n : *a) entry("building", [&] {
      Reader r(*n.as_table(), file, indexed("building", i++), {"name", "footprint", "floors", "height"});
      Building b;
      b.line = r.line();
      b.name = r.name();
      b.footprint = polygon(r, "footprint");
      b.floors_m = r.has("floors") ? heights(r, "floors") : std::vector<double>{0.0};
      b.height_m = r.quantity("height", [](std::string_view t, const Where& w) { return parse_length(t, w); }).value();
      for (double f : b.floors_m)
        if (f >= b.height_m) throw InputError(r.where("floors"), "a floor is at or above the building's height");
      st.site.buildings.push_back(std::move(b));
    });
    entry("building", [&] { check_unique(st.site.buildings, "building", file); });
  }

  if (const auto* a = tables("zone")) {
    std::size_t i = 0;
    for (const auto& n : *a) entry("zone", [&] {
      Reader r(*n.as_table(), file, indexed("zone", i++),
               {"name", "polygon", "building", "tier", "floors", "kind", "holes", "barrier", "keeps_out"});
      Zone z;
      z.line = r.line();
      z.name = r.name();
      read_zone_kind(r, z);
      if (z.kind == ZoneKind::people) z.tier = tier(r);
      z.building = r.opt_string("building").value_or("");
      if (!z.building.empty()) {
        if (r.has("polygon")) throw InputError(r.where("polygon"), "give either polygon or building, not both");
        const Building* b = nullptr;
        for (const auto& bb : st.site.buildings)
          if (bb.name == z.building) b = &bb;
        if (!b && failed.contains("building")) return void(failed.insert("zone"));  // already reported
        if (!b) throw InputError(r.where("building"), "unknown building \"" + z.building + "\"");
        z.polygon = b->footprint;
        z.floors_m = b->floors_m;
      } else {
        z.polygon = polygon(r, "polygon");
        z.floors_m = {0.0};
      }
      if (r.has("floors")) z.floors_m = heights(r, "floors");
      z.holes = zone_holes(r, z.polygon);
      st.site.zones.push_back(std::move(z));
    });
    entry("zone", [&] { check_unique(st.site.zones, "zone", file); });
  }
  if (!failed.contains("zone") &&
      std::none_of(st.site.zones.begin(), st.site.zones.end(), [](const Zone& z) { return z.kind == ZoneKind::people; }))
    errs.add(InputError(Where{file, 1, "zone"}, "no [[zone]]: describe at least one place where people can be"));

  if (const auto* a = tables("point")) {
    std::size_t i = 0;
    for (const auto& n : *a) entry("point", [&] {
      Reader r(*n.as_table(), file, indexed("point", i++), {"name", "at", "tier"});
      PointOfInterest p;
      p.line = r.line();
      p.name = r.name();
      if (!r.has("at")) throw InputError(r.where_table_key("at"), "missing (required)");
      p.at = point3(*r.node("at"), r.where("at"));
      if (p.at.z_m < 0.0) throw InputError(r.where("at"), "point is below ground");
      p.tier = r.has("tier") ? tier(r) : limits::Tier::uncontrolled;
      st.site.points.push_back(p);
    });
    entry("point", [&] { check_unique(st.site.points, "point", file); });
  }

  if (const auto* a = tables("transmitter")) {
    std::size_t i = 0;
    for (const auto& n : *a) entry("transmitter", [&] {
      Reader r(*n.as_table(), file, indexed("transmitter", i++), {"name", "pep"});
      Transmitter t;
      t.line = r.line();
      t.name = r.name();
      t.pep = r.quantity("pep", parse_power);
      bounds::power_pep(t.pep.value(), r.where("pep"));
      st.transmitters.push_back(t);
    });
    entry("transmitter", [&] { check_unique(st.transmitters, "transmitter", file); });
  }

  if (const auto* a = tables("feed_line")) {
    std::size_t i = 0;
    for (const auto& n : *a) entry("feed_line", [&] {
      Reader r(*n.as_table(), file, indexed("feed_line", i++),
               {"name", "class", "length", "swr", "route", "z0", "velocity_factor", "matched_loss",
                "conductor_diameter", "spacing", "material"});
      FeedLine f;
      f.line = r.line();
      f.name = r.name();
      f.inline_line = inline_feed_line(r, f.name);
      if (!f.inline_line) f.line_class = r.string("class");
      f.length = r.quantity("length", [](std::string_view t, const Where& w) { return parse_length(t, w); });
      if (const toml::node* sw = r.node("swr")) {
        // A number (swr = 1.5) or a quoted ratio (swr = "1.5" or "1.5:1").
        double v = 0.0;
        bool ok = false;
        if (sw->is_number()) {
          v = sw->value<double>().value_or(0.0);
          ok = true;
        } else if (const auto* str = sw->as_string()) {
          std::string t = str->get();
          while (!t.empty() && t.back() == ' ') t.pop_back();
          if (t.size() > 2 && t.substr(t.size() - 2) == ":1") t.resize(t.size() - 2);
          const auto [ptr, ec] = std::from_chars(t.data(), t.data() + t.size(), v);
          ok = ec == std::errc() && ptr == t.data() + t.size() && std::isfinite(v);
        }
        if (!ok || !(v >= 1.0)) throw InputError(r.where("swr"), "expected a number of 1 or more, e.g. swr = 1.5 or swr = \"1.5:1\"");
        bounds::swr(v, r.where("swr"));
        f.swr = v;
      }
      f.route = feed_line_route(r);
      st.feed_lines.push_back(f);
    });
    entry("feed_line", [&] { check_unique(st.feed_lines, "feed_line", file); });
  }

  if (const auto* a = tables("antenna")) {
    std::size_t i = 0;
    for (const auto& n : *a) entry("antenna", [&] {
      Reader r(*n.as_table(), file, indexed("antenna", i++),
               {"name", "kind", "position", "height", "azimuth", "length", "wire_diameter", "apex_angle", "elements",
                "band_centre", "gain", "diameter", "efficiency", "beamwidth", "radials", "radial_length", "wire",
                "end_heights", "end_height", "counterpoise", "matching_ratio", "spacing", "second_wire_diameter",
                "sides", "feed_position", "wires", "feed_wire"});
      Antenna ant = read_antenna(r);
      // An attic or indoor antenna is allowed: the building does not shield (station/sources.cpp
      // evaluates the building's floors and adds a caution).
      for (const auto& b : st.site.buildings)
        if (exposure::inside(b.footprint, ant.position) && ant.height_m < b.height_m) ant.inside_building = b.name;
      st.antennas.push_back(std::move(ant));
    });
    entry("antenna", [&] { check_unique(st.antennas, "antenna", file); });
  }

  if (const auto* a = tables("operation")) {
    std::size_t i = 0;
    for (const auto& n : *a) entry("operation", [&] {
      Reader r(*n.as_table(), file, indexed("operation", i++),
               {"name", "transmitter", "feed_line", "antenna", "frequency", "mode", "duty", "on", "off", "group"});
      Operation o = read_operation(r);
      if (!st.transmitter(o.transmitter) && failed.contains("transmitter")) return void(failed.insert("operation"));
      if (!o.feed_line.empty() && !st.feed_line(o.feed_line) && failed.contains("feed_line")) return void(failed.insert("operation"));
      if (!st.transmitter(o.transmitter))
        throw InputError(r.where("transmitter"), "unknown transmitter \"" + o.transmitter + "\"");
      if (!o.feed_line.empty() && !st.feed_line(o.feed_line))
        throw InputError(r.where("feed_line"), "unknown feed line \"" + o.feed_line + "\"");
      if (!st.antenna(o.antenna) && failed.contains("antenna")) return void(failed.insert("operation"));
      if (!st.antenna(o.antenna)) throw InputError(r.where("antenna"), "unknown antenna \"" + o.antenna + "\"");
      st.operations.push_back(std::move(o));
    });
    entry("operation", [&] { check_unique(st.operations, "operation", file); });
  }
  if (st.operations.empty() && !failed.contains("operation"))
    errs.add(InputError(Where{file, 1, "operation"}, "no [[operation]]: nothing to evaluate"));

  // Installation elements (issue 6): parsed and validated by the siting module.
  errs.run([&] { st.installation = siting::parse_site_elements(root, file); });
  errs.throw_if_any();
  // ... plus every wire, route and support the antennas and feed lines imply (one geometry for the
  // exposure model and the power-line checks).
  assemble::derive_installation(st);

  return st;
}

}  // namespace standoff::station
