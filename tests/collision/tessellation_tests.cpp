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

TEST_CASE("Cutting a capsule out of a mesh drops only what lies inside the capsule") {
  const kinematics::LinkShape rod = roundShape(kinematics::LinkShape::Kind::kCylinder, 0.01, 0.2);
  const TriangleMesh mesh = tessellateShape(rod, 32);
  // A ball (both ends at the rod's tip) and a capsule along the rod's axis
  // from its tip 50 mm inwards, narrower than the rod: it takes only the
  // middle of the end face.
  struct Cut {
    Eigen::Vector3d a, b;
    double radius;
  };
  for (const Cut& cut_zone : {Cut{{0, 0, -0.1}, {0, 0, -0.1}, 0.03},
                              Cut{{0, 0, -0.1}, {0, 0, -0.05}, 0.004}}) {
    CAPTURE(cut_zone.a.transpose(), cut_zone.b.transpose(), cut_zone.radius);
    const auto inside = [&](const Eigen::Vector3d& p) {
      return distanceToSegment(p, cut_zone.a, cut_zone.b) <= cut_zone.radius;
    };
    const TriangleMesh cut = meshOutsideCapsule(mesh, cut_zone.a, cut_zone.b, cut_zone.radius);
    REQUIRE_FALSE(cut.triangles.empty());
    // No kept triangle lies wholly inside the capsule (a convex set holds a
    // triangle iff it holds its corners).
    for (const std::array<int, 3>& t : cut.triangles) {
      CHECK_FALSE((inside(cut.vertices[t[0]]) && inside(cut.vertices[t[1]]) &&
                   inside(cut.vertices[t[2]])));
    }
    // Every original corner outside the capsule survives.
    for (const Eigen::Vector3d& v : mesh.vertices) {
      if (inside(v)) continue;
      bool kept = false;
      for (const Eigen::Vector3d& w : cut.vertices) kept = kept || (w - v).norm() < 1e-15;
      CHECK(kept);
    }
    // Kept triangles reach into the capsule by at most the split limit
    // radius / 8.
    for (const Eigen::Vector3d& w : cut.vertices) {
      CHECK(distanceToSegment(w, cut_zone.a, cut_zone.b) > cut_zone.radius - cut_zone.radius / 8.0);
    }
  }
}

}  // namespace
}  // namespace tw::collision
