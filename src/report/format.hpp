// Display formatting shared by the text, Markdown and HTML writers: directed rounding (distances
// up, powers down, ratios up — the project's safety rule), frequencies, verdict words, and a
// column-aligned plain-text table that counts UTF-8 characters, not bytes.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "report/record.hpp"

namespace standoff::report::fmtx {

std::string frequency(double hz);                        // "14.2 MHz", "1.296 GHz", "475 kHz"
std::string power(double watts);                          // 3 significant figures, as given ("1500 W")
std::string power_down(const std::optional<double>& w);   // rounded DOWN, or "not evaluated"
std::string distance_up(const std::optional<double>& m);  // rounded UP to 0.1 m, or "not evaluated"
std::string distance_down(const std::optional<double>& m);  // rounded DOWN (an actual clearance)
std::string check_required(const LineCheck& c);          // distance_up, or a diameter in mm
std::string check_actual(const LineCheck& c);            // distance_down, or a diameter in mm
std::string percent_up(double ratio);                     // "212.4 %" rounded UP to 0.1 %
std::string where(const exposure::SitePoint& p);         // "(12.0, -4.5, 1.0) m"
std::string verdict_word(const std::string& verdict);     // "WITHIN LIMITS", "EXCEEDS", "NOT EVALUATED"
std::string tiers(const exposure::TierDistances& d);     // "C 3.1 m / U 7.0 m"

// Display width of UTF-8 text: code points, each one column; ANSI colour sequences count zero.
std::size_t display_width(const std::string& s);

// A plain-text table with columns padded to their widest cell.
struct TextTable {
  std::vector<std::string> header;
  std::vector<std::vector<std::string>> rows;
  std::string render(const std::string& indent = "") const;
};

}  // namespace standoff::report::fmtx
