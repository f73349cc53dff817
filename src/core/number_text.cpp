#include "core/number_text.hpp"

#include <cmath>
#include <cstdio>
#include <string>

namespace standoff {

std::string significant(double v, int precision) {
  if (!std::isfinite(v)) return "not finite";
  if (precision < 1) precision = 1;
  char buf[512];
  std::snprintf(buf, sizeof buf, "%.*g", precision, v);
  const std::string g = buf;
  if (g.find_first_of("eE") == std::string::npos) return g;
  // Exponent form: print the same rounded value in fixed notation instead.
  const double a = std::fabs(v);
  const int exponent = static_cast<int>(std::floor(std::log10(a)));
  const int decimals = exponent >= 0 ? 0 : std::min(300, precision - 1 - exponent);
  std::snprintf(buf, sizeof buf, "%.*f", decimals, std::stod(g));
  std::string f = buf;
  if (f.find('.') != std::string::npos) {
    while (!f.empty() && f.back() == '0') f.pop_back();
    if (!f.empty() && f.back() == '.') f.pop_back();
  }
  return f;
}

}  // namespace standoff
