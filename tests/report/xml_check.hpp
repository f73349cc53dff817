// A small strict XML 1.0 well-formedness checker for the SVG files the report writes: one root
// element, properly nested and matched tags, quoted and unique attributes, only the five
// predefined entities or numeric character references, no stray '<' or '&'. It checks the
// well-formedness constraints of W3C XML 1.0 (5th ed.) §2–§4 that hand-written SVG can break;
// it does not read DTDs (our SVGs have none) and does not validate against the SVG schema.
#pragma once

#include <cctype>
#include <optional>
#include <set>
#include <string>
#include <string_view>
#include <vector>

namespace standoff::report::test {

inline std::optional<std::string> xml_well_formed(std::string_view s) {
  std::size_t i = 0;
  std::vector<std::string> open;
  bool root_seen = false, root_closed = false;
  auto fail = [&](const std::string& why) { return std::optional<std::string>(why + " at offset " + std::to_string(i)); };
  auto name_start = [](char c) { return std::isalpha(static_cast<unsigned char>(c)) || c == '_' || c == ':'; };
  auto name_char = [&](char c) {
    return name_start(c) || std::isdigit(static_cast<unsigned char>(c)) || c == '-' || c == '.';
  };
  auto read_name = [&]() -> std::string {
    const std::size_t b = i;
    if (i >= s.size() || !name_start(s[i])) return {};
    while (i < s.size() && name_char(s[i])) ++i;
    return std::string(s.substr(b, i - b));
  };
  auto entity_ok = [&](std::size_t at) -> std::size_t {  // length of a valid reference at `at`, 0 if none
    const std::size_t semi = s.find(';', at);
    if (semi == std::string_view::npos || semi - at > 10) return 0;
    const std::string_view ref = s.substr(at + 1, semi - at - 1);
    if (ref == "amp" || ref == "lt" || ref == "gt" || ref == "quot" || ref == "apos") return semi - at + 1;
    if (ref.size() >= 2 && ref[0] == '#') {
      const bool hex = ref[1] == 'x';
      const std::string_view digits = ref.substr(hex ? 2 : 1);
      if (digits.empty()) return 0;
      for (const char c : digits) {
        if (!(hex ? std::isxdigit(static_cast<unsigned char>(c)) : std::isdigit(static_cast<unsigned char>(c)))) return 0;
      }
      return semi - at + 1;
    }
    return 0;
  };
  auto skip_space = [&] {
    while (i < s.size() && std::isspace(static_cast<unsigned char>(s[i]))) ++i;
  };

  if (s.substr(0, 5) == "<?xml") {
    const std::size_t end = s.find("?>");
    if (end == std::string_view::npos) return fail("unterminated XML declaration");
    i = end + 2;
  }
  while (i < s.size()) {
    if (s[i] == '<') {
      if (s.substr(i, 4) == "<!--") {
        const std::size_t end = s.find("-->", i + 4);
        if (end == std::string_view::npos) return fail("unterminated comment");
        if (s.substr(i + 4, end - i - 4).find("--") != std::string_view::npos) return fail("'--' inside a comment");
        i = end + 3;
        continue;
      }
      if (s.substr(i, 2) == "<?") {
        const std::size_t end = s.find("?>", i);
        if (end == std::string_view::npos) return fail("unterminated processing instruction");
        i = end + 2;
        continue;
      }
      if (s.substr(i, 2) == "<!") return fail("declarations and CDATA are not expected");
      if (s.substr(i, 2) == "</") {
        i += 2;
        const std::string name = read_name();
        skip_space();
        if (i >= s.size() || s[i] != '>') return fail("malformed end tag");
        ++i;
        if (open.empty() || open.back() != name) return fail("end tag </" + name + "> does not match");
        open.pop_back();
        if (open.empty()) root_closed = true;
        continue;
      }
      ++i;
      if (root_closed) return fail("content after the root element");
      const std::string name = read_name();
      if (name.empty()) return fail("bad element name");
      std::set<std::string> attrs;
      for (;;) {
        const std::size_t before = i;
        skip_space();
        if (i >= s.size()) return fail("unterminated start tag");
        if (s[i] == '>' || s.substr(i, 2) == "/>") break;
        if (i == before) return fail("attributes must be separated by white space");
        const std::string an = read_name();
        if (an.empty()) return fail("bad attribute name in <" + name + ">");
        if (!attrs.insert(an).second) return fail("duplicate attribute " + an);
        skip_space();
        if (i >= s.size() || s[i] != '=') return fail("attribute " + an + " without '='");
        ++i;
        skip_space();
        if (i >= s.size() || (s[i] != '"' && s[i] != '\'')) return fail("unquoted attribute " + an);
        const char q = s[i++];
        while (i < s.size() && s[i] != q) {
          if (s[i] == '<') return fail("'<' in attribute " + an);
          if (s[i] == '&') {
            const std::size_t n = entity_ok(i);
            if (n == 0) return fail("bad reference in attribute " + an);
            i += n;
            continue;
          }
          ++i;
        }
        if (i >= s.size()) return fail("unterminated attribute " + an);
        ++i;
      }
      if (open.empty() && root_seen) return fail("second root element");
      root_seen = true;
      if (s[i] == '/') {
        i += 2;
        if (open.empty()) root_closed = true;
      } else {
        ++i;
        open.push_back(name);
      }
      continue;
    }
    if (s[i] == '&') {
      const std::size_t n = entity_ok(i);
      if (n == 0) return fail("bad reference in text");
      i += n;
      continue;
    }
    if (open.empty() && !std::isspace(static_cast<unsigned char>(s[i]))) return fail("text outside the root element");
    ++i;
  }
  if (!open.empty()) return fail("unclosed element <" + open.back() + ">");
  if (!root_seen) return fail("no root element");
  return std::nullopt;
}

}  // namespace standoff::report::test
