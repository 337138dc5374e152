#pragma once

#include <string>
#include <vector>

#include "kinematics/common/angles.hpp"
#include "planner/cell/cell_collision_world.hpp"
#include "planner/job/job.hpp"
#include "planner/motion/move_following.hpp"
#include "planner/program/program.hpp"

namespace tw::planner {

/// What `verify` checks a program against, set by field name.
struct VerifyOptions {
  /// Margins of the collision world the process moves (linear, circular)
  /// are checked in; the joint moves use the job's transit clearance as the
  /// cell margin, as the planner does.
  CellCollisionOptions collision;
  /// What following a linear or circular move must keep.
  FollowLimits limits;
  /// A record's stored TCP pose may differ from the forward kinematics of
  /// its stored joints by this much before it is reported [m], [rad]: the
  /// file rounds joints to 1e-4°, which moves a TCP 1.5 m out by up to
  /// about 0.01 mm over six joints; 0.05 mm and 0.005° leave room for that.
  double pose_position_tolerance = 0.05e-3;
  double pose_angle_tolerance = 0.005 * kPi / 180.0;
};

/// One problem of one record, with its reason in words.
struct RecordProblem {
  int record = 0;  ///< 1-based record number, as in the file's `n=`
  std::string kind;
  std::string seam;
  std::string reason;
};

/// Replays `program` in the cell of `job` as the controller interpolates it
/// and returns every record that is out of reach, past a limit, too close
/// to a singularity, leaves its branch or collides, with its reason (empty:
/// the program runs as written). Joint moves: the straight joint-space
/// segment from where the arm is to the stored joints (both within limits,
/// CollisionWorld::checkSegment). Linear and circular moves: the controller
/// drives to the stored TCP pose in the record's frame as the cell has it
/// now, so the target (and via point) is solved again in the branch of the
/// stored joints (out of reach or past a limit there is reported), then the
/// TCP path from where the arm is, straight or on the circle through the via
/// point, orientation by slerp, is followed in that branch (MoveFollower,
/// the checks the planner's compaction used). Blended corners are checked along the unblended path; a blend of
/// radius r rounds the corner by at most r·tan(α/4) (postproc/FORMAT.md),
/// far inside the collision margin for the planner's radii (≤ 2 mm).
/// Every record's stored TCP pose is also checked against the forward
/// kinematics of its stored joints in the current cell: a difference means
/// the cell changed since planning (a fixture moved) or the file was edited,
/// and is reported. The arm of the cell must have
/// ortho-parallel parameters; the program must use the cell's tool.
std::vector<RecordProblem> verifyProgram(const Program& program, const Job& job,
                                         const VerifyOptions& options);

}  // namespace tw::planner
