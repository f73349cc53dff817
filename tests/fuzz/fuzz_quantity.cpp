// libFuzzer target (issue 14): the quantity parser (src/core/quantity_parse.hpp) on arbitrary text.
// Every input either parses to a finite value or throws InputError; anything else is a finding.
#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <string_view>

#include "core/quantity_parse.hpp"

namespace {
template <class F>
void one(F parse, std::string_view text) {
  try {
    const auto q = parse(text);
    (void)q;
  } catch (const standoff::InputError&) {
  }
}
}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace standoff;
  const std::string_view t(reinterpret_cast<const char*>(data), size);
  auto check = [](double v) {
    if (!std::isfinite(v)) std::abort();  // a parser must never return a non-finite quantity
  };
  one([&](std::string_view s) { auto q = parse_length(s, {}, Sign::any); check(q.value()); return q; }, t);
  one([&](std::string_view s) { auto q = parse_frequency(s); check(q.value()); return q; }, t);
  one([&](std::string_view s) { auto q = parse_power(s); check(q.value()); return q; }, t);
  one([&](std::string_view s) { auto q = parse_gain(s); check(q.ratio); return q; }, t);
  one([&](std::string_view s) { auto q = parse_fraction(s); check(q.value); return q; }, t);
  one([&](std::string_view s) { auto q = parse_angle(s); check(q.value()); return q; }, t);
  one([&](std::string_view s) { auto q = parse_time(s); check(q.value()); return q; }, t);
  one([&](std::string_view s) { auto q = parse_efield(s); check(q.value()); return q; }, t);
  one([&](std::string_view s) { auto q = parse_hfield(s); check(q.value()); return q; }, t);
  one([&](std::string_view s) { auto q = parse_power_density(s); check(q.value()); return q; }, t);
  one([&](std::string_view s) { auto q = parse_impedance(s); check(q.value()); return q; }, t);
  one([&](std::string_view s) { auto q = parse_conductivity(s); check(q.value()); return q; }, t);
  one([&](std::string_view s) {
        auto z = parse_complex_impedance(s);
        check(z.real());
        check(z.imag());
        return z;
      },
      t);
  return 0;
}
