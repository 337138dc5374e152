#pragma once

#include <fcl/narrowphase/collision_object.h>

#include <memory>

namespace tw::collision {

/// An FCL collision object whose broad-phase box is grown by a fixed amount.
///
/// FCL's own computeAABB() bounds a rotated object by a cube around its
/// bounding sphere and offers no margin; with the two sides of a pair grown
/// by amounts that add up to the pair's margin, the broad phase hands on
/// every pair that might be nearer than it (see WorldModel::moving_growth). After
/// setTransform() call updateBounds() before the manager's update(): FCL
/// does not refresh the box itself.
class MarginObject : public fcl::CollisionObjectd {
 public:
  MarginObject(std::shared_ptr<fcl::CollisionGeometryd> geometry, double growth)
      : fcl::CollisionObjectd(std::move(geometry)), growth_(growth) {
    updateBounds();
  }

  /// Recomputes the world box from the geometry's local box and the pose:
  /// the rotated local box's extent is |R|·half-size, tighter than FCL's cube.
  void updateBounds() {
    const fcl::AABBd& local = collisionGeometry()->aabb_local;
    const Eigen::Vector3d center_local = 0.5 * (local.min_ + local.max_);
    const Eigen::Vector3d half_local = 0.5 * (local.max_ - local.min_);
    const Eigen::Vector3d center = getTransform() * center_local;
    const Eigen::Vector3d half =
        getRotation().cwiseAbs() * half_local + Eigen::Vector3d::Constant(growth_);
    aabb.min_ = center - half;
    aabb.max_ = center + half;
  }

 private:
  double growth_;
};

}  // namespace tw::collision
