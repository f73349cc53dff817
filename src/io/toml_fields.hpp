// Reading typed fields out of a toml++ table with file:line:field errors (InputError). Internal to
// the siting module's *_toml.cpp files.
#pragma once

#include <algorithm>
#include <cmath>
#include <initializer_list>
#include <optional>
#include <string>
#include <string_view>

#include <toml++/toml.h>

#include "core/bounds.hpp"
#include "core/error.hpp"
#include "core/quantity_parse.hpp"

namespace standoff::siting::detail {

class Fields {
 public:
  Fields(const toml::table& t, std::string file, std::string prefix)
      : t_(t), file_(std::move(file)), prefix_(std::move(prefix)) {}

  const toml::table& table() const { return t_; }
  const std::string& file() const { return file_; }

  std::string name(std::string_view key) const { return prefix_.empty() ? std::string(key) : prefix_ + "." + std::string(key); }

  int line_of(const toml::node* n) const {
    const auto line = n ? n->source().begin.line : t_.source().begin.line;
    return static_cast<int>(line);
  }

  Where where(std::string_view key) const { return Where{file_, line_of(t_.get(key)), name(key)}; }
  Where where_node(const toml::node& n, const std::string& field) const { return Where{file_, line_of(&n), field}; }

  const toml::node* get(std::string_view key) const { return t_.get(key); }
  bool has(std::string_view key) const { return t_.contains(key); }

  [[noreturn]] void missing(std::string_view key) const {
    throw InputError(Where{file_, line_of(nullptr), name(key)}, "required field is missing");
  }

  std::string string(std::string_view key) const {
    const auto* n = get(key);
    if (!n) missing(key);
    if (!n->is_string()) throw InputError(where(key), "expected a string");
    // Control characters escaped (issue 14): a name can never fake a line of the output.
    return printable(std::string(*n->value<std::string_view>()));
  }

  std::optional<std::string> opt_string(std::string_view key) const {
    if (!has(key)) return std::nullopt;
    return string(key);
  }

  double number(std::string_view key) const {
    const auto* n = get(key);
    if (!n) missing(key);
    if (!n->is_number()) throw InputError(where(key), "expected a number");
    const double v = *n->value<double>();
    if (!std::isfinite(v)) throw InputError(where(key), "expected a finite number");
    return v;
  }

  int integer(std::string_view key) const {
    const auto* n = get(key);
    if (!n) missing(key);
    if (!n->is_integer()) throw InputError(where(key), "expected an integer");
    // Range-checked on the 64-bit TOML value before the cast (issue 14).
    return bounds::integer(*n->value<int64_t>(), -1000000, 1000000, where(key));
  }

  const toml::array& array(std::string_view key) const {
    const auto* n = get(key);
    if (!n) missing(key);
    if (!n->is_array()) throw InputError(where(key), "expected an array");
    return *n->as_array();
  }

  template <class Parse>
  auto quantity(std::string_view key, Parse parse) const {
    auto q = parse(string(key), where(key));
    bounds::check(q, where(key));  // plausibility bounds by dimension (core/bounds.hpp)
    return q;
  }

  template <class Parse>
  auto opt_quantity(std::string_view key, Parse parse) const -> std::optional<decltype(parse(std::string(), Where{}))> {
    if (!has(key)) return std::nullopt;
    return quantity(key, parse);
  }

  // Refuses keys that are not in `allowed` (catches typos).
  void only(std::initializer_list<std::string_view> allowed) const {
    for (const auto& [k, v] : t_) {
      const std::string_view key = k.str();
      if (std::find(allowed.begin(), allowed.end(), key) == allowed.end()) {
        std::string list;
        for (auto a : allowed) list += (list.empty() ? "" : ", ") + std::string(a);
        throw InputError(Where{file_, line_of(&v), name(key)}, "unknown field (allowed: " + list + ")");
      }
    }
  }

 private:
  const toml::table& t_;
  std::string file_;
  std::string prefix_;
};

}  // namespace standoff::siting::detail
