// The worked check vector of the closed-form IK for an ortho-parallel arm:
// domain-facts reference §4, computed from the equations of Brandstötter,
// Angerer & Hofbaur (2014) for synthetic parameters.
#include <catch2/catch.hpp>

#include "kinematics/forward_kinematics.hpp"
#include "kinematics/ortho_parallel_ik.hpp"
#include "tests/kinematics/test_arms.hpp"

using namespace tw::kinematics;

namespace {

// The reference values are printed to 6 decimals.
constexpr double kPrintedPrecision = 1e-6;

JointVector joints(std::initializer_list<double> values) {
  JointVector q(static_cast<int>(values.size()));
  int i = 0;
  for (double v : values) q[i++] = v;
  return q;
}

}  // namespace

TEST_CASE("The reference arm's zero pose puts the flange at (a1 + a2, b, c1 + c2 + c3 + c4)",
          "[fk][reference]") {
  // domain-facts §4: zero pose flange at (0.30, 0.05, 2.15).
  const ArmModel arm = test::referenceOrthoArm();
  const Eigen::Isometry3d X_BF = flangePose(arm, JointVector::Zero(6));
  CHECK(X_BF.translation().isApprox(Eigen::Vector3d(0.30, 0.05, 2.15), 1e-15));
  CHECK(X_BF.linear().isApprox(Eigen::Matrix3d::Identity(), 1e-15));
}

TEST_CASE("Forward kinematics of the worked joint vector gives the worked pose",
          "[fk][reference]") {
  // domain-facts §4, [C] from the paper's equations.
  const ArmModel arm = test::referenceOrthoArm();
  const Eigen::Isometry3d X_BF = flangePose(arm, joints({0.3, -0.4, 0.5, 0.6, 0.7, -0.8}));
  Eigen::Matrix3d expected_rotation;
  expected_rotation << 0.846323, -0.249053, 0.470861,  //
      -0.042993, 0.849141, 0.526413,                   //
      -0.530932, -0.465759, 0.707940;
  CAPTURE(X_BF.matrix());
  CHECK((X_BF.translation() - Eigen::Vector3d(0.157859, 0.158283, 2.036954)).cwiseAbs().maxCoeff() <
        kPrintedPrecision);
  CHECK((X_BF.linear() - expected_rotation).cwiseAbs().maxCoeff() < kPrintedPrecision);
}

TEST_CASE("IK of the worked pose returns 8 distinct branches including the worked solutions",
          "[ik][reference]") {
  const ArmModel arm = test::referenceOrthoArm();
  const OrthoParallelSolver solver(arm);
  const JointVector q = joints({0.3, -0.4, 0.5, 0.6, 0.7, -0.8});
  const IkSolutions result = solver.solve(flangePose(arm, q));

  // With ±180° limits every branch has exactly one value per joint.
  REQUIRE(result.solutions.size() == 8);
  for (int i = 0; i < 8; ++i) {
    CAPTURE(i);
    CHECK(result.branches[i].status == BranchStatus::kSolved);
    for (int j = i + 1; j < 8; ++j) {
      CHECK((result.solutions[i].q - result.solutions[j].q).cwiseAbs().maxCoeff() > 1e-3);
    }
  }
  // domain-facts §4: the given solution and its flipped-wrist twin.
  const auto contains = [&](const JointVector& expected) {
    for (const IkSolution& solution : result.solutions) {
      if ((solution.q - expected).cwiseAbs().maxCoeff() < kPrintedPrecision) return true;
    }
    return false;
  };
  CHECK(contains(q));
  CHECK(contains(joints({0.3, -0.4, 0.5, -2.541593, -0.7, 2.341593})));
}
