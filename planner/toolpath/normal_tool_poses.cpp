#include "planner/toolpath/normal_tool_poses.hpp"

#include "kinematics/common/input_error.hpp"
#include "planner/toolpath/tool_frame.hpp"

namespace tw::planner {

Eigen::Isometry3d normalToolPose(const SeamSample& sample, const std::string& source) {
  Eigen::Vector3d normal = sample.normal;
  if (sample.second_normal) {
    normal += *sample.second_normal;
    // Opposite normals leave no side for the tool to stand on.
    if (normal.norm() < 1e-6) {
      throw InputError(source, sample.line, "the two surface normals are opposite");
    }
    normal.normalize();
  }
  const std::optional<Eigen::Isometry3d> X_XT =
      toolFrameAlong(sample.p_XP, -normal, sample.tangent);
  if (!X_XT) {
    throw InputError(source, sample.line,
                     "the surface normal lies along the seam; expected it across the seam");
  }
  return *X_XT;
}

}  // namespace tw::planner
