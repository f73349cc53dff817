// Sag of a uniform flexible wire hanging between two supports, by the exact catenary:
// c = H/w, z(x) = c[cosh((x − x0)/c) − cosh(x0/c)]; level span: sag d = c(cosh(L/2c) − 1),
// length S = 2c·sinh(L/2c), end tension T = H + w·d; parabolic check d ≈ wL²/(8H).
// Source: F. P. Beer, E. R. Johnston, Vector Mechanics for Engineers: Statics, cables chapter
// (catenary and parabolic cables). Valid for an inextensible wire with uniform weight, no wind.
#pragma once

namespace standoff::siting {

// Notation (SI, metres and newtons): L horizontal span, dz = z_end − z_start, H horizontal
// tension, w weight per length, c = H/w, x horizontal distance from the start, x0 the vertex.
class Catenary {
 public:
  // From the horizontal tension H (N) and the weight per length w (N/m).
  static Catenary from_tension(double span_m, double dz_m, double tension_n, double weight_n_per_m);
  // From a measured mid-span sag below the chord (m); the weight only scales the tensions.
  static Catenary from_midspan_sag(double span_m, double dz_m, double sag_m);
  // From the catenary parameter c = H/w (m) directly.
  static Catenary from_parameter(double span_m, double dz_m, double c_m);

  double span() const { return L_; }
  double rise() const { return dz_; }
  double parameter() const { return c_; }  // c = H/w
  double vertex_x() const { return x0_; }  // horizontal position of the vertex from the start

  double z(double x) const;          // height above the start at x
  double slope(double x) const;      // dz/dx at x
  double sag_below_chord(double x) const;
  double midspan_sag() const { return sag_below_chord(0.5 * L_); }
  double max_sag() const;            // largest vertical distance below the chord
  double lowest_x() const;           // where the wire is lowest (vertex, or the lower end)
  double lowest_z() const { return z(lowest_x()); }
  double length() const;             // arc length S
  // Tension at the start (end = 0) or the end (end = 1) for a weight per length w: T = w·c·cosh(…).
  double end_tension(int end, double weight_n_per_m) const;
  // Parabolic approximation of the mid-span sag of the same span: L²/(8c) (= wL²/(8H)).
  double parabolic_midspan_sag() const { return L_ * L_ / (8.0 * c_); }

 private:
  Catenary(double L, double dz, double c);
  double L_;
  double dz_;
  double c_;
  double x0_;
};

}  // namespace standoff::siting
