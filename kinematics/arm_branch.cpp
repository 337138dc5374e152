#include "kinematics/arm_branch.hpp"

namespace tw::kinematics {

std::string ArmBranch::toString() const {
  std::string text = shoulder == ShoulderSide::kFront ? "shoulder front" : "shoulder back";
  text += elbow == ElbowSide::kUp ? ", elbow up" : ", elbow down";
  text += wrist == WristSide::kFlipped ? ", wrist flipped" : ", wrist not flipped";
  return text;
}

}  // namespace tw::kinematics
