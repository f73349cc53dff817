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
std::string distance_up(const std::optional<double>& m, bool none);  // "none" when nothing exceeds
std::string distance_down(const std::optional<double>& m);  // rounded DOWN (an actual clearance)
// A check's required / actual value: a length (up / down, in the unit system) or a wire diameter in mm.
std::string check_required(const LineCheck& c, UnitSystem u = UnitSystem::metric);
std::string check_actual(const LineCheck& c, UnitSystem u = UnitSystem::metric);
std::string percent_up(double ratio);                     // "212.4 %" rounded UP to 0.1 %; "23 014 %" from 1000 %
// Lengths in the record's unit system: "3.1 m", "10.2 ft" or "3.1 m (10.2 ft)"; up or down.
std::string length_up(const std::optional<double>& m, UnitSystem u);
std::string length_down(const std::optional<double>& m, UnitSystem u);
// Voltage for people: "240 V" below 1 kV, "7.2 kV" above.
std::string voltage(double volts);
// Permitted power for people: rounded DOWN; kW from 10 kW; "more than 100 kW" beyond (the
// exposure limit is then not what limits the power: see kAbsurdPowerNote).
std::string permitted_power(const std::optional<double>& w);
inline constexpr const char* kAbsurdPowerNote =
    "more than 100 kW: exposure does not limit this power; the licence and the equipment do.";
// Integer with a thin space between thousands ("23 014").
std::string grouped(long long v);
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
  // As render() when every line fits `width` columns; otherwise each row is folded: its first
  // cell on a line, then "header: value" pairs wrapped to the width.
  std::string render_fit(std::size_t width, const std::string& indent = "") const;
};

// Words of `text` wrapped to `width` columns: the first line starts with `first`, the others with
// `rest`. A word longer than a line is put on a line of its own (never cut).
std::string wrap(const std::string& text, std::size_t width, const std::string& first, const std::string& rest);

}  // namespace standoff::report::fmtx
