#include "planner/seam/seam_report.hpp"

#include <locale>
#include <sstream>

#include "kinematics/common/angles.hpp"

namespace tw::planner {
namespace {

constexpr double kDegrees = 180.0 / kPi;

/// Degrees with one decimal, whatever the global locale.
std::string degrees(double radians) {
  std::ostringstream out;
  out.imbue(std::locale::classic());
  out.setf(std::ios::fixed);
  out.precision(1);
  out << radians * kDegrees;
  return out.str();
}

std::string where(int index, int count) {
  if (index < 0) return "approach start";
  if (index >= count) return "retract end";
  return "waypoint " + std::to_string(index);
}

}  // namespace

const char* toString(RejectReason reason) {
  switch (reason) {
    case RejectReason::kOutOfReach:
      return "out of reach";
    case RejectReason::kJointLimit:
      return "joint limit";
    case RejectReason::kWristSingularity:
      return "wrist singularity margin";
    case RejectReason::kWristTwist:
      return "wrist twist limit";
    case RejectReason::kCollision:
      return "collision or clearance below the margin";
  }
  return "unknown";
}

const char* toString(StepReason reason) {
  switch (reason) {
    case StepReason::kBranchChange:
      return "branch change";
    case StepReason::kJointJump:
      return "joint step above the bound";
    case StepReason::kDiscontinuous:
      return "joint midpoint off the Cartesian line";
    case StepReason::kInterpolation:
      return "linear move not followable in the branch";
    case StepReason::kMotionCollision:
      return "collision along the linear move";
  }
  return "unknown";
}

std::string SeamReport::text() const {
  std::ostringstream out;
  out << "seam " << name << ": no feasible joint path\n";
  for (const auto& [first, last] : stretches) {
    out << "  blocked: " << where(first, waypoint_count);
    if (last != first) out << " to " << where(last, waypoint_count);
    out << '\n';
  }
  for (const BlockedWaypoint& b : blocked) {
    out << "  " << where(b.index, waypoint_count) << " (" << source << ':' << b.line << "): "
        << b.tried << " branch and spin samples;";
    for (int r = 0; r < kRejectReasonCount; ++r) {
      if (b.rejected[r] == 0) continue;
      out << ' ' << toString(static_cast<RejectReason>(r)) << ' ' << b.rejected[r];
      if (static_cast<RejectReason>(r) == RejectReason::kJointLimit) {
        out << " (";
        bool first = true;
        for (int j = 0; j < static_cast<int>(b.limit_joint.size()); ++j) {
          if (b.limit_joint[j] == 0) continue;
          out << (first ? "" : ", ") << "joint " << j + 1 << ": " << b.limit_joint[j];
          first = false;
        }
        out << ')';
      }
      out << ';';
    }
    for (const std::string& pair : b.colliding_pairs) out << " [" << pair << ']';
    if (b.nearest) {
      const NearMiss& n = *b.nearest;
      out << "; nearest: " << n.branch << ", spin "
          << degrees(n.spin) << " deg, " << toString(n.reason);
      if (n.reason == RejectReason::kCollision) {
        out << " (" << n.bodies << (n.touching ? ", touching)" : ", within the margin only)");
      } else {
        out << " by " << degrees(n.shortfall) << " deg";
        if (n.joint >= 0) out << " at joint " << n.joint + 1;
      }
    }
    out << '\n';
  }
  if (step) {
    out << "  no step from " << where(step->from, waypoint_count) << " to "
        << where(step->to, waypoint_count) << ":";
    for (int r = 0; r < kStepReasonCount; ++r) {
      if (step->rejected[r] == 0) continue;
      out << ' ' << toString(static_cast<StepReason>(r)) << ' ' << step->rejected[r] << ';';
    }
    out << '\n';
  }
  return out.str();
}

}  // namespace tw::planner
