// The thin-wire model of a station-file wire antenna, built by the em builders (src/em/builders,
// common practice), shared by the exposure evaluation and the installation geometry checks.
#pragma once

#include <string>
#include <vector>

#include "core/error.hpp"
#include "em/model.hpp"
#include "station/station.hpp"

namespace standoff::assemble {

// The model of wire antenna `a` at `f_hz` over `ground` at its real position, height and azimuth.
// Appends what was assumed to `notes`. std::logic_error for a non-wire kind.
em::Model antenna_model(const station::Antenna& a, double f_hz, const em::Ground& ground, std::vector<std::string>& notes);

// A frequency at which to build the antenna's geometry: the lowest operating frequency on it, or
// its design frequency, or 7 MHz (the wire geometry of every builder but the Yagi's is the same at
// any frequency; the Yagi's comes from its band_centre).
double geometry_frequency_hz(const station::Station& st, const station::Antenna& a);

// The station key behind a wire-model error (issue 14): the model names its own fields (a wire,
// "length", "segments"); the user wrote antenna keys, so a message names the key that sets it.
std::string antenna_key_for(const station::Antenna& a, const InputError& e);

}  // namespace standoff::assemble
