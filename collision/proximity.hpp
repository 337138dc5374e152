#pragma once

#include <fcl/narrowphase/collision_object.h>

#include <optional>

namespace tw::collision {

/// Are two posed objects nearer than `threshold` [m]? Returns the distance
/// of the first nearer part found (0 for touching or overlapping parts), not
/// the minimum, or nullopt when they are at least the threshold apart. The
/// question a state check with a clearance margin asks.
///
/// For two OBBRSS meshes this walks both bounding-volume trees at once,
/// nearer pair first, pruning every pair of bounding volumes at least the
/// threshold apart, and stops at the first triangle pair nearer than it;
/// FCL's distance query would keep searching for the minimum. Other pairs
/// (primitives) go to fcl::distance started at the threshold, so it prunes
/// the same way. Read-only on the geometry, so thread-safe.
std::optional<double> nearerThan(const fcl::CollisionObjectd& a, const fcl::CollisionObjectd& b,
                                 double threshold);

/// True when `p_S` (in the mesh's own frame) is inside the closed OBBRSS
/// mesh `object` holds, by the parity of crossings of a fixed ray; the ray
/// is tested only against triangles whose boxes it passes, so the cost
/// grows with the tree depth, not the triangle count. Precondition: the
/// object is an OBBRSS mesh whose surface is closed.
bool insideClosedMesh(const fcl::CollisionObjectd& object, const Eigen::Vector3d& p_S);

}  // namespace tw::collision
