#include "collision/tessellation.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <vector>

#include "kinematics/common/angles.hpp"

namespace tw::collision {
namespace {


using Kind = kinematics::LinkShape::Kind;

TriangleMesh boxMesh(const Eigen::Vector3d& size) {
  TriangleMesh mesh;
  const Eigen::Vector3d half = 0.5 * size;
  for (int i = 0; i < 8; ++i) {
    mesh.vertices.emplace_back((i & 1) ? half.x() : -half.x(), (i & 2) ? half.y() : -half.y(),
                               (i & 4) ? half.z() : -half.z());
  }
  // Two outward triangles per face; corner index bits are (x, y, z).
  mesh.triangles = {{{0, 2, 1}}, {{1, 2, 3}}, {{4, 5, 6}}, {{5, 7, 6}},
                    {{0, 1, 4}}, {{1, 5, 4}}, {{2, 6, 3}}, {{3, 6, 7}},
                    {{0, 4, 2}}, {{2, 4, 6}}, {{1, 3, 5}}, {{3, 7, 5}}};
  mesh.closed = true;
  return mesh;
}

/// A surface of revolution about z through the given (radius, z) profile
/// rings, bottom to top, closed with fans to axis points at z_bottom and z_top.
TriangleMesh revolvedMesh(const std::vector<Eigen::Vector2d>& profile, int segments,
                          double z_bottom, double z_top) {
  TriangleMesh mesh;
  const int rings = static_cast<int>(profile.size());
  mesh.vertices.emplace_back(0.0, 0.0, z_bottom);
  for (const Eigen::Vector2d& point : profile) {
    for (int s = 0; s < segments; ++s) {
      const double angle = 2.0 * kPi * s / segments;
      mesh.vertices.emplace_back(point.x() * std::cos(angle), point.x() * std::sin(angle),
                                 point.y());
    }
  }
  const int top = static_cast<int>(mesh.vertices.size());
  mesh.vertices.emplace_back(0.0, 0.0, z_top);
  const auto at = [segments](int ring, int s) { return 1 + ring * segments + (s % segments); };
  for (int s = 0; s < segments; ++s) {
    mesh.triangles.push_back({{0, at(0, s + 1), at(0, s)}});
    for (int r = 0; r + 1 < rings; ++r) {
      mesh.triangles.push_back({{at(r, s), at(r, s + 1), at(r + 1, s + 1)}});
      mesh.triangles.push_back({{at(r, s), at(r + 1, s + 1), at(r + 1, s)}});
    }
    mesh.triangles.push_back({{top, at(rings - 1, s), at(rings - 1, s + 1)}});
  }
  mesh.closed = true;
  return mesh;
}

/// Profile rings of a quarter circle from the equator (excluded) towards a
/// pole (excluded), centred at height z0, going up when `up`.
void appendCap(double radius, double z0, bool up, int rings, std::vector<Eigen::Vector2d>& out) {
  for (int i = 1; i < rings; ++i) {
    const double angle = 0.5 * kPi * (up ? i : rings - i) / rings;
    out.emplace_back(radius * std::cos(angle), z0 + (up ? 1.0 : -1.0) * radius * std::sin(angle));
  }
}

/// Profile rings of a straight side of `length` centred at z = 0, both ends
/// included, spaced at most four times the arc between segments: long thin
/// slivers make loose bounding volumes and slow distance queries.
void appendSide(double radius, double length, int segments, std::vector<Eigen::Vector2d>& out) {
  const double arc = 2.0 * kPi * radius / segments;
  const int steps = std::max(1, static_cast<int>(std::ceil(length / (4.0 * arc))));
  for (int i = 0; i <= steps; ++i) {
    out.emplace_back(radius, -0.5 * length + length * i / steps);
  }
}

}  // namespace

TriangleMesh tessellateShape(const kinematics::LinkShape& shape, int segments) {
  if (segments < 3) throw std::invalid_argument("tessellation needs at least 3 segments");
  const int rings = std::max(2, segments / 4);
  std::vector<Eigen::Vector2d> profile;
  switch (shape.kind) {
    case Kind::kMesh:
      throw std::invalid_argument(shape.mesh_path + ": " + "a mesh shape is loaded, not tessellated");
    case Kind::kBox:
      return boxMesh(shape.box_size);
    case Kind::kCylinder:
      appendSide(shape.radius, shape.length, segments, profile);
      return revolvedMesh(profile, segments, profile.front().y(), profile.back().y());
    case Kind::kSphere:
      appendCap(shape.radius, 0.0, false, rings, profile);
      profile.emplace_back(shape.radius, 0.0);
      appendCap(shape.radius, 0.0, true, rings, profile);
      return revolvedMesh(profile, segments, -shape.radius, shape.radius);
    case Kind::kCapsule: {
      const double half = 0.5 * shape.length;
      appendCap(shape.radius, -half, false, rings, profile);
      appendSide(shape.radius, shape.length, segments, profile);
      appendCap(shape.radius, half, true, rings, profile);
      return revolvedMesh(profile, segments, -half - shape.radius, half + shape.radius);
    }
  }
  throw std::invalid_argument("unknown shape kind");
}

}  // namespace tw::collision
