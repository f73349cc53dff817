#include "io/clearances_toml.hpp"

#include <toml++/toml.h>

#include "io/embedded.hpp"
#include "siting/siting_units.hpp"
#include "io/toml_fields.hpp"

namespace standoff::siting {
namespace {

using detail::Fields;

auto length_parser() {
  return [](const std::string& s, const Where& w) { return parse_length(s, w); };
}
auto voltage_parser() {
  return [](const std::string& s, const Where& w) { return parse_voltage(s, w); };
}

const toml::table& sub_table(const toml::table& root, std::string_view key, const std::string& file) {
  const auto* n = root.get(key);
  if (!n || !n->is_table()) throw InputError(Where{file, 0, std::string(key)}, "required table is missing");
  return *n->as_table();
}

// The source to quote in outputs: recalled values say so.
std::string sourced(const Fields& f) {
  std::string s = f.string("source");
  const std::string c = f.string("confidence");
  if (c == "verify") s += " [recalled: verify against the published text]";
  else if (c != "confirmed" && c != "partly" && c != "common practice")
    throw InputError(f.where("confidence"), "expected confirmed, partly, verify or common practice");
  return s;
}

SourcedLength sourced_length(const toml::table& root, std::string_view key, const std::string& file) {
  const Fields f(sub_table(root, key, file), file, std::string(key));
  f.only({"source", "confidence", "distance"});
  return SourcedLength{f.quantity("distance", length_parser()), sourced(f)};
}

LineKind line_kind(const Fields& f) {
  const std::string k = f.string("kind");
  if (k == "service") return LineKind::service;
  if (k == "distribution") return LineKind::distribution;
  if (k == "transmission") return LineKind::transmission;
  throw InputError(f.where("kind"), "expected service, distribution or transmission, got \"" + k + "\"");
}

}  // namespace

ClearanceTables load_clearance_tables(std::string_view toml_text, const std::string& file) {
  toml::table root;
  try {
    root = toml::parse(toml_text, file);
  } catch (const toml::parse_error& e) {
    throw InputError(Where{file, static_cast<int>(e.source().begin.line), ""}, std::string(e.description()));
  }
  ClearanceTables t;
  {
    const Fields f(sub_table(root, "osha_general", file), file, "osha_general");
    f.only({"source", "confidence", "threshold", "base", "increment", "step"});
    t.general_source = sourced(f);
    t.general_threshold = f.quantity("threshold", voltage_parser());
    t.general_base = f.quantity("base", length_parser());
    t.general_increment = f.quantity("increment", length_parser());
    t.general_step = f.quantity("step", voltage_parser());
    if (!(t.general_step.value() > 0.0)) throw InputError(f.where("step"), "must be above zero");
  }
  {
    const Fields f(sub_table(root, "osha_table_a", file), file, "osha_table_a");
    f.only({"source", "confidence", "rows"});
    t.table_a_source = sourced(f);
    int i = 0;
    for (const auto& n : f.array("rows")) {
      const std::string prefix = "osha_table_a.rows[" + std::to_string(i++) + "]";
      if (!n.is_table()) throw InputError(f.where_node(n, prefix), "expected a table");
      const Fields r(*n.as_table(), file, prefix);
      r.only({"up_to", "distance"});
      ApproachRow row{r.quantity("up_to", voltage_parser()), r.quantity("distance", length_parser())};
      if (!t.table_a.empty() && row.up_to.value() <= t.table_a.back().up_to.value())
        throw InputError(r.where("up_to"), "rows must be in increasing voltage");
      t.table_a.push_back(row);
    }
    if (t.table_a.empty()) throw InputError(f.where("rows"), "at least one row is needed");
  }
  t.unknown_voltage = sourced_length(root, "unknown_voltage", file);
  {
    const Fields f(sub_table(root, "nfpa_810", file), file, "nfpa_810");
    f.only({"source", "crossing_source", "confidence", "low_voltage", "low_clearance", "high_clearance"});
    t.nfpa_source = sourced(f);
    t.nfpa_crossing_source = f.string("crossing_source");
    if (f.string("confidence") == "verify") t.nfpa_crossing_source += " [recalled: verify against the published text]";
    t.nfpa_low_voltage = f.quantity("low_voltage", voltage_parser());
    t.nfpa_low_clearance = f.quantity("low_clearance", length_parser());
    t.nfpa_high_clearance = f.quantity("high_clearance", length_parser());
  }
  {
    const Fields f(sub_table(root, "nfpa_810_52", file), file, "nfpa_810_52");
    f.only({"source", "confidence", "rows"});
    t.span_size_source = sourced(f);
    int i = 0;
    for (const auto& n : f.array("rows")) {
      const std::string prefix = "nfpa_810_52.rows[" + std::to_string(i++) + "]";
      if (!n.is_table()) throw InputError(f.where_node(n, prefix), "expected a table");
      const Fields r(*n.as_table(), file, prefix);
      r.only({"material", "max_span", "max_awg"});
      SpanSizeRule rule;
      rule.material = r.string("material");
      if (auto s = r.opt_quantity("max_span", length_parser())) rule.max_span = *s;
      rule.max_awg = r.integer("max_awg");
      t.span_sizes.push_back(rule);
    }
  }
  {
    const Fields f(sub_table(root, "cpsc_fall_zone", file), file, "cpsc_fall_zone");
    f.only({"source", "confidence", "factor"});
    t.cpsc_source = sourced(f);
    t.cpsc_factor = f.number("factor");
    if (!(t.cpsc_factor >= 1.0)) throw InputError(f.where("factor"), "expected a factor of at least 1");
  }
  t.fall_margin = sourced_length(root, "fall_margin", file);
  t.rf_burn_height = sourced_length(root, "rf_burn_height", file);
  t.hand_reach = sourced_length(root, "hand_reach", file);

  if (const auto* arr = root.get_as<toml::array>("typical_height")) {
    int i = 0;
    for (const auto& n : *arr) {
      const std::string prefix = "typical_height[" + std::to_string(i++) + "]";
      if (!n.is_table()) throw InputError(Where{file, 0, prefix}, "expected a table");
      const Fields f(*n.as_table(), file, prefix);
      f.only({"kind", "place", "height", "source", "confidence"});
      t.typical_heights.push_back(
          TypicalHeight{line_kind(f), f.string("place"), f.quantity("height", length_parser()), sourced(f)});
    }
  }
  if (const auto* arr = root.get_as<toml::array>("wire")) {
    int i = 0;
    for (const auto& n : *arr) {
      const std::string prefix = "wire[" + std::to_string(i++) + "]";
      if (!n.is_table()) throw InputError(Where{file, 0, prefix}, "expected a table");
      const Fields f(*n.as_table(), file, prefix);
      f.only({"name", "material", "awg", "weight", "source", "confidence"});
      WireClass w;
      w.name = f.string("name");
      if (t.find_wire(w.name)) throw InputError(f.where("name"), "duplicate wire class \"" + w.name + "\"");
      w.material = f.string("material");
      w.awg = f.integer("awg");
      if (w.awg < 0 || w.awg > 40) throw InputError(f.where("awg"), "expected an AWG size from 0 to 40");
      w.diameter = awg_diameter(w.awg);
      w.mass_per_length = f.opt_quantity("weight", [](const std::string& s, const Where& wh) {
        return parse_linear_density(s, wh);
      });
      w.source = sourced(f);
      t.wires.push_back(w);
    }
  }
  return t;
}

const ClearanceTables& builtin_clearance_tables() {
  static const ClearanceTables tables = [] {
    const auto text = io::embedded_file("tables/clearances.toml");
    if (!text) throw std::runtime_error("tables/clearances.toml is not embedded in this build");
    return load_clearance_tables(*text, "tables/clearances.toml");
  }();
  return tables;
}

}  // namespace standoff::siting
