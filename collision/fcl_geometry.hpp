#pragma once

#include <fcl/geometry/collision_geometry.h>

#include <memory>

#include "collision/triangle_mesh.hpp"
#include "kinematics/link_geometry.hpp"

namespace tw::collision {

/// A BVH model of the mesh with OBBRSS bounding volumes, the one FCL 0.7
/// type that is fast for both collision and distance and never refits the
/// model during a query (RSS refits on every collision call, OBB cannot do
/// distance), so one model can be shared by threads. Precondition: the
/// mesh has triangles.
std::shared_ptr<fcl::CollisionGeometryd> makeMeshGeometry(const TriangleMesh& mesh);

/// The FCL primitive (solid) for a box, cylinder, sphere or capsule shape,
/// in the shape frame S as LinkShape defines it. Throws tw::InputError for a
/// mesh shape or a non-positive size.
std::shared_ptr<fcl::CollisionGeometryd> makePrimitiveGeometry(const kinematics::LinkShape& shape);

}  // namespace tw::collision
