// 3-D distances between segments and points, and plan (2-D) crossings of segments, used for the
// clearance checks; and the distance from a segment to a power line whose conductor runs at a
// known height, or anywhere from a lowest height upward when its height is unknown.
// Method: closest points of two segments by clamped parametric minimisation (C. Ericson,
// Real-Time Collision Detection, 2005, §5.1.9); plan crossings through Boost.Geometry
// (core/plan_geometry.hpp, the project's one polygon module).
#pragma once

#include <optional>
#include <vector>

#include <Eigen/Core>

#include "core/segment_distance.hpp"

namespace standoff::siting {

using Vec2 = Eigen::Vector2d;
using Vec3 = Eigen::Vector3d;

// Point/segment and segment/segment distances (src/core/segment_distance.hpp).
using geometry::point_segment_distance;
using geometry::segment_segment_distance;

// Where the plan segments ab and cd cross or touch (any common point), if they do.
std::optional<Vec2> plan_crossing(const Vec2& a, const Vec2& b, const Vec2& c, const Vec2& d);

// Shortest plan distance between the segments ab and cd (0 if they cross).
double plan_segment_distance(const Vec2& a, const Vec2& b, const Vec2& c, const Vec2& d);

// A power line's conductor: a plan route at height `z_low`; when `height_known` is false the
// conductor may be at any height from `z_low` upward (worst case over that range).
struct ConductorGeometry {
  std::vector<Vec2> path;
  double z_low = 0.0;
  bool height_known = true;
};

// Shortest 3-D distance from the segment ab to the conductor (worst case over the height range
// when the height is unknown; the distance is convex in the height, so a golden-section search
// on [z_low, max(z_low, a.z, b.z)] finds the minimum).
double segment_conductor_distance(const Vec3& a, const Vec3& b, const ConductorGeometry& line);

// Shortest plan distance from the plan segment ab to the conductor's route, and the first
// crossing point if they cross.
double plan_conductor_distance(const Vec2& a, const Vec2& b, const ConductorGeometry& line);
std::optional<Vec2> plan_conductor_crossing(const Vec2& a, const Vec2& b, const ConductorGeometry& line);

}  // namespace standoff::siting
