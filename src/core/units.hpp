// Physical quantities that cross module boundaries, as Boost.Units SI quantities, plus the
// dimensionless kinds (gain, fraction) as small typed structs. Inside numeric kernels use plain SI
// doubles (`.value()`); convert at the seam with the helpers below.
#pragma once

#include <cmath>

#include <boost/units/quantity.hpp>
#include <boost/units/systems/si.hpp>

namespace standoff::units {

namespace bu = boost::units;
namespace si = boost::units::si;

using Length = bu::quantity<si::length>;
using Area = bu::quantity<si::area>;
using Frequency = bu::quantity<si::frequency>;
using Power = bu::quantity<si::power>;
using Time = bu::quantity<si::time>;
using Angle = bu::quantity<si::plane_angle>;
using Impedance = bu::quantity<si::resistance>;
using Conductivity = bu::quantity<si::conductivity>;
using EField = bu::quantity<bu::divide_typeof_helper<si::electric_potential, si::length>::type>;
using HField = bu::quantity<bu::divide_typeof_helper<si::current, si::length>::type>;
using PowerDensity = bu::quantity<bu::divide_typeof_helper<si::power, si::area>::type>;

// Construct from SI doubles.
inline Length metres(double v) { return v * si::meters; }
inline Frequency hertz(double v) { return v * si::hertz; }
inline Power watts(double v) { return v * si::watts; }
inline Time seconds(double v) { return v * si::seconds; }
inline Angle radians(double v) { return v * si::radians; }
inline Impedance ohms(double v) { return v * si::ohms; }
inline Conductivity siemens_per_metre(double v) { return v * si::siemens / si::meters; }
inline EField volts_per_metre(double v) { return v * si::volts / si::meters; }
inline HField amperes_per_metre(double v) { return v * si::amperes / si::meters; }
inline PowerDensity watts_per_square_metre(double v) { return v * si::watts / si::square_meters; }

// Antenna gain relative to an isotropic radiator, stored as a power ratio.
struct Gain {
  double ratio = 1.0;
  static Gain from_dbi(double dbi) { return Gain{std::pow(10.0, dbi / 10.0)}; }
  // dBd is relative to a half-wave dipole: 0 dBd = 2.15 dBi (ratio 1.64, OET 65 Eq. 5).
  static Gain from_dbd(double dbd) { return Gain{1.64 * std::pow(10.0, dbd / 10.0)}; }
  double dbi() const { return 10.0 * std::log10(ratio); }
};

// A share of something (duty factor, on-air fraction, efficiency), 0..1.
struct Fraction {
  double value = 0.0;
  double percent() const { return 100.0 * value; }
};

}  // namespace standoff::units
