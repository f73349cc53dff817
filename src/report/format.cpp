#include "report/format.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

namespace standoff::report::fmtx {

namespace {
// Up to `decimals` decimals, trailing zeros dropped.
std::string trim_num(double v, int decimals) {
  std::string s = fmt::format("{:.{}f}", v, decimals);
  if (s.find('.') != std::string::npos) {
    while (s.back() == '0') s.pop_back();
    if (s.back() == '.') s.pop_back();
  }
  return s;
}
}  // namespace

std::string frequency(double hz) {
  if (hz >= 1e9) return trim_num(hz / 1e9, 6) + " GHz";
  if (hz >= 1e6) return trim_num(hz / 1e6, 6) + " MHz";
  if (hz >= 1e3) return trim_num(hz / 1e3, 3) + " kHz";
  return trim_num(hz, 1) + " Hz";
}

std::string power(double watts) {
  if (!std::isfinite(watts)) return "not evaluated";
  if (watts >= 10000.0) return trim_num(watts / 1000.0, watts >= 100000.0 ? 0 : 1) + " kW";
  if (watts >= 100.0) return fmt::format("{:.0f} W", watts);
  if (watts >= 1.0) return trim_num(watts, 2) + " W";
  return trim_num(watts * 1000.0, 2) + " mW";
}

std::string power_down(const std::optional<double>& w) {
  if (!w || !std::isfinite(*w)) return "not evaluated";
  return power(round_power_down(*w));
}

std::string distance_up(const std::optional<double>& m) {
  if (!m || !std::isfinite(*m)) return "not evaluated";
  return fmt::format("{:.1f} m", round_distance_up(*m));
}

std::string distance_down(const std::optional<double>& m) {
  if (!m || !std::isfinite(*m)) return "not evaluated";
  // An actual clearance is compared with a required one: rounding it down errs on the safe side.
  return fmt::format("{:.1f} m", std::max(0.0, std::floor(*m * 10.0 * (1.0 + 1e-9)) / 10.0));
}

std::string grouped(long long v) {
  std::string digits = std::to_string(v < 0 ? -v : v), out;
  for (std::size_t k = 0; k < digits.size(); ++k) {
    if (k > 0 && (digits.size() - k) % 3 == 0) out += ' ';
    out += digits[k];
  }
  return (v < 0 ? "-" : "") + out;
}

std::string length_up(const std::optional<double>& m, UnitSystem u) {
  if (!m || !std::isfinite(*m)) return "not evaluated";
  const std::string ft = fmt::format("{:.1f} ft", std::ceil(std::max(0.0, *m) / 0.3048 * 10.0 * (1.0 - 1e-9)) / 10.0);
  if (u == UnitSystem::imperial) return ft;
  const std::string me = distance_up(m);
  return u == UnitSystem::both ? me + " (" + ft + ")" : me;
}

std::string length_down(const std::optional<double>& m, UnitSystem u) {
  if (!m || !std::isfinite(*m)) return "not evaluated";
  const std::string ft = fmt::format("{:.1f} ft", std::max(0.0, std::floor(*m / 0.3048 * 10.0 * (1.0 + 1e-9)) / 10.0));
  if (u == UnitSystem::imperial) return ft;
  const std::string me = distance_down(m);
  return u == UnitSystem::both ? me + " (" + ft + ")" : me;
}

std::string voltage(double volts) {
  if (!std::isfinite(volts)) return "voltage unknown";
  if (volts < 1000.0) return trim_num(volts, 0) + " V";
  return trim_num(volts / 1000.0, 2) + " kV";
}

std::string permitted_power(const std::optional<double>& w) {
  if (!w || !std::isfinite(*w)) return "not evaluated";
  if (*w > 100000.0) return "more than 100 kW";
  return power(round_power_down(*w));
}

// Wire diameters (NFPA 70 Table 810.52 check): millimetres to 0.01 mm, required up, actual down.
std::string check_required(const LineCheck& c, UnitSystem u) {
  if (!c.diameter) return length_up(c.required_m, u);
  if (!c.required_m || !std::isfinite(*c.required_m)) return "not evaluated";
  return fmt::format("{:.2f} mm", std::ceil(*c.required_m * 1e5 * (1.0 - 1e-9)) / 100.0);
}
std::string check_actual(const LineCheck& c, UnitSystem u) {
  if (!c.diameter) return length_down(c.actual_m, u);
  if (!c.actual_m || !std::isfinite(*c.actual_m)) return "not evaluated";
  return fmt::format("{:.2f} mm", std::floor(*c.actual_m * 1e5 * (1.0 + 1e-9)) / 100.0);
}

std::string percent_up(double ratio) {
  if (!std::isfinite(ratio)) return "not evaluated";
  if (ratio >= 10.0) return grouped(static_cast<long long>(std::ceil(ratio * 100.0 * (1.0 - 1e-9)))) + " %";
  return fmt::format("{:.1f} %", round_percent_up(ratio));
}

std::string where(const exposure::SitePoint& p) {
  return fmt::format("({:.1f}, {:.1f}, {:.1f}) m", p.x_m, p.y_m, p.z_m);
}

std::string verdict_word(const std::string& verdict) {
  if (verdict == "within") return "WITHIN LIMITS";
  if (verdict == "exceeds") return "EXCEEDS";
  if (verdict == "pass") return "PASS";
  if (verdict == "fail") return "FAIL";
  return "NOT EVALUATED";
}

std::string distance_up(const std::optional<double>& m, bool none) { return none ? "none" : distance_up(m); }

std::string tiers(const exposure::TierDistances& d) {
  return "C " + distance_up(d.controlled_m, d.controlled_none) + " / U " + distance_up(d.uncontrolled_m, d.uncontrolled_none);
}

std::size_t display_width(const std::string& s) {
  std::size_t n = 0;
  for (std::size_t k = 0; k < s.size(); ++k) {
    if (s[k] == '\x1b' && k + 1 < s.size() && s[k + 1] == '[') {  // ANSI colour sequence: no width
      k += 2;
      while (k < s.size() && s[k] != 'm') ++k;
      continue;
    }
    if ((static_cast<unsigned char>(s[k]) & 0xC0) != 0x80) ++n;  // skip UTF-8 continuation bytes
  }
  return n;
}

std::string TextTable::render(const std::string& indent) const {
  std::vector<std::size_t> width(header.size(), 0);
  for (std::size_t c = 0; c < header.size(); ++c) width[c] = display_width(header[c]);
  for (const auto& row : rows) {
    for (std::size_t c = 0; c < row.size() && c < width.size(); ++c) width[c] = std::max(width[c], display_width(row[c]));
  }
  auto line = [&](const std::vector<std::string>& cells) {
    std::string s = indent;
    for (std::size_t c = 0; c < width.size(); ++c) {
      const std::string cell = c < cells.size() ? cells[c] : "";
      s += cell;
      if (c + 1 < width.size()) s += std::string(width[c] - display_width(cell) + 2, ' ');
    }
    while (!s.empty() && s.back() == ' ') s.pop_back();
    return s + "\n";
  };
  std::string out = line(header);
  std::string rule = indent;
  for (std::size_t c = 0; c < width.size(); ++c) {
    rule += std::string(width[c], '-');
    if (c + 1 < width.size()) rule += "  ";
  }
  out += rule + "\n";
  for (const auto& row : rows) out += line(row);
  return out;
}

std::string wrap(const std::string& text, std::size_t width, const std::string& first, const std::string& rest) {
  std::string out, line = first;
  std::size_t line_w = display_width(first);
  bool empty_line = true;
  std::size_t k = 0;
  while (k < text.size()) {
    while (k < text.size() && text[k] == ' ') ++k;
    if (k >= text.size()) break;
    std::size_t e = text.find(' ', k);
    if (e == std::string::npos) e = text.size();
    const std::string word = text.substr(k, e - k);
    k = e;
    const std::size_t ww = display_width(word);
    if (!empty_line && line_w + 1 + ww > width) {
      out += line + "\n";
      line = rest;
      line_w = display_width(rest);
      empty_line = true;
    }
    if (!empty_line) {
      line += ' ';
      ++line_w;
    }
    line += word;
    line_w += ww;
    empty_line = false;
  }
  return out + line + "\n";
}

std::string TextTable::render_fit(std::size_t width, const std::string& indent) const {
  const std::string full = render(indent);
  std::size_t widest = 0, start = 0;
  while (start < full.size()) {
    const std::size_t e = full.find('\n', start);
    widest = std::max(widest, display_width(full.substr(start, e - start)));
    start = e == std::string::npos ? full.size() : e + 1;
  }
  if (widest <= width) return full;
  std::string out;
  for (const auto& row : rows) {
    if (row.empty()) continue;
    out += indent + row[0] + "\n";
    std::string rest;
    for (std::size_t c = 1; c < row.size() && c < header.size(); ++c) {
      rest += (rest.empty() ? "" : "; ") + header[c] + ": " + row[c];
    }
    if (!rest.empty()) out += wrap(rest, width, indent + "    ", indent + "    ");
  }
  return out;
}

}  // namespace standoff::report::fmtx
