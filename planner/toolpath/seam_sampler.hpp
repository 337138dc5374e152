#pragma once

#include <Eigen/Geometry>
#include <optional>
#include <vector>

#include "kinematics/common/angles.hpp"
#include "planner/job/seam_point.hpp"

namespace tw::planner {

/// How a seam polyline is resampled.
struct SamplingOptions {
  /// Largest distance between consecutive samples along the seam [m].
  /// 2 mm: common practice, no source (fine enough for welding paths,
  /// few enough points for the seam solver).
  double step = 0.002;
  /// A vertex where the direction turns by more than this is a corner [rad]
  /// and is kept exactly. 20°: common practice, no source (CAD lists of
  /// curved seams turn by a few degrees per point).
  double corner_angle = 20.0 * kPi / 180.0;
};

/// One resampled point of a seam, in the seam frame X.
struct SeamSample {
  Eigen::Vector3d p_XP = Eigen::Vector3d::Zero();      ///< on the input polyline [m]
  Eigen::Vector3d tangent = Eigen::Vector3d::UnitX();  ///< unit travel direction
  Eigen::Vector3d normal = Eigen::Vector3d::UnitZ();   ///< unit, interpolated
  std::optional<Eigen::Vector3d> second_normal;        ///< unit, interpolated
  std::optional<double> speed;  ///< [m/s], interpolated when the list has speeds
  double arc_length = 0.0;      ///< distance from the seam start along the polyline [m]
  /// True at a corner; a corner appears twice: once with the incoming
  /// direction (arriving), once with the outgoing one (leaving), so the tool
  /// turns on the spot instead of cutting the corner.
  bool corner = false;
  /// Line of the input point this sample is on, else of the point that
  /// starts the input segment it lies in.
  int line = 0;
};

/// Resamples `points` along its polyline. Samples sit on the polyline; the
/// spans between corners (and the ends) are divided evenly with spacing at
/// most options.step; the ends and every corner are kept exactly. The
/// tangent is the segment direction on straight runs and blends between
/// neighbouring segment directions across smooth vertices; normals and
/// speeds are interpolated linearly by arc length (normals renormalised).
///
/// Throws tw::InputError (located at the point's line in points.source) for
/// fewer than two points, coincident consecutive points, a normal (or second
/// normal) turning by more than 90° from one point to the next (a sign error
/// or a list too sparse to interpolate), a direction reversal (a turn of
/// 180°), a non-positive step or a corner angle outside (0°, 170°].
/// A pure function, safe to call from several threads.
std::vector<SeamSample> sampleSeam(const SeamPointList& points, const SamplingOptions& options);

}  // namespace tw::planner
