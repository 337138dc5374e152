#pragma once

#include <Eigen/Core>

#include "collision/triangle_mesh.hpp"

namespace tw::collision {

/// The part of `mesh` outside the capsule of `radius` [m] about the segment
/// from `a` to `b` (all in the mesh frame; a == b gives a ball), used to take
/// the part of the tool that may touch a workpiece (the wire stick-out or
/// bead with its allowance) out of the tool body.
///
/// Triangles near the capsule's surface are split at edge midpoints until
/// their edges are at most radius / 8, then every triangle with all three
/// corners inside the capsule is dropped (the capsule is convex, so such a
/// triangle lies wholly inside). A kept triangle may reach into the capsule
/// by up to its edge length, so the removed zone is never larger than the
/// capsule (conservative: more of the tool is checked, never less). The
/// result is an open surface and may be empty. Precondition: radius > 0.
TriangleMesh meshOutsideCapsule(const TriangleMesh& mesh, const Eigen::Vector3d& a,
                                const Eigen::Vector3d& b, double radius);

/// Distance [m] from `p` to the segment from `a` to `b`.
double distanceToSegment(const Eigen::Vector3d& p, const Eigen::Vector3d& a,
                         const Eigen::Vector3d& b);

}  // namespace tw::collision
