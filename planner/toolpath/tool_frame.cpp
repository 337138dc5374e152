#include "planner/toolpath/tool_frame.hpp"

namespace tw::planner {

std::optional<Eigen::Isometry3d> toolFrameAlong(const Eigen::Vector3d& p_XT,
                                                const Eigen::Vector3d& z,
                                                const Eigen::Vector3d& travel) {
  const Eigen::Vector3d along = travel - travel.dot(z) * z;
  // |along| = |travel|·sin(angle to z); 1e-6 rad keeps x well defined.
  if (along.norm() < 1e-6 * travel.norm()) return std::nullopt;
  const Eigen::Vector3d x = along.normalized();
  Eigen::Isometry3d X_XT = Eigen::Isometry3d::Identity();
  X_XT.linear().col(0) = x;
  X_XT.linear().col(1) = z.cross(x);
  X_XT.linear().col(2) = z;
  X_XT.translation() = p_XT;
  return X_XT;
}

}  // namespace tw::planner
