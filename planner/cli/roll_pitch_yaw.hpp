#pragma once

#include <Eigen/Core>

namespace tw::cli {

/// Roll, pitch and yaw [rad] of a rotation in the convention of the cell
/// files (R = Rz(yaw) · Ry(pitch) · Rx(roll), the inverse of
/// kinematics::rotationFromRollPitchYaw), with pitch in [−π/2, π/2]. At
/// pitch ±90° (roll and yaw turn about the same axis) roll is set to 0.
Eigen::Vector3d rollPitchYaw(const Eigen::Matrix3d& R);

}  // namespace tw::cli
