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

struct Capsule {
  Eigen::Vector3d a, b;
  double radius;
  bool holds(const Eigen::Vector3d& p) const { return distanceToSegment(p, a, b) <= radius; }
};

void trim(const Corners& t, const Capsule& capsule, double edge_limit, TriangleMesh& out) {
  if (capsule.holds(t.a) && capsule.holds(t.b) && capsule.holds(t.c)) return;
  // A bounding sphere about the centroid tells whether the ball may cut it.
  const Eigen::Vector3d centroid = (t.a + t.b + t.c) / 3.0;
  const double reach = std::sqrt(std::max({(t.a - centroid).squaredNorm(),
                                           (t.b - centroid).squaredNorm(),
                                           (t.c - centroid).squaredNorm()}));
  const bool may_cross =
      distanceToSegment(centroid, capsule.a, capsule.b) - reach < capsule.radius;
  if (may_cross && longestEdge(t) > edge_limit) {
    const Eigen::Vector3d ab = 0.5 * (t.a + t.b);
    const Eigen::Vector3d bc = 0.5 * (t.b + t.c);
    const Eigen::Vector3d ca = 0.5 * (t.c + t.a);
    trim({t.a, ab, ca}, capsule, edge_limit, out);
    trim({ab, t.b, bc}, capsule, edge_limit, out);
    trim({ca, bc, t.c}, capsule, edge_limit, out);
    trim({ab, bc, ca}, capsule, edge_limit, out);
    return;
  }
  const int first = static_cast<int>(out.vertices.size());
  out.vertices.push_back(t.a);
  out.vertices.push_back(t.b);
  out.vertices.push_back(t.c);
  out.triangles.push_back({{first, first + 1, first + 2}});
}

}  // namespace

double distanceToSegment(const Eigen::Vector3d& p, const Eigen::Vector3d& a,
                         const Eigen::Vector3d& b) {
  const Eigen::Vector3d ab = b - a;
  const double length2 = ab.squaredNorm();
  const double s = length2 > 0.0 ? std::clamp((p - a).dot(ab) / length2, 0.0, 1.0) : 0.0;
  return (p - (a + s * ab)).norm();
}

TriangleMesh meshOutsideCapsule(const TriangleMesh& mesh, const Eigen::Vector3d& a,
                                const Eigen::Vector3d& b, double radius) {
  TriangleMesh out;
  out.source = mesh.source;
  const double edge_limit = radius / 8.0;
  for (const std::array<int, 3>& triangle : mesh.triangles) {
    trim({mesh.vertices[triangle[0]], mesh.vertices[triangle[1]], mesh.vertices[triangle[2]]},
         {a, b, radius}, edge_limit, out);
  }
  weldIdenticalVertices(out);
  return out;
}

}  // namespace tw::collision
