#include "assemble/antenna_model.hpp"

#include <algorithm>
#include <cmath>
#include <sstream>
#include <stdexcept>

#include "core/number_text.hpp"
#include "core/constants.hpp"
#include "core/error.hpp"
#include "em/builders.hpp"

namespace standoff::assemble {

namespace {
// A straight wire from `a` to `b` fed at fraction `feed` along it (sloping and off-centre dipoles).
em::Model straight_wire(double f_hz, const Eigen::Vector3d& a, const Eigen::Vector3d& b, double feed,
                        const em::Conductor& c, const em::Ground& ground, const std::string& name) {
  em::Wire w;
  w.a = a;
  w.b = b;
  w.radius_m = c.radius_m;
  w.conductivity_s_per_m = c.conductivity_s_per_m;
  w.name = name;
  return em::free_form(f_hz, {w}, {em::Feed{0, feed, {1.0, 0.0}}}, ground);
}

// Horizontal unit vector of an azimuth (clockwise from north, +y).
Eigen::Vector3d along(double az) { return Eigen::Vector3d(std::sin(az), std::cos(az), 0.0); }

// Ends of a wire of length L centred (in plan) at the antenna's position, rising from h1 to h2.
std::pair<Eigen::Vector3d, Eigen::Vector3d> sloping_ends(const station::Antenna& a, double h1, double h2) {
  const double L = *a.length_m;
  const double plan = std::sqrt(std::max(0.0, L * L - (h2 - h1) * (h2 - h1)));
  const Eigen::Vector3d c(a.position.x_m, a.position.y_m, 0.0);
  const Eigen::Vector3d u = along(a.azimuth_rad);
  return {c - 0.5 * plan * u + Eigen::Vector3d(0, 0, h1), c + 0.5 * plan * u + Eigen::Vector3d(0, 0, h2)};
}

}  // namespace

double geometry_frequency_hz(const station::Station& st, const station::Antenna& a) {
  double f = 0.0;
  for (const auto& op : st.operations)
    if (op.antenna == a.name && (f == 0.0 || op.frequency.value() < f)) f = op.frequency.value();
  if (f > 0.0) return f;
  if (a.band_centre_hz) return *a.band_centre_hz;
  return 7.0e6;
}

em::Model antenna_model(const station::Antenna& a, double f_hz, const em::Ground& ground, std::vector<std::string>& notes) {
  em::Placement at{a.position.x_m, a.position.y_m, a.height_m, a.azimuth_rad};
  em::Conductor wire;
  wire.radius_m = a.wire_diameter_m.value_or(0.002) / 2.0;
  if (!a.wire_diameter_m) notes.push_back("wire diameter not stated: 2 mm assumed");
  switch (a.kind) {
    case station::AntennaKind::dipole:
      if (a.end_heights_m) {
        const auto [p, q] = sloping_ends(a, a.end_heights_m->first, a.end_heights_m->second);
        return straight_wire(f_hz, p, q, 0.5, wire, ground, "dipole");
      }
      return em::dipole(f_hz, *a.length_m, at, wire, ground);
    case station::AntennaKind::ocf_dipole: {
      const double h1 = a.end_heights_m ? a.end_heights_m->first : a.height_m;
      const double h2 = a.end_heights_m ? a.end_heights_m->second : a.height_m;
      const auto [p, q] = sloping_ends(a, h1, h2);
      return straight_wire(f_hz, p, q, *a.feed_fraction, wire, ground, "dipole");
    }
    case station::AntennaKind::end_fed_half_wave: {
      // Radiator from the feed point along the azimuth (rising to end_height); the matching unit
      // is the feed itself (its ratio is applied to the impedance the line sees: station/sources.cpp).
      const double L = *a.length_m;
      const double cp = a.counterpoise_m.value_or(0.05 * L);
      if (!a.counterpoise_m) notes.push_back("end-fed: counterpoise not stated, 5 % of the wire assumed");
      const double dz = a.end_height_m.value_or(a.height_m) - a.height_m;
      const double plan = std::sqrt(std::max(0.0, L * L - dz * dz));
      const Eigen::Vector3d feed(a.position.x_m, a.position.y_m, a.height_m);
      const Eigen::Vector3d dir = (plan * along(a.azimuth_rad) + Eigen::Vector3d(0, 0, dz)) / L;
      // One straight wire: the counterpoise continues the radiator's line behind the feed point.
      const Eigen::Vector3d start = feed - cp * dir;
      if (start.z() < 0.0)
        throw InputError(Where{"antenna model", 0, "counterpoise"},
                         "the counterpoise, continuing the wire's line behind the feed, would go below ground");
      return straight_wire(f_hz, start, feed + L * dir, cp / (L + cp), wire, ground, "end-fed wire");
    }
    case station::AntennaKind::folded_dipole: {
      em::Conductor wire2 = wire;
      if (a.second_wire_diameter_m) wire2.radius_m = *a.second_wire_diameter_m / 2.0;
      return em::folded_dipole(f_hz, *a.length_m, *a.spacing_m, at, wire, wire2, ground);
    }
    case station::AntennaKind::loop: return em::horizontal_loop(f_hz, *a.length_m, a.sides, at, wire, ground);
    case station::AntennaKind::wires: {
      std::vector<em::Wire> ws;
      for (std::size_t i = 0; i < a.free_wires.size(); ++i) {
        const station::FreeWire& fw = a.free_wires[i];
        em::Wire w;
        w.a = Eigen::Vector3d(fw.from.x_m, fw.from.y_m, fw.from.z_m);
        w.b = Eigen::Vector3d(fw.to.x_m, fw.to.y_m, fw.to.z_m);
        w.radius_m = fw.diameter_m ? *fw.diameter_m / 2.0 : wire.radius_m;
        w.name = "wire " + std::to_string(i + 1);
        ws.push_back(w);
      }
      return em::free_form(f_hz, std::move(ws),
                           {em::Feed{static_cast<std::size_t>(a.feed_wire), a.feed_fraction.value_or(0.5), {1.0, 0.0}}},
                           ground);
    }
    case station::AntennaKind::inverted_v:
      return em::inverted_v(f_hz, *a.length_m, (constants::pi - *a.apex_angle_rad) / 2.0, at, wire, ground);
    case station::AntennaKind::vertical:
      if (a.height_m <= 0.0) {
        notes.push_back("ground-mounted vertical: its radial system is modelled as a perfect ground plane "
                        "(usually conservative above ground)");
        return em::monopole(f_hz, *a.length_m, at, wire, em::perfect_ground());
      }
      return em::monopole(f_hz, *a.length_m, at, wire, ground, a.radials, a.radial_length_m.value_or(0.0), 0.0);
    case station::AntennaKind::yagi: {
      const em::YagiSpec spec = em::default_yagi(*a.band_centre_hz, *a.elements);
      notes.push_back("Yagi element lengths and spacings scaled from the design frequency " +
                      significant(*a.band_centre_hz / 1e6) + " MHz (common practice)");
      return em::yagi(f_hz, *a.elements, spec, at, wire, ground);
    }
    default: break;
  }
  throw std::logic_error("wire_model: not a wire antenna");
}


namespace {
// The key of the quantity a wire-model error is about, from the model's field and message.
std::string model_error_key(const InputError& e) {
  const std::string& f = e.where().field;
  const std::string& m = e.message();
  auto has = [&](const char* s) { return m.find(s) != std::string::npos; };
  if (f == "elements") return "elements";
  if (f == "radials" || f == "radial length" || f.rfind("radial ", 0) == 0) return has("radius") ? "wire_diameter" : "radial_length";
  if (has("radius") || has("radii") || has("thin-wire")) return "wire_diameter";
  if (has("ground")) return "height";
  if (f == "droop") return "apex_angle";
  if (f == "frequency") return "band_centre";
  if (f == "length" || f == "segments" || has("segments") || has("zero-length")) return "length";
  return "kind";
}
}  // namespace

std::string antenna_key_for(const station::Antenna& a, const InputError& e) {
  std::string key = model_error_key(e);
  if (a.kind == station::AntennaKind::yagi && key == "length") key = "band_centre";  // a Yagi is sized from it
  return key;
}


}  // namespace standoff::assemble
