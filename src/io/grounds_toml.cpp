#include "io/grounds_toml.hpp"

#include <cmath>

#include <toml++/toml.h>

#include "core/quantity_parse.hpp"
#include "io/embedded.hpp"

namespace standoff::em {
namespace {

int line_of(const toml::node& n, int fallback) {
  const int l = static_cast<int>(n.source().begin.line);
  return l > 0 ? l : fallback;
}

}  // namespace

const GroundClass* GroundTable::find(std::string_view name) const {
  for (const auto& c : classes)
    if (c.name == name) return &c;
  return nullptr;
}

std::string GroundTable::names() const {
  std::string s;
  for (const auto& c : classes) s += (s.empty() ? "" : ", ") + c.name;
  return s;
}

GroundTable load_ground_table(std::string_view text, const std::string& file) {
  GroundTable table;
  table.file = file;
  toml::table root;
  try {
    root = toml::parse(text, file);
  } catch (const toml::parse_error& e) {
    throw InputError(Where{file, static_cast<int>(e.source().begin.line), ""}, std::string(e.description()));
  }
  const toml::array* rows = root["ground"].as_array();
  if (rows == nullptr || rows->empty()) throw InputError(Where{file, 1, "ground"}, "expected an array of [[ground]] tables");
  for (const toml::node& node : *rows) {
    const toml::table* t = node.as_table();
    const int line = line_of(node, 1);
    if (t == nullptr) throw InputError(Where{file, line, "ground"}, "expected a table");
    GroundClass g;
    g.source_line = line;
    auto str = [&](std::string_view key, bool required) {
      const toml::node* n = t->get(key);
      if (n == nullptr) {
        if (required) throw InputError(Where{file, line, "ground." + std::string(key)}, "required field is missing");
        return std::string{};
      }
      if (!n->is_string() || n->value<std::string>()->empty())
        throw InputError(Where{file, line_of(*n, line), "ground." + std::string(key)}, "expected a non-empty string");
      return *n->value<std::string>();
    };
    for (auto&& [k, v] : *t) {
      const std::string_view key = k.str();
      if (key != "name" && key != "description" && key != "eps_r" && key != "sigma" && key != "source" && key != "confidence")
        throw InputError(Where{file, line_of(v, line), "ground." + std::string(key)},
                         "unknown key; expected one of: name, description, eps_r, sigma, source, confidence");
    }
    g.name = str("name", true);
    g.description = str("description", false);
    g.source = str("source", true);
    g.confidence = str("confidence", true);
    const toml::node* eps = t->get("eps_r");
    if (eps == nullptr || !eps->is_number() || !(*eps->value<double>() >= 1.0) || !std::isfinite(*eps->value<double>()))
      throw InputError(Where{file, eps ? line_of(*eps, line) : line, "ground.eps_r"}, "expected a number >= 1");
    g.eps_r = *eps->value<double>();
    const toml::node* sig = t->get("sigma");
    if (sig == nullptr || !sig->is_string())
      throw InputError(Where{file, sig ? line_of(*sig, line) : line, "ground.sigma"}, "expected a conductivity such as \"5 mS/m\"");
    g.sigma_s_per_m = parse_conductivity(*sig->value<std::string>(), Where{file, line_of(*sig, line), "ground.sigma"}).value();
    if (table.find(g.name) != nullptr || g.name == "free" || g.name == "perfect")
      throw InputError(Where{file, line, "ground.name"}, "duplicate or reserved ground name \"" + g.name + "\"");
    table.classes.push_back(std::move(g));
  }
  return table;
}

const GroundTable& builtin_ground_table() {
  static const GroundTable table = [] {
    const auto text = io::embedded_file("tables/grounds.toml");
    if (!text) throw InputError(Where{"tables/grounds.toml", 0, ""}, "ground table is not embedded in this build");
    return load_ground_table(*text, "tables/grounds.toml");
  }();
  return table;
}

Ground ground_by_name(std::string_view name, const Where& where) {
  if (name == "free" || name == "free-space") return free_space();
  if (name == "perfect") return perfect_ground();
  const GroundTable& t = builtin_ground_table();
  const GroundClass* c = t.find(name);
  if (c == nullptr)
    throw InputError(where, "unknown ground \"" + std::string(name) + "\"; expected free, perfect or one of: " + t.names());
  return real_ground(c->eps_r, c->sigma_s_per_m, c->name);
}

const GroundClass* ground_class_of(const Ground& ground) {
  if (ground.kind != GroundKind::real) return nullptr;
  return builtin_ground_table().find(ground.name);
}

}  // namespace standoff::em
