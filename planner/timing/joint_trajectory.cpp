#include "planner/timing/joint_trajectory.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>


namespace tw::planner {

namespace {
bool isFraction(double value) { return value > 0.0 && value <= 1.0; }
}  // namespace

JointTrajectory::JointTrajectory(const kinematics::ArmModel& arm, const JointPath& path,
                                 const JointTimingLimits& limits) {
  if (path.empty()) throw std::invalid_argument("cannot time an empty joint path");
  if (!isFraction(limits.velocity_fraction) || !isFraction(limits.acceleration_fraction)) {
    throw std::invalid_argument("joint velocity and acceleration fractions must lie in (0, 1]");
  }
  for (const kinematics::JointVector& q : path) {
    if (q.size() != arm.jointCount()) {
      throw std::invalid_argument("joint path waypoint has " + std::to_string(q.size()) +
                       " values; the arm has " + std::to_string(arm.jointCount()));
    }
  }
  for (std::size_t i = 0; i + 1 < path.size(); ++i) {
    double velocity = std::numeric_limits<double>::infinity();
    double acceleration = std::numeric_limits<double>::infinity();
    for (int j = 0; j < arm.jointCount(); ++j) {
      const double step = std::abs(path[i + 1][j] - path[i][j]);
      if (step == 0.0) continue;
      velocity = std::min(velocity, limits.velocity_fraction * arm.joint(j).max_velocity / step);
      acceleration =
          std::min(acceleration, limits.acceleration_fraction * arm.joint(j).max_acceleration / step);
    }
    // A repeated waypoint: no motion, no time (any positive bounds will do).
    const bool still = !std::isfinite(velocity);
    const TrapezoidProfile profile(still ? 0.0 : 1.0, still ? 1.0 : velocity,
                                   still ? 1.0 : acceleration);
    segments_.push_back({path[i], path[i + 1], profile, duration_});
    duration_ += profile.duration();
  }
  end_ = path.back();
}

JointSample JointTrajectory::sample(double t) const {
  const int joints = static_cast<int>(end_.size());
  JointSample state{end_, kinematics::JointVector::Zero(joints),
                    kinematics::JointVector::Zero(joints)};
  if (t >= duration_) return state;  // exactly the last waypoint, whatever the rounding
  t = std::max(t, 0.0);
  // The last segment that starts at or before t (segments are in time order).
  const auto after = std::upper_bound(
      segments_.begin(), segments_.end(), t,
      [](double time, const Segment& segment) { return time < segment.start_time; });
  if (after == segments_.begin()) return state;
  const Segment& segment = *std::prev(after);
  const double local = t - segment.start_time;
  if (local >= segment.profile.duration()) {  // at rest on the segment's end
    state.q = segment.q_end;
    return state;
  }
  const kinematics::JointVector delta = segment.q_end - segment.q_start;
  state.q = segment.q_start + segment.profile.position(local) * delta;
  state.velocity = segment.profile.velocity(local) * delta;
  state.acceleration = segment.profile.accelerationAt(local) * delta;
  return state;
}

}  // namespace tw::planner
