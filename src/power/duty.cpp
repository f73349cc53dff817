#include "power/duty.hpp"

#include <cctype>
#include <stdexcept>

namespace standoff::power {

namespace {
bool same_ignoring_case(const std::string& a, const std::string& b) {
  if (a.size() != b.size()) return false;
  for (std::size_t k = 0; k < a.size(); ++k) {
    if (std::tolower(static_cast<unsigned char>(a[k])) != std::tolower(static_cast<unsigned char>(b[k]))) return false;
  }
  return true;
}
}  // namespace

const DutyMode* DutyTable::find(const std::string& name) const {
  for (const auto& m : modes)
    if (same_ignoring_case(m.name, name)) return &m;
  for (const auto& m : modes)
    for (const auto& a : m.aliases)
      if (same_ignoring_case(a, name)) return &m;
  return nullptr;
}

std::string DutyTable::names() const {
  std::string s;
  for (const auto& m : modes) {
    if (!s.empty()) s += ", ";
    s += m.name;
    for (const auto& a : m.aliases) s += (&a == &m.aliases.front() ? " (also " : ", ") + a;
    if (!m.aliases.empty()) s += ")";
  }
  return s;
}

units::Fraction am_carrier_duty(double m) {
  if (!(m >= 0.0 && m <= 1.0)) throw std::invalid_argument("AM modulation index must be within 0..1");
  // PEP = Pc (1+m)² (envelope peak (1+m)·Vc); average = Pc (1 + m²/2) (carrier + two sidebands).
  return units::Fraction{(1.0 + 0.5 * m * m) / ((1.0 + m) * (1.0 + m))};
}

}  // namespace standoff::power
