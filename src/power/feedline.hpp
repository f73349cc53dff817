// Feed-line loss: matched attenuation of coax classes (published points fitted by
// α = k1·√f + k2·f), of parallel-wire lines from their geometry (Z0 = (η0/(π√εr))·acosh(D/d),
// conductor loss α = R′/(2·Z0) with R′ = 2·Rs/(π·d), Rs = √(π·f·μ0/σ)), and of user lines; then the
// extra loss of a mismatched load, L = 10·log10[(a² − |Γ|²)/(a·(1 − |Γ|²))] dB with a = 10^(A/10)
// (transmission-line theory for a real Z0, e.g. Pozar, Microwave Engineering, §2.7 and §2.2).
//
// Notation: f frequency; A matched loss of the run (dB); a = 10^(A/10); Γ load reflection
// coefficient; SWR = (1 + |Γ|)/(1 − |Γ|); at the line input |Γ_in| = |Γ|/a.
// Not modelled (each makes the computed loss SMALLER than the real one, so the power reaching the
// antenna — and the exposure — is over- rather than under-estimated): proximity effect and
// dielectric loss of parallel-wire lines, connector losses, weathering of the line.
#pragma once

#include <complex>
#include <optional>
#include <string>
#include <vector>

#include "core/units.hpp"

namespace standoff::power {

enum class LineKind { coax, parallel_wire, user };
enum class ConductorMaterial { copper, copper_clad_steel };

std::string to_string(LineKind k);
std::string to_string(ConductorMaterial m);

// One published matched-attenuation point.
struct AttenuationPoint {
  double f_mhz = 0.0;
  double db_per_100m = 0.0;
};

// A coax class: published attenuation points and their least-squares fit α = k1·√f + k2·f
// (dB/100 m, f in MHz). Lookups outside [f_min, f_max] of the points are refused.
struct CoaxData {
  std::vector<AttenuationPoint> points;
  double k1 = 0.0;  // dB/100 m per √MHz (conductor loss)
  double k2 = 0.0;  // dB/100 m per MHz (dielectric loss)
  double f_min_mhz = 0.0;
  double f_max_mhz = 0.0;
};

// Least-squares fit of k1·√f + k2·f through the points (weighted by relative error, so every
// point counts alike). Throws std::invalid_argument with fewer than two points.
CoaxData fit_coax(std::vector<AttenuationPoint> points);

// A parallel-wire (open-wire, ladder, window) line given by its geometry.
struct ParallelWireGeometry {
  units::Length conductor_diameter;  // d
  units::Length spacing;             // D, centre to centre (D > d)
  double velocity_factor = 1.0;      // εr,eff = 1/vf² (1 for air-spaced open-wire line)
  ConductorMaterial material = ConductorMaterial::copper;
  // Copper-clad steel: thickness of the copper layer as a fraction of the radius. Below the
  // frequency where the copper skin depth exceeds the layer, the loss is not evaluated.
  double cladding_fraction = 0.117;  // ≈ 30 % IACS conductance (copper area ≈ 22 %)
};

// A user-defined line: Z0 and its matched loss at one reference frequency. Scaling to another
// frequency takes the SMALLER of the √f (conductor) and f (dielectric) laws, so the loss is never
// over-estimated: ×√(f/f_ref) above f_ref, ×(f/f_ref) below.
// Matched line loss above which a run is not evaluated (the power left is below 1e-10 of the
// input; common practice (no source): no real station feeds an antenna through 100 dB of cable).
inline constexpr double kMaxLineLossDb = 100.0;

struct UserLineData {
  units::Impedance z0;
  double loss_db_per_100m = 0.0;
  units::Frequency reference_frequency;
  double velocity_factor = 1.0;
};

// A named line class from tables/feedlines.toml (or built by hand).
struct FeedLine {
  std::string name;         // e.g. "rg-213", "ladder-450", or "user"
  std::string description;
  LineKind kind = LineKind::coax;
  units::Impedance z0;      // nominal (for coax and user lines); parallel-wire: from geometry
  double velocity_factor = 0.66;
  CoaxData coax;                 // kind == coax
  ParallelWireGeometry wire;     // kind == parallel_wire
  UserLineData user;             // kind == user
  std::string source;            // document the data come from
  std::string confidence;        // "confirmed", "partly" or "verify" (REFERENCES.md convention)
  int source_line = 0;
};

// Line built from geometry / from a user's Z0 and loss.
FeedLine parallel_wire_line(std::string name, const ParallelWireGeometry& geometry);
FeedLine user_line(std::string name, const UserLineData& data);

// Parallel-wire characteristic impedance Z0 = (η0/(π√εr))·acosh(D/d), ohm. D > d required.
double parallel_wire_z0_ohm(double conductor_diameter_m, double spacing_m, double eps_r);

// Surface resistance Rs = √(π·f·μ0/σ), ohm per square; skin depth δ = 1/√(π·f·μ0·σ), m.
double surface_resistance_ohm(double f_hz, double sigma_s_per_m);
double skin_depth_m(double f_hz, double sigma_s_per_m);

// Matched line characteristics at one frequency.
struct LineCharacteristics {
  units::Impedance z0;
  double loss_db_per_100m = 0.0;  // matched attenuation
  double velocity_factor = 1.0;
  bool evaluated = true;          // false: outside the model's validity (see note)
  std::string note;
};

// Throws InputError (naming the line class, the table file and line) when f is outside the
// class's data range. A copper-clad-steel line below its validity frequency returns
// evaluated = false with a note ("not evaluated — measure or use another method").
LineCharacteristics characteristics(const FeedLine& line, units::Frequency f);

// The load at the far (antenna) end: matched, an SWR there, or a complex impedance.
struct LoadSpec {
  enum class Kind { matched, swr, impedance };
  Kind kind = Kind::matched;
  double swr = 1.0;
  std::complex<double> impedance{50.0, 0.0};

  static LoadSpec matched_load() { return {}; }
  static LoadSpec from_swr(double s) { return {Kind::swr, s, {}}; }
  static LoadSpec from_impedance(std::complex<double> z) { return {Kind::impedance, 1.0, z}; }
};

// |Γ| = |(Z_L − Z0)/(Z_L + Z0)| for a real Z0; |Γ| = (S − 1)/(S + 1) from an SWR S ≥ 1.
double reflection_magnitude(std::complex<double> z_load_ohm, double z0_ohm);
double reflection_from_swr(double swr);
double swr_from_reflection(double gamma);

// Total loss of a run with matched loss A (dB) into a load with |Γ| (transmission-line formula
// above). Equals A when |Γ| = 0; the extra loss vanishes as A → 0.
double total_loss_db(double matched_loss_db, double gamma_load);

// Everything about one run of line at one frequency.
struct LineRun {
  std::string line_name;
  units::Length length;
  units::Frequency frequency;
  units::Impedance z0;
  double matched_loss_db = 0.0;  // A
  double gamma_load = 0.0;       // |Γ| at the load
  double swr_load = 1.0;
  double swr_input = 1.0;        // at the transmitter end, (1 + |Γ|/a)/(1 − |Γ|/a)
  double total_loss_db = 0.0;    // L
  double mismatch_loss_db = 0.0; // L − A, the extra loss due to the SWR
  units::Power input;            // into the line at the transmitter end
  units::Power delivered;        // into the load (antenna): input / 10^(L/10)
  bool evaluated = true;
  std::string note;
};

// Power `input` enters the line (the transmitter, or a tuner at the transmitter, delivers it
// whatever the SWR at the input). Length ≥ 0. Throws InputError for f outside the line's data.
LineRun run_line(const FeedLine& line, units::Length length, units::Frequency f, const LoadSpec& load,
                 units::Power input);

}  // namespace standoff::power
