#pragma once

#include <Eigen/Geometry>

#include <vector>

#include "kinematics/common/angles.hpp"

namespace tw::planner {


enum class MoveShape { kLine, kArc };

/// One controller move between two samples of a seam, by sample index into
/// the pose list it was compacted from.
///
/// How the controller interpolates it (the model every function here and in
/// move_compaction.hpp follows):
/// - kLine: the TCP position runs on the straight segment start → end.
/// - kArc: the TCP position runs on the circular arc through the positions of
///   start, via and end (the minor arc, sweep < 180°; the via picks the side).
///   The via's orientation is not used.
/// - Both: the orientation is the slerp (shortest rotation) from the start
///   orientation to the end orientation, parameterised by the fraction of the
///   path length travelled, u ∈ [0, 1].
struct CompactMove {
  MoveShape shape = MoveShape::kLine;
  int start = 0;
  int end = 0;
  int via = -1;  ///< index of the via pose for kArc, −1 for kLine
};

/// Tangent directions (unit vectors, in the poses' frame) of a move's
/// geometric path where it leaves its start and where it arrives at its end.
struct MoveEndTangents {
  Eigen::Vector3d at_start;
  Eigen::Vector3d at_end;
};

// Every function below takes the pose list the move indexes (TCP poses in the
// seam frame, SI units) and throws std::invalid_argument when the move does
// not fit it: indices out of range, start ≥ end, an arc without a via strictly
// between start and end, a line with a via, or three arc points that define
// no circle (coincident or collinear). They are pure and thread-safe.

/// The pose the controller commands at path fraction `fraction` ∈ [0, 1]
/// (std::invalid_argument outside it). At 0 and 1 it returns the start and
/// end poses bit for bit, so consecutive moves join exactly.
Eigen::Isometry3d interpolateMove(const std::vector<Eigen::Isometry3d>& poses,
                                  const CompactMove& move, double fraction);

/// Length of the move's geometric path [m] (segment or arc length).
double moveLength(const std::vector<Eigen::Isometry3d>& poses, const CompactMove& move);

/// Rotation angle from the start to the end orientation [rad], in [0, π].
double moveRotationAngle(const std::vector<Eigen::Isometry3d>& poses, const CompactMove& move);

MoveEndTangents moveEndTangents(const std::vector<Eigen::Isometry3d>& poses,
                                const CompactMove& move);

/// Fractions at which to re-check a move (e.g. by inverse kinematics): evenly
/// spaced from 0 to 1 inclusive, with consecutive fractions at most
/// `max_step` [m] of path and at most `max_angle_step` [rad] of rotation
/// apart. Uniform spacing meets both bounds at once because the controller
/// advances position and orientation uniformly in the fraction. Throws
/// std::invalid_argument for non-positive or non-finite steps.
std::vector<double> moveCheckFractions(const std::vector<Eigen::Isometry3d>& poses,
                                       const CompactMove& move, double max_step = 1e-3,
                                       double max_angle_step = 2.0 * kPi / 180.0);

}  // namespace tw::planner
