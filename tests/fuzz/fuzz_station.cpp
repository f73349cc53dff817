// libFuzzer target (issue 14): the station loader and the build of the evaluation's inputs on
// arbitrary text. Bad input must end in InputError; the MoM cap is kept small so that each input
// runs in milliseconds.
#include <cstdint>
#include <string_view>

#include "core/error.hpp"
#include "station/sources.hpp"
#include "station/station_toml.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  try {
    const standoff::station::Station st = standoff::station::load_station(text, "fuzz.toml");
    standoff::station::BuildOptions bo;
    bo.max_unknowns = 80;
    const auto built = standoff::station::build(st, bo);
    (void)built;
  } catch (const standoff::InputError&) {
  }
  return 0;
}
