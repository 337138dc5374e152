#include "planner/timing/process_move_timing.hpp"

#include <catch2/catch.hpp>
#include <random>
#include <stdexcept>

#include "kinematics/forward_kinematics.hpp"
#include "tests/planner/transit_test_world.hpp"

namespace tw::planner {
namespace {

/// Waypoints q0 + k·step (k = 0..count−1) with their flange poses by FK.
std::vector<ProcessWaypoint> jointLine(const kinematics::JointVector& q0,
                                       const kinematics::JointVector& step, int count) {
  std::vector<ProcessWaypoint> waypoints;
  for (int k = 0; k < count; ++k) {
    const kinematics::JointVector q = q0 + k * step;
    waypoints.push_back({q, kinematics::flangePose(test::sampleArm(), q)});
  }
  return waypoints;
}

/// What timeProcessMove promises, checked from its output: TCP speed held
/// exactly on every segment not reported, the reported speed where it is,
/// and no joint above its allowed velocity by finite differences.
void checkPromises(const std::vector<ProcessWaypoint>& waypoints, const ProcessSpeed& speed,
                   const ProcessMoveTiming& timing) {
  const kinematics::ArmModel& arm = test::sampleArm();
  REQUIRE(timing.durations.size() == waypoints.size() - 1);
  std::size_t next_lowered = 0;
  double total = 0.0;
  for (std::size_t i = 0; i + 1 < waypoints.size(); ++i) {
    CAPTURE(i);
    const double distance =
        (waypoints[i + 1].X_WT.translation() - waypoints[i].X_WT.translation()).norm();
    const double time = timing.durations[i];
    total += time;
    const bool lowered = next_lowered < timing.lowered.size() &&
                         timing.lowered[next_lowered].segment == static_cast<int>(i);
    // 1e-12 relative: one division and one multiplication of rounding.
    if (lowered) {
      CHECK(distance / time == Approx(timing.lowered[next_lowered].speed).epsilon(1e-12));
      CHECK(timing.lowered[next_lowered].speed < speed.tcp_speed);
      ++next_lowered;
    } else {
      CHECK(distance / time == Approx(speed.tcp_speed).epsilon(1e-12));
    }
    for (int j = 0; j < arm.jointCount(); ++j) {
      CAPTURE(j);
      const double velocity = std::abs(waypoints[i + 1].q[j] - waypoints[i].q[j]) / time;
      CHECK(velocity <= speed.joint_velocity_fraction * arm.joint(j).max_velocity * (1 + 1e-12));
    }
  }
  CHECK(next_lowered == timing.lowered.size());  // every report names a real segment, in order
  CHECK(timing.duration == Approx(total).epsilon(1e-12));
}

TEST_CASE("A slow process move holds its TCP speed everywhere", "[timing]") {
  kinematics::JointVector q0(6), step(6);
  q0 << 0.1, 0.5, 0.3, 0.2, 0.8, 0.1;
  step << 0.002, 0.001, -0.001, 0.0, 0.0005, 0.0;
  const std::vector<ProcessWaypoint> waypoints = jointLine(q0, step, 50);
  const ProcessSpeed speed{0.01, 1.0, 1.0};  // 10 mm/s: slow for the arm
  const ProcessMoveTiming timing = timeProcessMove(test::sampleArm(), waypoints, speed);
  CHECK(timing.lowered.empty());
  checkPromises(waypoints, speed, timing);
}

TEST_CASE("Where a wrist joint cannot keep up the speed is lowered and reported", "[timing]") {
  // Near the wrist singularity (axis 5 almost 0) axes 4 and 6 turn against
  // each other while the TCP hardly moves: joint velocity sets the time.
  kinematics::JointVector q0(6), step(6);
  q0 << 0.0, 0.4, 0.2, 0.0, 0.02, 0.0;
  step << 0.0005, 0.0, 0.0, 0.05, 0.0, -0.05;
  std::vector<ProcessWaypoint> waypoints = jointLine(q0, step, 20);
  const ProcessSpeed speed{0.2, 100.0, 0.5};  // orientation bound high: joints decide
  const ProcessMoveTiming timing = timeProcessMove(test::sampleArm(), waypoints, speed);
  REQUIRE_FALSE(timing.lowered.empty());
  for (const LoweredSpeed& lowered : timing.lowered) {
    CAPTURE(lowered.reason);
    CHECK(lowered.cause == SpeedLimitCause::kJointVelocity);
    CHECK((lowered.joint == 3 || lowered.joint == 5));
    CHECK(lowered.programmed_speed == 0.2);
    CHECK_THAT(lowered.reason, Catch::Contains("lowered from 200.0 to") && Catch::Contains(" deg/s"));
  }
  checkPromises(waypoints, speed, timing);
}

TEST_CASE("A turn faster than the orientation bound lowers the speed", "[timing]") {
  kinematics::JointVector q0(6), step(6);
  q0 << 0.0, 0.4, 0.2, 0.0, 0.8, 0.0;
  step << 0.001, 0.0, 0.0, 0.0, 0.0, 0.02;  // the tool spins as the TCP moves
  const std::vector<ProcessWaypoint> waypoints = jointLine(q0, step, 10);
  const ProcessSpeed speed{0.05, 0.5, 1.0};
  const ProcessMoveTiming timing = timeProcessMove(test::sampleArm(), waypoints, speed);
  REQUIRE(timing.lowered.size() == 9);
  CHECK(timing.lowered.front().cause == SpeedLimitCause::kOrientationSpeed);
  CHECK(timing.lowered.front().joint == -1);
  // The flange turns about its own axis by Δq6 = 0.02 rad plus the small
  // turn of axis 1: at 0.5 rad/s at least 0.04 s per segment.
  CHECK(timing.durations.front() >= 0.04);
  checkPromises(waypoints, speed, timing);
}

TEST_CASE("Random process moves keep every promise of their timing", "[timing]") {
  std::mt19937 random(314);
  std::uniform_real_distribution<double> unit(-1.0, 1.0);
  for (int trial = 0; trial < 30; ++trial) {
    kinematics::JointVector q0(6), step(6);
    for (int j = 0; j < 6; ++j) {
      q0[j] = 0.5 * unit(random);
      step[j] = 0.01 * unit(random);
    }
    const ProcessSpeed speed{0.05 + 0.5 * std::abs(unit(random)), 0.5 + std::abs(unit(random)),
                             0.2 + 0.8 * std::abs(unit(random))};
    CAPTURE(trial, q0.transpose(), step.transpose(), speed.tcp_speed, speed.orientation_speed,
            speed.joint_velocity_fraction);
    const std::vector<ProcessWaypoint> waypoints = jointLine(q0, step, 15);
    checkPromises(waypoints, speed, timeProcessMove(test::sampleArm(), waypoints, speed));
  }
}

TEST_CASE("Malformed process moves are programming errors", "[timing]") {
  kinematics::JointVector q0 = kinematics::JointVector::Zero(6);
  const std::vector<ProcessWaypoint> two = jointLine(q0, q0, 2);
  CHECK_THROWS_AS(timeProcessMove(test::sampleArm(), {two.front()}, {0.1, 1.0, 1.0}), std::invalid_argument);
  CHECK_THROWS_AS(timeProcessMove(test::sampleArm(), two, {0.0, 1.0, 1.0}), std::invalid_argument);
  CHECK_THROWS_AS(timeProcessMove(test::sampleArm(), two, {0.1, 1.0, 1.5}), std::invalid_argument);
}

}  // namespace
}  // namespace tw::planner
