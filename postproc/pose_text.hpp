#pragma once

#include <Eigen/Geometry>
#include <string>

#include "kinematics/common/rotations.hpp"
#include "postproc/file_quantities.hpp"

namespace tw::postproc {

/// A pose as the motion text writes it.
struct PoseText {
  std::string position;     ///< "x,y,z" in the file's length unit
  std::string orientation;  ///< "w,x,y,z" of tw::canonicalQuaternion()
};

PoseText poseText(const Eigen::Isometry3d& X_RT, const FileQuantities& quantities);

}  // namespace tw::postproc
