#include <Eigen/Geometry>
#include <catch2/catch.hpp>
#include <random>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/rotations.hpp"
#include "kinematics/urdf_chain.hpp"

namespace tw::cli {

TEST_CASE("Roll, pitch and yaw give back the rotation they were read from", "[rpy]") {
  // Two routes: rotationFromRollPitchYaw (the cell loader's
  // convention) after rollPitchYaw must be the identity map on rotations.
  std::mt19937 random(11);
  std::normal_distribution<double> normal(0.0, 1.0);
  for (int trial = 0; trial < 200; ++trial) {
    const Eigen::Matrix3d R =
        Eigen::Quaterniond(normal(random), normal(random), normal(random), normal(random))
            .normalized()
            .toRotationMatrix();
    CAPTURE(trial, R);
    const Eigen::Vector3d rpy = rollPitchYaw(R);
    CHECK(std::abs(rpy.y()) <= kPi / 2 + 1e-12);
    // Rounding of a few trigonometric calls.
    CHECK(rotationFromRollPitchYaw(rpy).isApprox(R, 1e-12));
  }
}

TEST_CASE("At pitch 90 degrees the roll is 0 and the yaw carries the turn", "[rpy]") {
  const Eigen::Vector3d written(0.3, kPi / 2, -0.4);
  const Eigen::Matrix3d R = rotationFromRollPitchYaw(written);
  const Eigen::Vector3d rpy = rollPitchYaw(R);
  CHECK(rpy.x() == 0.0);
  // Near the lock the angles lose about half the digits of a double.
  CHECK(rotationFromRollPitchYaw(rpy).isApprox(R, 1e-7));
}

}  // namespace tw::cli
