#pragma once

#include <Eigen/Geometry>
#include <array>
#include <string>
#include <vector>

namespace tw::collision {

/// An indexed triangle surface in its own frame, lengths [m].
///
/// Meshes are surfaces, not solids: FCL reports contact between surfaces
/// only, so a body wholly inside a mesh does not touch it. `closed` says
/// whether every edge is shared by exactly two triangles (a watertight
/// surface that bounds a solid), which the collision world uses to catch
/// containment.
struct TriangleMesh {
  /// Where the mesh came from, for messages ("" when built in code).
  std::string source;
  std::vector<Eigen::Vector3d> vertices;
  std::vector<std::array<int, 3>> triangles;
  /// Triangles dropped on loading because they have no area.
  int degenerate_triangles = 0;
  bool closed = false;
};

/// Axis-aligned bounds of the vertices; empty box for an empty mesh.
Eigen::AlignedBox3d meshBounds(const TriangleMesh& mesh);

/// Enclosed volume [m³] by the divergence theorem (sum of signed tetrahedra
/// from the origin), positive for outward-facing triangles. Meaningful only
/// for a closed mesh.
double meshVolume(const TriangleMesh& mesh);

/// Merges vertices at exactly the same position (file formats such as STL
/// repeat each vertex per triangle) and drops the unused ones, keeping the
/// first occurrence's order so that the result is deterministic.
void weldIdenticalVertices(TriangleMesh& mesh);

/// True when every undirected edge is used by exactly two triangles.
bool isClosedSurface(const std::vector<std::array<int, 3>>& triangles);

/// The mesh with every vertex mapped through X_AM (mesh frame M to frame A).
TriangleMesh transformedMesh(const TriangleMesh& mesh, const Eigen::Isometry3d& X_AM);

}  // namespace tw::collision
