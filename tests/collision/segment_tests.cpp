#include <catch2/catch.hpp>

#include <algorithm>
#include <limits>
#include <random>
#include <thread>
#include <vector>

#include "collision/collision_world.hpp"
#include "kinematics/forward_kinematics.hpp"
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

/// Six thin posts (4 mm square) on a 0.7 m circle about the arm base, as
/// cell bodies.
void addPosts(WorldDescription& description) {
  for (int i = 0; i < 6; ++i) {
    const double angle = 1.047 * i;
    description.bodies.push_back(
        {"post" + std::to_string(i), BodyRole::kObstacle, "",
         {test::boxShape(Eigen::Vector3d(0.004, 0.004, 0.5),
                         Eigen::Vector3d(0.7 * std::cos(angle), 0.7 * std::sin(angle), 0))}});
  }
}

TEST_CASE("A segment found valid keeps half the margin everywhere along it") {
  // Two links over a field of posts; random segments, dense re-check.
  WorldDescription description;
  addPosts(description);
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

/// Three links 0.5 m apart, each a 0.6 m bar (40 mm square) from 0.05 m
/// behind its joint; link 1 and link 3 are the only self pair (the others
/// are neighbours along the chain). `posts` adds the six posts of addPosts.
CollisionWorld threeBars(double cell_margin, double self_margin, bool posts) {
  WorldDescription description;
  description.clearance_margin = cell_margin;
  description.self_margin = self_margin;
  if (posts) addPosts(description);
  const kinematics::LinkShape bar =
      test::boxShape(Eigen::Vector3d(0.6, 0.04, 0.04), Eigen::Vector3d(0.25, 0, 0));
  return CollisionWorld(test::planarArm({{}, {bar}, {bar}, {bar}}, 0.5), description);
}

TEST_CASE("The self motion bound counts only the joints between a pair's bodies") {
  const CollisionWorld world = threeBars(0.010, 0.010, false);
  CollisionWorkspace workspace(world);
  // Folded so that link 3 comes back towards link 1 (about 0.11 m apart).
  const kinematics::JointVector q = joints({0.2, 2.0, 1.8});
  ClearanceQuery self;
  self.pairs = PairGroup::kSelf;
  REQUIRE(world.clearance(q, workspace, self).distance > 0.05);

  SECTION("joint 1 turns link 1 and link 3 alike") {
    const kinematics::JointVector turned = joints({0.7, 2.0, 1.8});
    CHECK(world.selfMotionBound(q, turned) == 0.0);
    CHECK(world.motionBound(q, turned) > 0.0);
    // A rigid motion of both bodies keeps their distance (elementary
    // geometry); 1e-9: primitive distances are exact up to rounding.
    CHECK(world.clearance(turned, workspace, self).distance ==
          Approx(world.clearance(q, workspace, self).distance).margin(1e-9));
  }
  SECTION("joint 2 moves link 3 relative to link 1, within the bound") {
    const kinematics::JointVector bent = joints({0.2, 2.3, 1.8});
    // Link 3's bar corners seen from link 1 before and after: none moves
    // farther than the bound (Schwarzer, Saha and Latombe 2005, from
    // memory: the bound sums |Δq_j| times the reach from joint j's axis).
    const kinematics::ArmModel& arm = world.arm();
    kinematics::LinkPoses before, after;
    kinematics::computeLinkPoses(arm, q, before);
    kinematics::computeLinkPoses(arm, bent, after);
    double farthest = 0.0;
    for (double x : {-0.05, 0.55}) {
      for (double y : {-0.02, 0.02}) {
        for (double z : {-0.02, 0.02}) {
          const Eigen::Vector3d p_3(x, y, z);
          const Eigen::Vector3d from = before.X_BL[1].inverse() * before.X_BL[3] * p_3;
          const Eigen::Vector3d to = after.X_BL[1].inverse() * after.X_BL[3] * p_3;
          farthest = std::max(farthest, (to - from).norm());
        }
      }
    }
    CHECK(farthest > 0.1);
    CHECK(world.selfMotionBound(q, bent) >= farthest);
    CHECK(world.selfMotionBound(q, bent) <= world.motionBound(q, bent));
  }
}

TEST_CASE("A segment found valid keeps half of each pair's margin along it") {
  // Three bars over a field of posts with a large cell margin and a small
  // self margin, and the other way round; short random segments, dense
  // re-check of both pair groups.
  const double cell_margin = GENERATE(0.020, 0.004);
  const double self_margin = cell_margin == 0.020 ? 0.004 : 0.020;
  const CollisionWorld world = threeBars(cell_margin, self_margin, true);
  CollisionWorkspace workspace(world);
  ClearanceQuery cell_query;
  cell_query.pairs = PairGroup::kCell;
  ClearanceQuery self_query;
  self_query.pairs = PairGroup::kSelf;

  std::mt19937 random(20261202);
  std::uniform_real_distribution<double> angle(-3.0, 3.0);
  std::uniform_real_distribution<double> step(-0.4, 0.4);
  int valid_segments = 0;
  int close_states = 0;
  double nearest_self = std::numeric_limits<double>::infinity();
  for (int trial = 0; trial < 60; ++trial) {
    const kinematics::JointVector a = joints({angle(random), angle(random), angle(random)});
    const kinematics::JointVector b = a + joints({step(random), step(random), step(random)});
    CAPTURE(cell_margin, trial, a.transpose(), b.transpose());
    if (!world.checkSegment(a, b, workspace).valid()) continue;
    ++valid_segments;
    // Ten times finer than the segment check's own steps; primitive
    // distances are exact, 1e-12 m covers rounding.
    const double intervals = std::max(world.motionBound(a, b) / cell_margin,
                                      world.selfMotionBound(a, b) / self_margin);
    const int steps = static_cast<int>(10 * intervals) + 1;
    for (int i = 0; i <= steps; ++i) {
      const kinematics::JointVector q = a + (static_cast<double>(i) / steps) * (b - a);
      const double to_cell = world.clearance(q, workspace, cell_query).distance;
      const double to_self = world.clearance(q, workspace, self_query).distance;
      nearest_self = std::min(nearest_self, to_self);
      if (to_cell < 0.5 * cell_margin - 1e-12 || to_self < 0.5 * self_margin - 1e-12) {
        ++close_states;
        FAIL_CHECK("cell " << to_cell << " m, self " << to_self << " m at step " << i);
      }
    }
  }
  CHECK(close_states == 0);
  // Some segments valid and some not, and some passing near the self pair,
  // or the re-check above proved little.
  CHECK(valid_segments >= 5);
  CHECK(valid_segments <= 55);
  CHECK(nearest_self < 0.1);
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
