#include "planner/toolpath/tool_path.hpp"

namespace tw::planner {

std::vector<Eigen::Isometry3d> worldPoses(const ToolPath& path, const FrameTree& frames) {
  const Eigen::Isometry3d& X_WX = frames.X_W(path.frame);
  std::vector<Eigen::Isometry3d> poses;
  poses.reserve(path.waypoints.size() + 2);
  poses.push_back(X_WX * path.approach);
  for (const Waypoint& waypoint : path.waypoints) poses.push_back(X_WX * waypoint.X_XT);
  poses.push_back(X_WX * path.retract);
  return poses;
}

Eigen::Isometry3d backedOff(const Eigen::Isometry3d& X_XT, double distance) {
  return X_XT * Eigen::Translation3d(0.0, 0.0, -distance);
}

}  // namespace tw::planner
