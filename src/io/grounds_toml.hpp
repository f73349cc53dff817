// Ground classes (relative permittivity and conductivity) from tables/grounds.toml — ITU-R P.527
// classes plus the literature's "average" ground (flagged) — and the --ground name lookup.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "core/error.hpp"
#include "em/model.hpp"

namespace standoff::em {

struct GroundClass {
  std::string name;
  std::string description;
  double eps_r = 1.0;
  double sigma_s_per_m = 0.0;
  std::string source;
  std::string confidence;  // "verify", "confirmed", or "convention" (not a published class)
  int source_line = 0;
};

struct GroundTable {
  std::string file;
  std::vector<GroundClass> classes;
  const GroundClass* find(std::string_view name) const;
  std::string names() const;  // comma-separated, for messages
};

// Throws InputError naming file, line and field for a bad table.
GroundTable load_ground_table(std::string_view toml_text, const std::string& file_name);
// The embedded tables/grounds.toml (parsed once).
const GroundTable& builtin_ground_table();

// "free" (free space), "perfect" (perfect ground), or a class name from the table.
// Throws InputError at `where` for an unknown name, listing the accepted names.
Ground ground_by_name(std::string_view name, const Where& where);
// The table row behind a ground built by ground_by_name (nullptr for free/perfect).
const GroundClass* ground_class_of(const Ground& ground);

}  // namespace standoff::em
