#include "planner/transit/joint_path.hpp"

#include "planner/report_text.hpp"

namespace tw::planner {

double jointPathLength(const JointPath& path) {
  double length = 0.0;
  for (std::size_t i = 1; i < path.size(); ++i) length += (path[i] - path[i - 1]).norm();
  return length;
}

std::optional<PathCheckFailure> recheckPath(const collision::CollisionWorld& world,
                                            const JointPath& path,
                                            collision::CollisionWorkspace& workspace) {
  if (path.empty()) return PathCheckFailure{-1, "the path has no waypoint"};
  const kinematics::ArmModel& arm = world.arm();
  for (std::size_t i = 0; i < path.size(); ++i) {
    if (path[i].size() != arm.jointCount() || !arm.withinLimits(path[i])) {
      return PathCheckFailure{i > 0 ? static_cast<int>(i) - 1 : 0,
                              "waypoint " + std::to_string(i) +
                                  " has the wrong joint count or is outside the joint limits"};
    }
  }
  if (path.size() == 1) {
    const collision::StateResult state = world.checkState(path.front(), workspace);
    if (state.valid()) return std::nullopt;
    return PathCheckFailure{-1, "the only waypoint is invalid: " + describeState(world, state)};
  }
  for (std::size_t i = 0; i + 1 < path.size(); ++i) {
    const collision::SegmentResult segment = world.checkSegment(path[i], path[i + 1], workspace);
    if (!segment.valid()) {
      return PathCheckFailure{
          static_cast<int>(i),
          "segment " + std::to_string(i) + " is invalid at fraction " +
              formatFixed(segment.fraction, 4) + ": " + describeState(world, segment.state)};
    }
  }
  return std::nullopt;
}

}  // namespace tw::planner
