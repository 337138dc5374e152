// The two margins: the cell margin for pairs with a cell body, the self
// margin for the arm's links and its tool among themselves; and the
// clearance query by pair group.
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>
#include <set>
#include <string>

#include "collision/collision_world.hpp"
#include "tests/collision/test_arms.hpp"

namespace tw::collision {
namespace {

kinematics::JointVector slide(double x) {
  kinematics::JointVector q(1);
  q[0] = x;
  return q;
}

std::set<std::string> pairNames(const CollisionWorld& world, int a, int b) {
  return {world.bodyName(a), world.bodyName(b)};
}

/// The slider arm with a ball r = 0.1 at the base origin, a ball r = 0.05
/// 1 m above the carriage origin (clear of everything; it only keeps the
/// tool from being the base's neighbour along the chain) and a tool ball
/// r = 0.1 at the flange; a wall whose face is at x = 1.0 (x ∈ [1.0, 1.4],
/// y and z ∈ [−0.5, 0.5]). At slide position q ∈ (0.2, 0.9) the tool is
/// q − 0.2 from the base ball (a self pair) and 0.9 − q from the wall (a
/// cell pair); the carriage ball stays at least √(0.7² + 0.5²) − 0.05 m
/// from the wall for q ≤ 0.3 (elementary geometry).
WorldDescription ballsAndWall(double cell_margin, double self_margin) {
  WorldDescription description;
  description.clearance_margin = cell_margin;
  description.self_margin = self_margin;
  ToolDescription tool;
  tool.name = "tool";
  tool.shapes = {test::sphereShape(0.1, Eigen::Vector3d::Zero())};
  description.tool = tool;
  description.bodies.push_back(
      {"wall", BodyRole::kObstacle, "",
       {test::boxShape(Eigen::Vector3d(0.4, 1.0, 1.0), Eigen::Vector3d(1.2, 0, 0))}});
  return description;
}

kinematics::ArmModel ballArm() {
  return test::sliderArm({test::sphereShape(0.05, Eigen::Vector3d(0, 0, 1.0))},
                         {test::sphereShape(0.1, Eigen::Vector3d::Zero())});
}

TEST_CASE("A self pair between the two margins is valid, a cell pair at that distance is not") {
  const kinematics::ArmModel arm = ballArm();

  SECTION("cell margin 30 mm, self margin 10 mm") {
    const CollisionWorld world(arm, ballsAndWall(0.030, 0.010));
    CollisionWorkspace workspace(world);
    CHECK(world.clearanceMargin() == 0.030);
    CHECK(world.selfMargin() == 0.010);
    // 15 mm from the base ball: beyond the self margin, valid.
    CHECK(world.checkState(slide(0.215), workspace).status == StateStatus::kFree);
    // 15 mm from the wall: within the cell margin.
    const StateResult wall = world.checkState(slide(0.885), workspace);
    CHECK(wall.status == StateStatus::kWithinMargin);
    CHECK(pairNames(world, wall.body_a, wall.body_b) == std::set<std::string>{"tool", "wall"});
    // 35 mm from the wall is enough, 5 mm from the base ball is not.
    CHECK(world.checkState(slide(0.865), workspace).status == StateStatus::kFree);
    const StateResult base = world.checkState(slide(0.205), workspace);
    CHECK(base.status == StateStatus::kWithinMargin);
    CHECK(pairNames(world, base.body_a, base.body_b) == std::set<std::string>{"base", "tool"});
  }
  SECTION("the margins the other way round: the same states swap verdicts") {
    const CollisionWorld world(arm, ballsAndWall(0.010, 0.030));
    CollisionWorkspace workspace(world);
    CHECK(world.checkState(slide(0.215), workspace).status == StateStatus::kWithinMargin);
    CHECK(world.checkState(slide(0.885), workspace).status == StateStatus::kFree);
  }
  SECTION("the defaults are 10 mm for both, as one margin was before") {
    WorldDescription description = ballsAndWall(0.010, 0.010);
    const WorldDescription defaults;
    CHECK(defaults.clearance_margin == 0.010);  // the documented default
    CHECK(defaults.self_margin == 0.010);       // the documented default
    const CollisionWorld world(arm, description);
    CollisionWorkspace workspace(world);
    CHECK(world.checkState(slide(0.215), workspace).valid());
    CHECK(world.checkState(slide(0.885), workspace).valid());
    CHECK_FALSE(world.checkState(slide(0.205), workspace).valid());
    CHECK_FALSE(world.checkState(slide(0.895), workspace).valid());
  }
}

TEST_CASE("The clearance to the cell ignores a nearer self pair") {
  const CollisionWorld world(ballArm(), ballsAndWall(0.010, 0.010));
  CollisionWorkspace workspace(world);
  // At q = 0.3 the tool ball (centre x = 0.3) is 0.3 − 0.2 = 0.1 from the
  // base ball and 0.9 − 0.3 = 0.6 from the wall; the carriage ball is
  // √(0.7² + 0.5²) − 0.05 ≈ 0.81 from it (elementary geometry, see
  // ballsAndWall). 1e-9: primitive distances are exact up to rounding.
  ClearanceQuery cell_query;
  cell_query.pairs = PairGroup::kCell;
  const Clearance cell = world.clearance(slide(0.3), workspace, cell_query);
  CHECK(cell.distance == Approx(0.6).margin(1e-9));
  CHECK(world.bodyName(cell.body_a) == "tool");
  CHECK(world.bodyName(cell.body_b) == "wall");
  // Witnesses: the tool ball's point nearest the wall and the wall's face
  // straight ahead of it (same geometry).
  CHECK((cell.p_WA - Eigen::Vector3d(0.4, 0, 0)).norm() < 1e-9);
  CHECK((cell.p_WB - Eigen::Vector3d(1.0, 0, 0)).norm() < 1e-9);

  ClearanceQuery self_query;
  self_query.pairs = PairGroup::kSelf;
  const Clearance self = world.clearance(slide(0.3), workspace, self_query);
  CHECK(self.distance == Approx(0.1).margin(1e-9));
  CHECK(pairNames(world, self.body_a, self.body_b) == std::set<std::string>{"base", "tool"});
  // All pairs together: the nearer, self pair.
  CHECK(world.clearance(slide(0.3), workspace).distance == Approx(0.1).margin(1e-9));

  SECTION("a world without cell bodies has no clearance to the cell") {
    WorldDescription bare = ballsAndWall(0.010, 0.010);
    bare.bodies.clear();
    const CollisionWorld alone(ballArm(), bare);
    CollisionWorkspace alone_workspace(alone);
    const Clearance none = alone.clearance(slide(0.3), alone_workspace, cell_query);
    CHECK(none.distance == std::numeric_limits<double>::infinity());
    CHECK(none.body_a == -1);
    CHECK(alone.clearance(slide(0.3), alone_workspace, self_query).distance ==
          Approx(0.1).margin(1e-9));
  }
}

TEST_CASE("A non-positive or non-finite margin is refused by name") {
  const kinematics::ArmModel arm = ballArm();
  WorldDescription description = ballsAndWall(0.010, 0.010);
  SECTION("self margin negative") {
    description.self_margin = -0.001;
    CHECK_THROWS_WITH(CollisionWorld(arm, description),
                      Catch::Contains("self margin") &&
                          Catch::Contains("must be a positive length, got -0.001"));
  }
  SECTION("self margin zero") {
    description.self_margin = 0.0;
    CHECK_THROWS_WITH(CollisionWorld(arm, description), Catch::Contains("self margin"));
  }
  SECTION("cell margin not a number") {
    description.clearance_margin = std::numeric_limits<double>::quiet_NaN();
    CHECK_THROWS_WITH(CollisionWorld(arm, description),
                      Catch::Contains("clearance margin") &&
                          Catch::Contains("must be a positive length"));
  }
}

/// Three plates 2 mm thick across the slide's x axis: one 0.4 m square on
/// the base at x = 0.6, the tool (0.05 m square, at the flange) and a cell
/// plate 0.4 m square at x = −0.6. The carriage ball is 1 m up, clear of
/// all three. Slide position x is invalid where the tool's centre plane is
/// within 2 mm + the pair's margin of another plate's.
CollisionWorld thinPlates(double cell_margin, double self_margin) {
  WorldDescription description;
  description.clearance_margin = cell_margin;
  description.self_margin = self_margin;
  ToolDescription tool;
  tool.name = "blade";
  tool.shapes = {test::boxShape(Eigen::Vector3d(0.002, 0.05, 0.05), Eigen::Vector3d::Zero())};
  description.tool = tool;
  description.bodies.push_back(
      {"screen", BodyRole::kObstacle, "",
       {test::boxShape(Eigen::Vector3d(0.002, 0.4, 0.4), Eigen::Vector3d(-0.6, 0, 0))}});
  const kinematics::LinkShape base_plate =
      test::boxShape(Eigen::Vector3d(0.002, 0.4, 0.4), Eigen::Vector3d(0.6, 0, 0));
  return CollisionWorld(
      test::sliderArm({test::sphereShape(0.05, Eigen::Vector3d(0, 0, 1.0))}, {base_plate}),
      description);
}

TEST_CASE("The segment check steps finely enough for each pair's margin") {
  // Over a 0.6 m slide, stepping by the larger margin (50 mm) alone gives 13
  // intervals of 46 mm, whose states (x = 0.3 + k · 0.0462) all miss the
  // 12 mm wide invalid band about the far plate (|x − 0.6| < 6 mm): the plate
  // would be stepped over. Stepping by the 4 mm margin cannot miss it.
  SECTION("a thin plate of the arm's own base, small self margin") {
    const CollisionWorld world = thinPlates(0.050, 0.004);
    CollisionWorkspace workspace(world);
    REQUIRE(world.checkState(slide(0.3), workspace).valid());
    REQUIRE(world.checkState(slide(0.9), workspace).valid());
    const SegmentResult through = world.checkSegment(slide(0.3), slide(0.9), workspace);
    CHECK_FALSE(through.valid());
    CHECK(pairNames(world, through.state.body_a, through.state.body_b) ==
          std::set<std::string>{"base", "blade"});
    CHECK(std::abs(0.3 + 0.6 * through.fraction - 0.6) < 0.006);
  }
  SECTION("a thin cell plate, small cell margin") {
    const CollisionWorld world = thinPlates(0.004, 0.050);
    CollisionWorkspace workspace(world);
    REQUIRE(world.checkState(slide(-0.3), workspace).valid());
    REQUIRE(world.checkState(slide(-0.9), workspace).valid());
    const SegmentResult through = world.checkSegment(slide(-0.3), slide(-0.9), workspace);
    CHECK_FALSE(through.valid());
    CHECK(pairNames(world, through.state.body_a, through.state.body_b) ==
          std::set<std::string>{"blade", "screen"});
    CHECK(std::abs(-0.3 - 0.6 * through.fraction + 0.6) < 0.006);
  }
  SECTION("a valid segment checks as many states as the larger bound ÷ margin asks") {
    const CollisionWorld world = thinPlates(0.050, 0.004);
    CollisionWorkspace workspace(world);
    const SegmentResult clear = world.checkSegment(slide(0.3), slide(0.5), workspace);
    CHECK(clear.valid());
    // A slide moves every point by exactly its travel (lever 1, see
    // world_model.cpp), relative to the base as well: 0.2 m.
    CHECK(world.motionBound(slide(0.3), slide(0.5)) == Approx(0.2).margin(1e-12));
    CHECK(world.selfMotionBound(slide(0.3), slide(0.5)) == Approx(0.2).margin(1e-12));
    const double intervals =
        std::max(world.motionBound(slide(0.3), slide(0.5)) / world.clearanceMargin(),
                 world.selfMotionBound(slide(0.3), slide(0.5)) / world.selfMargin());
    CHECK(clear.states_checked == static_cast<int>(intervals) + 2);
  }
}

}  // namespace
}  // namespace tw::collision
