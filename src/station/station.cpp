#include "station/station.hpp"

namespace standoff::station {

std::string to_string(AntennaKind k) {
  switch (k) {
    case AntennaKind::dipole: return "dipole";
    case AntennaKind::inverted_v: return "inverted_v";
    case AntennaKind::vertical: return "vertical";
    case AntennaKind::yagi: return "yagi";
    case AntennaKind::gain_only: return "gain";
    case AntennaKind::collinear: return "collinear";
    case AntennaKind::aperture: return "aperture";
    case AntennaKind::folded_dipole: return "folded_dipole";
    case AntennaKind::loop: return "loop";
    case AntennaKind::end_fed_half_wave: return "end_fed_half_wave";
    case AntennaKind::ocf_dipole: return "ocf_dipole";
    case AntennaKind::wires: return "wires";
  }
  return "gain";
}

bool is_wire(AntennaKind k) {
  return k == AntennaKind::dipole || k == AntennaKind::inverted_v || k == AntennaKind::vertical ||
         k == AntennaKind::yagi || k == AntennaKind::folded_dipole || k == AntennaKind::loop ||
         k == AntennaKind::end_fed_half_wave || k == AntennaKind::ocf_dipole || k == AntennaKind::wires;
}

namespace {
template <class T>
const T* find(const std::vector<T>& v, const std::string& name) {
  for (const auto& x : v)
    if (x.name == name) return &x;
  return nullptr;
}
}  // namespace

const Transmitter* Station::transmitter(const std::string& n) const { return find(transmitters, n); }
const FeedLine* Station::feed_line(const std::string& n) const { return find(feed_lines, n); }
const Antenna* Station::antenna(const std::string& n) const { return find(antennas, n); }
const Operation* Station::operation(const std::string& n) const { return find(operations, n); }

}  // namespace standoff::station
