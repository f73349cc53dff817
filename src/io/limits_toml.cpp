#include "io/limits_toml.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <initializer_list>
#include <map>
#include <mutex>
#include <stdexcept>

#include <toml++/toml.h>

#include "core/quantity_parse.hpp"
#include "io/embedded.hpp"

namespace standoff::limits {
namespace {

// 1 mW/cm² = 10 W/m² (exact: 1e-3 W / 1e-4 m²).
constexpr double kWPerM2PerMWPerCm2 = 10.0;

std::string pct(double rel) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.2f %%", 100.0 * rel);
  return buf;
}

std::string num(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.6g", v);
  return buf;
}

int line_of(const toml::node& n, int fallback) {
  const int l = static_cast<int>(n.source().begin.line);
  return l > 0 ? l : fallback;
}

// The loading context: the file name and the path of the table being read, for messages.
struct Ctx {
  const std::string& file;
  std::string path;  // e.g. "tier[uncontrolled].band[2]"
  int line = 0;      // line of the table being read

  std::string field(std::string_view key) const {
    if (key.empty()) return path;
    return path.empty() ? std::string(key) : path + "." + std::string(key);
  }
  [[noreturn]] void fail(std::string_view key, const std::string& msg, int at_line = 0) const {
    throw InputError(Where{file, at_line > 0 ? at_line : line, field(key)}, msg);
  }
  [[noreturn]] void fail_at(const toml::node& n, std::string_view key, const std::string& msg) const {
    fail(key, msg, line_of(n, line));
  }
};

void check_keys(const toml::table& t, const Ctx& ctx, std::initializer_list<std::string_view> allowed) {
  for (auto&& [k, v] : t) {
    if (std::find(allowed.begin(), allowed.end(), k.str()) != allowed.end()) continue;
    std::string list;
    for (auto a : allowed) list += (list.empty() ? "" : ", ") + std::string(a);
    ctx.fail_at(v, k.str(), "unknown key; expected one of: " + list);
  }
}

const toml::node& require(const toml::table& t, const Ctx& ctx, std::string_view key) {
  const toml::node* n = t.get(key);
  if (n == nullptr) ctx.fail(key, "required field is missing");
  return *n;
}

std::string get_string(const toml::node& n, const Ctx& ctx, std::string_view key) {
  const auto v = n.value<std::string>();
  if (!v || !n.is_string()) ctx.fail_at(n, key, "expected a string");
  if (v->empty()) ctx.fail_at(n, key, "must not be empty");
  return *v;
}

double get_number(const toml::node& n, const Ctx& ctx, std::string_view key) {
  if (!n.is_number()) ctx.fail_at(n, key, "expected a number");
  const double v = *n.value<double>();
  if (!std::isfinite(v)) ctx.fail_at(n, key, "must be a finite number");
  return v;
}

double get_positive(const toml::node& n, const Ctx& ctx, std::string_view key) {
  const double v = get_number(n, ctx, key);
  if (v <= 0.0) ctx.fail_at(n, key, "must be above zero, got " + num(v));
  return v;
}

const toml::table& get_table(const toml::node& n, const Ctx& ctx, std::string_view key) {
  if (!n.is_table()) ctx.fail_at(n, key, "expected a table such as { a = 1.0, b = 0.0 }");
  return *n.as_table();
}

// { a = ..., b = ..., div = ... } → (a/div)·f^b; with `allow_f_unit`, also f_unit = "MHz" | "GHz".
PowerLaw get_law(const toml::node& n, const Ctx& parent, std::string_view key, bool allow_f_unit = false) {
  const toml::table& t = get_table(n, parent, key);
  Ctx ctx{parent.file, parent.field(key), line_of(n, parent.line)};
  if (allow_f_unit)
    check_keys(t, ctx, {"a", "b", "div", "f_unit"});
  else
    check_keys(t, ctx, {"a", "b", "div"});
  const double a = get_positive(require(t, ctx, "a"), ctx, "a");
  const double b = get_number(require(t, ctx, "b"), ctx, "b");
  double div = 1.0;
  if (const toml::node* d = t.get("div")) div = get_positive(*d, ctx, "div");
  PowerLaw law{a / div, b};
  if (const toml::node* u = t.get("f_unit")) {
    const std::string unit = get_string(*u, ctx, "f_unit");
    if (unit == "GHz")
      law.a *= std::pow(1e3, -b);  // a·(f_MHz/1000)^b = a·1000^-b · f_MHz^b
    else if (unit != "MHz")
      ctx.fail_at(*u, "f_unit", "expected \"MHz\" or \"GHz\", got \"" + unit + "\"");
  }
  return law;
}

constexpr std::array<std::string_view, 3> kQuantities{"e_v_per_m", "h_a_per_m", "s_w_per_m2"};

const std::optional<PowerLaw>& quantity(const Band& b, std::string_view q) {
  if (q == "e_v_per_m") return b.e_v_per_m;
  if (q == "h_a_per_m") return b.h_a_per_m;
  return b.s_w_per_m2;
}

struct BandRead {
  Band band;
  std::vector<std::string> declared_steps;  // quantities with a published step at f_min
  int steps_line = 0;
  int f_min_line = 0;
  std::array<int, 3> quantity_line{};  // per kQuantities entry
};

BandRead read_band(const toml::table& t, const Ctx& ctx) {
  check_keys(t, ctx,
             {"f_min_mhz", "f_max_mhz", "e_v_per_m", "h_a_per_m", "s_w_per_m2", "s_mw_per_cm2",
              "s_is_equivalent", "averaging_min", "step_at_f_min"});
  BandRead r;
  Band& b = r.band;
  b.source_line = ctx.line;
  b.f_min_mhz = get_positive(require(t, ctx, "f_min_mhz"), ctx, "f_min_mhz");
  r.f_min_line = line_of(*t.get("f_min_mhz"), ctx.line);
  b.f_max_mhz = get_positive(require(t, ctx, "f_max_mhz"), ctx, "f_max_mhz");
  if (b.f_max_mhz <= b.f_min_mhz)
    ctx.fail_at(*t.get("f_max_mhz"), "f_max_mhz",
                "must be above f_min_mhz (" + num(b.f_min_mhz) + " MHz), got " + num(b.f_max_mhz));
  if (const toml::node* n = t.get("e_v_per_m")) b.e_v_per_m = get_law(*n, ctx, "e_v_per_m");
  if (const toml::node* n = t.get("h_a_per_m")) b.h_a_per_m = get_law(*n, ctx, "h_a_per_m");
  const toml::node* s_si = t.get("s_w_per_m2");
  const toml::node* s_mw = t.get("s_mw_per_cm2");
  if (s_si && s_mw) ctx.fail_at(*s_mw, "s_mw_per_cm2", "give the power density once: s_w_per_m2 or s_mw_per_cm2");
  if (s_si) b.s_w_per_m2 = get_law(*s_si, ctx, "s_w_per_m2");
  if (s_mw) {
    PowerLaw law = get_law(*s_mw, ctx, "s_mw_per_cm2");
    law.a *= kWPerM2PerMWPerCm2;
    b.s_w_per_m2 = law;
  }
  for (std::size_t i = 0; i < kQuantities.size(); ++i) {
    const toml::node* n = t.get(kQuantities[i]);
    if (kQuantities[i] == "s_w_per_m2" && n == nullptr) n = s_mw;
    r.quantity_line[i] = n ? line_of(*n, ctx.line) : ctx.line;
  }
  if (!b.e_v_per_m && !b.h_a_per_m && !b.s_w_per_m2)
    ctx.fail("e_v_per_m", "a band needs at least one of e_v_per_m, h_a_per_m, s_w_per_m2 (or s_mw_per_cm2)");
  const toml::node* eq = t.get("s_is_equivalent");
  if (b.s_w_per_m2) {
    if (eq == nullptr) ctx.fail("s_is_equivalent", "required where the band gives a power density (true or false)");
    if (!eq->is_boolean()) ctx.fail_at(*eq, "s_is_equivalent", "expected true or false");
    b.s_is_equivalent = *eq->value<bool>();
  } else if (eq != nullptr) {
    ctx.fail_at(*eq, "s_is_equivalent", "the band gives no power density");
  }
  if (const toml::node* n = t.get("averaging_min")) {
    PowerLaw law = get_law(*n, ctx, "averaging_min", true);
    law.a *= 60.0;  // minutes → seconds
    b.averaging_s = law;
  }
  if (const toml::node* n = t.get("step_at_f_min")) {
    const toml::array* arr = n->as_array();
    if (arr == nullptr) ctx.fail_at(*n, "step_at_f_min", "expected an array of quantity names such as [\"e_v_per_m\"]");
    r.steps_line = line_of(*n, ctx.line);
    for (const toml::node& q : *arr) {
      const auto name = q.value<std::string>();
      const bool known = name && (std::find(kQuantities.begin(), kQuantities.end(), *name) != kQuantities.end());
      if (!known) ctx.fail_at(q, "step_at_f_min", "expected e_v_per_m, h_a_per_m or s_w_per_m2");
      r.declared_steps.push_back(*name);
    }
  }
  return r;
}

// Order, gaps, overlaps and continuity between consecutive bands of one tier.
void check_bands(const std::vector<BandRead>& bands, const Ctx& tier_ctx) {
  for (std::size_t i = 1; i < bands.size(); ++i) {
    const Band& lo = bands[i - 1].band;
    const Band& hi = bands[i].band;
    Ctx ctx{tier_ctx.file, tier_ctx.path + ".band[" + std::to_string(i + 1) + "]", bands[i].f_min_line};
    if (hi.f_min_mhz < lo.f_min_mhz)
      ctx.fail("f_min_mhz", "bands out of order: " + num(hi.f_min_mhz) + " MHz follows a band starting at " +
                                num(lo.f_min_mhz) + " MHz (list bands by rising frequency)");
    if (hi.f_min_mhz > lo.f_max_mhz)
      ctx.fail("f_min_mhz", "gap: the previous band ends at " + num(lo.f_max_mhz) + " MHz but this one starts at " +
                                num(hi.f_min_mhz) + " MHz");
    if (hi.f_min_mhz < lo.f_max_mhz)
      ctx.fail("f_min_mhz", "overlap: the previous band ends at " + num(lo.f_max_mhz) +
                                " MHz but this one starts at " + num(hi.f_min_mhz) + " MHz");
    const double f = hi.f_min_mhz;
    const auto& declared = bands[i].declared_steps;
    for (std::size_t k = 0; k < kQuantities.size(); ++k) {
      const std::string_view q = kQuantities[k];
      const bool is_declared = std::find(declared.begin(), declared.end(), q) != declared.end();
      const auto& a = quantity(lo, q);
      const auto& b = quantity(hi, q);
      if (!a || !b) {
        if (is_declared)
          ctx.fail("step_at_f_min", std::string(q) + " is not given on both sides of " + num(f) + " MHz",
                   bands[i].steps_line);
        continue;
      }
      const double va = a->at_mhz(f);
      const double vb = b->at_mhz(f);
      const double rel = std::abs(va - vb) / std::max(va, vb);
      const std::string what = std::string(q) + " at " + num(f) + " MHz is " + num(va) + " below and " + num(vb) +
                               " above (" + pct(rel) + ")";
      if (!is_declared && rel > kContinuityTolerance)
        ctx.fail(q, "discontinuous: " + what + "; the limit is " + pct(kContinuityTolerance) +
                        " unless the published table steps there (declare it with step_at_f_min)",
                 bands[i].quantity_line[k]);
      if (is_declared && rel <= kContinuityTolerance)
        ctx.fail("step_at_f_min", "declared step but " + what + " is continuous: remove the declaration",
                 bands[i].steps_line);
      if (is_declared && rel > kDeclaredStepLimit)
        ctx.fail(q, "step too large: " + what + "; declared steps may be at most " + pct(kDeclaredStepLimit),
                 bands[i].quantity_line[k]);
    }
  }
}

int weakness(Confidence c) { return static_cast<int>(c); }  // confirmed < partly < verify

Confidence get_confidence(const toml::node& n, const Ctx& ctx) {
  const std::string s = get_string(n, ctx, "confidence");
  const auto c = confidence_from_string(s);
  if (!c) ctx.fail_at(n, "confidence", "expected confirmed, partly or verify, got \"" + s + "\"");
  return *c;
}

TierTable read_tier(const toml::table& t, const Ctx& parent, std::size_t index, Confidence file_confidence) {
  Ctx ctx{parent.file, "tier[" + std::to_string(index + 1) + "]", parent.line};
  check_keys(t, ctx, {"tier", "document_tier", "table", "averaging", "confidence", "band"});
  TierTable tt;
  const toml::node& name = require(t, ctx, "tier");
  const std::string tier_name = get_string(name, ctx, "tier");
  const auto tier = tier_from_string(tier_name);
  if (!tier) ctx.fail_at(name, "tier", "expected controlled or uncontrolled, got \"" + tier_name + "\"");
  tt.tier = *tier;
  ctx.path = "tier[" + tier_name + "]";
  ctx.line = line_of(name, parent.line);
  tt.document_tier_name = get_string(require(t, ctx, "document_tier"), ctx, "document_tier");
  if (const toml::node* n = t.get("table")) tt.table = get_string(*n, ctx, "table");
  const toml::node& avg = require(t, ctx, "averaging");
  tt.averaging = parse_time(get_string(avg, ctx, "averaging"), Where{ctx.file, line_of(avg, ctx.line), ctx.field("averaging")});
  if (tt.averaging.value() <= 0.0) ctx.fail_at(avg, "averaging", "must be above zero");
  tt.confidence = file_confidence;
  if (const toml::node* n = t.get("confidence")) tt.confidence = get_confidence(*n, ctx);
  const toml::node& bands_node = require(t, ctx, "band");
  const toml::array* arr = bands_node.as_array();
  if (arr == nullptr || arr->empty()) ctx.fail_at(bands_node, "band", "expected one or more [[tier.band]] tables");
  std::vector<BandRead> bands;
  for (std::size_t i = 0; i < arr->size(); ++i) {
    const toml::node& bn = *arr->get(i);
    Ctx bctx{ctx.file, ctx.path + ".band[" + std::to_string(i + 1) + "]", line_of(bn, ctx.line)};
    if (!bn.is_table()) bctx.fail("", "expected a [[tier.band]] table");
    bands.push_back(read_band(*bn.as_table(), bctx));
  }
  check_bands(bands, ctx);
  for (auto& b : bands) tt.bands.push_back(std::move(b.band));
  return tt;
}

}  // namespace

LimitTable load_limit_table(std::string_view toml_text, const std::string& file_name) {
  toml::table root;
  try {
    root = toml::parse(toml_text, file_name);
  } catch (const toml::parse_error& e) {
    throw InputError(Where{file_name, static_cast<int>(e.source().begin.line), ""},
                     "not valid TOML: " + std::string(e.description()));
  }
  Ctx ctx{file_name, "", 1};
  check_keys(root, ctx, {"schema", "standard", "name", "document", "table", "year", "confidence", "note", "tier"});
  const toml::node& schema = require(root, ctx, "schema");
  if (!schema.is_integer() || *schema.value<int64_t>() != 1)
    ctx.fail_at(schema, "schema", "expected schema = 1 (the format in docs/adding-a-limits-table.md)");

  LimitTable table;
  table.file = file_name;
  const toml::node& std_node = require(root, ctx, "standard");
  const std::string std_id = get_string(std_node, ctx, "standard");
  const auto standard = standard_from_string(std_id);
  if (!standard) ctx.fail_at(std_node, "standard", "expected fcc, icnirp2020, icnirp1998 or sc6, got \"" + std_id + "\"");
  table.standard = *standard;
  table.name = get_string(require(root, ctx, "name"), ctx, "name");
  table.document = get_string(require(root, ctx, "document"), ctx, "document");
  table.table = get_string(require(root, ctx, "table"), ctx, "table");
  const toml::node& year = require(root, ctx, "year");
  if (!year.is_integer() || *year.value<int64_t>() < 1900 || *year.value<int64_t>() > 2100)
    ctx.fail_at(year, "year", "expected the publication year as an integer such as 1996");
  table.year = static_cast<int>(*year.value<int64_t>());
  const toml::node& conf = require(root, ctx, "confidence");
  table.confidence = get_confidence(conf, ctx);
  if (const toml::node* n = root.get("note")) table.note = get_string(*n, ctx, "note");

  const toml::node& tiers_node = require(root, ctx, "tier");
  const toml::array* tiers = tiers_node.as_array();
  if (tiers == nullptr || tiers->empty()) ctx.fail_at(tiers_node, "tier", "expected one or more [[tier]] tables");
  int weakest = weakness(Confidence::confirmed);
  for (std::size_t i = 0; i < tiers->size(); ++i) {
    const toml::node& tn = *tiers->get(i);
    Ctx tctx{file_name, "tier[" + std::to_string(i + 1) + "]", line_of(tn, 1)};
    if (!tn.is_table()) tctx.fail("", "expected a [[tier]] table");
    TierTable tt = read_tier(*tn.as_table(), tctx, i, table.confidence);
    if (table.find(tt.tier) != nullptr)
      tctx.fail("tier", "the " + to_string(tt.tier) + " tier is given twice");
    weakest = std::max(weakest, weakness(tt.confidence));
    table.tiers.push_back(std::move(tt));
  }
  if (weakness(table.confidence) != weakest)
    ctx.fail_at(conf, "confidence",
                "the file's flag must be the weakest of its tiers' flags (" +
                    to_string(static_cast<Confidence>(weakest)) + "), got " + to_string(table.confidence));
  return table;
}

const LimitTable& builtin_limit_table_ref(Standard s) {
  // Parsed on first use; immutable afterwards. The embedded files are checked by the tests.
  static std::mutex mutex;
  static std::map<Standard, LimitTable> cache;
  const std::lock_guard lock(mutex);
  if (auto it = cache.find(s); it != cache.end()) return it->second;
  const std::string path = "tables/limits/" + to_string(s) + ".toml";
  const auto text = io::embedded_file(path);
  if (!text) throw std::logic_error("embedded limits table " + path + " is missing");
  LimitTable t = load_limit_table(*text, path);
  if (t.standard != s) throw std::logic_error(path + " declares standard " + to_string(t.standard));
  return cache.emplace(s, std::move(t)).first->second;
}

LimitTable builtin_limit_table(Standard s) { return builtin_limit_table_ref(s); }

}  // namespace standoff::limits
