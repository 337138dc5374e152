#include "kinematics/arm_branch.hpp"

namespace tw::kinematics {

int ArmBranch::index() const {
  return (shoulder == ShoulderSide::kBack ? 4 : 0) + (elbow == ElbowSide::kDown ? 2 : 0) +
         (wrist == WristSide::kFlipped ? 1 : 0);
}

ArmBranch ArmBranch::fromIndex(int index) {
  ArmBranch branch;
  branch.shoulder = (index & 4) != 0 ? ShoulderSide::kBack : ShoulderSide::kFront;
  branch.elbow = (index & 2) != 0 ? ElbowSide::kDown : ElbowSide::kUp;
  branch.wrist = (index & 1) != 0 ? WristSide::kFlipped : WristSide::kNotFlipped;
  return branch;
}

std::string ArmBranch::toString() const {
  std::string text = shoulder == ShoulderSide::kFront ? "shoulder front" : "shoulder back";
  text += elbow == ElbowSide::kUp ? ", elbow up" : ", elbow down";
  text += wrist == WristSide::kFlipped ? ", wrist flipped" : ", wrist not flipped";
  return text;
}

}  // namespace tw::kinematics
