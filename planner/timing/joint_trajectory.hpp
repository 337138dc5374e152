#pragma once

#include <vector>

#include "kinematics/arm_model.hpp"
#include "planner/timing/trapezoid_profile.hpp"
#include "planner/transit/joint_path.hpp"

namespace tw::planner {

/// Fractions of every joint's maximum velocity and acceleration a timed
/// joint path may use, each in (0, 1]. Set by field name.
struct JointTimingLimits {
  double velocity_fraction = 1.0;
  double acceleration_fraction = 1.0;
};

/// Joint values, velocities and accelerations at one instant, chain order,
/// [rad], [rad/s], [rad/s²] (or [m], [m/s], [m/s²] for prismatic joints).
struct JointSample {
  kinematics::JointVector q;
  kinematics::JointVector velocity;
  kinematics::JointVector acceleration;
};

/// A joint path timed segment by segment, stopping at every waypoint: along
/// segment i the arm moves q(t) = q_i + s(t)·(q_{i+1} − q_i) with one
/// trapezoidal profile s(t) from 0 to 1 shared by all joints, so the arm stays
/// on the straight segment that was collision-checked and all joints finish
/// together. The profile's bounds are the tightest over the joints,
/// v_s = min_j f_v·v_j / |Δq_j| and a_s = min_j f_a·a_j / |Δq_j|: the slowest
/// joint sets the time and no joint exceeds its limits.
class JointTrajectory {
 public:
  struct Segment {
    kinematics::JointVector q_start;
    kinematics::JointVector q_end;
    TrapezoidProfile profile;  ///< in the segment parameter s ∈ [0, 1]
    double start_time = 0.0;   ///< [s] from the start of the trajectory
  };

  /// Times `path` (at least one waypoint, each of the arm's joint count) for
  /// `arm`. Throws tw::InputError for an empty path, a wrong joint count, or
  /// fractions outside (0, 1].
  JointTrajectory(const kinematics::ArmModel& arm, const JointPath& path,
                  const JointTimingLimits& limits = {});

  const std::vector<Segment>& segments() const { return segments_; }
  /// Total time [s]; 0 for a single waypoint.
  double duration() const { return duration_; }
  /// The state at time t [s], clamped to [0, duration()].
  JointSample sample(double t) const;

 private:
  std::vector<Segment> segments_;
  kinematics::JointVector end_;
  double duration_ = 0.0;
};

}  // namespace tw::planner
