// Builders of common wire antennas from physical parameters (dipole, folded dipole, inverted-V,
// monopole with or without radials, horizontal loop, 2- and 3-element Yagi); common practice.
#pragma once

#include <functional>
#include <optional>
#include <string>

#include "core/constants.hpp"
#include "em/model.hpp"
#include "em/solve.hpp"

namespace standoff::em {

// Where the antenna stands: centre (x, y) in the site frame, height of the feed point (dipoles,
// loop, Yagi) or of the base (monopole; 0 = on the ground), and the azimuth of the wire (dipoles,
// loop side) or of the boom/main lobe (Yagi), radians clockwise from north.
struct Placement {
  double x_m = 0.0;
  double y_m = 0.0;
  double height_m = 10.0;
  double azimuth_rad = 0.0;
};

struct Conductor {
  double radius_m = 1e-3;
  double conductivity_s_per_m = constants::sigma_copper;  // infinity = perfect conductor
};

// Radius of an AWG gauge (ASTM B258: d = 0.127 mm × 92^((36 − n)/39)); gauges 0000 = -3 .. 40.
double awg_radius_m(int gauge);

// Centre-fed straight dipole of total length `length_m`, horizontal at placement.height_m.
Model dipole(double frequency_hz, double length_m, const Placement& at, const Conductor& wire,
             const Ground& ground);

// Folded dipole: fed conductor (wire) and second conductor (wire2) `spacing_m` apart (axis to
// axis), joined at the ends; the second conductor lies above the fed one.
Model folded_dipole(double frequency_hz, double length_m, double spacing_m, const Placement& at,
                    const Conductor& wire, const Conductor& wire2, const Ground& ground);

// Inverted-V: two legs of length_m/2 each from an apex at placement.height_m, drooping by
// `droop_rad` below horizontal (0 = flat dipole), fed at the apex.
Model inverted_v(double frequency_hz, double length_m, double droop_rad, const Placement& at,
                 const Conductor& wire, const Ground& ground);

// Vertical monopole of length_m. Base at placement.height_m: 0 = fed against the ground (needs a
// perfect or real ground); above 0 = elevated with `radials` radials of radial_length_m,
// sloping down by radial_droop_rad, fed at the base.
Model monopole(double frequency_hz, double length_m, const Placement& at, const Conductor& wire,
               const Ground& ground, int radials = 0, double radial_length_m = 0.0,
               double radial_droop_rad = 0.0);

// Horizontal regular polygon loop (sides >= 3) of perimeter circumference_m, fed at the middle
// of the first side.
Model horizontal_loop(double frequency_hz, double circumference_m, int sides, const Placement& at,
                      const Conductor& wire, const Ground& ground);

// Yagi–Uda: horizontal elements along the boom (azimuth = direction of the main lobe).
struct YagiSpec {
  double driven_length_m = 0.0;
  double reflector_length_m = 0.0;
  double reflector_spacing_m = 0.0;
  double director_length_m = 0.0;  // yagi3 only
  double director_spacing_m = 0.0;  // yagi3 only
};
// Defaults scaled from the wavelength (common practice (no source): reflector 0.50 λ at 0.2 λ,
// driven 0.47 λ, director 0.44 λ at 0.15 λ); any non-zero field of `spec` overrides.
YagiSpec default_yagi(double frequency_hz, int elements);
Model yagi(double frequency_hz, int elements, const YagiSpec& spec, const Placement& at,
           const Conductor& wire, const Ground& ground);

// Free-form: wires as given, one feed.
Model free_form(double frequency_hz, std::vector<Wire> wires, std::vector<Feed> feeds,
                const Ground& ground, std::vector<Load> loads = {});

// Resonance: trims a length until the feed reactance is zero (secant iteration on X(L)).
struct Resonance {
  double length_m = 0.0;
  std::complex<double> impedance_ohm;
  Solution solution;
  int iterations = 0;
};
// `build(length)` returns the model for one length. Throws InputError (field "--resonate") when no
// zero of the reactance is found within [0.5, 1.5] × initial_length_m.
Resonance resonate(const std::function<Model(double)>& build, double initial_length_m,
                   const SolveOptions& options = {});

}  // namespace standoff::em
