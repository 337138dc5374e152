#pragma once

#include "collision/triangle_mesh.hpp"
#include "kinematics/link_geometry.hpp"

namespace tw::collision {

/// A closed, outward-facing triangle surface of a primitive (box, cylinder,
/// sphere or capsule) in the shape's own frame S (centred, axis along z, as
/// LinkShape defines), lengths [m]. `segments` (≥ 3) is the number of
/// divisions around the axis; spheres and capsule ends use segments / 4
/// rings per hemisphere; straight sides are divided along the axis so that no
/// triangle is more than about four times as long as it is wide (slivers
/// make loose bounding volumes). Vertices lie on the true surface, so the mesh is inside
/// the primitive (flat facets cut corners by at most r·(1 − cos(π/segments))).
///
/// Throws tw::InputError for a mesh shape (load it instead) or segments < 3.
TriangleMesh tessellateShape(const kinematics::LinkShape& shape, int segments);

}  // namespace tw::collision
