#pragma once

#include <Eigen/Geometry>
#include <string>

#include "postproc/file_quantities.hpp"

namespace tw::postproc {

/// The orientation of `X_RT` as a unit quaternion with w >= 0: q and -q are
/// the same rotation, and one sign keeps files deterministic.
Eigen::Quaterniond canonicalQuaternion(const Eigen::Isometry3d& X_RT);

/// A pose as the motion text writes it.
struct PoseText {
  std::string position;     ///< "x,y,z" in the file's length unit
  std::string orientation;  ///< "w,x,y,z" of canonicalQuaternion()
};

PoseText poseText(const Eigen::Isometry3d& X_RT, const FileQuantities& quantities);

}  // namespace tw::postproc
