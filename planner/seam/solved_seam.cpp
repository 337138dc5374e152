#include "planner/seam/solved_seam.hpp"

#include "kinematics/common/angles.hpp"
#include "kinematics/common/number_text.hpp"

namespace tw::planner {

std::string describeMargins(const PathMargins& margins) {
  constexpr double kDegree = 180.0 / kPi;
  std::string text = margins.branch.toString() + ", spin " +
                     formatFixed(margins.spin * kDegree, 1) + " deg, cost " +
                     formatFixed(margins.cost, 3) + " (motion " +
                     formatFixed(margins.motion_cost, 3) + "); axis 5 at least " +
                     formatFixed(margins.wrist_angle * kDegree, 1) + " deg from 0";
  if (margins.singular_poses > 0) {
    text += " (" + std::to_string(margins.singular_poses) + " poses within the warning margin)";
  }
  if (margins.limit_joint >= 0) {
    text += ", limits at least " + formatFixed(margins.limit_margin * kDegree, 1) +
            " deg (axis " + std::to_string(margins.limit_joint + 1) + ")";
  }
  if (margins.clearance >= 0.0) {
    text += std::string(margins.clearance_capped ? ", clearance at least " : ", clearance ") +
            formatFixed(margins.clearance * 1000.0, 1) + " mm";
  }
  return text;
}

std::string describeMargins(const SolvedSeam& seam) {
  std::string text = "chosen: " + describeMargins(seam.margins);
  text += seam.alternative ? "\n  best alternative: " + describeMargins(*seam.alternative)
                           : "\n  best alternative: none in another branch or spin";
  return text;
}

}  // namespace tw::planner
