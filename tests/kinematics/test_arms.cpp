#include "tests/kinematics/test_arms.hpp"

#include "kinematics/arm_loader.hpp"
#include "kinematics/common/angles.hpp"

namespace tw::kinematics::test {
namespace {

constexpr double kDeg = kPi / 180.0;

ArmModel orthoArm(const std::array<double, 6>& lower, const std::array<double, 6>& upper) {
  OrthoParallelGeometry geometry;
  geometry.a1 = 0.20;
  geometry.a2 = 0.10;
  geometry.b = 0.05;
  geometry.c1 = 0.50;
  geometry.c2 = 0.70;
  geometry.c3 = 0.80;
  geometry.c4 = 0.15;
  std::vector<JointSpec> limits(6);
  for (int i = 0; i < 6; ++i) {
    limits[i].name = "axis" + std::to_string(i + 1);
    limits[i].lower = lower[i];
    limits[i].upper = upper[i];
    limits[i].max_velocity = 3.0;
    limits[i].max_acceleration = 10.0;
  }
  ArmDescription description;
  description.name = "reference-ortho";
  description.joints = orthoParallelChain(geometry, limits);
  description.X_LF = orthoParallelFlange(geometry);
  description.ortho_parallel = geometry;
  return ArmModel(std::move(description));
}

}  // namespace

ArmModel referenceOrthoArm(double lower, double upper) {
  return orthoArm({lower, lower, lower, lower, lower, lower},
                  {upper, upper, upper, upper, upper, upper});
}

ArmModel referenceOrthoArmMultiTurn() {
  return orthoArm({-170 * kDeg, -100 * kDeg, -150 * kDeg, -350 * kDeg, -130 * kDeg, -350 * kDeg},
                  {170 * kDeg, 145 * kDeg, 160 * kDeg, 350 * kDeg, 130 * kDeg, 350 * kDeg});
}

ArmModel sampleArm() { return loadArmDescription(sourcePath("samples/arms/weld_arm_1400.xml")); }

std::string sourcePath(const std::string& relative) {
  return std::string(TW_SOURCE_DIR) + "/" + relative;
}

}  // namespace tw::kinematics::test

namespace tw::kinematics::test {

double unitDraw(std::mt19937_64& generator) {
  return static_cast<double>(generator() >> 11) * 0x1.0p-53;
}

JointVector randomJoints(const ArmModel& arm, std::mt19937_64& generator) {
  JointVector q(arm.jointCount());
  for (int j = 0; j < arm.jointCount(); ++j) {
    q[j] = arm.lowerLimits()[j] + unitDraw(generator) * (arm.upperLimits()[j] - arm.lowerLimits()[j]);
  }
  return q;
}

double rotationAngleBetween(const Eigen::Matrix3d& R_a, const Eigen::Matrix3d& R_b) {
  return Eigen::AngleAxisd(R_a.transpose() * R_b).angle();
}

}  // namespace tw::kinematics::test
