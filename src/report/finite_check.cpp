#include "report/finite_check.hpp"

#include <cmath>
#include <stdexcept>

namespace standoff::report {
namespace {

void walk(const nlohmann::json& j, const std::string& path, const std::string& what) {
  if (j.is_number_float()) {
    if (!std::isfinite(j.get<double>()))
      throw std::logic_error(what + ": the number at " + (path.empty() ? "/" : path) +
                             " is not finite; nothing was written (please report this input)");
  } else if (j.is_object()) {
    for (auto it = j.begin(); it != j.end(); ++it) walk(it.value(), path + "/" + it.key(), what);
  } else if (j.is_array()) {
    for (std::size_t i = 0; i < j.size(); ++i) walk(j[i], path + "/" + std::to_string(i), what);
  }
}

}  // namespace

void check_finite(const nlohmann::json& j, const std::string& what) { walk(j, "", what); }

}  // namespace standoff::report
