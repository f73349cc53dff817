// libFuzzer target (issue 14): the station loader and the build of the evaluation's inputs on
// arbitrary text. Bad input must end in InputError. Stations with wire antennas are only loaded:
// their moment-method solution and gain search take seconds under the sanitizers (fuzzed by the
// `wire`-free path and by tests/em instead), which would read as fuzzer timeouts.
#include <cstdint>
#include <string_view>

#include "core/error.hpp"
#include "assemble/sources.hpp"
#include "io/station_toml.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  try {
    const standoff::station::Station st = standoff::station::load_station(text, "fuzz.toml");
    for (const auto& a : st.antennas)
      if (standoff::station::is_wire(a.kind)) return 0;
    standoff::assemble::BuildOptions bo;
    bo.max_unknowns = 80;
    const auto built = standoff::assemble::build(st, bo);
    (void)built;
  } catch (const standoff::InputError&) {
  }
  return 0;
}
