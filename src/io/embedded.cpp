#include "io/embedded.hpp"

namespace standoff::io {

std::optional<std::string_view> embedded_file(std::string_view path) {
  for (const auto& f : embedded_files())
    if (f.path == path) return f.content;
  return std::nullopt;
}

std::vector<EmbeddedFile> embedded_files_under(std::string_view prefix) {
  std::vector<EmbeddedFile> out;
  for (const auto& f : embedded_files())
    if (f.path.starts_with(prefix)) out.push_back(f);
  return out;
}

}  // namespace standoff::io
