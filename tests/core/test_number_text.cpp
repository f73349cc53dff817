// Numbers for people (issue 13): never exponent notation; otherwise the C library's %g rounding.
#include <catch2/catch.hpp>

#include <cmath>
#include <cstdio>
#include <limits>
#include <string>

#include "core/number_text.hpp"

using standoff::significant;

TEST_CASE("significant: the C library's %g wherever %g prints no exponent", "[number_text]") {
  // Reference: std::snprintf("%.*g") of the C standard library (ISO C 7.21.6.1).
  for (double v : {0.0, 1.0, -2.5, 0.001234, 3.14159265, 1500.0, 9999.0, 12.0, 0.5, 278.25}) {
    char ref[64];
    std::snprintf(ref, sizeof ref, "%.4g", v);
    CAPTURE(v);
    CHECK(significant(v) == std::string(ref));
  }
}

TEST_CASE("significant: large and small values in fixed notation, rounded as %g rounds", "[number_text]") {
  CHECK(significant(1945.3) == "1945");
  CHECK(significant(19453.0) == "19450");       // %.4g gives 1.945e+04
  CHECK(significant(603000.0, 3) == "603000");  // %.3g gives 6.03e+05
  CHECK(significant(-1.5e6) == "-1500000");
  CHECK(significant(1.234e-5) == "0.00001234");
  CHECK(significant(std::numeric_limits<double>::infinity()) == "not finite");
  CHECK(significant(std::nan("")) == "not finite");
  for (double v : {1e-12, 3.3e-7, 7.7e9, 1e15, -4.2e-9}) {
    CAPTURE(v);
    const std::string s = significant(v);
    CHECK(s.find('e') == std::string::npos);
    CHECK(std::fabs(std::stod(s) - v) <= 1e-3 * std::fabs(v));  // 4 significant figures kept
  }
}
