// Forward kinematics and the geometric Jacobian, checked against Orocos KDL
// (a general-purpose reference library, Debian liborocos-kdl-dev 1.5) and
// against central finite differences.
#include <catch2/catch.hpp>

#include <kdl/chain.hpp>
#include <kdl/chainfksolverpos_recursive.hpp>
#include <kdl/chainjnttojacsolver.hpp>

#include "kinematics/arm_loader.hpp"
#include "kinematics/common/angles.hpp"
#include "kinematics/forward_kinematics.hpp"
#include "kinematics/singularity.hpp"
#include "tests/kinematics/kdl_chain.hpp"
#include "tests/kinematics/test_arms.hpp"

using namespace tw::kinematics;

namespace {

// KDL and this code compose the same rotations in a different order; their
// rounding differs by a few ulps of metre-sized values.
constexpr double kAgreement = 1e-9;

void checkAgainstKdl(const ArmModel& arm, int configurations, std::uint64_t seed) {
  const KDL::Chain chain = test::kdlChain(arm);
  KDL::ChainFkSolverPos_recursive kdl_fk(chain);
  KDL::ChainJntToJacSolver kdl_jacobian(chain);
  std::mt19937_64 generator(seed);
  for (int i = 0; i < configurations; ++i) {
    const JointVector q = test::randomJoints(arm, generator);
    CAPTURE(i, q.transpose());
    const KDL::JntArray q_kdl = test::kdlJoints(q);
    KDL::Frame kdl_frame;
    REQUIRE(kdl_fk.JntToCart(q_kdl, kdl_frame) >= 0);
    KDL::Jacobian kdl_J(arm.jointCount());
    REQUIRE(kdl_jacobian.JntToJac(q_kdl, kdl_J) >= 0);

    const Eigen::Isometry3d X_BF = flangePose(arm, q);
    const Eigen::Isometry3d X_kdl = test::fromKdl(kdl_frame);
    CHECK((X_BF.matrix() - X_kdl.matrix()).cwiseAbs().maxCoeff() < kAgreement);
    const Jacobian J = geometricJacobian(arm, q);
    CHECK((J - kdl_J.data).cwiseAbs().maxCoeff() < kAgreement);
  }
}

}  // namespace

TEST_CASE("Forward kinematics and Jacobian agree with Orocos KDL", "[fk][jacobian][kdl]") {
  SECTION("the invented sample arm (ortho-parallel), 1000 random configurations") {
    checkAgainstKdl(test::sampleArm(), 1000, 11);
  }
  SECTION("the synthetic reference arm with offsets, 1000 random configurations") {
    checkAgainstKdl(test::referenceOrthoArm(), 1000, 12);
  }
  SECTION("a general chain with an offset, tilted wrist, 1000 random configurations") {
    checkAgainstKdl(loadArmDescription(test::sourcePath("tests/kinematics/data/general_chain.xml")),
                    1000, 13);
  }
}

TEST_CASE("The Jacobian matches central finite differences of forward kinematics",
          "[jacobian]") {
  // Central differences: truncation error O(h²) ≈ 1e-12 for h = 1e-6, rounding
  // ≈ 1e-16/h = 1e-10; a 1e-8 bound covers both with margin.
  constexpr double kStep = 1e-6;
  constexpr double kDifferenceTolerance = 1e-8;
  const ArmModel arm =
      loadArmDescription(test::sourcePath("tests/kinematics/data/general_chain.xml"));
  std::mt19937_64 generator(21);
  for (int i = 0; i < 200; ++i) {
    const JointVector q = test::randomJoints(arm, generator);
    CAPTURE(i, q.transpose());
    const Jacobian J = geometricJacobian(arm, q);
    for (int j = 0; j < arm.jointCount(); ++j) {
      JointVector plus = q;
      JointVector minus = q;
      plus[j] += kStep;
      minus[j] -= kStep;
      const Eigen::Isometry3d X_plus = flangePose(arm, plus);
      const Eigen::Isometry3d X_minus = flangePose(arm, minus);
      const Eigen::Vector3d linear = (X_plus.translation() - X_minus.translation()) / (2 * kStep);
      const Eigen::AngleAxisd turn(X_plus.linear() * X_minus.linear().transpose());
      const Eigen::Vector3d angular = turn.angle() * turn.axis() / (2 * kStep);
      CHECK((linear - J.block<3, 1>(0, j)).norm() < kDifferenceTolerance);
      CHECK((angular - J.block<3, 1>(3, j)).norm() < kDifferenceTolerance);
    }
  }
}

TEST_CASE("Every link frame is the flange pose of the chain cut after that link", "[fk]") {
  // The joint axis of link i passes through the origin of X_BL[i]: moving
  // joint i alone must leave that origin in place.
  const ArmModel arm = test::sampleArm();
  std::mt19937_64 generator(31);
  for (int i = 0; i < 100; ++i) {
    const JointVector q = test::randomJoints(arm, generator);
    LinkPoses before;
    computeLinkPoses(arm, q, before);
    REQUIRE(before.count == 7);
    CHECK(before.X_BL[0].matrix().isIdentity(0.0));
    for (int j = 0; j < 6; ++j) {
      JointVector moved = q;
      moved[j] += 0.3;
      LinkPoses after;
      computeLinkPoses(arm, moved, after);
      // Rounding of metre-sized positions.
      CHECK((after.X_BL[j + 1].translation() - before.X_BL[j + 1].translation()).norm() < 1e-12);
    }
  }
}

TEST_CASE("Manipulability of a planar two-link arm is |sin θ2|", "[singularity]") {
  // Yoshikawa, IJRR 4(2), 1985; check values from the domain-facts reference
  // §4 ([C]): l1 = l2 = 1, w = 1.0 at 90°, 0.5 at 30°, 0 at 0°.
  ArmDescription description;
  description.name = "planar-2link";
  for (int i = 0; i < 2; ++i) {
    JointSpec joint;
    joint.name = "j" + std::to_string(i + 1);
    joint.X_PJ = Eigen::Isometry3d(Eigen::Translation3d(i == 0 ? 0.0 : 1.0, 0, 0));
    joint.lower = -3;
    joint.upper = 3;
    joint.max_velocity = 1;
    joint.max_acceleration = 1;
    description.joints.push_back(joint);
  }
  description.X_LF = Eigen::Isometry3d(Eigen::Translation3d(1, 0, 0));
  const ArmModel arm(description);
  constexpr double kDeg = tw::kPi / 180.0;
  for (const auto& [theta2, expected] : {std::pair{90.0, 1.0}, {30.0, 0.5}, {0.0, 0.0}}) {
    JointVector q(2);
    q << 0.4, theta2 * kDeg;
    const Jacobian J = geometricJacobian(arm, q);
    // The planar position Jacobian: x and y velocity rows. The square root
    // lifts the determinant's ~1e-16 rounding to ~1e-8 at the singularity.
    CHECK(manipulability(J.topRows<2>()) == Approx(expected).margin(1e-7));
  }
}
