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

// Wire diameters (NFPA 70 Table 810.52 check): millimetres to 0.01 mm, required up, actual down.
std::string check_required(const LineCheck& c) {
  if (!c.diameter) return distance_up(c.required_m);
  if (!c.required_m || !std::isfinite(*c.required_m)) return "not evaluated";
  return fmt::format("{:.2f} mm", std::ceil(*c.required_m * 1e5 * (1.0 - 1e-9)) / 100.0);
}
std::string check_actual(const LineCheck& c) {
  if (!c.diameter) return distance_down(c.actual_m);
  if (!c.actual_m || !std::isfinite(*c.actual_m)) return "not evaluated";
  return fmt::format("{:.2f} mm", std::floor(*c.actual_m * 1e5 * (1.0 + 1e-9)) / 100.0);
}

std::string percent_up(double ratio) {
  if (!std::isfinite(ratio)) return "not evaluated";
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

std::string tiers(const exposure::TierDistances& d) {
  return "C " + distance_up(d.controlled_m) + " / U " + distance_up(d.uncontrolled_m);
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

}  // namespace standoff::report::fmtx
