#pragma once

#include <variant>
#include <vector>

#include "collision/collision_workspace.hpp"
#include "planner/motion/compact_move.hpp"
#include "planner/motion/move_compaction.hpp"
#include "planner/motion/move_following.hpp"
#include "planner/seam/solved_seam.hpp"

namespace tw::planner {

/// How a solved seam becomes controller moves.
struct SeamMoveOptions {
  /// How far the controller's path may leave the sampled seam: position
  /// [m] and orientation [rad]. Half of the position tolerance goes to the
  /// compaction (line or arc against the samples), half to the blends
  /// (rounded corner against the programmed point), so that the blended
  /// path stays within the whole tolerance.
  CompactionTolerance path_tolerance;
  /// Largest blend radius at an interior point of a process path [m]; the
  /// radius used is the largest up to this one that keeps the tolerance.
  double max_blend = 0.002;
  /// A move has one programmed speed: where the seam's speed varies, moves
  /// end where it has changed by more than this fraction since the last
  /// end, and each runs at the mean speed of its waypoints (speedOf). 5 %:
  /// common practice, no source (a step a weld bead does not show).
  double speed_step = 0.05;
};

/// One controller move of a solved seam, by waypoint index of the
/// SolvedSeam: from waypoints[start] to waypoints[end], through
/// waypoints[via] for an arc.
struct SeamMove {
  CompactMove move;
  /// Blend radius at the end of the move [m]; 0 = exact stop (at corners,
  /// process on/off points, speed steps and the last waypoint).
  double blend = 0.0;
  /// The path's length [m] and turn [rad] (a turn on the spot has length 0).
  double length = 0.0;
  double turn = 0.0;
  /// The joint path the arm takes, re-solved as the controller interpolates.
  FollowedPath joints;
};

/// The programmed TCP speed of `move` [m/s]: the mean of the speeds of the
/// waypoints it arrives at (start excluded), which differ by at most
/// SeamMoveOptions::speed_step.
double speedOf(const SolvedSeam& seam, const SeamMove& move);

/// A seam move that could not be followed even between neighbouring
/// waypoints: the step from waypoints[waypoint − 1] to waypoints[waypoint].
struct SeamMoveFailure {
  int waypoint = 0;
  FollowFailure failure;
};

/// Replaces the dense waypoints of `seam` (poses X_XT in the seam frame) by
/// the fewest linear and circular moves within the tolerance
/// (compactMoves), each checked as the controller interpolates it
/// (MoveFollower, in the seam's branch): a move that fails is split at its
/// middle waypoint and both halves fitted and checked again, down to single
/// steps; none is kept unchecked. A corner, where the tool turns on the
/// spot, is a move of its own (a turn with no travel). Moves start and end
/// exactly at corners, process on/off points and speed changes.
/// The follower's setting must be the seam frame X in the arm base.
std::variant<std::vector<SeamMove>, SeamMoveFailure> compactSolvedSeam(
    const SolvedSeam& seam, const SeamMoveOptions& options, MoveFollower& follower,
    collision::CollisionWorkspace& workspace);

}  // namespace tw::planner
