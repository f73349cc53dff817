#include "core/error.hpp"

namespace standoff {

std::string Where::describe() const {
  std::string s = file;
  if (line > 0) {
    s += ':';
    s += std::to_string(line);
  }
  if (!field.empty()) {
    if (!s.empty()) s += ": ";
    s += field;
  }
  return s;
}

namespace {
std::string compose(const Where& w, const std::string& message) {
  const std::string prefix = w.describe();
  return prefix.empty() ? message : prefix + ": " + message;
}
}  // namespace

InputError::InputError(Where where, const std::string& message)
    : std::runtime_error(compose(where, message)), where_(std::move(where)), message_(message) {}

}  // namespace standoff
