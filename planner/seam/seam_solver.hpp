#pragma once

#include <Eigen/Geometry>
#include <optional>
#include <variant>

#include "collision/collision_workspace.hpp"
#include "collision/collision_world.hpp"
#include "planner/seam/seam_report.hpp"
#include "planner/seam/seam_solver_options.hpp"
#include "planner/seam/solved_seam.hpp"
#include "planner/toolpath/tool_path.hpp"

namespace tw::planner {

/// Where a seam is solved: the collision world (built for the arm and the
/// path's tool, see buildCellCollisionWorld) and the frames it needs.
struct SeamSetting {
  const collision::CollisionWorld* world = nullptr;  ///< its arm() is the arm solved for
  Eigen::Isometry3d X_WB = Eigen::Isometry3d::Identity();  ///< arm base in the world
  Eigen::Isometry3d X_WX = Eigen::Isometry3d::Identity();  ///< seam frame in the world
  Eigen::Isometry3d X_FT = Eigen::Isometry3d::Identity();  ///< TCP in the flange frame
  /// Where the arm comes from (e.g. its home position), when known: the
  /// weighted joint motion from it to the approach start is added to the
  /// cost, so that of otherwise equal branches the one nearest to it wins
  /// (a programmer expects the arm to face its work, not to reach back).
  std::optional<kinematics::JointVector> reference;
};

/// A solved seam, or why it cannot be solved (never both, never neither).
using SeamOutcome = std::variant<SolvedSeam, SeamReport>;

/// Solves one tool path: picks one joint vector per pose (approach start,
/// every waypoint, retract end) that minimises the total weighted joint
/// motion Σ_i Σ_j w_j |q_j(i+1) − q_j(i)|.
///
/// Candidates per pose: every IK branch × spin samples (spin_step apart
/// over ToolPath::spin; the whole circle sampled once when it spans 360°)
/// × every in-limit turn of each joint, rejected for being out of reach,
/// past a limit, within the hard wrist margin or past the twist limit.
/// A step between candidates of consecutive poses exists only in the same
/// branch, with the spin changing by at most max_spin_change, each joint within
/// the bound for the TCP travel; it is accepted only if the linear TCP
/// motion, re-solved in that branch at least interpolation_step apart,
/// stays within limits and the bound, passes the midpoint continuity test on
/// every sub-step and is collision-free (CollisionWorld::checkSegment).
///
/// The shortest path through the layered graph is found by dynamic
/// programming; collision of candidates and the full step checks are
/// evaluated lazily on the current best path only, and the search resumes
/// from the first pose whose choice failed, until a path passes every check.
/// The result is optimal over the candidates and steps that pass.
///
/// When no path exists every candidate is checked and the report names each
/// blocked pose with its reasons, or the first step no path crosses.
/// Deterministic. Thread-safe for distinct workspaces (one per thread).
/// Throws tw::InputError unless the arm has ortho-parallel parameters, for a
/// setting without a world, and for options out of range (a non-positive
/// step, rate or interpolation step, weights of the wrong size).
SeamOutcome solveSeam(const ToolPath& path, const SeamSetting& setting,
                      const SeamSolverOptions& options, collision::CollisionWorkspace& workspace);

}  // namespace tw::planner
