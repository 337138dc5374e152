#include "kinematics/common/rotations.hpp"

#include <Eigen/Geometry>
#include <cmath>

namespace tw {
namespace {

// Below this cos(pitch) the roll and yaw axes coincide to within rounding.
constexpr double kGimbalLock = 1e-9;

}  // namespace

Eigen::Matrix3d rotationFromRollPitchYaw(const Eigen::Vector3d& rpy) {
  return (Eigen::AngleAxisd(rpy.z(), Eigen::Vector3d::UnitZ()) *
          Eigen::AngleAxisd(rpy.y(), Eigen::Vector3d::UnitY()) *
          Eigen::AngleAxisd(rpy.x(), Eigen::Vector3d::UnitX()))
      .toRotationMatrix();
}

Eigen::Vector3d rollPitchYaw(const Eigen::Matrix3d& R) {
  const double cos_pitch = std::hypot(R(0, 0), R(1, 0));
  const double pitch = std::atan2(-R(2, 0), cos_pitch);
  if (cos_pitch < kGimbalLock) return Eigen::Vector3d(0.0, pitch, std::atan2(-R(0, 1), R(1, 1)));
  return Eigen::Vector3d(std::atan2(R(2, 1), R(2, 2)), pitch, std::atan2(R(1, 0), R(0, 0)));
}

Eigen::Quaterniond canonicalQuaternion(const Eigen::Isometry3d& X_RT) {
  Eigen::Quaterniond quaternion(X_RT.linear());
  quaternion.normalize();
  if (quaternion.w() < 0.0) quaternion.coeffs() = -quaternion.coeffs();
  return quaternion;
}

}  // namespace tw
