#include "postproc/pose_text.hpp"

namespace tw::postproc {

PoseText poseText(const Eigen::Isometry3d& X_RT, const FileQuantities& quantities) {
  const Eigen::Vector3d p_RT = X_RT.translation();
  const Eigen::Quaterniond quaternion = canonicalQuaternion(X_RT);
  const QuantityFormat& unit = quantities.quaternion;
  PoseText text;
  text.position = quantities.length.format(p_RT.x()) + ',' + quantities.length.format(p_RT.y()) +
                  ',' + quantities.length.format(p_RT.z());
  text.orientation = unit.format(quaternion.w()) + ',' + unit.format(quaternion.x()) + ',' +
                     unit.format(quaternion.y()) + ',' + unit.format(quaternion.z());
  return text;
}

}  // namespace tw::postproc
