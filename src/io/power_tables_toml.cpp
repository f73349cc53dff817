#include "io/power_tables_toml.hpp"

#include <algorithm>
#include <cmath>
#include <initializer_list>
#include <stdexcept>

#include <toml++/toml.h>

#include "core/error.hpp"
#include "core/quantity_parse.hpp"
#include "io/embedded.hpp"

namespace standoff::power {
namespace {

// International foot (exact, 1959): 100 ft = 30.48 m.
constexpr double kFtPer100ToM = 100.0 / 30.48;

int line_of(const toml::node& n, int fallback) {
  const int l = static_cast<int>(n.source().begin.line);
  return l > 0 ? l : fallback;
}

struct Ctx {
  const std::string& file;
  std::string path;
  int line = 0;
  std::string field(std::string_view key) const { return path.empty() ? std::string(key) : path + "." + std::string(key); }
  [[noreturn]] void fail(std::string_view key, const std::string& msg, int at = 0) const {
    throw InputError(Where{file, at > 0 ? at : line, field(key)}, msg);
  }
  Where where(const toml::node& n, std::string_view key) const { return Where{file, line_of(n, line), field(key)}; }
};

void check_keys(const toml::table& t, const Ctx& ctx, std::initializer_list<std::string_view> allowed) {
  for (auto&& [k, v] : t) {
    if (std::find(allowed.begin(), allowed.end(), k.str()) != allowed.end()) continue;
    std::string list;
    for (auto a : allowed) list += (list.empty() ? "" : ", ") + std::string(a);
    ctx.fail(k.str(), "unknown key; expected one of: " + list, line_of(v, ctx.line));
  }
}

const toml::node& require(const toml::table& t, const Ctx& ctx, std::string_view key) {
  const toml::node* n = t.get(key);
  if (n == nullptr) ctx.fail(key, "required field is missing");
  return *n;
}

std::string get_string(const toml::node& n, const Ctx& ctx, std::string_view key) {
  if (!n.is_string()) ctx.fail(key, "expected a string", line_of(n, ctx.line));
  auto s = *n.value<std::string>();
  if (s.empty()) ctx.fail(key, "must not be empty", line_of(n, ctx.line));
  return s;
}

std::string opt_string(const toml::table& t, const Ctx& ctx, std::string_view key) {
  const toml::node* n = t.get(key);
  return n ? get_string(*n, ctx, key) : std::string{};
}

double get_number(const toml::node& n, const Ctx& ctx, std::string_view key) {
  if (!n.is_number()) ctx.fail(key, "expected a number", line_of(n, ctx.line));
  const double v = *n.value<double>();
  if (!std::isfinite(v)) ctx.fail(key, "must be finite", line_of(n, ctx.line));
  return v;
}

std::vector<double> get_numbers(const toml::node& n, const Ctx& ctx, std::string_view key) {
  const auto* arr = n.as_array();
  if (!arr) ctx.fail(key, "expected an array of numbers", line_of(n, ctx.line));
  std::vector<double> out;
  for (const auto& e : *arr) {
    const double v = get_number(e, ctx, key);
    if (!(v > 0.0)) ctx.fail(key, "values must be above zero", line_of(e, line_of(n, ctx.line)));
    out.push_back(v);
  }
  return out;
}

const toml::array* array_of_tables(const toml::table& root, const std::string& file, std::string_view key) {
  const toml::node* n = root.get(key);
  if (!n) return nullptr;
  const auto* arr = n->as_array();
  if (!arr || !arr->is_array_of_tables())
    throw InputError(Where{file, line_of(*n, 0), std::string(key)}, "expected [[" + std::string(key) + "]] tables");
  return arr;
}

double velocity_factor(const toml::table& t, const Ctx& ctx) {
  const auto& n = require(t, ctx, "velocity_factor");
  const double vf = get_number(n, ctx, "velocity_factor");
  if (!(vf > 0.0 && vf <= 1.0)) ctx.fail("velocity_factor", "must be above 0 and at most 1", line_of(n, ctx.line));
  return vf;
}

toml::table parse(std::string_view text, const std::string& file) {
  try {
    return toml::parse(text, file);
  } catch (const toml::parse_error& e) {
    throw InputError(Where{file, static_cast<int>(e.source().begin.line), ""},
                     "TOML syntax: " + std::string(e.description()));
  }
}

}  // namespace

const FeedLine* FeedLineTable::find(const std::string& name) const {
  for (const auto& l : lines)
    if (l.name == name) return &l;
  return nullptr;
}

std::string FeedLineTable::names() const {
  std::string s;
  for (const auto& l : lines) s += (s.empty() ? "" : ", ") + l.name;
  return s;
}

DutyTable load_duty_table(std::string_view text, const std::string& file) {
  const toml::table root = parse(text, file);
  Ctx top{file, "", 0};
  check_keys(root, top, {"document", "confidence", "mode"});
  DutyTable table;
  table.file = file;
  table.document = get_string(require(root, top, "document"), top, "document");
  const auto* modes = array_of_tables(root, file, "mode");
  if (!modes || modes->empty()) top.fail("mode", "the table has no [[mode]] entries");
  for (std::size_t i = 0; i < modes->size(); ++i) {
    const auto& t = *(*modes)[i].as_table();
    Ctx ctx{file, "mode[" + std::to_string(i) + "]", line_of(t, 0)};
    check_keys(t, ctx, {"name", "description", "duty", "derived", "modulation_index", "source", "aliases"});
    DutyMode m;
    m.source_line = ctx.line;
    m.name = get_string(require(t, ctx, "name"), ctx, "name");
    if (table.find(m.name)) ctx.fail("name", "duplicate mode \"" + m.name + "\"");
    m.description = opt_string(t, ctx, "description");
    m.source = get_string(require(t, ctx, "source"), ctx, "source");
    if (const toml::node* al = t.get("aliases")) {
      const auto* arr = al->as_array();
      if (!arr) ctx.fail("aliases", "expected an array of trade names", line_of(*al, ctx.line));
      for (const auto& e : *arr) {
        const std::string a = get_string(e, ctx, "aliases");
        if (table.find(a) || a == m.name) ctx.fail("aliases", "\"" + a + "\" names another mode already", line_of(e, ctx.line));
        m.aliases.push_back(a);
      }
    }
    const toml::node* duty = t.get("duty");
    const toml::node* derived = t.get("derived");
    if ((duty != nullptr) == (derived != nullptr)) ctx.fail("duty", "give exactly one of `duty` and `derived`");
    if (duty) {
      m.duty = parse_fraction(get_string(*duty, ctx, "duty"), ctx.where(*duty, "duty"));
    } else {
      const std::string kind = get_string(*derived, ctx, "derived");
      if (kind != "am-carrier") ctx.fail("derived", "unknown derivation \"" + kind + "\"; expected am-carrier", line_of(*derived, ctx.line));
      const auto& mi = require(t, ctx, "modulation_index");
      const double idx = get_number(mi, ctx, "modulation_index");
      if (!(idx >= 0.0 && idx <= 1.0)) ctx.fail("modulation_index", "must be within 0 and 1", line_of(mi, ctx.line));
      m.duty = am_carrier_duty(idx);
      m.derived = true;
    }
    table.modes.push_back(std::move(m));
  }
  return table;
}

FeedLineTable load_feedline_table(std::string_view text, const std::string& file) {
  const toml::table root = parse(text, file);
  Ctx top{file, "", 0};
  check_keys(root, top, {"coax", "parallel_wire"});
  FeedLineTable table;
  table.file = file;
  auto check_name = [&](const std::string& name, const Ctx& ctx) {
    if (table.find(name)) ctx.fail("name", "duplicate line class \"" + name + "\"");
  };
  if (const auto* arr = array_of_tables(root, file, "coax")) {
    for (std::size_t i = 0; i < arr->size(); ++i) {
      const auto& t = *(*arr)[i].as_table();
      Ctx ctx{file, "coax[" + std::to_string(i) + "]", line_of(t, 0)};
      check_keys(t, ctx, {"name", "description", "z0", "velocity_factor", "f_mhz", "loss_db_per_100ft", "source",
                          "confidence"});
      FeedLine l;
      l.kind = LineKind::coax;
      l.source_line = ctx.line;
      l.name = get_string(require(t, ctx, "name"), ctx, "name");
      check_name(l.name, ctx);
      l.description = opt_string(t, ctx, "description");
      const auto& z0 = require(t, ctx, "z0");
      l.z0 = parse_impedance(get_string(z0, ctx, "z0"), ctx.where(z0, "z0"));
      if (!(l.z0.value() > 0.0)) ctx.fail("z0", "must be above zero", line_of(z0, ctx.line));
      l.velocity_factor = velocity_factor(t, ctx);
      const auto& fn = require(t, ctx, "f_mhz");
      const auto f = get_numbers(fn, ctx, "f_mhz");
      const auto loss = get_numbers(require(t, ctx, "loss_db_per_100ft"), ctx, "loss_db_per_100ft");
      if (f.size() != loss.size()) ctx.fail("loss_db_per_100ft", "must have as many values as f_mhz");
      if (f.size() < 2) ctx.fail("f_mhz", "at least two attenuation points are needed for the fit", line_of(fn, ctx.line));
      if (!std::is_sorted(f.begin(), f.end()) || std::adjacent_find(f.begin(), f.end()) != f.end())
        ctx.fail("f_mhz", "frequencies must rise strictly", line_of(fn, ctx.line));
      std::vector<AttenuationPoint> pts;
      for (std::size_t k = 0; k < f.size(); ++k) pts.push_back({f[k], loss[k] * kFtPer100ToM});
      l.coax = fit_coax(std::move(pts));
      l.source = get_string(require(t, ctx, "source"), ctx, "source");
      l.confidence = get_string(require(t, ctx, "confidence"), ctx, "confidence");
      if (l.confidence != "confirmed" && l.confidence != "partly" && l.confidence != "verify")
        ctx.fail("confidence", "expected confirmed, partly or verify");
      table.lines.push_back(std::move(l));
    }
  }
  if (const auto* arr = array_of_tables(root, file, "parallel_wire")) {
    for (std::size_t i = 0; i < arr->size(); ++i) {
      const auto& t = *(*arr)[i].as_table();
      Ctx ctx{file, "parallel_wire[" + std::to_string(i) + "]", line_of(t, 0)};
      check_keys(t, ctx, {"name", "description", "conductor_diameter", "spacing", "velocity_factor", "material",
                          "cladding_fraction", "source"});
      ParallelWireGeometry g;
      const auto name = get_string(require(t, ctx, "name"), ctx, "name");
      check_name(name, ctx);
      const auto& dn = require(t, ctx, "conductor_diameter");
      g.conductor_diameter = parse_length(get_string(dn, ctx, "conductor_diameter"), ctx.where(dn, "conductor_diameter"));
      const auto& sn = require(t, ctx, "spacing");
      g.spacing = parse_length(get_string(sn, ctx, "spacing"), ctx.where(sn, "spacing"));
      if (!(g.conductor_diameter.value() > 0.0))
        ctx.fail("conductor_diameter", "must be above zero", line_of(dn, ctx.line));
      if (!(g.spacing.value() > g.conductor_diameter.value()))
        ctx.fail("spacing", "centre-to-centre spacing must exceed the conductor diameter", line_of(sn, ctx.line));
      g.velocity_factor = velocity_factor(t, ctx);
      const auto& mn = require(t, ctx, "material");
      const auto mat = get_string(mn, ctx, "material");
      if (mat == "copper")
        g.material = ConductorMaterial::copper;
      else if (mat == "copper-clad-steel")
        g.material = ConductorMaterial::copper_clad_steel;
      else
        ctx.fail("material", "unknown material \"" + mat + "\"; expected copper or copper-clad-steel", line_of(mn, ctx.line));
      if (const toml::node* cf = t.get("cladding_fraction")) {
        g.cladding_fraction = get_number(*cf, ctx, "cladding_fraction");
        if (!(g.cladding_fraction > 0.0 && g.cladding_fraction < 1.0))
          ctx.fail("cladding_fraction", "must be between 0 and 1", line_of(*cf, ctx.line));
      }
      FeedLine l = parallel_wire_line(name, g);
      l.description = opt_string(t, ctx, "description");
      // Optional provenance of the geometry; a geometry recalled from memory is marked "verify".
      if (const std::string geometry_source = opt_string(t, ctx, "source"); !geometry_source.empty()) {
        l.source += "; " + geometry_source;
        if (geometry_source.find("from memory") != std::string::npos) l.confidence = "verify";
      }
      l.source_line = ctx.line;
      table.lines.push_back(std::move(l));
    }
  }
  if (table.lines.empty()) top.fail("coax", "the table has no [[coax]] or [[parallel_wire]] entries");
  return table;
}

const DutyTable& builtin_duty_table() {
  static const DutyTable table = [] {
    const auto text = io::embedded_file("tables/duty.toml");
    if (!text) throw std::logic_error("tables/duty.toml is not embedded");
    return load_duty_table(*text, "tables/duty.toml");
  }();
  return table;
}

const FeedLineTable& builtin_feedline_table() {
  static const FeedLineTable table = [] {
    const auto text = io::embedded_file("tables/feedlines.toml");
    if (!text) throw std::logic_error("tables/feedlines.toml is not embedded");
    return load_feedline_table(*text, "tables/feedlines.toml");
  }();
  return table;
}

}  // namespace standoff::power
