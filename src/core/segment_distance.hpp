// Shortest distances between points and segments in 3-D, shared by the MoM geometry checks and
// the power-line clearance checks. Method: closest points of two segments by clamped parametric
// minimisation (C. Ericson, Real-Time Collision Detection, 2005, §5.1.9).
#pragma once

#include <Eigen/Core>

namespace standoff::geometry {

// Shortest distance between a point and the segment ab (metres in, metres out).
double point_segment_distance(const Eigen::Vector3d& p, const Eigen::Vector3d& a, const Eigen::Vector3d& b);

// Shortest distance between the segments p1q1 and p2q2 (either may be a single point).
double segment_segment_distance(const Eigen::Vector3d& p1, const Eigen::Vector3d& q1, const Eigen::Vector3d& p2,
                                const Eigen::Vector3d& q2);

}  // namespace standoff::geometry
