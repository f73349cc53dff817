#include "power/feedline.hpp"

#include <algorithm>
#include <cmath>
#include <sstream>
#include <stdexcept>

#include "core/constants.hpp"
#include "core/error.hpp"

namespace standoff::power {
namespace {

// Nepers to decibels: 20·log10(e) (definition of the neper).
constexpr double kDbPerNeper = 8.685889638065035;

std::string fmt_mhz(double f) {
  std::ostringstream o;
  o << f << " MHz";
  return o.str();
}

}  // namespace

std::string to_string(LineKind k) {
  switch (k) {
    case LineKind::coax: return "coax";
    case LineKind::parallel_wire: return "parallel-wire";
    case LineKind::user: return "user";
  }
  return {};
}

std::string to_string(ConductorMaterial m) {
  return m == ConductorMaterial::copper ? "copper" : "copper-clad steel";
}

CoaxData fit_coax(std::vector<AttenuationPoint> points) {
  if (points.size() < 2) throw std::invalid_argument("a coax fit needs at least two points");
  std::sort(points.begin(), points.end(), [](auto& a, auto& b) { return a.f_mhz < b.f_mhz; });
  // Weighted least squares: minimise Σ ((k1·√f + k2·f − α)/α)², i.e. rows (√f/α, f/α)·k = 1.
  double s11 = 0, s12 = 0, s22 = 0, b1 = 0, b2 = 0;
  for (const auto& p : points) {
    const double u = std::sqrt(p.f_mhz) / p.db_per_100m;
    const double v = p.f_mhz / p.db_per_100m;
    s11 += u * u;
    s12 += u * v;
    s22 += v * v;
    b1 += u;
    b2 += v;
  }
  CoaxData d;
  const double det = s11 * s22 - s12 * s12;
  d.k1 = (b1 * s22 - b2 * s12) / det;
  d.k2 = (s11 * b2 - s12 * b1) / det;
  // Keep both terms physical (non-negative): refit with one term if needed.
  if (d.k2 < 0.0) {
    d.k2 = 0.0;
    d.k1 = b1 / s11;
  } else if (d.k1 < 0.0) {
    d.k1 = 0.0;
    d.k2 = b2 / s22;
  }
  d.points = std::move(points);
  d.f_min_mhz = d.points.front().f_mhz;
  d.f_max_mhz = d.points.back().f_mhz;
  return d;
}

double parallel_wire_z0_ohm(double d, double spacing, double eps_r) {
  if (!(d > 0.0 && spacing > d && eps_r >= 1.0))
    throw std::invalid_argument("parallel-wire line needs spacing > diameter > 0 and εr ≥ 1");
  return constants::eta0 / (constants::pi * std::sqrt(eps_r)) * std::acosh(spacing / d);
}

double surface_resistance_ohm(double f_hz, double sigma) {
  return std::sqrt(constants::pi * f_hz * constants::mu0 / sigma);
}

double skin_depth_m(double f_hz, double sigma) {
  return 1.0 / std::sqrt(constants::pi * f_hz * constants::mu0 * sigma);
}

FeedLine parallel_wire_line(std::string name, const ParallelWireGeometry& g) {
  FeedLine l;
  l.name = std::move(name);
  l.kind = LineKind::parallel_wire;
  l.wire = g;
  l.velocity_factor = g.velocity_factor;
  const double eps_r = 1.0 / (g.velocity_factor * g.velocity_factor);
  l.z0 = units::ohms(parallel_wire_z0_ohm(g.conductor_diameter.value(), g.spacing.value(), eps_r));
  l.source = "computed from geometry: Z0 = (η0/(π√εr))·acosh(D/d), skin-effect conductor loss";
  l.confidence = "confirmed";
  return l;
}

FeedLine user_line(std::string name, const UserLineData& data) {
  FeedLine l;
  l.name = std::move(name);
  l.kind = LineKind::user;
  l.user = data;
  l.z0 = data.z0;
  l.velocity_factor = data.velocity_factor;
  l.source = "given by the user";
  l.confidence = "confirmed";
  return l;
}

LineCharacteristics characteristics(const FeedLine& line, units::Frequency f) {
  const double f_hz = f.value();
  const double f_mhz = f_hz / 1e6;
  LineCharacteristics c;
  c.velocity_factor = line.velocity_factor;
  c.z0 = line.z0;
  switch (line.kind) {
    case LineKind::coax: {
      const auto& d = line.coax;
      // Published points only: no extrapolation beyond them (a small rounding margin of 0.1 %).
      if (f_mhz < d.f_min_mhz * (1 - 1e-3) || f_mhz > d.f_max_mhz * (1 + 1e-3))
        throw InputError(Where{line.source_line > 0 ? "tables/feedlines.toml" : "", line.source_line, "line " + line.name},
                         "frequency " + fmt_mhz(f_mhz) + " is outside the data of line class \"" + line.name +
                             "\" (" + fmt_mhz(d.f_min_mhz) + " to " + fmt_mhz(d.f_max_mhz) + ")");
      c.loss_db_per_100m = d.k1 * std::sqrt(f_mhz) + d.k2 * f_mhz;
      break;
    }
    case LineKind::parallel_wire: {
      const auto& g = line.wire;
      const double dia = g.conductor_diameter.value();
      const double delta = skin_depth_m(f_hz, constants::sigma_copper);
      // Rs with copper: copper conductors, or copper-clad steel while the current stays in the
      // copper layer (skin depth ≤ cladding thickness).
      const double rs = surface_resistance_ohm(f_hz, constants::sigma_copper);
      const double r_per_m = 2.0 * rs / (constants::pi * dia);  // two conductors, R′ = 2·Rs/(π·d)
      c.loss_db_per_100m = 100.0 * kDbPerNeper * r_per_m / (2.0 * line.z0.value());
      if (g.material == ConductorMaterial::copper_clad_steel) {
        const double cladding = g.cladding_fraction * dia / 2.0;
        if (delta > cladding) {
          c.evaluated = false;
          c.note = "copper-clad steel: at " + fmt_mhz(f_mhz) +
                   " the skin depth exceeds the copper layer, so the loss is not evaluated — measure or use "
                   "another method";
        }
      }
      if (c.evaluated && delta > dia / 4.0) {
        c.evaluated = false;
        c.note = "skin depth is not small against the conductor diameter at " + fmt_mhz(f_mhz) +
                 ": loss not evaluated — measure or use another method";
      }
      break;
    }
    case LineKind::user: {
      const auto& u = line.user;
      const double ratio = f_hz / u.reference_frequency.value();
      // The smaller of the √f and f laws, so the loss is never over-estimated.
      c.loss_db_per_100m = u.loss_db_per_100m * (ratio >= 1.0 ? std::sqrt(ratio) : ratio);
      break;
    }
  }
  return c;
}

double reflection_magnitude(std::complex<double> z, double z0) { return std::abs((z - z0) / (z + z0)); }

double reflection_from_swr(double swr) { return (swr - 1.0) / (swr + 1.0); }

double swr_from_reflection(double g) { return g >= 1.0 ? INFINITY : (1.0 + g) / (1.0 - g); }

double total_loss_db(double matched_loss_db, double gamma) {
  const double a = std::pow(10.0, matched_loss_db / 10.0);
  const double g2 = gamma * gamma;
  return 10.0 * std::log10((a * a - g2) / (a * (1.0 - g2)));
}

LineRun run_line(const FeedLine& line, units::Length length, units::Frequency f, const LoadSpec& load,
                 units::Power input) {
  const auto c = characteristics(line, f);
  LineRun r;
  r.line_name = line.name;
  r.length = length;
  r.frequency = f;
  r.z0 = c.z0;
  r.evaluated = c.evaluated;
  r.note = c.note;
  r.matched_loss_db = c.loss_db_per_100m * length.value() / 100.0;
  switch (load.kind) {
    case LoadSpec::Kind::matched: r.gamma_load = 0.0; break;
    case LoadSpec::Kind::swr: r.gamma_load = reflection_from_swr(load.swr); break;
    case LoadSpec::Kind::impedance: r.gamma_load = reflection_magnitude(load.impedance, c.z0.value()); break;
  }
  if (!(r.gamma_load < 1.0 - 1e-9))
    throw InputError(Where{"", 0, "load"},
                     "the load reflects all power (|Γ| = 1): no power reaches the antenna's resistance — give the "
                     "antenna's feed impedance or an SWR below infinity");
  r.swr_load = swr_from_reflection(r.gamma_load);
  // Beyond kMaxLineLossDb the power reaching the antenna is below 1e-10 of the input and the
  // loss formulas overflow double precision: the run is not evaluated rather than printed as inf.
  if (!(r.matched_loss_db <= kMaxLineLossDb)) {
    r.evaluated = false;
    r.note = "the line's matched loss (" + std::to_string(static_cast<long long>(std::min(r.matched_loss_db, 1e15))) +
             " dB) exceeds " + std::to_string(static_cast<int>(kMaxLineLossDb)) +
             " dB: the power reaching the antenna is not meaningful (check the line length); not evaluated — "
             "measure or use another method";
    r.swr_input = 1.0;
    r.total_loss_db = r.matched_loss_db;
    r.mismatch_loss_db = 0.0;
    r.input = input;
    r.delivered = input * 0.0;
    return r;
  }
  const double a = std::pow(10.0, r.matched_loss_db / 10.0);
  r.swr_input = swr_from_reflection(r.gamma_load / a);
  r.total_loss_db = total_loss_db(r.matched_loss_db, r.gamma_load);
  r.mismatch_loss_db = r.total_loss_db - r.matched_loss_db;
  if (r.mismatch_loss_db < 1e-12) r.mismatch_loss_db = 0.0;  // ≥ 0 by theory; clears rounding noise
  r.input = input;
  r.delivered = input / std::pow(10.0, r.total_loss_db / 10.0);
  return r;
}

}  // namespace standoff::power
