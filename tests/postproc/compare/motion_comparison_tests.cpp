#include <catch2/catch.hpp>

#include "kinematics/common/angles.hpp"
#include "postproc/compare/motion_comparison.hpp"
#include "tests/postproc/sample_program.hpp"
#include "tests/postproc/two_programs.hpp"

namespace tw::postproc {
namespace {

constexpr double kDeg = kPi / 180.0;

}  // namespace

TEST_CASE("A program compared with itself is equal", "[compare]") {
  const planner::Program a = test::programA();
  const MotionComparison result = compareMotionPrograms(a, a, "a.twm", ComparisonTolerances{});
  CHECK(result.equal);
  CHECK(result.matched == static_cast<int>(a.records.size()));
  CHECK(result.changes.empty());
  CHECK(result.added.empty());
  CHECK(result.removed.empty());
  REQUIRE(result.largest_joint_delta.size() == 6);
  for (const LargestChange& change : result.largest_joint_delta) CHECK(change.value == 0.0);
  CHECK(result.cycle_time_a == result.cycle_time_b);
}

TEST_CASE("The comparison finds each planted change where it was planted", "[compare]") {
  const MotionComparison result =
      compareMotionPrograms(test::programA(), test::programB(), "b.twm", ComparisonTolerances{});
  CHECK_FALSE(result.equal);
  // Record 8 of A (joint move home) has no partner; record 8 of B is the
  // fifth linear move of seam_1, which A lacks.
  CHECK(result.removed == std::vector<int>{8});
  CHECK(result.added == std::vector<int>{8});
  CHECK(result.matched == 7);
  REQUIRE(result.changes.size() == 3);
  CHECK(result.changes[0].record_a == 4);
  CHECK(result.changes[1].record_a == 5);
  CHECK(result.changes[1].branch_changed);
  CHECK(result.changes[1].branch_b == "shoulder front, elbow down, wrist not flipped");
  CHECK(result.changes[2].record_a == 7);
  CHECK(result.branch_changes == 1);
  // Planted values; the arithmetic only rounds.
  CHECK(result.largest_joint_delta[0].value == Approx(0.5 * kDeg).epsilon(1e-12));
  CHECK(result.largest_joint_delta[0].record_a == 4);
  CHECK(result.largest_joint_delta[1].value == 0.0);
  CHECK(result.largest_position_deviation.value == Approx(0.002).epsilon(1e-12));
  CHECK(result.largest_position_deviation.record_b == 7);
  CHECK(result.largest_angle_deviation.value == Approx(0.0).margin(1e-12));
  CHECK(result.cycle_time_a == Approx(14.7).epsilon(1e-12));
  CHECK(result.cycle_time_b == Approx(13.7).epsilon(1e-12));
}

TEST_CASE("Changes within the tolerances do not count", "[compare]") {
  ComparisonTolerances loose;
  loose.revolute = 1.0 * kDeg;
  loose.position = 0.003;
  const MotionComparison result =
      compareMotionPrograms(test::programA(), test::programB(), "b.twm", loose);
  // Only the branch change is left among the matched records.
  REQUIRE(result.changes.size() == 1);
  CHECK(result.changes[0].record_a == 5);
  // The largest values are reported whether or not they count as changes.
  CHECK(result.largest_joint_delta[0].value == Approx(0.5 * kDeg).epsilon(1e-12));
}

TEST_CASE("The comparison of two arc programs compares their via points too", "[compare]") {
  const planner::Program a = test::arcProgram();
  planner::Program b = a;
  // Record 5 is the half circle (sample data): move its via 0.4 mm outwards
  // and turn its via axis 6 by 0.7°; its target stays where it was.
  planner::ViaPoint& via = *std::get<planner::MotionRecord>(b.records[4]).via;
  via.X_RV.translation().x() += 0.0004;
  via.q_via[5] += 0.7 * kDeg;
  const MotionComparison result = compareMotionPrograms(a, b, "b.twm", ComparisonTolerances{});
  CHECK_FALSE(result.equal);
  CHECK(result.matched == static_cast<int>(a.records.size()));
  REQUIRE(result.changes.size() == 1);
  const RecordChange& change = result.changes[0];
  CHECK(change.record_a == 5);
  CHECK(change.position_deviation == 0.0);
  // Planted values; the arithmetic only rounds.
  CHECK(change.via_position_deviation == Approx(0.0004).epsilon(1e-9));
  REQUIRE(change.via_joint_deltas.size() == 6);
  CHECK(change.via_joint_deltas[5] == Approx(0.7 * kDeg).epsilon(1e-12));
  CHECK(change.via_joint_deltas[0] == 0.0);
  // The largest changes cover via points as well as targets.
  CHECK(result.largest_joint_delta[5].value == Approx(0.7 * kDeg).epsilon(1e-12));
  CHECK(result.largest_joint_delta[5].record_a == 5);
  CHECK(result.largest_position_deviation.value == Approx(0.0004).epsilon(1e-9));
  // Other records carry no via figures.
  const MotionComparison same = compareMotionPrograms(a, a, "a.twm", ComparisonTolerances{});
  CHECK(same.equal);
}

TEST_CASE("Programs for different joints cannot be compared", "[compare]") {
  planner::Program b = test::programA();
  b.metadata.joints[2].name = "elbow";
  CHECK_THROWS_WITH(compareMotionPrograms(test::programA(), b, "b.twm", ComparisonTolerances{}),
                    Catch::StartsWith("b.twm: its joints differ"));
}

}  // namespace tw::postproc
