// The wrist centre of an articulated arm moves in a spherical shell about
// the shoulder (common practice, no source: the spherical-shell workspace of
// an articulated arm).
#include <catch2/catch.hpp>

#include <cmath>

#include "kinematics/forward_kinematics.hpp"
#include "kinematics/reach_shell.hpp"
#include "tests/kinematics/test_arms.hpp"

using namespace tw::kinematics;

TEST_CASE("No wrist centre lies outside the outer reach radius", "[reach]") {
  const ArmModel arm = test::sampleArm();
  const ReachShell shell(arm);
  const OrthoParallelGeometry& g = *arm.orthoParallel();
  CHECK(shell.outerRadius() == Approx(g.c2 + std::hypot(g.a2, g.c3)).epsilon(1e-15));
  CHECK(shell.innerRadius() == Approx(std::abs(g.c2 - std::hypot(g.a2, g.c3))).epsilon(1e-15));

  std::mt19937_64 generator(201);
  LinkPoses poses;
  double farthest = 0.0;
  for (int i = 0; i < 100000; ++i) {
    const JointVector q = test::randomJoints(arm, generator);
    computeLinkPoses(arm, q, poses);
    // Link 2's origin is the shoulder: axis 2 in the arm plane.
    const double distance = (poses.X_BL[6].translation() - poses.X_BL[2].translation()).norm();
    farthest = std::max(farthest, distance);
    CAPTURE(q.transpose());
    // Rounding of metre-sized positions.
    REQUIRE(distance <= shell.outerRadius() + 1e-12);
    REQUIRE(distance >= shell.innerRadius() - 1e-12);
    REQUIRE(shell.mayReach(shell.wristCentre(poses.X_BF)));
  }
  // Random configurations come close to the bound without passing it.
  CHECK(farthest > 0.99 * shell.outerRadius());
}

TEST_CASE("The fully stretched arm meets the outer radius", "[reach]") {
  const ArmModel arm = test::sampleArm();
  const ReachShell shell(arm);
  const OrthoParallelGeometry& g = *arm.orthoParallel();
  JointVector q(6);
  q << 0.5, 0.7, -std::atan2(g.a2, g.c3), 0.1, 0.2, 0.3;
  LinkPoses poses;
  computeLinkPoses(arm, q, poses);
  const double distance = (poses.X_BL[6].translation() - poses.X_BL[2].translation()).norm();
  CHECK(distance == Approx(shell.outerRadius()).epsilon(1e-12));
}

TEST_CASE("The reach pre-check rejects points outside the shell", "[reach]") {
  const ArmModel arm = test::sampleArm();
  const ReachShell shell(arm);
  CHECK_FALSE(shell.mayReach(Eigen::Vector3d(5.0, 0.0, 0.5)));
  CHECK_FALSE(shell.mayReach(Eigen::Vector3d(0.0, 0.0, 5.0)));
  CHECK(shell.mayReach(Eigen::Vector3d(1.0, 0.2, 0.9)));
}
