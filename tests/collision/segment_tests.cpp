#include <catch2/catch.hpp>

#include <algorithm>
#include <random>
#include <thread>
#include <vector>

#include "collision/collision_world.hpp"
#include "tests/collision/test_arms.hpp"

namespace tw::collision {
namespace {

kinematics::JointVector joints(std::initializer_list<double> values) {
  kinematics::JointVector q(static_cast<int>(values.size()));
  int i = 0;
  for (double value : values) q[i++] = value;
  return q;
}

/// One revolute joint about z carrying a bar from r = 0.2 to 1.0 m along
/// its x axis (40 mm square); a plate 2 mm thick stands in the y–z plane at
/// x = 0, from y = 0.3 to 0.9, right in the bar's sweep at q = π/2.
CollisionWorld plateCell() {
  WorldDescription description;
  description.bodies.push_back(
      {"plate", BodyRole::kObstacle, "",
       {test::boxShape(Eigen::Vector3d(0.002, 0.6, 0.2), Eigen::Vector3d(0, 0.6, 0))}});
  const kinematics::LinkShape bar =
      test::boxShape(Eigen::Vector3d(0.8, 0.04, 0.04), Eigen::Vector3d(0.6, 0, 0));
  return CollisionWorld(test::planarArm({{}, {bar}}, 0.0), description);
}

TEST_CASE("A thin plate between two valid states is caught by the segment check") {
  const CollisionWorld world = plateCell();
  CollisionWorkspace workspace(world);
  const kinematics::JointVector start = joints({0.0});
  const kinematics::JointVector end = joints({3.0});
  REQUIRE(world.checkState(start, workspace).valid());
  REQUIRE(world.checkState(end, workspace).valid());

  const SegmentResult through = world.checkSegment(start, end, workspace);
  CHECK_FALSE(through.valid());
  CHECK(world.bodyName(through.state.body_b) == "plate");
  // The bar meets the plate (with the margin) only within ±0.11 rad of π/2
  // (|cos q| · 0.3 m < 20 mm + 1 mm + 10 mm; planar geometry).
  CHECK(std::abs(3.0 * through.fraction - 1.5707963) < 0.11);

  SECTION("the other way round the plate is free") {
    const SegmentResult around = world.checkSegment(start, joints({-3.0}), workspace);
    CHECK(around.valid());
    CHECK(around.fraction == -1.0);
    // floor(bound / margin) + 1 intervals, each end and interior state once.
    const double bound = world.motionBound(start, joints({-3.0}));
    CHECK(around.states_checked == static_cast<int>(bound / world.clearanceMargin()) + 2);
  }
}

TEST_CASE("The motion bound covers the farthest point of every body") {
  const CollisionWorld world = plateCell();
  // The bar's farthest corner is √(1.0² + 0.02² + 0.02²) m from the axis; a
  // turn of Δq moves it at most that times Δq (arc length ≥ chord).
  const double reach = std::sqrt(1.0 + 2 * 0.02 * 0.02);
  CHECK(world.motionBound(joints({0.2}), joints({0.5})) >= 0.3 * reach - 1e-12);
}

TEST_CASE("A segment found valid keeps half the margin everywhere along it") {
  // Two links over a field of posts; random segments, dense re-check.
  WorldDescription description;
  for (int i = 0; i < 6; ++i) {
    const double angle = 1.047 * i;
    description.bodies.push_back(
        {"post" + std::to_string(i), BodyRole::kObstacle, "",
         {test::boxShape(Eigen::Vector3d(0.004, 0.004, 0.5),
                         Eigen::Vector3d(0.7 * std::cos(angle), 0.7 * std::sin(angle), 0))}});
  }
  const kinematics::LinkShape bar =
      test::boxShape(Eigen::Vector3d(0.45, 0.02, 0.02), Eigen::Vector3d(0.25, 0, 0));
  const CollisionWorld world(test::planarArm({{}, {bar}, {bar}}, 0.5), description);
  CollisionWorkspace workspace(world);

  std::mt19937 random(20261201);
  std::uniform_real_distribution<double> angle(-3.0, 3.0);
  int valid_segments = 0;
  int close_states = 0;
  for (int trial = 0; trial < 60; ++trial) {
    const kinematics::JointVector a = joints({angle(random), angle(random)});
    const kinematics::JointVector b = joints({angle(random), angle(random)});
    CAPTURE(trial, a.transpose(), b.transpose());
    if (!world.checkSegment(a, b, workspace).valid()) continue;
    ++valid_segments;
    // Re-measured with steps 20 times finer than the margin, the clearance
    // never drops below half the margin (the header's guarantee; primitive
    // distances are exact, 1e-12 m covers rounding).
    const int steps = static_cast<int>(20 * world.motionBound(a, b) / world.clearanceMargin()) + 1;
    for (int i = 0; i <= steps; ++i) {
      const kinematics::JointVector q = a + (static_cast<double>(i) / steps) * (b - a);
      const double distance = world.clearance(q, workspace).distance;
      if (distance < 0.5 * world.clearanceMargin() - 1e-12) {
        ++close_states;
        FAIL_CHECK("clearance " << distance << " m at step " << i << " of " << steps);
      }
    }
  }
  CHECK(close_states == 0);
  // Some segments valid and some not, or the re-check above proved nothing.
  CHECK(valid_segments >= 5);
  CHECK(valid_segments <= 55);
}

TEST_CASE("Threads sharing one world with their own workspaces agree with one thread") {
  const CollisionWorld world = plateCell();
  std::vector<kinematics::JointVector> states;
  for (int i = 0; i < 400; ++i) states.push_back(joints({-3.0 + 6.0 * i / 399.0}));
  const auto run = [&](std::vector<int>& out) {
    CollisionWorkspace workspace(world);
    for (const kinematics::JointVector& q : states) {
      out.push_back(static_cast<int>(world.checkState(q, workspace).status));
    }
  };
  std::vector<int> alone;
  run(alone);
  std::vector<int> first, second;
  std::thread a([&] { run(first); });
  std::thread b([&] { run(second); });
  a.join();
  b.join();
  CHECK(first == alone);
  CHECK(second == alone);
  // Some states collide and some do not, so the comparison means something.
  CHECK(std::count(alone.begin(), alone.end(), 0) > 0);
  CHECK(std::count(alone.begin(), alone.end(), 0) < static_cast<long>(alone.size()));
}

}  // namespace
}  // namespace tw::collision
