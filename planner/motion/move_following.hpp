#pragma once

#include <Eigen/Geometry>
#include <functional>
#include <string>
#include <variant>
#include <vector>

#include "collision/collision_workspace.hpp"
#include "collision/collision_world.hpp"
#include "kinematics/joint.hpp"
#include "kinematics/ortho_parallel_ik.hpp"

namespace tw::planner {

/// Where a controller-interpolated TCP path is followed: the collision world
/// (its arm() is the arm, which must have ortho-parallel parameters), the
/// frame R the path's poses are given in, the tool, and the IK branch the
/// arm must stay in.
struct FollowSetting {
  const collision::CollisionWorld* world = nullptr;
  Eigen::Isometry3d X_BR = Eigen::Isometry3d::Identity();  ///< pose frame R in the arm base B
  Eigen::Isometry3d X_FT = Eigen::Isometry3d::Identity();  ///< TCP in the flange frame
  int branch_index = 0;                                    ///< kinematics::ArmBranch::index()
};

/// What following a path must keep; the seam solver's values by default
/// (planner/seam/seam_solver_options.hpp gives their reasons).
struct FollowLimits {
  double wrist_hard_margin = 0.0349;     ///< axis 5 at least this far from 0 or ±180° [rad]
  double joint_rate = 20.0;              ///< joint change per TCP travel allowed [rad/m] ...
  double joint_step_floor = 0.005;       ///< ... plus this [rad]: more is a branch change or flip
  double rotation_lever = 0.100;         ///< TCP travel counted per radian of turn [m/rad]
  double continuity_position = 0.0005;   ///< midpoint FK against the path [m]
  double continuity_angle = 0.0087;      ///< midpoint FK against the path [rad]
  double max_step = 0.001;               ///< the path is re-solved at least this often [m] ...
  double max_angle_step = 0.0349;        ///< ... and this often in turn [rad]
};

/// The joint path the arm takes along a followed TCP path: q[k] reaches the
/// pose at fractions[k]; fractions run from 0 to 1.
struct FollowedPath {
  std::vector<double> fractions;
  std::vector<kinematics::JointVector> q;
};

/// Why a path cannot be followed, at the fraction where it fails.
struct FollowFailure {
  double fraction = 0.0;
  std::string reason;
};

using FollowOutcome = std::variant<FollowedPath, FollowFailure>;

/// Follows a TCP path the way a controller drives it and checks what the
/// arm does on the way: the pose at each fraction (at most max_step and
/// max_angle_step apart, more where asked) is solved in the closed form, the
/// solution of the setting's branch nearest to the previous joint vector is
/// taken, and the path fails where that branch has no in-limit solution,
/// axis 5 comes within the hard wrist margin, a joint moves more than the
/// travel allows (a branch change or wrist flip), the straight joint step
/// leaves the path at its midpoint, or a joint step collides
/// (CollisionWorld::checkSegment, with the world's margins). The first and
/// last joint vectors are the caller's (`q_start`, `q_end`): the end must be
/// reached continuously too.
///
/// One copy of these checks serves the compaction of solved seams and the
/// `verify` command. Not thread safe (scratch inside); one per thread.
class MoveFollower {
 public:
  /// Throws std::invalid_argument for a setting without a world or an arm
  /// without ortho-parallel parameters.
  MoveFollower(const FollowSetting& setting, const FollowLimits& limits);

  /// `pose_at(u)` is the TCP pose X_RT the controller commands at fraction
  /// u ∈ [0, 1]; `fractions` (optional, increasing, within [0, 1]) are
  /// checked in addition to the regular steps.
  FollowOutcome follow(const std::function<Eigen::Isometry3d(double)>& pose_at,
                       const kinematics::JointVector& q_start,
                       const kinematics::JointVector& q_end,
                       collision::CollisionWorkspace& workspace,
                       const std::vector<double>& fractions = {});

  const FollowSetting& setting() const { return setting_; }

 private:
  std::vector<double> checkFractions(const std::function<Eigen::Isometry3d(double)>& pose_at,
                                     const std::vector<double>& extra) const;

  FollowSetting setting_;
  FollowLimits limits_;
  kinematics::OrthoParallelSolver ik_;
  kinematics::IkSolutions solutions_;
  Eigen::Isometry3d X_TF_;
};

}  // namespace tw::planner
