// Data files compiled into the binary: the limits, duty, feed-line, ground and clearance tables
// under tables/, and the demo station under docs/examples/. Keys are paths relative to the repo.
#pragma once

#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace standoff::io {

struct EmbeddedFile {
  std::string_view path;     // e.g. "tables/limits/fcc.toml"
  std::string_view content;  // the file's text
};

// Every embedded file, sorted by path.
std::span<const EmbeddedFile> embedded_files();

// The text of one embedded file, if present.
std::optional<std::string_view> embedded_file(std::string_view path);

// Every embedded file whose path starts with `prefix` (e.g. "tables/limits/").
std::vector<EmbeddedFile> embedded_files_under(std::string_view prefix);

}  // namespace standoff::io
