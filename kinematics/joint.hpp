#pragma once

#include <Eigen/Geometry>
#include <string>

namespace tw::kinematics {

/// Most joints a chain may have: six arm axes plus room for an external
/// linear track and one spare. Fixed so that joint vectors never allocate.
inline constexpr int kMaxJoints = 8;

/// Joint values [rad] for revolute joints, [m] for prismatic joints, in chain
/// order. Dynamic size up to kMaxJoints, stored inline (no heap).
using JointVector = Eigen::Matrix<double, Eigen::Dynamic, 1, 0, kMaxJoints, 1>;

enum class JointType { kRevolute, kPrismatic };

const char* toString(JointType type);

/// One joint of a serial chain.
///
/// The joint frame J is placed at `X_PJ` in the previous joint's frame P (the
/// arm base frame for the first joint). The joint then moves its child link
/// about (revolute) or along (prismatic) `axis`, a unit vector in J, through
/// J's origin: X_P,child(q) = X_PJ · motion(axis, q).
struct JointSpec {
  std::string name;
  JointType type = JointType::kRevolute;
  Eigen::Isometry3d X_PJ = Eigen::Isometry3d::Identity();
  Eigen::Vector3d axis = Eigen::Vector3d::UnitZ();
  double lower = 0.0;             ///< position limit [rad] or [m]
  double upper = 0.0;             ///< position limit [rad] or [m]
  double max_velocity = 0.0;      ///< [rad/s] or [m/s], > 0
  double max_acceleration = 0.0;  ///< [rad/s²] or [m/s²], > 0
};

}  // namespace tw::kinematics
