#include "planner/timing/trapezoid_profile.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <string>


namespace tw::planner {

TrapezoidProfile::TrapezoidProfile(double distance, double max_velocity, double max_acceleration)
    : distance_(distance), acceleration_(max_acceleration) {
  if (!(distance >= 0.0) || !std::isfinite(distance)) {
    throw std::invalid_argument("trapezoid profile: distance must be finite and ≥ 0, got " +
                     std::to_string(distance));
  }
  if (!(max_velocity > 0.0) || !std::isfinite(max_velocity) || !(max_acceleration > 0.0) ||
      !std::isfinite(max_acceleration)) {
    throw std::invalid_argument("trapezoid profile: velocity and acceleration bounds must be finite and > 0");
  }
  if (distance >= max_velocity * max_velocity / max_acceleration) {
    peak_velocity_ = max_velocity;
    ramp_time_ = max_velocity / max_acceleration;
    cruise_time_ = distance / max_velocity - ramp_time_;
  } else {
    peak_velocity_ = std::sqrt(distance * max_acceleration);
    ramp_time_ = peak_velocity_ / max_acceleration;
    cruise_time_ = 0.0;
  }
}

double TrapezoidProfile::position(double t) const {
  t = std::clamp(t, 0.0, duration());
  if (t < ramp_time_) return 0.5 * acceleration_ * t * t;
  const double ramp_distance = 0.5 * peak_velocity_ * ramp_time_;
  if (t < ramp_time_ + cruise_time_) return ramp_distance + peak_velocity_ * (t - ramp_time_);
  const double left = duration() - t;
  return distance_ - 0.5 * acceleration_ * left * left;
}

double TrapezoidProfile::velocity(double t) const {
  t = std::clamp(t, 0.0, duration());
  if (t < ramp_time_) return acceleration_ * t;
  if (t < ramp_time_ + cruise_time_) return peak_velocity_;
  return acceleration_ * (duration() - t);
}

double TrapezoidProfile::accelerationAt(double t) const {
  if (t < 0.0 || t >= duration()) return 0.0;
  if (t < ramp_time_) return acceleration_;
  if (t < ramp_time_ + cruise_time_) return 0.0;
  return -acceleration_;
}

}  // namespace tw::planner
