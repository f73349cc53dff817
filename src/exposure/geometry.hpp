// Plan geometry for the site (boundary, footprints, zones): the project's one polygon module,
// src/core/plan_geometry.hpp (Boost.Geometry), under the exposure module's names.
#pragma once

#include "core/plan_geometry.hpp"

namespace standoff::exposure {

using geometry::Area;
using geometry::bounds;
using geometry::distance_to_segment;
using geometry::inside;
using geometry::PlanPoint;
using geometry::Polygon;
using geometry::segments_intersect;
using geometry::self_intersection;
using geometry::signed_area;

}  // namespace standoff::exposure
