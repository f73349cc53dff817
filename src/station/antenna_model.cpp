#include "station/antenna_model.hpp"

#include <sstream>
#include <stdexcept>

#include "core/constants.hpp"
#include "em/builders.hpp"

namespace standoff::station {

namespace {
std::string num(double v, int precision = 4) {
  std::ostringstream o;
  o.precision(precision);
  o << v;
  return o.str();
}
}  // namespace

double geometry_frequency_hz(const Station& st, const Antenna& a) {
  double f = 0.0;
  for (const auto& op : st.operations)
    if (op.antenna == a.name && (f == 0.0 || op.frequency.value() < f)) f = op.frequency.value();
  if (f > 0.0) return f;
  if (a.band_centre_hz) return *a.band_centre_hz;
  return 7.0e6;
}

em::Model antenna_model(const Antenna& a, double f_hz, const em::Ground& ground, std::vector<std::string>& notes) {
  em::Placement at{a.position.x_m, a.position.y_m, a.height_m, a.azimuth_rad};
  em::Conductor wire;
  wire.radius_m = a.wire_diameter_m.value_or(0.002) / 2.0;
  if (!a.wire_diameter_m) notes.push_back("wire diameter not stated: 2 mm assumed");
  switch (a.kind) {
    case AntennaKind::dipole: return em::dipole(f_hz, *a.length_m, at, wire, ground);
    case AntennaKind::inverted_v:
      return em::inverted_v(f_hz, *a.length_m, (constants::pi - *a.apex_angle_rad) / 2.0, at, wire, ground);
    case AntennaKind::vertical:
      if (a.height_m <= 0.0) {
        notes.push_back("ground-mounted vertical: its radial system is modelled as a perfect ground plane "
                        "(usually conservative above ground)");
        return em::monopole(f_hz, *a.length_m, at, wire, em::perfect_ground());
      }
      return em::monopole(f_hz, *a.length_m, at, wire, ground, a.radials, a.radial_length_m.value_or(0.0), 0.0);
    case AntennaKind::yagi: {
      const em::YagiSpec spec = em::default_yagi(*a.band_centre_hz, *a.elements);
      notes.push_back("Yagi element lengths and spacings scaled from the design frequency " +
                      num(*a.band_centre_hz / 1e6) + " MHz (common practice)");
      return em::yagi(f_hz, *a.elements, spec, at, wire, ground);
    }
    default: break;
  }
  throw std::logic_error("wire_model: not a wire antenna");
}

}  // namespace standoff::station
