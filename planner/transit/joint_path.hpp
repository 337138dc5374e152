#pragma once

#include <optional>
#include <string>
#include <vector>

#include "collision/collision_world.hpp"
#include "kinematics/joint.hpp"

namespace tw::planner {

/// A joint-space path: waypoints in chain order, [rad] revolute, [m]
/// prismatic, joined by straight joint-space segments.
using JointPath = std::vector<kinematics::JointVector>;

/// Sum of the Euclidean joint-space lengths of the segments (mixed units when
/// the arm has prismatic joints, like OMPL's PathGeometric::length()).
double jointPathLength(const JointPath& path);

/// Why a path failed its re-check: the segment (from waypoint `segment` to
/// `segment + 1`; for a bad waypoint the segment ending there, 0 for the
/// first; -1 for an empty path or a single invalid waypoint) and a sentence.
struct PathCheckFailure {
  int segment = -1;
  std::string reason;
};

/// Independent acceptance check of a planned path: at least one waypoint,
/// every waypoint of the arm's joint count and within its limits, every
/// segment valid by CollisionWorld::checkSegment (a single waypoint by
/// checkState). nullopt when the path is acceptable. `workspace` must belong
/// to `world`; call from one thread per workspace.
std::optional<PathCheckFailure> recheckPath(const collision::CollisionWorld& world,
                                            const JointPath& path,
                                            collision::CollisionWorkspace& workspace);

}  // namespace tw::planner
