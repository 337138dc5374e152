#pragma once

#include <Eigen/Core>

#include "collision/triangle_mesh.hpp"

namespace tw::collision {

/// The part of `mesh` outside the ball of `radius` [m] about `center` (both
/// in the mesh frame), used to take the tool tip out of the tool body.
///
/// Triangles near the ball's surface are split at edge midpoints until
/// their edges are at most radius / 8, then every triangle with all three
/// corners inside the ball is dropped. A kept triangle may reach into the
/// ball by up to its edge length, so the removed zone is never larger than
/// the ball (conservative: more of the tool is checked, never less). The
/// result is an open surface and may be empty.
TriangleMesh meshOutsideBall(const TriangleMesh& mesh, const Eigen::Vector3d& center,
                             double radius);

}  // namespace tw::collision
