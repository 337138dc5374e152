#include <catch2/catch.hpp>

#include <cmath>

#include "collision/mesh_trimming.hpp"
#include "collision/tessellation.hpp"
#include "kinematics/common/angles.hpp"
#include "tests/collision/test_arms.hpp"

namespace tw::collision {
namespace {


kinematics::LinkShape roundShape(kinematics::LinkShape::Kind kind, double radius, double length) {
  kinematics::LinkShape shape;
  shape.kind = kind;
  shape.radius = radius;
  shape.length = length;
  return shape;
}

TEST_CASE("Tessellated primitives are closed and hold slightly less than the solid") {
  using Kind = kinematics::LinkShape::Kind;
  const double r = 0.05;
  const double l = 0.3;
  // Volumes of the solids (elementary geometry, from memory).
  const std::vector<std::pair<kinematics::LinkShape, double>> cases = {
      {test::boxShape(Eigen::Vector3d(0.1, 0.2, 0.3), {0, 0, 0}), 0.1 * 0.2 * 0.3},
      {roundShape(Kind::kSphere, r, 0.0), 4.0 / 3.0 * kPi * r * r * r},
      {roundShape(Kind::kCylinder, r, l), kPi * r * r * l},
      {roundShape(Kind::kCapsule, r, l), kPi * r * r * l + 4.0 / 3.0 * kPi * r * r * r},
  };
  for (const auto& [shape, volume] : cases) {
    CAPTURE(kinematics::toString(shape.kind));
    const TriangleMesh mesh = tessellateShape(shape, 64);
    CHECK(mesh.closed);
    CHECK(isClosedSurface(mesh.triangles));
    const double mesh_volume = meshVolume(mesh);
    // Inscribed in a convex solid, so never more (convexity); 64 segments
    // lose under 1 % (polygon area ratio sin(2π/n)·n/2π ≈ 0.998, from memory).
    CHECK(mesh_volume <= volume * (1.0 + 1e-12));
    CHECK(mesh_volume >= 0.99 * volume);
  }
}

TEST_CASE("Cutting a ball out of a mesh drops only what lies inside the ball") {
  const kinematics::LinkShape rod = roundShape(kinematics::LinkShape::Kind::kCylinder, 0.01, 0.2);
  const TriangleMesh mesh = tessellateShape(rod, 32);
  const Eigen::Vector3d tip(0, 0, -0.1);
  const double radius = 0.03;
  const TriangleMesh cut = meshOutsideBall(mesh, tip, radius);
  REQUIRE_FALSE(cut.triangles.empty());
  // No kept triangle lies wholly inside the ball (a convex set holds a
  // triangle iff it holds its corners).
  for (const std::array<int, 3>& t : cut.triangles) {
    const bool inside = (cut.vertices[t[0]] - tip).norm() <= radius &&
                        (cut.vertices[t[1]] - tip).norm() <= radius &&
                        (cut.vertices[t[2]] - tip).norm() <= radius;
    CHECK_FALSE(inside);
  }
  // Every original corner outside the ball survives.
  for (const Eigen::Vector3d& v : mesh.vertices) {
    if ((v - tip).norm() <= radius) continue;
    bool kept = false;
    for (const Eigen::Vector3d& w : cut.vertices) kept = kept || (w - v).norm() < 1e-15;
    CHECK(kept);
  }
  // Kept triangles reach into the ball by at most the split limit radius / 8.
  for (const Eigen::Vector3d& w : cut.vertices) CHECK((w - tip).norm() > radius - radius / 8.0);
}

}  // namespace
}  // namespace tw::collision
