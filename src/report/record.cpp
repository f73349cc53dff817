#include "report/record.hpp"

#include <algorithm>
#include <cctype>
#include <chrono>
#include <cmath>
#include <ctime>

namespace standoff::report {

bool LinesSection::all_pass() const {
  return std::all_of(checks.begin(), checks.end(), [](const LineCheck& c) { return c.pass; });
}

std::string tier_name(limits::Tier t) {
  return t == limits::Tier::controlled ? "controlled" : "uncontrolled";
}

std::string overall_verdict(const Record& r) {
  const bool lines_fail = r.lines && !r.lines->all_pass();
  if (r.evaluation.verdict == exposure::Verdict::exceeds || lines_fail) return "exceeds";
  return exposure::to_string(r.evaluation.verdict);
}

std::vector<std::string> all_cautions(const Record& r) {
  // Our own wording; each is common practice (no source) except where a source is named.
  std::vector<std::string> out = {
      "Never touch an antenna, its feed point or an open-wire line while a transmitter is keyed, "
      "even at low power: contact with a conductor carrying RF can cause deep RF burns that this "
      "evaluation of unperturbed fields does not cover.",
      "Overhead power lines kill. Treat every line as energised and uninsulated; call the utility "
      "before working near one; never raise a mast, tower, ladder, throw line or wire where it "
      "could reach a line standing, swinging or falling.",
      "Climbing towers, trees and roofs and raising masts risk falls: use fall protection, work with "
      "a helper, and keep people out of the fall zone while raising or lowering.",
      "Bond and ground masts, towers and feed-line shields for lightning and static per the "
      "electrical code (NFPA 70 Art. 810 in the US); disconnect and ground antennas when not in use.",
      "This record supports, and does not replace, the rules that apply: local codes, the "
      "regulator, the electric utility and licensed professional practice govern.",
      "Exposure results assume the station operates as described (power, mode, on-air time, feed "
      "line, antenna position); re-evaluate after any change.",
  };
  auto add = [&](const std::string& c) {
    if (!c.empty() && std::find(out.begin(), out.end(), c) == out.end()) out.push_back(c);
  };
  for (const auto& c : r.cautions) add(c);
  for (const auto& c : r.evaluation.cautions) add(c);
  if (r.lines) {
    for (const auto& c : r.lines->cautions) add(c);
  }
  return out;
}

std::vector<Reference> default_references() {
  return {
      {"Exposure limits (US)", "47 CFR § 1.1310(e)(1), Table 1; tiers per 47 CFR § 97.13(c)(1)"},
      {"Multiple sources", "47 CFR § 1.1307(b)(5): Σ of ratios to the limits ≤ 1 at every place"},
      {"Duty factors and time averaging", "FCC OET Bulletin 65, Supplement B (1997), Table 2 and worked examples"},
      {"Far-field screening", "FCC OET Bulletin 65, Edition 97-01, Section 2, Eqs. 3, 5, 6 and 7"},
      {"Detailed near field", "Thin-wire method of moments (Pocklington's equation), see docs/methods.md"},
      {"Exposure limits (international)", "ICNIRP 2020, Health Phys. 118(5):483–524, Table 5; ICNIRP 1998 / "
                                          "EU 1999/519/EC; Health Canada Safety Code 6 (2015) Table 5"},
      {"Approach distances to power lines", "OSHA 29 CFR 1910.333(c)(3); OSHA 29 CFR 1926.1408 Table A"},
      {"Fall zone", "US CPSC Release 02-151 (2002): 1.5 × the height of the antenna or mast"},
      {"Antenna installation", "NFPA 70 (National Electrical Code) Article 810"},
      {"Wire sag", "Catenary and parabolic cable (Beer & Johnston, Vector Mechanics for Engineers: Statics)"},
      {"Contours on the site map", "Marching squares with linear interpolation (Lorensen & Cline, 1987, 2-D form)"},
      {"Fingerprint of the input file", "SHA-256, FIPS PUB 180-4 (NIST, 2015)"},
  };
}

std::string slug(const std::string& name) {
  std::string out;
  bool pending_dash = false;
  for (const char ch : name) {
    const auto u = static_cast<unsigned char>(ch);
    if (u < 0x80 && std::isalnum(u)) {
      if (pending_dash && !out.empty()) out += '-';
      pending_dash = false;
      out += static_cast<char>(std::tolower(u));
    } else {
      pending_dash = true;
    }
  }
  return out.empty() ? "station" : out;
}

std::string utc_now_iso8601() {
  const std::time_t now = std::chrono::system_clock::to_time_t(std::chrono::system_clock::now());
  std::tm tm{};
  gmtime_r(&now, &tm);
  char buf[32];
  std::strftime(buf, sizeof buf, "%Y-%m-%dT%H:%M:%SZ", &tm);
  return buf;
}

// A relative slack of 1e-9 keeps values that are already on the display grid (12.3 m) from being
// pushed to the next step by binary floating-point representation error.
namespace {
constexpr double kSlack = 1e-9;
}

double round_distance_up(double metres) {
  if (!std::isfinite(metres)) return metres;
  if (metres <= 0.0) return 0.0;  // no distance needed (and never "-0.0")
  return std::ceil(metres * 10.0 * (1.0 - kSlack)) / 10.0;
}

double round_power_down(double watts) {
  if (!std::isfinite(watts) || watts <= 0.0) return watts;
  const double step = std::pow(10.0, std::floor(std::log10(watts)) - 2.0);
  return std::floor(watts / step * (1.0 + kSlack)) * step;
}

double round_percent_up(double ratio) {
  if (!std::isfinite(ratio)) return ratio;
  return std::ceil(ratio * 1000.0 * (1.0 - kSlack)) / 10.0;
}

}  // namespace standoff::report
