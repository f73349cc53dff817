// Numbers as text for people: `precision` significant figures, as an ostream would print them,
// but never in exponent notation (issue 13: "1945 dB", not "1.95e+03 dB"). Common practice (no source).
#pragma once

#include <string>

namespace standoff {

// Up to `precision` significant figures, trailing zeros dropped; integers of more digits than
// `precision` are rounded to a whole number ("1945"); "not finite" for NaN or infinity.
std::string significant(double v, int precision = 4);

}  // namespace standoff
