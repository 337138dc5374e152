// Numeric IK (damped least squares, Levenberg–Marquardt) on chains with and
// without a closed form.
#include <catch2/catch.hpp>

#include "kinematics/arm_loader.hpp"
#include "kinematics/forward_kinematics.hpp"
#include "kinematics/numeric_ik.hpp"
#include "kinematics/ortho_parallel_ik.hpp"
#include "tests/kinematics/test_arms.hpp"

using namespace tw::kinematics;

namespace {

// The solver's own tolerance is 1e-11; allow for rounding in the check.
constexpr double kSolvedPosition = 1e-9;
constexpr double kSolvedAngle = 1e-9;

}  // namespace

TEST_CASE("Numeric IK agrees with the closed form on an ortho-parallel arm", "[ik][numeric]") {
  const ArmModel arm = test::referenceOrthoArmMultiTurn();
  const OrthoParallelSolver closed_form(arm);
  std::mt19937_64 generator(301);
  int converged = 0;
  for (int i = 0; i < 200; ++i) {
    const JointVector target_q = test::randomJoints(arm, generator);
    const Eigen::Isometry3d X_BF = flangePose(arm, target_q);
    // A seed near the answer, as when tracking along a seam.
    JointVector seed = target_q;
    for (int j = 0; j < 6; ++j) seed[j] += 0.2 * (test::unitDraw(generator) - 0.5);
    const NumericIkResult result = solveNumericIk(arm, X_BF, seed);
    CAPTURE(i, target_q.transpose(), seed.transpose());
    if (!result.converged) continue;
    ++converged;
    CHECK(arm.withinLimits(result.q));
    const IkSolutions all = closed_form.solve(X_BF);
    bool found = false;
    for (const IkSolution& solution : all.solutions) {
      // Both are converged to ~1e-11 in the pose; joints agree to ~1e-8.
      found = found || (solution.q - result.q).cwiseAbs().maxCoeff() < 1e-7;
    }
    CHECK(found);
  }
  // Seeds within ±0.1 rad converge nearly always; a few hit a clamped limit.
  CHECK(converged > 190);
}

TEST_CASE("Multi-start numeric IK finds only closed-form branches, most of them",
          "[ik][numeric]") {
  const ArmModel arm = test::referenceOrthoArm();
  const OrthoParallelSolver closed_form(arm);
  JointVector q(6);
  q << 0.3, -0.4, 0.5, 0.6, 0.7, -0.8;  // the worked vector of domain-facts §4
  const Eigen::Isometry3d X_BF = flangePose(arm, q);
  const IkSolutions all = closed_form.solve(X_BF);
  const std::vector<JointVector> found = enumerateNumericIk(arm, X_BF);
  for (const JointVector& solution : found) {
    bool listed = false;
    for (const IkSolution& exact : all.solutions) {
      listed = listed || (exact.q - solution).cwiseAbs().maxCoeff() < 1e-6;
    }
    CAPTURE(solution.transpose());
    CHECK(listed);
  }
  // 100 random starts over ±180° find most of the 8 branches.
  CHECK(found.size() >= 4);
  CHECK(found.size() <= 8);
  SECTION("the same seed gives the same list") {
    CHECK(enumerateNumericIk(arm, X_BF) == found);
  }
}

TEST_CASE("Numeric IK solves a general chain that has no closed form", "[ik][numeric]") {
  const ArmModel arm =
      loadArmDescription(test::sourcePath("tests/kinematics/data/general_chain.xml"));
  REQUIRE_FALSE(arm.orthoParallel());
  std::mt19937_64 generator(311);
  int converged = 0;
  for (int i = 0; i < 100; ++i) {
    const JointVector target_q = test::randomJoints(arm, generator);
    const Eigen::Isometry3d X_BF = flangePose(arm, target_q);
    MultiStartOptions options;
    options.starts = 20;
    options.seed = 1000 + i;
    const std::vector<JointVector> solutions = enumerateNumericIk(arm, X_BF, options);
    CAPTURE(i, target_q.transpose());
    if (solutions.empty()) continue;
    ++converged;
    for (const JointVector& solution : solutions) {
      const Eigen::Isometry3d X = flangePose(arm, solution);
      CHECK((X.translation() - X_BF.translation()).norm() < kSolvedPosition);
      CHECK(test::rotationAngleBetween(X.linear(), X_BF.linear()) < kSolvedAngle);
      CHECK(arm.withinLimits(solution));
    }
  }
  // Every target is reachable by construction; 20 starts almost always find one.
  CHECK(converged >= 95);
}

TEST_CASE("Numeric IK reports a target beyond reach as not converged", "[ik][numeric]") {
  const ArmModel arm = test::sampleArm();
  Eigen::Isometry3d X_BF = Eigen::Isometry3d::Identity();
  X_BF.translation() << 3.0, 0.0, 1.0;  // twice the reach
  JointVector seed = JointVector::Zero(6);
  const NumericIkResult result = solveNumericIk(arm, X_BF, seed);
  CHECK_FALSE(result.converged);
  CHECK(result.q.allFinite());
  CHECK(arm.withinLimits(result.q));
  CHECK(result.position_error > 1.0);
}
