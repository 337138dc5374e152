#pragma once

#include <string>

namespace tw::kinematics {

/// Which side of axis 1 the wrist centre is on, seen along the arm: in front
/// (the arm faces its work) or behind (the arm reaches back over itself).
enum class ShoulderSide { kFront, kBack };
/// Whether the elbow lies above or below the line from shoulder to wrist
/// centre, seen from the side of the arm in its ordinary poses.
enum class ElbowSide { kUp, kDown };
/// Whether the wrist is flipped: axis 5 bent the other way, with axes 4 and
/// 6 turned half a revolution to give the same flange pose.
enum class WristSide { kNotFlipped, kFlipped };

/// One solution family of the closed-form inverse kinematics. Along a
/// continuous path a family changes only through a singularity: shoulder
/// (wrist centre on axis 1), elbow (arm stretched or folded) or wrist (axis 5
/// at 0). The labels are words, never codes.
struct ArmBranch {
  ShoulderSide shoulder = ShoulderSide::kFront;
  ElbowSide elbow = ElbowSide::kUp;
  WristSide wrist = WristSide::kNotFlipped;

  /// Stable index 0–7: shoulder, then elbow, then wrist, front/up/not
  /// flipped first.
  int index() const {
    return (shoulder == ShoulderSide::kBack ? 4 : 0) + (elbow == ElbowSide::kDown ? 2 : 0) +
           (wrist == WristSide::kFlipped ? 1 : 0);
  }
  static ArmBranch fromIndex(int index) {
    ArmBranch branch;
    branch.shoulder = (index & 4) != 0 ? ShoulderSide::kBack : ShoulderSide::kFront;
    branch.elbow = (index & 2) != 0 ? ElbowSide::kDown : ElbowSide::kUp;
    branch.wrist = (index & 1) != 0 ? WristSide::kFlipped : WristSide::kNotFlipped;
    return branch;
  }
  /// E.g. "shoulder front, elbow up, wrist not flipped".
  std::string toString() const;

  bool operator==(const ArmBranch& other) const { return index() == other.index(); }
  bool operator!=(const ArmBranch& other) const { return !(*this == other); }
};

}  // namespace tw::kinematics
