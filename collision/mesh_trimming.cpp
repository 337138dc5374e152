#include "collision/mesh_trimming.hpp"

#include <algorithm>
#include <cmath>

namespace tw::collision {
namespace {

struct Corners {
  Eigen::Vector3d a, b, c;
};

double longestEdge(const Corners& t) {
  return std::sqrt(std::max({(t.b - t.a).squaredNorm(), (t.c - t.b).squaredNorm(),
                             (t.a - t.c).squaredNorm()}));
}

void trim(const Corners& t, const Eigen::Vector3d& center, double radius, double edge_limit,
          TriangleMesh& out) {
  const double r2 = radius * radius;
  const bool a_in = (t.a - center).squaredNorm() <= r2;
  const bool b_in = (t.b - center).squaredNorm() <= r2;
  const bool c_in = (t.c - center).squaredNorm() <= r2;
  if (a_in && b_in && c_in) return;
  // A bounding sphere about the centroid tells whether the ball may cut it.
  const Eigen::Vector3d centroid = (t.a + t.b + t.c) / 3.0;
  const double reach = std::sqrt(std::max({(t.a - centroid).squaredNorm(),
                                           (t.b - centroid).squaredNorm(),
                                           (t.c - centroid).squaredNorm()}));
  const bool may_cross = (centroid - center).norm() - reach < radius;
  if (may_cross && longestEdge(t) > edge_limit) {
    const Eigen::Vector3d ab = 0.5 * (t.a + t.b);
    const Eigen::Vector3d bc = 0.5 * (t.b + t.c);
    const Eigen::Vector3d ca = 0.5 * (t.c + t.a);
    trim({t.a, ab, ca}, center, radius, edge_limit, out);
    trim({ab, t.b, bc}, center, radius, edge_limit, out);
    trim({ca, bc, t.c}, center, radius, edge_limit, out);
    trim({ab, bc, ca}, center, radius, edge_limit, out);
    return;
  }
  const int first = static_cast<int>(out.vertices.size());
  out.vertices.push_back(t.a);
  out.vertices.push_back(t.b);
  out.vertices.push_back(t.c);
  out.triangles.push_back({{first, first + 1, first + 2}});
}

}  // namespace

TriangleMesh meshOutsideBall(const TriangleMesh& mesh, const Eigen::Vector3d& center,
                             double radius) {
  TriangleMesh out;
  out.source = mesh.source;
  const double edge_limit = radius / 8.0;
  for (const std::array<int, 3>& triangle : mesh.triangles) {
    trim({mesh.vertices[triangle[0]], mesh.vertices[triangle[1]], mesh.vertices[triangle[2]]},
         center, radius, edge_limit, out);
  }
  weldIdenticalVertices(out);
  return out;
}

}  // namespace tw::collision
