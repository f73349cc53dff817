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

std::string exposure_verdict(const Record& r) { return exposure::to_string(r.evaluation.verdict); }

std::string installation_verdict(const Record& r) {
  if (!r.lines || r.lines->checks.empty()) return "not checked";
  return r.lines->all_pass() ? "pass" : "fail";
}

std::size_t installation_failures(const Record& r) {
  if (!r.lines) return 0;
  return static_cast<std::size_t>(
      std::count_if(r.lines->checks.begin(), r.lines->checks.end(), [](const LineCheck& c) { return !c.pass; }));
}

std::size_t installation_checks(const Record& r) { return r.lines ? r.lines->checks.size() : 0; }

std::string exposure_headline(const Record& r) {
  const std::string v = exposure_verdict(r);
  return std::string("RF exposure: ") + (v == "within" ? "WITHIN LIMITS" : v == "exceeds" ? "EXCEEDS" : "NOT EVALUATED");
}

std::string installation_headline(const Record& r) {
  const std::string v = installation_verdict(r);
  const std::size_t n = installation_checks(r);
  const std::string checks = std::to_string(n) + (n == 1 ? " check" : " checks");
  if (v == "fail") return "Installation: FAIL (" + std::to_string(installation_failures(r)) + " of " + checks + ")";
  if (v == "pass") return "Installation: PASS (" + checks + ")";
  return "Installation: NOT CHECKED (no power lines or supports described)";
}

namespace {

// Cautions of the other modules whose matter our own standard set already says (merged into the
// power-line and codes cautions below); each topic is said once.
bool said_by_standard_set(const std::string& c) {
  for (const char* key : {"Call the utility before any work near overhead lines",
                          "Assume every overhead line is energised and uninsulated",
                          "Never raise, lower or climb a mast, tower or antenna near a power line",
                          "These checks are a planning aid, not an approval"}) {
    if (c.find(key) != std::string::npos) return true;
  }
  return false;
}

// A caution about physical work (wires, supports, lines) ranks above the model's caveats.
bool about_physical_harm(const std::string& text) {
  std::string c;
  for (const char ch : text) c += static_cast<char>(std::tolower(static_cast<unsigned char>(ch)));
  for (const char* key : {"sag", "wire", "mast", "tower", "climb", "ladder", "power line", "overhead", "burn", "shock"}) {
    if (c.find(key) != std::string::npos) return true;
  }
  return false;
}

}  // namespace

std::vector<std::string> all_cautions(const Record& r) {
  // Our own wording; each is common practice (no source) except where a source is named. In the
  // order of harm: electrocution, RF burns, falls, then other physical hazards, lightning, the
  // model's limits, and finally who governs.
  const std::vector<std::string> first = {
      "Overhead power lines kill. Treat every line as energised and uninsulated, service drops and lines "
      "that look dead included. Call the utility before any work near one: have them confirm the voltage "
      "and height, and cover or de-energise the line where needed. Never raise, lower or climb a mast, "
      "tower, ladder, throw line or wire where anything could come within the approach distance, standing, "
      "swinging, slipping or falling.",
      "Never touch an antenna, its feed point or an open-wire line while a transmitter is keyed, even at low "
      "power: contact with a conductor carrying RF can cause deep RF burns that this evaluation of "
      "unperturbed fields does not cover.",
      "Climbing towers, trees and roofs and raising masts risk falls: use fall protection, work with a helper, "
      "and keep people out of the fall zone while raising or lowering.",
  };
  const std::string lightning =
      "Bond and ground masts, towers and feed-line shields for lightning and static per the electrical code "
      "(NFPA 70 Art. 810 in the US); disconnect and ground antennas when not in use.";
  const std::vector<std::string> last = {
      "Exposure results assume the station operates as described (power, mode, on-air time, feed line, "
      "antenna position); re-evaluate after any change.",
      "This record is a planning aid and supports, but does not replace, the rules that apply: local codes, "
      "the regulator, the electric utility and licensed professional practice govern wherever they ask for "
      "more.",
  };
  std::vector<std::string> physical, caveats;
  std::vector<std::string> seen(first.begin(), first.end());
  seen.push_back(lightning);
  seen.insert(seen.end(), last.begin(), last.end());
  auto add = [&](const std::string& c) {
    if (c.empty() || said_by_standard_set(c)) return;
    if (std::find(seen.begin(), seen.end(), c) != seen.end()) return;
    seen.push_back(c);
    (about_physical_harm(c) ? physical : caveats).push_back(c);
  };
  for (const auto& c : r.cautions) add(c);
  for (const auto& c : r.evaluation.cautions) add(c);
  if (r.lines) {
    for (const auto& c : r.lines->cautions) add(c);
  }
  std::vector<std::string> out(first);
  out.insert(out.end(), physical.begin(), physical.end());
  out.push_back(lightning);
  out.insert(out.end(), caveats.begin(), caveats.end());
  out.insert(out.end(), last.begin(), last.end());
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
