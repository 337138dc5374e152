#include "planner/transit/transit_planner.hpp"

#include <catch2/catch.hpp>
#include <ompl/base/ScopedState.h>
#include <ompl/base/SpaceInformation.h>
#include <ompl/base/spaces/RealVectorStateSpace.h>
#include <stdexcept>
#include <thread>

#include "kinematics/common/input_error.hpp"
#include "planner/transit/collision_validity_checker.hpp"
#include "planner/transit/ompl_joint_state.hpp"
#include "tests/planner/transit_test_world.hpp"

namespace tw::planner {
namespace {

using kinematics::JointVector;

/// Generous for a test: the demo plans take milliseconds, and a slow,
/// shared machine must not turn a found path into a timeout.
constexpr double kTestTimeLimit = 10.0;
/// A segment valid by checkSegment keeps half the margin (collision_world.hpp);
/// 0.4 leaves room for rounding in FCL's distances.
constexpr double kDenseMarginFactor = 0.4;

TransitRequest demoRequest(const std::string& planner_name, unsigned seed) {
  TransitRequest request;
  request.start = test::demoStart();
  request.goals = {test::demoGoal()};
  request.planner = planner_name;
  request.seed = seed;
  request.time_limit = kTestTimeLimit;
  return request;
}

/// Checks what every accepted transit must satisfy: ends exactly at the start
/// and the chosen goal, and free on the dense re-check with 0.4 of the margin
/// at 1 mm steps of any point of the arm and tool (independent of the
/// planner's segment check).
void checkAcceptedPath(const TransitRequest& request, const TransitResult& result,
                       const collision::CollisionWorld& dense_world) {
  CAPTURE(result.reason);
  REQUIRE(result.solved());
  REQUIRE(result.path.size() >= 2);
  REQUIRE(result.goal_index >= 0);
  CHECK(result.path.front() == request.start);
  CHECK(result.path.back() == request.goals[result.goal_index]);
  CHECK_FALSE(test::firstCollidingSegment(dense_world, result.path).has_value());
}

TEST_CASE("A free straight segment is taken directly", "[transit]") {
  const collision::CollisionWorld world(test::sampleArm(), test::demoCellDescription());
  const collision::CollisionWorld dense(test::sampleArm(),
                                        test::withMargin(test::demoCellDescription(), kDenseMarginFactor));
  TransitRequest request = demoRequest("RRTConnect", 1);
  JointVector near_goal = test::demoStart();
  near_goal[0] += 0.3;  // same side of the wall
  request.goals = {near_goal};
  const TransitResult result = TransitPlanner(world).plan(request);
  checkAcceptedPath(request, result, dense);
  CHECK(result.direct);
  CHECK(result.path.size() == 2);
  CHECK(result.length == Approx(0.3));  // one joint moved by 0.3 rad
}

TEST_CASE("A transit around the wall passes the dense re-check", "[transit]") {
  const collision::CollisionWorld world(test::sampleArm(), test::demoCellDescription());
  const collision::CollisionWorld dense(test::sampleArm(),
                                        test::withMargin(test::demoCellDescription(), kDenseMarginFactor));
  const TransitPlanner planner(world);
  // The premise: the straight segment runs through the wall.
  REQUIRE(test::firstCollidingSegment(world, {test::demoStart(), test::demoGoal()}).has_value());

  for (unsigned seed : {1u, 2u, 3u, 4u, 5u}) {
    CAPTURE(seed);
    const TransitRequest request = demoRequest("RRTConnect", seed);
    const TransitResult result = planner.plan(request);
    checkAcceptedPath(request, result, dense);
    CHECK_FALSE(result.direct);
    CHECK(result.state_checks > 0);
    CHECK(result.segment_checks > 0);
    // Shortcuts and B-spline corner cuts replace a polyline by chords of it.
    CHECK(result.length <= result.planned_length + 1e-9);
  }
}

TEST_CASE("The same seed gives the identical path, another seed another one", "[transit]") {
  const collision::CollisionWorld world(test::sampleArm(), test::demoCellDescription());
  const TransitPlanner planner(world);
  for (const std::string& name : {std::string("RRTConnect"), std::string("KPIECE1"),
                                  std::string("BiTRRT")}) {
    CAPTURE(name);
    const TransitResult first = planner.plan(demoRequest(name, 7));
    const TransitResult again = planner.plan(demoRequest(name, 7));
    REQUIRE(first.solved());
    REQUIRE(again.solved());
    CHECK(first.path == again.path);
    CHECK(first.state_checks == again.state_checks);
  }
  // Seeding must matter: of three other seeds at least one plans differently.
  const TransitResult reference = planner.plan(demoRequest("RRTConnect", 7));
  bool any_different = false;
  for (unsigned seed : {8u, 9u, 10u}) {
    any_different = any_different || planner.plan(demoRequest("RRTConnect", seed)).path != reference.path;
  }
  CHECK(any_different);
}

TEST_CASE("Plans from several threads at once equal the plans made one by one", "[transit]") {
  const collision::CollisionWorld world(test::sampleArm(), test::demoCellDescription());
  const TransitPlanner planner(world);
  const TransitResult serial_a = planner.plan(demoRequest("RRTConnect", 21));
  const TransitResult serial_b = planner.plan(demoRequest("RRTConnect", 22));
  TransitResult parallel_a, parallel_b;
  std::thread first([&] { parallel_a = planner.plan(demoRequest("RRTConnect", 21)); });
  std::thread second([&] { parallel_b = planner.plan(demoRequest("RRTConnect", 22)); });
  first.join();
  second.join();
  REQUIRE(serial_a.solved());
  REQUIRE(serial_b.solved());
  CHECK(parallel_a.path == serial_a.path);
  CHECK(parallel_b.path == serial_b.path);
}

TEST_CASE("Every listed planner succeeds on the demo cell", "[transit]") {
  const collision::CollisionWorld world(test::sampleArm(), test::demoCellDescription());
  const collision::CollisionWorld dense(test::sampleArm(),
                                        test::withMargin(test::demoCellDescription(), kDenseMarginFactor));
  const TransitPlanner planner(world);
  REQUIRE_FALSE(transitPlannerNames().empty());
  CHECK(transitPlannerNames().front() == "RRTConnect");
  for (const std::string& name : transitPlannerNames()) {
    CAPTURE(name);
    const TransitRequest request = demoRequest(name, 3);
    const TransitResult result = planner.plan(request);
    checkAcceptedPath(request, result, dense);
    CHECK(result.planner == name);
  }
}

TEST_CASE("A thin fence that OMPL's default motion check steps over is not crossed", "[transit]") {
  const collision::WorldDescription description = test::thinFenceDescription();
  const collision::CollisionWorld world(test::sampleArm(), description);
  const collision::CollisionWorld dense(test::sampleArm(),
                                        test::withMargin(description, kDenseMarginFactor));
  const JointVector start = test::demoStart();
  const JointVector goal = test::demoGoal();

  // The premise, with OMPL's own DiscreteMotionValidator at its default
  // resolution (1 % of the space's extent) over the same state validity: it
  // accepts the straight segment, which the dense check finds colliding.
  detail::GuardedWorkspace guarded(world);
  const auto space = std::make_shared<ompl::base::RealVectorStateSpace>(6);
  ompl::base::RealVectorBounds bounds(6);
  for (int j = 0; j < 6; ++j) {
    bounds.setLow(j, test::sampleArm().lowerLimits()[j]);
    bounds.setHigh(j, test::sampleArm().upperLimits()[j]);
  }
  space->setBounds(bounds);
  const auto si = std::make_shared<ompl::base::SpaceInformation>(space);
  si->setStateValidityChecker(std::make_shared<detail::CollisionValidityChecker>(si, guarded));
  si->setup();
  ompl::base::ScopedState<> start_state(space);
  ompl::base::ScopedState<> goal_state(space);
  detail::setJointVector(start, start_state.get());
  detail::setJointVector(goal, goal_state.get());
  REQUIRE(si->checkMotion(start_state.get(), goal_state.get()));
  REQUIRE(test::firstCollidingSegment(world, {start, goal}).has_value());

  TransitRequest request = demoRequest("RRTConnect", 11);
  const TransitResult result = TransitPlanner(world).plan(request);
  checkAcceptedPath(request, result, dense);
  CHECK_FALSE(result.direct);
}

TEST_CASE("The preferred goal is reached when it can be", "[transit]") {
  const collision::CollisionWorld world(test::sampleArm(), test::demoCellDescription());
  const TransitPlanner planner(world);
  JointVector other = test::demoGoal();
  other[5] += 1.0;  // the torch spun about its own axis: another valid goal
  JointVector in_wall = test::demoGoal();
  in_wall[0] = 0.0;  // reaches into the wall

  SECTION("on a direct segment") {
    TransitRequest request = demoRequest("RRTConnect", 1);
    request.goals = {test::demoStart(), test::demoStart()};
    request.goals[0][0] += 0.2;
    request.goals[1][0] += 0.3;
    request.preferred_goal = 1;
    const TransitResult result = planner.plan(request);
    REQUIRE(result.solved());
    CHECK(result.direct);
    CHECK(result.goal_index == 1);
  }
  SECTION("past an invalid goal, through the planner") {
    TransitRequest request = demoRequest("RRTConnect", 1);
    request.goals = {in_wall, other, test::demoGoal()};
    request.preferred_goal = 2;
    const TransitResult result = planner.plan(request);
    REQUIRE(result.solved());
    CHECK_FALSE(result.direct);
    CHECK(result.goal_index != 0);
  }
  SECTION("no valid goal is reported with each goal's reason") {
    TransitRequest request = demoRequest("RRTConnect", 1);
    request.goals = {in_wall};
    const TransitResult result = planner.plan(request);
    CHECK(result.outcome == TransitOutcome::kNoValidGoal);
    CHECK(result.path.empty());
    CHECK_THAT(result.reason, Catch::Contains("goal 0") && Catch::Contains("wall"));
  }
}

TEST_CASE("Planning failures are values with their reasons", "[transit]") {
  const collision::CollisionWorld world(test::sampleArm(), test::demoCellDescription());
  const TransitPlanner planner(world);

  SECTION("a start in collision") {
    TransitRequest request = demoRequest("RRTConnect", 1);
    request.start[0] = 0.0;  // the torch in the wall
    const TransitResult result = planner.plan(request);
    CHECK(result.outcome == TransitOutcome::kInvalidStart);
    CHECK(result.path.empty());
    CHECK_THAT(result.reason, Catch::Contains("start (") && Catch::Contains("wall"));
  }
  SECTION("a start outside the joint limits") {
    TransitRequest request = demoRequest("RRTConnect", 1);
    request.start[1] = 3.0;  // axis 2 ends at 145°
    const TransitResult result = planner.plan(request);
    CHECK(result.outcome == TransitOutcome::kInvalidStart);
    CHECK_THAT(result.reason, Catch::Contains("joint limits"));
  }
  SECTION("no path within the time limit, never a straight line") {
    TransitRequest request = demoRequest("RRTConnect", 1);
    request.time_limit = 1e-9;  // over before the first iteration
    const TransitResult result = planner.plan(request);
    CHECK(result.outcome == TransitOutcome::kTimeout);
    CHECK(result.path.empty());
    CHECK(result.goal_index == -1);
    CHECK_THAT(result.reason, Catch::Contains("RRTConnect") && Catch::Contains("start (") &&
                                  Catch::Contains("goal 0 ("));
    CHECK(std::string(toString(result.outcome)) == "timeout");
  }
}

TEST_CASE("An unknown planner name is an input error", "[transit]") {
  const collision::CollisionWorld world(test::sampleArm(), test::demoCellDescription());
  TransitRequest request = demoRequest("NoSuchPlanner", 1);
  CHECK_THROWS_AS(TransitPlanner(world).plan(request), InputError);
}

TEST_CASE("Malformed transit requests are programming errors", "[transit]") {
  // The job loader and the commands check everything a user can write; what
  // is left is a caller's mistake (exit code 1, not 2).
  const collision::CollisionWorld world(test::sampleArm(), test::demoCellDescription());
  const TransitPlanner planner(world);
  TransitRequest request = demoRequest("RRTConnect", 1);
  SECTION("wrong joint count") { request.goals[0] = JointVector::Zero(5); }
  SECTION("not finite") { request.start[2] = std::numeric_limits<double>::quiet_NaN(); }
  SECTION("no goal") { request.goals.clear(); }
  SECTION("preferred goal out of range") { request.preferred_goal = 1; }
  SECTION("non-positive time limit") { request.time_limit = 0.0; }
  SECTION("seed 0") { request.seed = 0; }
  CHECK_THROWS_AS(planner.plan(request), std::invalid_argument);
}

TEST_CASE("The path re-check finds a segment through the wall", "[transit]") {
  const collision::CollisionWorld world(test::sampleArm(), test::demoCellDescription());
  collision::CollisionWorkspace workspace(world);
  JointVector beside = test::demoStart();
  beside[0] += 0.3;
  CHECK_FALSE(recheckPath(world, {test::demoStart(), beside}, workspace).has_value());
  const std::optional<PathCheckFailure> through =
      recheckPath(world, {test::demoStart(), beside, test::demoGoal()}, workspace);
  REQUIRE(through.has_value());
  CHECK(through->segment == 1);
  CHECK_THAT(through->reason, Catch::Contains("wall"));
  CHECK(recheckPath(world, {}, workspace).has_value());
}

}  // namespace
}  // namespace tw::planner
