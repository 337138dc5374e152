// Closed-form IK of ortho-parallel arms: round trips, branch counts, edge
// cases, and agreement with Orocos KDL's numeric LMA solver.
#include <catch2/catch.hpp>

#include <cmath>
#include <kdl/chainiksolverpos_lma.hpp>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"
#include "kinematics/forward_kinematics.hpp"
#include "kinematics/ortho_parallel_ik.hpp"
#include "kinematics/reach_shell.hpp"
#include "kinematics/singularity.hpp"
#include "tests/kinematics/kdl_chain.hpp"
#include "tests/kinematics/test_arms.hpp"

using namespace tw::kinematics;

namespace {

// The bar for FK∘IK: position ≤ 1e-9 m, orientation ≤ 1e-9 rad.
constexpr double kRoundTripPosition = 1e-9;
constexpr double kRoundTripAngle = 1e-9;

bool samePose(const Eigen::Isometry3d& a, const Eigen::Isometry3d& b) {
  return (a.translation() - b.translation()).norm() <= kRoundTripPosition &&
         test::rotationAngleBetween(a.linear(), b.linear()) <= kRoundTripAngle;
}

bool allFinite(const IkSolutions& result) {
  for (const IkSolution& solution : result.solutions) {
    if (!solution.q.allFinite()) return false;
  }
  for (const BranchOutcome& outcome : result.branches) {
    if (outcome.status != BranchStatus::kOutOfReach && !outcome.q.allFinite()) return false;
  }
  return true;
}

/// Whether `q` equals one of the solutions (all multi-turn values are listed).
bool containsJoints(const IkSolutions& result, const JointVector& q, double tolerance) {
  for (const IkSolution& solution : result.solutions) {
    if ((solution.q - q).cwiseAbs().maxCoeff() < tolerance) return true;
  }
  return false;
}

void checkRoundTrips(const ArmModel& arm, int poses, std::uint64_t seed, int max_solutions) {
  const OrthoParallelSolver solver(arm);
  IkSolutions result;
  std::mt19937_64 generator(seed);
  for (int i = 0; i < poses; ++i) {
    const JointVector q = test::randomJoints(arm, generator);
    const Eigen::Isometry3d X_BF = flangePose(arm, q);
    CAPTURE(i, q.transpose());
    solver.solve(X_BF, {}, result);
    REQUIRE(allFinite(result));
    REQUIRE(static_cast<int>(result.solutions.size()) <= max_solutions);
    // The configuration that made the pose is one of the answers. Rounding
    // near the wrist singularity moves axes 4/6 more, hence the looser bound.
    CHECK(containsJoints(result, q, 1e-6));
    for (const IkSolution& solution : result.solutions) {
      CAPTURE(solution.q.transpose(), solution.branch_index);
      REQUIRE(arm.withinLimits(solution.q));
      CHECK(samePose(flangePose(arm, solution.q), X_BF));
    }
  }
}

}  // namespace

TEST_CASE("FK of every returned branch gives back the target pose", "[ik]") {
  SECTION("reference arm, ±180° limits: never more than 8 solutions, 10,000 poses") {
    checkRoundTrips(test::referenceOrthoArm(), 10000, 101, 8);
  }
  SECTION("reference arm with ±350° axes 4 and 6: multi-turn values listed, 10,000 poses") {
    // 8 branches × up to 2 values of axis 4 × up to 2 of axis 6 (±350° spans
    // 700°, so each angle has at most two equivalents inside).
    checkRoundTrips(test::referenceOrthoArmMultiTurn(), 10000, 102, 32);
  }
  SECTION("the invented sample arm, 10,000 poses") {
    // Axis 4 ±190° (up to 2 values), axis 6 ±360° (up to 3 at ±180°).
    checkRoundTrips(test::sampleArm(), 10000, 103, 48);
  }
}

TEST_CASE("With ±180° limits all 8 branches exist and are distinct away from singularities",
          "[ik]") {
  const ArmModel arm = test::referenceOrthoArm();
  const OrthoParallelSolver solver(arm);
  std::mt19937_64 generator(111);
  int poses_with_all_eight = 0;
  for (int i = 0; i < 2000; ++i) {
    const Eigen::Isometry3d X_BF = flangePose(arm, test::randomJoints(arm, generator));
    const IkSolutions result = solver.solve(X_BF);
    if (result.solutions.size() != 8) continue;
    ++poses_with_all_eight;
    for (int a = 0; a < 8; ++a) {
      CHECK(result.solutions[a].branch_index == a);
      for (int b = a + 1; b < 8; ++b) {
        CHECK((result.solutions[a].q - result.solutions[b].q).cwiseAbs().maxCoeff() > 1e-6);
      }
    }
  }
  // Random poses of an arm with full ±180° ranges mostly reach all branches.
  CHECK(poses_with_all_eight > 100);
}

TEST_CASE("Branch labels follow the geometry", "[ik]") {
  const ArmModel arm = test::sampleArm();
  const OrthoParallelSolver solver(arm);
  // A pose in front of the arm, wrist bent: the front/up/not-flipped branch
  // has the elbow above the shoulder–wrist line and axis 5 positive.
  JointVector q(6);
  q << 0.2, 0.3, 0.2, 0.4, 0.8, 0.1;
  const IkSolutions result = solver.solve(flangePose(arm, q));
  const BranchOutcome& outcome = result.branches[ArmBranch{}.index()];
  REQUIRE(outcome.status == BranchStatus::kSolved);
  CHECK(outcome.q.isApprox(q, 1e-9));
  CHECK(ArmBranch{}.toString() == "shoulder front, elbow up, wrist not flipped");
  LinkPoses poses;
  computeLinkPoses(arm, outcome.q, poses);
  const Eigen::Vector3d shoulder = poses.X_BL[2].translation();
  const Eigen::Vector3d elbow = poses.X_BL[3].translation();
  const Eigen::Vector3d wrist = poses.X_BL[6].translation();
  // Height of the elbow above the straight line from shoulder to wrist centre.
  const double along = (elbow - shoulder).dot((wrist - shoulder).normalized());
  const Eigen::Vector3d on_line = shoulder + along * (wrist - shoulder).normalized();
  CHECK(elbow.z() > on_line.z());
  for (int index = 0; index < 8; ++index) {
    CHECK(ArmBranch::fromIndex(index).index() == index);
  }
}

TEST_CASE("Every in-limit branch found by 100 seeded KDL LMA solves is among the closed-form ones",
          "[ik][kdl]") {
  // Orocos KDL ChainIkSolverPos_LMA, a general-purpose reference library. It
  // ignores limits and returns angles outside ±π (library notes): wrap each
  // answer into the limits before comparing.
  const ArmModel arm = test::referenceOrthoArmMultiTurn();
  const OrthoParallelSolver solver(arm);
  const KDL::Chain chain = test::kdlChain(arm);
  // Tighter than KDL's default stop (eps = 1e-5, which leaves joints ~1e-3
  // rad off), so that answers can be compared closely.
  KDL::ChainIkSolverPos_LMA lma(chain, 1e-12, 1000, 1e-15);
  std::mt19937_64 generator(121);
  int compared = 0;
  for (int pose = 0; pose < 20; ++pose) {
    const Eigen::Isometry3d X_BF = flangePose(arm, test::randomJoints(arm, generator));
    const IkSolutions closed_form = solver.solve(X_BF);
    const KDL::Frame target = test::toKdl(X_BF);
    for (int start = 0; start < 100; ++start) {
      JointVector seed(6);
      for (int j = 0; j < 6; ++j) seed[j] = -tw::kPi + 2 * tw::kPi * test::unitDraw(generator);
      KDL::JntArray answer(6);
      if (lma.CartToJnt(test::kdlJoints(seed), target, answer) < 0) continue;
      JointVector q = test::fromKdl(answer);
      // Bring each angle to its first equivalent at or above the lower limit.
      for (int j = 0; j < 6; ++j) {
        q[j] -= std::floor((q[j] - arm.lowerLimits()[j]) / (2 * tw::kPi)) * 2 * tw::kPi;
      }
      if (!arm.withinLimits(q)) continue;
      // At eps = 1e-12 LMA's joints agree to ~1e-6; branches are tenths of a
      // radian apart.
      CAPTURE(pose, start, q.transpose());
      CHECK(containsJoints(closed_form, q, 1e-5));
      ++compared;
    }
  }
  CHECK(compared > 500);
}

TEST_CASE("Edge cases give exact answers or clear outcomes, never NaN", "[ik][edge]") {
  const ArmModel arm = test::sampleArm();
  const OrthoParallelSolver solver(arm);
  const OrthoParallelGeometry& g = *arm.orthoParallel();
  const double stretch = -std::atan2(g.a2, g.c3);  // θ3 that lines the forearm up with the upper arm

  SECTION("fully stretched arm") {
    JointVector q(6);
    q << 0.3, 0.4, stretch, 0.5, 0.6, 0.7;
    const Eigen::Isometry3d X_BF = flangePose(arm, q);
    const IkSolutions result = solver.solve(X_BF);
    REQUIRE(allFinite(result));
    REQUIRE(!result.solutions.empty());
    for (const IkSolution& solution : result.solutions) {
      CHECK(samePose(flangePose(arm, solution.q), X_BF));
    }
    CHECK(singularityMeasures(arm, result.solutions.front().q).elbow.value() < 1e-6);
  }

  SECTION("a target 1 mm beyond reach is out of reach on every branch") {
    JointVector q(6);
    q << 0.3, 0.4, stretch, 0.0, 0.0, 0.0;
    LinkPoses poses;
    computeLinkPoses(arm, q, poses);
    const Eigen::Vector3d outward =
        (poses.X_BL[6].translation() - poses.X_BL[2].translation()).normalized();
    Eigen::Isometry3d X_BF = poses.X_BF;
    X_BF.translation() += 0.001 * outward;
    const IkSolutions result = solver.solve(X_BF);
    CHECK(result.solutions.empty());
    for (const BranchOutcome& outcome : result.branches) {
      CHECK(outcome.status == BranchStatus::kOutOfReach);
    }
    CHECK_FALSE(ReachShell(arm).mayReach(ReachShell(arm).wristCentre(X_BF)));
  }

  SECTION("wrist centre on axis 1 (b = 0): axis 1 is free, the pose is still met") {
    // Choose q2, q3 so that the wrist centre is above the base: a1 + c2 sin q2
    // + k sin(q2 + q3 + ψ) = 0 with q2 = 0 gives sin(q3 + ψ) = −a1/k.
    const double k = std::hypot(g.a2, g.c3);
    JointVector q(6);
    q << 0.0, 0.0, std::asin(-g.a1 / k) + stretch, 0.4, 0.5, 0.6;
    const Eigen::Isometry3d X_BF = flangePose(arm, q);
    REQUIRE(std::hypot((X_BF * arm.flangeInLastLink().inverse()).translation().x(),
                       (X_BF * arm.flangeInLastLink().inverse()).translation().y()) < 1e-12);
    const IkSolutions result = solver.solve(X_BF);
    REQUIRE(allFinite(result));
    REQUIRE(!result.solutions.empty());
    for (const IkSolution& solution : result.solutions) {
      CHECK(samePose(flangePose(arm, solution.q), X_BF));
    }
    CHECK(singularityMeasures(arm, q).shoulder.value() < 1e-12);
  }

  SECTION("wrist centre inside the offset cylinder (b ≠ 0) is out of reach") {
    const ArmModel offset_arm = test::referenceOrthoArm();  // b = 0.05 m
    const OrthoParallelSolver offset_solver(offset_arm);
    Eigen::Isometry3d X_BF = Eigen::Isometry3d::Identity();
    X_BF.translation() << 0.01, 0.0, 1.5 + 0.15;  // wrist centre 1 cm from axis 1
    const IkSolutions result = offset_solver.solve(X_BF);
    CHECK(result.solutions.empty());
    CHECK(result.branches[0].status == BranchStatus::kOutOfReach);
  }

  SECTION("axis 5 = 0 keeps axis 4 at the caller's reference") {
    for (const double reference : {0.0, 1.0, -2.5}) {
      CAPTURE(reference);
      JointVector q(6);
      q << 0.3, 0.2, 0.1, 0.7, 0.0, -0.4;
      const Eigen::Isometry3d X_BF = flangePose(arm, q);
      IkOptions options;
      options.axis4_reference = reference;
      const IkSolutions result = solver.solve(X_BF, options);
      const BranchOutcome& outcome = result.branches[ArmBranch{}.index()];
      REQUIRE(outcome.status == BranchStatus::kSolved);
      CHECK(outcome.wrist_singular);
      CHECK(outcome.q[3] == Approx(reference).margin(1e-12));
      CHECK(outcome.q[4] == Approx(0.0).margin(1e-12));
      // θ4 + θ6 is what the pose fixes: 0.7 − 0.4.
      CHECK(std::remainder(outcome.q[3] + outcome.q[5] - 0.3, 2 * tw::kPi) == Approx(0.0).margin(1e-9));
      for (const IkSolution& solution : result.solutions) {
        CHECK(samePose(flangePose(arm, solution.q), X_BF));
      }
    }
  }

  // The sample arm with some limits replaced.
  const auto withLimits = [&](const std::vector<JointSpec>& limits) {
    ArmDescription description;
    description.name = "changed-limits";
    description.ortho_parallel = g;
    description.joints = orthoParallelChain(g, limits);
    description.X_LF = arm.flangeInLastLink();
    return ArmModel(description);
  };

  SECTION("a joint limit exactly at the solution is inside the limits") {
    JointVector q(6);
    q << 0.3, 0.2, 0.1, 0.7, 0.5, -0.4;
    std::vector<JointSpec> limits = arm.joints();
    limits[0].upper = q[0];
    limits[4].lower = q[4];
    const ArmModel limited = withLimits(limits);
    const IkSolutions result = OrthoParallelSolver(limited).solve(flangePose(limited, q));
    const BranchOutcome& outcome = result.branches[ArmBranch{}.index()];
    REQUIRE(outcome.status == BranchStatus::kSolved);
    const IkSolution& solution = result.solutions[outcome.first_solution];
    CHECK(solution.q[0] <= limited.upperLimits()[0]);
    CHECK(solution.q[0] == Approx(q[0]).margin(1e-9));
    CHECK(solution.q[4] >= limited.lowerLimits()[4]);
  }

  SECTION("a branch outside the limits says which joint and by how much") {
    JointVector q(6);
    q << 0.3, 0.2, 0.1, 0.7, 0.5, -0.4;
    std::vector<JointSpec> limits = arm.joints();
    limits[4].lower = 0.6;  // axis 5 may only bend from 0.6 to 1.0 rad
    limits[4].upper = 1.0;
    const ArmModel limited = withLimits(limits);
    const IkSolutions result = OrthoParallelSolver(limited).solve(flangePose(limited, q));
    const BranchOutcome& outcome = result.branches[ArmBranch{}.index()];
    REQUIRE(outcome.status == BranchStatus::kJointLimit);
    CHECK(outcome.limit_joint == 4);
    CHECK(outcome.limit_value == Approx(0.5).margin(1e-9));
    CHECK(outcome.solution_count == 0);
    CHECK(outcome.q.isApprox(q, 1e-9));
  }
}

TEST_CASE("The closed-form solver refuses an arm without ortho-parallel parameters", "[ik]") {
  ArmDescription description;
  description.name = "general";
  description.source = "general.xml";
  description.joints = test::referenceOrthoArm().joints();
  const ArmModel arm(description);
  CHECK_THROWS_AS(OrthoParallelSolver(arm), tw::InputError);
}
