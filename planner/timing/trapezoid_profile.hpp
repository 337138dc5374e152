#pragma once

namespace tw::planner {

/// Rest-to-rest trapezoidal velocity profile over a distance h ≥ 0 under a
/// velocity bound v and an acceleration bound a (Biagiotti & Melchiorri,
/// "Trajectory Planning for Automatic Machines and Robots", Springer 2008,
/// ch. 3; from memory): accelerate at a, cruise at v, decelerate at a.
/// When h ≥ v²/a the duration is T = h/v + v/a; otherwise the cruise
/// vanishes, the peak velocity is √(h·a) and T = 2√(h/a).
///
/// Units follow the caller (e.g. [m], [m/s], [m/s²] or a unitless path
/// parameter). Immutable value; the functions of time clamp t to [0, T].
class TrapezoidProfile {
 public:
  /// Throws tw::InputError for a negative or non-finite distance or a
  /// non-positive or non-finite bound.
  TrapezoidProfile(double distance, double max_velocity, double max_acceleration);

  double distance() const { return distance_; }
  double duration() const { return 2.0 * ramp_time_ + cruise_time_; }
  /// The highest velocity reached: v, or √(h·a) on a short move.
  double peakVelocity() const { return peak_velocity_; }
  double acceleration() const { return acceleration_; }
  /// Time spent accelerating (and again decelerating).
  double rampTime() const { return ramp_time_; }

  double position(double t) const;
  double velocity(double t) const;
  /// +a while accelerating, 0 cruising, −a decelerating; at a switching
  /// instant the value of the phase that begins there.
  double accelerationAt(double t) const;

 private:
  double distance_;
  double acceleration_;
  double peak_velocity_;
  double ramp_time_;
  double cruise_time_;
};

}  // namespace tw::planner
