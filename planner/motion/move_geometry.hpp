#pragma once

#include <Eigen/Geometry>

#include <optional>

#include "planner/motion/compact_move.hpp"

namespace tw::planner::detail {

/// Limits that decide when three points make a usable circular move.
///
/// - kMaxArcSweep: an arc must sweep less than 180°. Past 180° the chord
///   shrinks again (chord = 2R·sin(sweep/2)), so the circle through start,
///   via and end grows ill-conditioned and at 360° is undefined (start = end);
///   below 180° the arc is the minor arc, so a controller that rebuilds it
///   from the three points cannot pick the wrong side. Common practice, no
///   source. A full circle therefore takes at least three arcs.
/// - kMinViaOffsetRatio: the via must stand off the chord by at least this
///   fraction of the chord, else the points are nearly collinear and the
///   centre is numerically meaningless (its error grows like chord²/offset²
///   times the point error). 1e-3 corresponds to a sweep of about 0.46°.
/// - kMaxArcRadius [m]: a larger radius is numerically a line for a work
///   cell a few metres across; use a linear move.
inline constexpr double kMaxArcSweep = kPi;
inline constexpr double kMinViaOffsetRatio = 1e-3;
inline constexpr double kMaxArcRadius = 10.0;

/// The controller's path of one move, prepared for repeated evaluation.
struct MoveGeometry {
  MoveShape shape = MoveShape::kLine;
  Eigen::Vector3d p_start = Eigen::Vector3d::Zero();
  Eigen::Vector3d p_end = Eigen::Vector3d::Zero();
  double length = 0.0;  ///< [m]
  // kLine: unit direction start → end.
  Eigen::Vector3d direction = Eigen::Vector3d::Zero();
  // kArc: centre, radius [m], unit normal (right-handed about the travel),
  // in-plane unit axes with axis_x pointing at the start, sweep [rad].
  Eigen::Vector3d centre = Eigen::Vector3d::Zero();
  double radius = 0.0;
  Eigen::Vector3d normal = Eigen::Vector3d::Zero();
  Eigen::Vector3d axis_x = Eigen::Vector3d::Zero();
  Eigen::Vector3d axis_y = Eigen::Vector3d::Zero();
  double sweep = 0.0;
  // Orientation: q(u) = q_start · exp(u·rotation_angle·rotation_axis).
  Eigen::Quaterniond q_start = Eigen::Quaterniond::Identity();
  Eigen::Quaterniond q_start_inverse = Eigen::Quaterniond::Identity();
  Eigen::Vector3d rotation_axis = Eigen::Vector3d::UnitX();
  double rotation_angle = 0.0;  ///< [rad], in [0, π]

  Eigen::Vector3d positionAt(double fraction) const;
  /// The rotation from q_start to the orientation at `fraction`.
  Eigen::Quaterniond relativeRotationAt(double fraction) const;
};

/// Closest point of the path to p: squared distance [m²] and its fraction.
struct PathFoot {
  double distance_squared = 0.0;
  double fraction = 0.0;
};

PathFoot footOnPath(const MoveGeometry& geometry, const Eigen::Vector3d& p);

/// Shortest-rotation parameters from q_start to q_end (sets the four
/// orientation members).
void setOrientation(MoveGeometry& geometry, const Eigen::Quaterniond& q_start,
                    const Eigen::Quaterniond& q_end);

/// Straight path; nullopt when start and end coincide.
std::optional<MoveGeometry> lineGeometry(const Eigen::Vector3d& p_start,
                                         const Eigen::Vector3d& p_end);

/// Circular arc through three points, start → via → end; nullopt when the
/// points break a limit above (collinear, radius too large, sweep ≥ 180°).
std::optional<MoveGeometry> arcGeometry(const Eigen::Vector3d& p_start,
                                        const Eigen::Vector3d& p_via,
                                        const Eigen::Vector3d& p_end);

}  // namespace tw::planner::detail
