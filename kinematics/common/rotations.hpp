#pragma once

#include <Eigen/Geometry>

namespace tw {

/// Roll, pitch and yaw in the convention of the cell files and of URDF:
/// rotations about the fixed x, y and z axes in that order,
/// R = Rz(yaw) · Ry(pitch) · Rx(roll). Both directions live here.

/// Rotation from roll, pitch, yaw [rad].
Eigen::Matrix3d rotationFromRollPitchYaw(const Eigen::Vector3d& roll_pitch_yaw);

/// Roll, pitch and yaw [rad] of a rotation (the inverse of
/// rotationFromRollPitchYaw), with pitch in [−π/2, π/2]. At
/// pitch ±90° (roll and yaw turn about the same axis) roll is set to 0.
Eigen::Vector3d rollPitchYaw(const Eigen::Matrix3d& R);

/// The orientation of `X_RT` as a unit quaternion with w >= 0: q and -q are
/// the same rotation, and one sign keeps files deterministic.
Eigen::Quaterniond canonicalQuaternion(const Eigen::Isometry3d& X_RT);

}  // namespace tw
