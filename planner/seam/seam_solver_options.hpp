#pragma once

#include <Eigen/Core>
#include <map>
#include <optional>
#include <string>

#include "kinematics/common/angles.hpp"
#include "kinematics/joint.hpp"

namespace tw::planner {

/// Settings of the seam solver, set by field name. Angles [rad], lengths [m].
struct SeamSolverOptions {
  /// Spacing of the spin samples within the tool's spin range. 10°: the
  /// issue's default (finer costs IK calls linearly).
  double spin_step = 10.0 * kPi / 180.0;
  /// Largest change of the spin from one waypoint to the next. 90°: a
  /// corner turned on the spot may need the tool to keep its orientation
  /// while the seam frame turns by the corner angle (common practice, no
  /// source); the joint bound below still applies.
  double max_spin_change = 90.0 * kPi / 180.0;
  /// Axis 5 nearer than this to 0 or ±180° is rejected: axes 4 and 6 line up
  /// and a small tool motion needs a large wrist rotation. 2°: common
  /// practice, no source.
  double wrist_hard_margin = 2.0 * kPi / 180.0;
  /// Axis 5 nearer than this is kept but flagged in the result (domain-facts
  /// §6.2 suggests warning at 10°, from memory).
  double wrist_warning_margin = 10.0 * kPi / 180.0;
  /// Optional dress-pack protection: a candidate with |q4| + |q6| above
  /// this (the twist both wrist axes put on the hoses from their zero) is
  /// rejected. Off by default.
  std::optional<double> wrist_twist_limit;
  /// Bound on each joint's change between consecutive waypoints: at most
  /// joint_rate · travel + joint_step_floor, where travel is the TCP
  /// distance plus rotation_lever times the tool's rotation angle (so a
  /// corner turned on the spot still has travel). 20 rad/m: about ten times
  /// what a 1.4 m arm needs away from singularities (common practice, no
  /// source).
  double joint_rate = 20.0;             ///< [rad/m]
  double joint_step_floor = 0.005;      ///< [rad]
  double rotation_lever = 0.100;        ///< [m/rad]
  /// Continuity test: the joint-space midpoint of every (sub)step, through
  /// FK, must lie this close to the Cartesian interpolation of the step.
  double continuity_position = 0.0005;  ///< [m]
  double continuity_angle = 0.0087;     ///< [rad] (0.5°)
  /// The linear TCP motion between two waypoints is re-solved in the same
  /// branch at least this finely before it is accepted.
  double interpolation_step = 0.001;    ///< [m]
  double interpolation_angle = 0.035;   ///< [rad] (2°)
  /// Per-joint weights of the motion cost Σ w_j |Δq_j|; empty: 1/max
  /// velocity of each joint, so the cost is the time-like sum of joint
  /// motions at full speed [s].
  Eigen::VectorXd weights;

  /// Margin penalties. Every pose of the path (approach start, waypoints,
  /// retract end) adds to the motion cost, once per pose,
  ///   singularity_weight · shortfall(axis-5 angle, wrist_warning_margin)
  /// + clearance_weight   · shortfall(clearance to the cell, clearance_comfort)
  /// + limit_weight       · shortfall(smallest joint-limit margin, its warning margin),
  /// where shortfall(x, t) = max(0, 1 − x / t) runs from 0 at the threshold
  /// to 1 at zero margin. The weights are in the unit of the motion cost
  /// ([s] with the default weights); 0 turns a penalty off. The singularity
  /// weight comes from the wall-seam test (seam_margin_tests.cpp): at 0.05
  /// the solver kept 2 poses at 6.5° to save 0.09 of motion; at 0.5 it keeps
  /// 10° everywhere. At these defaults the four sample jobs keep their
  /// motion-only choices (same cycle times, records and warnings). The
  /// clearance and limit weights were not tuned by experiment: the sample
  /// welds sit 14–17 mm from the cell on every spin, so the clearance
  /// penalty there only shifts costs.
  double singularity_weight = 0.5;  ///< [cost unit per pose]
  double clearance_weight = 0.02;    ///< [cost unit per pose]
  double limit_weight = 0.05;        ///< [cost unit per pose]
  /// Clearance to the cell (CollisionWorld::clearance, PairGroup::kCell)
  /// below which a pose is penalised; above the cell margin of the world,
  /// or it never matters. 20 mm: twice the default cell margin (common
  /// practice, no source).
  double clearance_comfort = 0.020;              ///< [m]
  /// Joint-limit margins below which a pose is penalised; the summary's
  /// warning margins (postproc::WriteOptions, common practice, no source).
  double revolute_limit_warning = 5.0 * kPi / 180.0;  ///< [rad]
  double prismatic_limit_warning = 0.010;             ///< [m]
  /// Also find the best alternative (SolvedSeam::alternative): the
  /// cheapest path whose first waypoint is in another branch, or whose spin
  /// there is at least alternative_spin_gap from the chosen one. Costs one
  /// more lazy search whose steps are mostly new (about 1.5 times the solve
  /// on the 500-waypoint benchmark), so it is off unless asked for; the
  /// `plan` and `check` commands ask for it.
  bool find_alternative = false;
  double alternative_spin_gap = 30.0 * kPi / 180.0;  ///< [rad]
  /// Seams solved at once by solveJob; results do not depend on it.
  int threads = 2;
  /// By seam (task) name, a configuration to stay near instead of the
  /// cell's home (used by solveJob as SeamSetting::reference): the seam's
  /// first waypoint in an earlier program, so that a regenerated program
  /// keeps each seam's branch, spin and turns wherever they still work.
  std::map<std::string, kinematics::JointVector> references;
};

/// Work done by one solve, for benchmarks and reports.
struct SolverCounts {
  long candidates = 0;        ///< joint vectors generated (in limits) over all waypoints
  long ik_calls = 0;          ///< closed-form solves (candidates and interpolation)
  long state_checks = 0;      ///< collision state checks, including those inside segment checks
  long edges_validated = 0;   ///< steps fully checked (interpolation, continuity, collision)
  long clearance_queries = 0; ///< clearance distances computed for the margin penalty
  int searches = 0;           ///< shortest-path searches (1 + re-plans)
};

}  // namespace tw::planner
