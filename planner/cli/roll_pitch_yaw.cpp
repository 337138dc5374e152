#include "planner/cli/roll_pitch_yaw.hpp"

#include <cmath>

namespace tw::cli {
namespace {

// Below this cos(pitch) the roll and yaw axes coincide to within rounding.
constexpr double kGimbalLock = 1e-9;

}  // namespace

Eigen::Vector3d rollPitchYaw(const Eigen::Matrix3d& R) {
  const double cos_pitch = std::hypot(R(0, 0), R(1, 0));
  const double pitch = std::atan2(-R(2, 0), cos_pitch);
  if (cos_pitch < kGimbalLock) return Eigen::Vector3d(0.0, pitch, std::atan2(-R(0, 1), R(1, 1)));
  return Eigen::Vector3d(std::atan2(R(2, 1), R(2, 2)), pitch, std::atan2(R(1, 0), R(0, 0)));
}

}  // namespace tw::cli
