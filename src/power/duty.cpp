#include "power/duty.hpp"

#include <stdexcept>

namespace standoff::power {

const DutyMode* DutyTable::find(const std::string& name) const {
  for (const auto& m : modes)
    if (m.name == name) return &m;
  return nullptr;
}

std::string DutyTable::names() const {
  std::string s;
  for (const auto& m : modes) {
    if (!s.empty()) s += ", ";
    s += m.name;
  }
  return s;
}

units::Fraction am_carrier_duty(double m) {
  if (!(m >= 0.0 && m <= 1.0)) throw std::invalid_argument("AM modulation index must be within 0..1");
  // PEP = Pc (1+m)² (envelope peak (1+m)·Vc); average = Pc (1 + m²/2) (carrier + two sidebands).
  return units::Fraction{(1.0 + 0.5 * m * m) / ((1.0 + m) * (1.0 + m))};
}

}  // namespace standoff::power
