#include <catch2/catch.hpp>
#include <cmath>
#include <random>

#include "kinematics/common/input_error.hpp"
#include "planner/timing/joint_trajectory.hpp"
#include "planner/timing/trapezoid_profile.hpp"
#include "tests/planner/transit_test_world.hpp"

namespace tw::planner {
namespace {

TEST_CASE("A trapezoidal move matches the closed form", "[timing]") {
  // Reference: Biagiotti & Melchiorri 2008, ch. 3 (from memory), with the
  // check vectors of domain-facts §4: T = h/v + v/a when h ≥ v²/a, else
  // T = 2√(h/a) with peak √(h·a).
  SECTION("long move with a cruise") {
    const TrapezoidProfile profile(1.0, 0.5, 1.0);
    CHECK(profile.duration() == Approx(2.5).epsilon(1e-12));  // closed form, exact arithmetic
    CHECK(profile.peakVelocity() == 0.5);
    CHECK(profile.position(profile.duration()) == Approx(1.0).epsilon(1e-12));
  }
  SECTION("short move without a cruise") {
    const TrapezoidProfile profile(0.1, 0.5, 1.0);
    // 4 decimals as given in the check vector.
    CHECK(profile.duration() == Approx(0.6325).margin(5e-5));
    CHECK(profile.peakVelocity() == Approx(0.3162).margin(5e-5));
    CHECK(profile.duration() == Approx(2.0 * std::sqrt(0.1)).epsilon(1e-12));
  }
  SECTION("the boundary case h = v²/a is both") {
    const TrapezoidProfile profile(0.25, 0.5, 1.0);
    CHECK(profile.duration() == Approx(0.25 / 0.5 + 0.5).epsilon(1e-12));
    CHECK(profile.duration() == Approx(2.0 * std::sqrt(0.25)).epsilon(1e-12));
  }
  SECTION("zero distance takes no time") {
    CHECK(TrapezoidProfile(0.0, 1.0, 1.0).duration() == 0.0);
  }
  SECTION("bad bounds are input errors") {
    CHECK_THROWS_AS(TrapezoidProfile(-1.0, 1.0, 1.0), std::invalid_argument);
    CHECK_THROWS_AS(TrapezoidProfile(1.0, 0.0, 1.0), std::invalid_argument);
    CHECK_THROWS_AS(TrapezoidProfile(1.0, 1.0, std::nan("")), std::invalid_argument);
  }
}

TEST_CASE("Position is the integral of velocity, velocity of acceleration", "[timing]") {
  // Two routes to the same quantity: the profile's closed-form position
  // against a midpoint-rule integral of its velocity.
  std::mt19937 random(20261201);
  std::uniform_real_distribution<double> value(0.05, 3.0);
  for (int trial = 0; trial < 20; ++trial) {
    const double h = value(random), v = value(random), a = value(random);
    CAPTURE(trial, h, v, a);
    const TrapezoidProfile profile(h, v, a);
    const int steps = 20000;
    const double dt = profile.duration() / steps;
    double integral = 0.0;
    for (int k = 0; k < steps; ++k) integral += profile.velocity((k + 0.5) * dt) * dt;
    // Midpoint rule on a piecewise-linear velocity: exact but for the two
    // kinks, each off by at most a·dt²/4.
    CHECK(integral == Approx(h).margin(a * dt * dt));
    CHECK(profile.peakVelocity() <= v * (1 + 1e-12));
  }
}

TEST_CASE("Timed joint paths never exceed a joint's velocity or acceleration limit", "[timing]") {
  const kinematics::ArmModel& arm = test::sampleArm();
  std::mt19937 random(7);
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  for (int trial = 0; trial < 20; ++trial) {
    JointPath path;
    for (int w = 0; w < 4; ++w) {
      kinematics::JointVector q(6);
      for (int j = 0; j < 6; ++j) {
        q[j] = arm.lowerLimits()[j] + unit(random) * (arm.upperLimits()[j] - arm.lowerLimits()[j]);
      }
      path.push_back(q);
    }
    const JointTimingLimits limits{0.5, 0.8};
    CAPTURE(trial);
    const JointTrajectory trajectory(arm, path, limits);
    REQUIRE(trajectory.duration() > 0.0);
    const int samples = 2000;
    for (int k = 0; k <= samples; ++k) {
      const double t = trajectory.duration() * k / samples;
      const JointSample state = trajectory.sample(t);
      for (int j = 0; j < 6; ++j) {
        CAPTURE(t, j);
        // 1e-9 relative: rounding in the bound min_j v_j/|Δq_j| times Δq_j.
        CHECK(std::abs(state.velocity[j]) <= 0.5 * arm.joint(j).max_velocity * (1 + 1e-9));
        CHECK(std::abs(state.acceleration[j]) <= 0.8 * arm.joint(j).max_acceleration * (1 + 1e-9));
        CHECK(state.q[j] >= std::min({path[0][j], path[1][j], path[2][j], path[3][j]}) - 1e-12);
      }
    }
    // Each segment has one joint at its limit (the slowest sets the time)
    // and the waypoints are reached exactly, at rest.
    for (const JointTrajectory::Segment& segment : trajectory.segments()) {
      const JointSample middle =
          trajectory.sample(segment.start_time + 0.5 * segment.profile.duration());
      double highest = 0.0;
      for (int j = 0; j < 6; ++j) {
        highest = std::max(highest, std::abs(middle.velocity[j]) / (0.5 * arm.joint(j).max_velocity));
      }
      // Long random segments always cruise, so mid-segment speed is the peak.
      CHECK(highest == Approx(1.0).epsilon(1e-9));
      const JointSample at_end = trajectory.sample(segment.start_time + segment.profile.duration());
      CHECK(at_end.velocity.norm() == Approx(0.0).margin(1e-9));
    }
    CHECK(trajectory.sample(trajectory.duration()).q == path.back());
    CHECK(trajectory.sample(0.0).q == path.front());
  }
}

TEST_CASE("A single-joint move is the textbook trapezoid in that joint", "[timing]") {
  // The synchronised profile reduces to the joint's own trapezoid when only
  // one joint moves (Biagiotti & Melchiorri 2008, ch. 3, from memory).
  const kinematics::ArmModel& arm = test::sampleArm();
  kinematics::JointVector a = kinematics::JointVector::Zero(6);
  kinematics::JointVector b = a;
  b[0] = 1.0;
  const JointTrajectory trajectory(arm, {a, b});
  const double v = arm.joint(0).max_velocity, acc = arm.joint(0).max_acceleration;
  const double expected = 1.0 >= v * v / acc ? 1.0 / v + v / acc : 2.0 * std::sqrt(1.0 / acc);
  CHECK(trajectory.duration() == Approx(expected).epsilon(1e-12));
  CHECK_THROWS_AS(JointTrajectory(arm, {}), std::invalid_argument);
  CHECK_THROWS_AS(JointTrajectory(arm, {a, b}, JointTimingLimits{0.0, 1.0}), std::invalid_argument);
}

}  // namespace
}  // namespace tw::planner
