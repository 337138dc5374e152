#include "collision/triangle_mesh.hpp"

#include <algorithm>
#include <utility>

namespace tw::collision {

Eigen::AlignedBox3d meshBounds(const TriangleMesh& mesh) {
  Eigen::AlignedBox3d bounds;
  for (const Eigen::Vector3d& vertex : mesh.vertices) bounds.extend(vertex);
  return bounds;
}

double meshVolume(const TriangleMesh& mesh) {
  double six_volume = 0.0;
  for (const std::array<int, 3>& triangle : mesh.triangles) {
    const Eigen::Vector3d& a = mesh.vertices[triangle[0]];
    const Eigen::Vector3d& b = mesh.vertices[triangle[1]];
    const Eigen::Vector3d& c = mesh.vertices[triangle[2]];
    six_volume += a.dot(b.cross(c));
  }
  return six_volume / 6.0;
}

void weldIdenticalVertices(TriangleMesh& mesh) {
  const int count = static_cast<int>(mesh.vertices.size());
  std::vector<int> order(count);
  for (int i = 0; i < count; ++i) order[i] = i;
  const auto less = [&](int a, int b) {
    const Eigen::Vector3d& p = mesh.vertices[a];
    const Eigen::Vector3d& q = mesh.vertices[b];
    if (p.x() != q.x()) return p.x() < q.x();
    if (p.y() != q.y()) return p.y() < q.y();
    if (p.z() != q.z()) return p.z() < q.z();
    return a < b;
  };
  std::sort(order.begin(), order.end(), less);
  // Each vertex maps to the first index holding its position.
  std::vector<int> representative(count);
  for (int i = 0; i < count;) {
    int j = i;
    while (j < count && mesh.vertices[order[j]] == mesh.vertices[order[i]]) {
      representative[order[j]] = order[i];
      ++j;
    }
    i = j;
  }
  std::vector<int> new_index(count, -1);
  std::vector<Eigen::Vector3d> vertices;
  for (std::array<int, 3>& triangle : mesh.triangles) {
    for (int& index : triangle) {
      const int kept = representative[index];
      if (new_index[kept] < 0) {
        new_index[kept] = static_cast<int>(vertices.size());
        vertices.push_back(mesh.vertices[kept]);
      }
      index = new_index[kept];
    }
  }
  mesh.vertices = std::move(vertices);
}

bool isClosedSurface(const std::vector<std::array<int, 3>>& triangles) {
  if (triangles.empty()) return false;
  std::vector<std::pair<int, int>> edges;
  edges.reserve(triangles.size() * 3);
  for (const std::array<int, 3>& triangle : triangles) {
    for (int i = 0; i < 3; ++i) {
      const int a = triangle[i];
      const int b = triangle[(i + 1) % 3];
      edges.emplace_back(std::min(a, b), std::max(a, b));
    }
  }
  std::sort(edges.begin(), edges.end());
  for (std::size_t i = 0; i < edges.size();) {
    std::size_t j = i;
    while (j < edges.size() && edges[j] == edges[i]) ++j;
    if (j - i != 2) return false;
    i = j;
  }
  return true;
}

TriangleMesh transformedMesh(const TriangleMesh& mesh, const Eigen::Isometry3d& X_AM) {
  TriangleMesh result = mesh;
  for (Eigen::Vector3d& vertex : result.vertices) vertex = X_AM * vertex;
  return result;
}

}  // namespace tw::collision
