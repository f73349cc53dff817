// libFuzzer target (issue 14): the table loaders (limits, duty, feed lines, grounds, clearances)
// on arbitrary text. Bad input must end in InputError.
#include <cstdint>
#include <string_view>

#include "core/error.hpp"
#include "io/grounds_toml.hpp"
#include "io/limits_toml.hpp"
#include "io/power_tables_toml.hpp"
#include "io/clearances_toml.hpp"

namespace {
template <class F>
void one(F f) {
  try {
    f();
  } catch (const standoff::InputError&) {
  }
}
}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace standoff;
  const std::string_view t(reinterpret_cast<const char*>(data), size);
  one([&] { (void)limits::load_limit_table(t, "fuzz.toml"); });
  one([&] { (void)power::load_duty_table(t, "fuzz.toml"); });
  one([&] { (void)power::load_feedline_table(t, "fuzz.toml"); });
  one([&] { (void)em::load_ground_table(t, "fuzz.toml"); });
  one([&] { (void)siting::load_clearance_tables(t, "fuzz.toml"); });
  return 0;
}
