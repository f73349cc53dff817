// Options of `standoff place` shared with `evaluate --place` (issue 10).
#pragma once

#include <functional>
#include <iosfwd>
#include <string>

#include "assemble/placement.hpp"

namespace standoff::cli {

struct PlaceCliOptions {
  std::string station;
  std::string antenna;
  std::string step;
  std::string azimuths;
  std::string azimuth_step;
  std::size_t top = 10;
  std::string line;
  bool json = false;
  std::string out;
  unsigned threads = 0;
};

// Parses the option texts (units required); throws InputError naming the option.
assemble::PlaceOptions place_options(const PlaceCliOptions& options);

// Progress bar on stderr when it is a terminal and not --json; empty otherwise.
std::function<void(double)> place_progress(std::ostream& err, bool json);

}  // namespace standoff::cli
