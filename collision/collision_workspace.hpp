#pragma once

#include <fcl/broadphase/broadphase_dynamic_AABB_tree.h>

#include <memory>
#include <vector>

#include "collision/margin_object.hpp"
#include "kinematics/forward_kinematics.hpp"

namespace tw::collision {

class CollisionWorld;
namespace detail {
struct WorldModel;
}

/// Per-query scratch of collision queries: link poses, the posed arm and tool
/// objects and their broad-phase tree. Owned by the caller, one per thread;
/// made for one world and usable with it and with its withFixturePose()
/// copies (which share the arm and tool). Building one costs a few
/// allocations; reuse it across queries.
class CollisionWorkspace {
 public:
  explicit CollisionWorkspace(const CollisionWorld& world);
  CollisionWorkspace(const CollisionWorkspace&) = delete;
  CollisionWorkspace& operator=(const CollisionWorkspace&) = delete;

 private:
  friend class CollisionWorld;

  std::shared_ptr<const detail::WorldModel> model_;
  kinematics::LinkPoses poses_;
  std::vector<std::unique_ptr<MarginObject>> objects_;
  std::unique_ptr<fcl::DynamicAABBTreeCollisionManagerd> manager_;
  /// Clearance scratch: checked pairs with a lower bound of their distance.
  struct PairBound {
    double bound;
    const fcl::CollisionObjectd* a;
    const fcl::CollisionObjectd* b;
  };
  std::vector<PairBound> pairs_;
};

}  // namespace tw::collision
