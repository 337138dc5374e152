#pragma once

#include <mutex>

#include "collision/collision_world.hpp"

namespace tw::planner::detail {

/// One CollisionWorkspace shared by the OMPL validity checker and motion
/// validator of one planning call, behind a mutex: OMPL requires both to be
/// thread-safe, and a planner may call them from a thread of its own (PRM
/// grows its roadmap beside the thread that looks for a solution). Uncontended
/// locking costs far less than one state check. Counts the collision queries
/// for the planning report.
struct GuardedWorkspace {
  explicit GuardedWorkspace(const collision::CollisionWorld& world_in)
      : world(world_in), workspace(world_in) {}

  const collision::CollisionWorld& world;
  std::mutex mutex;
  collision::CollisionWorkspace workspace;
  long state_checks = 0;    ///< states checked, including those inside segment checks
  long segment_checks = 0;  ///< checkSegment calls
};

}  // namespace tw::planner::detail
