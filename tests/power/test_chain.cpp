// The power chain multiplies its published factors in order: OET 65 Supplement B (PEP × duty ×
// on-air share), the mismatch-loss formula of Pozar §2.7, and OET 65 Eq. 5 (EIRP = 1.64·ERP).
#include <catch2/catch.hpp>

#include <cmath>

#include "power/chain.hpp"

using namespace standoff;
using namespace standoff::power;

TEST_CASE("chain: PEP, duty, window, line, antenna", "[chain]") {
  ChainInput in;
  in.pep = units::watts(1500);
  in.duty = units::Fraction{0.2};  // OET 65 Supp. B Table 2, conversational SSB
  in.duty_source = "ssb";
  in.pattern = OperatingPattern::repeating({{units::seconds(420), true}, {units::seconds(420), false}});
  in.frequency = units::hertz(14.2e6);
  in.gain = units::Gain::from_dbi(2.15);
  in.line = LineSpec{user_line("u", {units::ohms(50), 2.0, units::hertz(14.2e6), 0.66}), units::metres(50),
                     LoadSpec::from_swr(3.0)};
  const auto c = power_chain(in, units::seconds(360));
  CHECK(c.average_at_transmitter.value() == Approx(300.0));  // Supp. B: 7 on/7 off → 300 W (6 min)
  const double a = 1.0;                                       // 2 dB/100 m × 50 m
  const double g = 0.5;                                       // SWR 3
  const double la = std::pow(10.0, a / 10.0);
  const double loss_db = 10.0 * std::log10((la * la - g * g) / (la * (1 - g * g)));
  CHECK(c.line_loss_db == Approx(loss_db));
  CHECK(c.average_at_antenna.value() == Approx(300.0 / std::pow(10.0, loss_db / 10.0)));
  CHECK(c.eirp.value() == Approx(c.average_at_antenna.value() * std::pow(10.0, 0.215)));
  CHECK(c.eirp.value() == Approx(1.64 * c.erp.value()));  // OET 65 Eq. 5
  REQUIRE(c.steps.size() == 5);
  CHECK(c.steps.back().name == "antenna");
}

TEST_CASE("chain without a line: the antenna gets the time-averaged power", "[chain]") {
  ChainInput in;
  in.pep = units::watts(100);
  in.duty = units::Fraction{0.4};
  in.frequency = units::hertz(7e6);
  in.gain = units::Gain::from_dbd(0.0);
  const auto c = power_chain(in, units::seconds(1800));
  CHECK(c.average_at_antenna.value() == Approx(40.0));
  CHECK(c.erp.value() == Approx(40.0));  // 0 dBd: ERP equals the power (OET 65 Eq. 5)
  CHECK(c.line_loss_db == 0.0);
}
