#pragma once

#include <Eigen/Geometry>
#include <optional>
#include <string>
#include <vector>

#include "kinematics/arm_branch.hpp"
#include "kinematics/joint.hpp"
#include "planner/job/process_parameters.hpp"
#include "planner/seam/seam_solver_options.hpp"

namespace tw::planner {

/// One solved pose of a seam: what the arm does there.
struct SolvedPose {
  /// Joint values [rad] (prismatic [m]), in-limit, with axes 4 and 6 as
  /// absolute (unwrapped) values: consecutive poses never differ by a turn.
  kinematics::JointVector q;
  /// TCP pose with the chosen spin applied, in the seam frame X and in the
  /// world W [m]: X_XT = waypoint.X_XT · Rz(spin); X_WT = X_WX · X_XT.
  Eigen::Isometry3d X_XT = Eigen::Isometry3d::Identity();
  Eigen::Isometry3d X_WT = Eigen::Isometry3d::Identity();
  double spin = 0.0;        ///< rotation about the tool axis [rad], within the tool's range
  /// TCP speed arriving here [m/s]; 0 for the approach start and retract
  /// end (the path gives none: program assembly chooses them).
  double speed = 0.0;
  bool process_on = false;  ///< process active on the move leaving this pose
  bool corner = false;      ///< the tool turns on the spot here
  int line = 0;             ///< input line (see ToolPath::source)
  /// Axis 5 within SeamSolverOptions::wrist_warning_margin of 0 or ±180°.
  bool wrist_warning = false;
};

/// The margins of one solved path over all its poses (approach start,
/// waypoints, retract end), and what it costs (SeamSolverOptions).
struct PathMargins {
  kinematics::ArmBranch branch;
  double spin = 0.0;         ///< spin at the first waypoint [rad]
  double cost = 0.0;         ///< motion plus margin penalties
  double motion_cost = 0.0;  ///< the weighted joint motion alone
  double wrist_angle = 0.0;  ///< smallest distance of axis 5 from 0 or ±180° [rad]
  /// Smallest margin of any joint to its nearer limit [rad] (prismatic
  /// [m]), and that joint's index.
  double limit_margin = 0.0;
  int limit_joint = -1;
  /// Smallest clearance to the cell, capped at
  /// SeamSolverOptions::clearance_comfort [m]: equal to the cap means at
  /// least that much (the solver measures exactly only below it). Negative
  /// when the clearance penalty is off (not measured).
  double clearance = -1.0;
  bool clearance_capped = false;  ///< the clearance is the cap: at least that much
  int singular_poses = 0;  ///< poses with axis 5 within the wrist warning margin
};

/// A seam the arm can run: one configuration per waypoint of its ToolPath,
/// all in one branch, continuous, within limits and collision-free with the
/// clearance margin (including the linear moves between them, re-solved
/// finely), plus the approach start and retract end in the same branch.
///
/// Program assembly uses it as follows: a linear approach move from
/// `approach` to waypoints.front() (process off), linear process moves
/// through `waypoints` (process_on says when the process runs, speed is the
/// TCP speed arriving at each), a linear retract move from waypoints.back()
/// to `retract`; transits join one seam's retract.q to the next seam's
/// approach.q.
struct SolvedSeam {
  std::string name;   ///< ToolPath::name
  std::string frame;  ///< seam frame X
  std::string tool;
  ProcessKind process = ProcessKind::kWeld;
  std::string source;  ///< file the poses' line numbers refer to
  kinematics::ArmBranch branch;  ///< use branch.toString() for the words
  SolvedPose approach;
  std::vector<SolvedPose> waypoints;  ///< index i ↔ ToolPath::waypoints[i]
  SolvedPose retract;
  /// Total weighted joint motion of the chosen path (see SeamSolverOptions::weights).
  double cost = 0.0;
  /// Smallest distance of axis 5 from 0 or ±180° over the seam [rad].
  double min_wrist_angle = 0.0;
  /// Range swept by axes 4 and 6 over approach, seam and retract [rad]
  /// (unwrapped values), for dress-pack review.
  double axis4_min = 0.0, axis4_max = 0.0, axis6_min = 0.0, axis6_max = 0.0;
  /// The chosen path's margins, and those of the best alternative
  /// (SeamSolverOptions::find_alternative): the cheapest path that starts
  /// in another branch or at a spin at least alternative_spin_gap away;
  /// empty when there is none or it was not sought.
  PathMargins margins;
  std::optional<PathMargins> alternative;
  SolverCounts counts;
};

/// What the choice traded, for the terminal: "chosen: <branch>, spin <deg>,
/// cost <c> (motion <m>); axis 5 at least <deg> from 0, limits at least
/// <deg> (axis <n>), clearance <mm>" and on a second line the same for the
/// best alternative ("none ..." without one). The clearance is capped at the
/// comfort distance and left out when not measured. Numbers through
/// tw::formatFixed (C locale).
std::string describeMargins(const SolvedSeam& seam);
/// The part after "chosen: " for one path.
std::string describeMargins(const PathMargins& margins);

}  // namespace tw::planner
