#include "planner/timing/process_move_timing.hpp"

#include <cmath>
#include <stdexcept>

#include "kinematics/common/angles.hpp"
#include "planner/report_text.hpp"

namespace tw::planner {
namespace {

constexpr double kRadToDeg = 180.0 / kPi;

void checkInput(const kinematics::ArmModel& arm, const std::vector<ProcessWaypoint>& waypoints,
                const ProcessSpeed& speed) {
  if (waypoints.size() < 2) throw std::invalid_argument("a process move needs at least two waypoints");
  for (std::size_t i = 0; i < waypoints.size(); ++i) {
    if (waypoints[i].q.size() != arm.jointCount() || !waypoints[i].q.allFinite() ||
        !waypoints[i].X_WT.matrix().allFinite()) {
      throw std::invalid_argument("process waypoint " + std::to_string(i) +
                       " has the wrong joint count or a value that is not finite");
    }
  }
  if (!(speed.tcp_speed > 0.0) || !std::isfinite(speed.tcp_speed) ||
      !(speed.orientation_speed > 0.0) || !std::isfinite(speed.orientation_speed)) {
    throw std::invalid_argument("process TCP speed and orientation speed must be finite and > 0");
  }
  if (!(speed.joint_velocity_fraction > 0.0) || speed.joint_velocity_fraction > 1.0) {
    throw std::invalid_argument("process joint velocity fraction must lie in (0, 1]");
  }
}

}  // namespace

const char* toString(SpeedLimitCause cause) {
  switch (cause) {
    case SpeedLimitCause::kOrientationSpeed: return "orientation speed";
    case SpeedLimitCause::kJointVelocity: return "joint velocity";
  }
  return "unknown";
}

ProcessMoveTiming timeProcessMove(const kinematics::ArmModel& arm,
                                  const std::vector<ProcessWaypoint>& waypoints,
                                  const ProcessSpeed& speed) {
  checkInput(arm, waypoints, speed);
  ProcessMoveTiming timing;
  for (std::size_t i = 0; i + 1 < waypoints.size(); ++i) {
    const ProcessWaypoint& from = waypoints[i];
    const ProcessWaypoint& to = waypoints[i + 1];
    const double distance = (to.X_WT.translation() - from.X_WT.translation()).norm();
    const double turn =
        Eigen::AngleAxisd(from.X_WT.linear().transpose() * to.X_WT.linear()).angle();
    const double programmed_time = distance / speed.tcp_speed;
    double time = programmed_time;
    LoweredSpeed lowered{static_cast<int>(i), speed.tcp_speed, 0.0,
                         SpeedLimitCause::kOrientationSpeed, -1, ""};
    if (turn / speed.orientation_speed > time) {
      time = turn / speed.orientation_speed;
      lowered.reason = "the tool turns " + formatFixed(turn * kRadToDeg, 1) + " deg, at most " +
                       formatFixed(speed.orientation_speed * kRadToDeg, 1) + " deg/s";
    }
    for (int j = 0; j < arm.jointCount(); ++j) {
      const double limit = speed.joint_velocity_fraction * arm.joint(j).max_velocity;
      const double joint_time = std::abs(to.q[j] - from.q[j]) / limit;
      if (joint_time > time) {
        time = joint_time;
        lowered.cause = SpeedLimitCause::kJointVelocity;
        lowered.joint = j;
        // The words are for the programmer: degrees and millimetres.
        const bool revolute = arm.joint(j).type == kinematics::JointType::kRevolute;
        const double to_user = revolute ? kRadToDeg : 1000.0;
        lowered.reason = "joint " + arm.joint(j).name + " moves " +
                         formatFixed(std::abs(to.q[j] - from.q[j]) * to_user, 2) +
                         (revolute ? " deg" : " mm") + ", at most " +
                         formatFixed(limit * to_user, 1) + (revolute ? " deg/s" : " mm/s");
      }
    }
    const double held = time > 0.0 ? distance / time : speed.tcp_speed;
    timing.durations.push_back(time);
    timing.speeds.push_back(time > programmed_time ? held : speed.tcp_speed);
    timing.duration += time;
    if (time > programmed_time) {
      lowered.speed = held;
      lowered.reason = "segment " + std::to_string(i) + ": TCP speed lowered from " +
                       formatFixed(speed.tcp_speed * 1000.0, 1) + " to " +
                       formatFixed(held * 1000.0, 1) + " mm/s; " + lowered.reason;
      timing.lowered.push_back(lowered);
    }
  }
  return timing;
}

}  // namespace tw::planner
