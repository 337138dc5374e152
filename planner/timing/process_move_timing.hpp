#pragma once

#include <Eigen/Geometry>
#include <string>
#include <vector>

#include "kinematics/arm_model.hpp"

namespace tw::planner {

/// One waypoint of a linear process move (a seam as solved): the joint
/// values that reach it and the TCP pose, in any one fixed frame for the
/// whole move (e.g. the world W), [m].
struct ProcessWaypoint {
  kinematics::JointVector q;
  Eigen::Isometry3d X_WT = Eigen::Isometry3d::Identity();
};

/// The programmed speed of a process move. Set by field name.
struct ProcessSpeed {
  double tcp_speed = 0.0;          ///< along the TCP path [m/s], > 0
  double orientation_speed = 0.0;  ///< bound on the tool's turning rate [rad/s], > 0
  /// Fraction of every joint's maximum velocity the move may use, in (0, 1].
  double joint_velocity_fraction = 1.0;
};

/// What lowered the TCP speed on a segment below the programmed one.
enum class SpeedLimitCause {
  kOrientationSpeed,  ///< the tool turns too fast at the programmed TCP speed
  kJointVelocity,     ///< a joint would exceed its (fractional) velocity limit
};

/// "orientation speed" or "joint velocity".
const char* toString(SpeedLimitCause cause);

/// One segment on which the programmed TCP speed is not held.
struct LoweredSpeed {
  int segment = -1;              ///< from waypoint `segment` to `segment + 1`
  double programmed_speed = 0.0; ///< [m/s]
  double speed = 0.0;            ///< the TCP speed held there instead [m/s]
  SpeedLimitCause cause = SpeedLimitCause::kJointVelocity;
  int joint = -1;                ///< the limiting joint for kJointVelocity, else -1
  std::string reason;            ///< one sentence with the numbers
};

/// The timing of one linear process move, segment by segment.
struct ProcessMoveTiming {
  /// Per segment (waypoints − 1 entries): duration [s] and TCP speed [m/s].
  std::vector<double> durations;
  std::vector<double> speeds;
  /// Every segment whose speed is below the programmed one, in order. A
  /// segment not listed moves at exactly the programmed TCP speed.
  std::vector<LoweredSpeed> lowered;
  double duration = 0.0;  ///< sum of the durations [s]
};

/// Times a linear process move at the programmed TCP speed, segment by
/// segment between consecutive waypoints: each takes the longest of
/// distance / tcp_speed, turning angle / orientation_speed and, for every
/// joint, |Δq_j| / (fraction · v_j) — the joint velocities estimated by finite
/// differences of the joint values over the segment's time, so waypoints
/// should be dense (a few mm) for the estimate to hold between them. Where
/// the TCP speed cannot be held it is lowered on that segment only and the
/// segment is reported with its cause and numbers; nothing is lowered
/// silently. Speed changes at segment ends are taken as instantaneous (the
/// controller's own ramps are not modelled).
///
/// Throws tw::InputError for fewer than two waypoints, a wrong joint count,
/// non-finite values, or speeds and fraction out of range.
ProcessMoveTiming timeProcessMove(const kinematics::ArmModel& arm,
                                  const std::vector<ProcessWaypoint>& waypoints,
                                  const ProcessSpeed& speed);

}  // namespace tw::planner
