#include <catch2/catch.hpp>

#include <cmath>

#include "collision/collision_world.hpp"
#include "tests/collision/test_arms.hpp"

namespace tw::collision {
namespace {

/// Distances here are exact closed forms; FCL's sphere–sphere and
/// sphere–box routines are closed forms too, so only rounding separates them.
constexpr double kExact = 1e-9;

kinematics::JointVector at(double x) {
  kinematics::JointVector q(1);
  q << x;
  return q;
}

CollisionWorld worldWith(const kinematics::LinkShape& moving, const kinematics::LinkShape& fixed) {
  WorldDescription description;
  description.bodies.push_back({"obstacle", BodyRole::kObstacle, "", {fixed}});
  return CollisionWorld(test::sliderArm({moving}), description);
}

void checkWitnesses(const Clearance& clearance) {
  // The witness points are the closest pair, so they lie the distance apart.
  CHECK((clearance.p_WA - clearance.p_WB).norm() == Approx(clearance.distance).margin(kExact));
}

TEST_CASE("Sphere–sphere clearance is the centre distance minus both radii") {
  const CollisionWorld world = worldWith(test::sphereShape(0.1, Eigen::Vector3d::Zero()),
                                         test::sphereShape(0.2, Eigen::Vector3d(1.0, 0.3, 0.0)));
  CollisionWorkspace workspace(world);
  for (double x : {-1.0, 0.0, 0.4, 0.55}) {
    CAPTURE(x);
    const Clearance clearance = world.clearance(at(x), workspace);
    // Two balls: |c1 − c2| − r1 − r2 (elementary geometry, from memory).
    const double expected = std::hypot(1.0 - x, 0.3) - 0.3;
    CHECK(clearance.distance == Approx(expected).margin(kExact));
    CHECK(world.bodyName(clearance.body_a) == "carriage");
    CHECK(world.bodyName(clearance.body_b) == "obstacle");
    checkWitnesses(clearance);
  }
}

TEST_CASE("Sphere–box clearance is the distance to the nearest box point minus the radius") {
  // Box [0.8, 1.2] × [−0.1, 0.1] × [−0.3, 0.3]; the sphere slides along y = 0.25.
  const CollisionWorld world =
      worldWith(test::sphereShape(0.05, Eigen::Vector3d(0.0, 0.25, 0.0)),
                test::boxShape(Eigen::Vector3d(0.4, 0.2, 0.6), Eigen::Vector3d(1.0, 0.0, 0.0)));
  CollisionWorkspace workspace(world);
  for (double x : {0.0, 0.5, 0.9, 1.1, 1.5}) {
    CAPTURE(x);
    const Clearance clearance = world.clearance(at(x), workspace);
    // Nearest box point: clamp the centre into the box (elementary geometry,
    // from memory); this covers the face (x inside) and edge (x outside) regions.
    const Eigen::Vector3d center(x, 0.25, 0.0);
    const Eigen::Vector3d nearest(std::clamp(x, 0.8, 1.2), 0.1, 0.0);
    CHECK(clearance.distance == Approx((center - nearest).norm() - 0.05).margin(kExact));
    checkWitnesses(clearance);
  }
}

TEST_CASE("Clearance between parallel box faces is the gap") {
  // Carriage box spans x ∈ [q − 0.1, q + 0.1]; the obstacle starts at x = 0.9.
  const CollisionWorld world =
      worldWith(test::boxShape(Eigen::Vector3d(0.2, 0.2, 0.2), Eigen::Vector3d::Zero()),
                test::boxShape(Eigen::Vector3d(0.2, 0.6, 0.6), Eigen::Vector3d(1.0, 0.05, 0.0)));
  CollisionWorkspace workspace(world);
  for (double x : {0.0, 0.3, 0.75, 0.79}) {
    CAPTURE(x);
    // Facing parallel faces whose projections overlap: the gap 0.9 − (x + 0.1).
    const Clearance clearance = world.clearance(at(x), workspace);
    CHECK(clearance.distance == Approx(0.8 - x).margin(kExact));
    checkWitnesses(clearance);
  }
}

}  // namespace
}  // namespace tw::collision
