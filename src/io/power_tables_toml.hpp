// Loaders for the power-chain tables: tables/duty.toml (duty factors, FCC OET Bulletin 65
// Supplement B Table 2) and tables/feedlines.toml (coax attenuation points fitted by
// k1·√f + k2·f; parallel-wire lines from geometry). Bad files throw InputError naming file,
// line and field.
#pragma once

#include <string>
#include <string_view>

#include "power/duty.hpp"
#include "power/feedline.hpp"

namespace standoff::power {

struct FeedLineTable {
  std::string file;
  std::vector<FeedLine> lines;

  const FeedLine* find(const std::string& name) const;
  std::string names() const;  // for error messages
};

DutyTable load_duty_table(std::string_view toml_text, const std::string& file_name);
FeedLineTable load_feedline_table(std::string_view toml_text, const std::string& file_name);

// From the embedded tables/duty.toml and tables/feedlines.toml (parsed once, then cached).
const DutyTable& builtin_duty_table();
const FeedLineTable& builtin_feedline_table();

}  // namespace standoff::power
