#pragma once

#include <array>
#include <optional>
#include <string>
#include <vector>

#include "planner/seam/seam_solver_options.hpp"

namespace tw::planner {

/// Why a candidate (one branch at one spin sample, or one joint vector) was
/// given up, in the order the solver tries the checks.
enum class RejectReason {
  kOutOfReach,        ///< no joint vector of the branch places the tool there
  kJointLimit,        ///< reachable, but a joint is outside its limits
  kWristSingularity,  ///< axis 5 within the hard margin of 0 or ±180°
  kWristTwist,        ///< |q4| + |q6| above the dress-pack limit
  kCollision,         ///< a checked pair nearer than its margin (cell or self)
};
inline constexpr int kRejectReasonCount = 5;
const char* toString(RejectReason reason);

/// Why a step between two candidates of consecutive waypoints was refused.
enum class StepReason {
  kBranchChange,     ///< the two candidates are in different branches (includes a wrist flip)
  kJointJump,        ///< a joint moves more than the bound for the TCP travel
  kDiscontinuous,    ///< the joint-space midpoint leaves the Cartesian line
  kInterpolation,    ///< the linear move cannot be followed in the branch within limits
  kMotionCollision,  ///< the linear move brings a checked pair nearer than its margin
};
inline constexpr int kStepReasonCount = 5;
const char* toString(StepReason reason);

/// The candidate that came nearest to being usable at a blocked waypoint.
struct NearMiss {
  RejectReason reason = RejectReason::kOutOfReach;
  std::string branch;  ///< ArmBranch::toString()
  double spin = 0.0;   ///< [rad]
  /// How far it missed: [rad] past the limit (kJointLimit, with `joint`),
  /// below the hard margin (kWristSingularity) or past the twist limit
  /// (kWristTwist); 0 for kCollision (then `bodies` and `touching`).
  double shortfall = 0.0;
  int joint = -1;  ///< 0-based
  std::string bodies;    ///< "a / b" for kCollision
  bool touching = false; ///< kCollision: in contact, not only within the margin
};

/// Why one waypoint has no usable candidate.
struct BlockedWaypoint {
  /// Index into ToolPath::waypoints; -1 for the approach start, n for the
  /// retract end.
  int index = 0;
  int line = 0;  ///< input line
  /// Branch × spin samples tried (each may have several turns).
  int tried = 0;
  /// Counts per RejectReason (kOutOfReach, kJointLimit per branch and spin;
  /// the others per joint vector).
  std::array<int, kRejectReasonCount> rejected{};
  /// kJointLimit counts per joint (0-based).
  std::array<int, 8> limit_joint{};
  /// Names of the bodies found in collision, sorted, each pair "a / b".
  std::vector<std::string> colliding_pairs;
  std::optional<NearMiss> nearest;
};

/// When every waypoint has candidates but no chain of steps joins them: the
/// first step that no surviving path crosses.
struct BlockedStep {
  int from = 0;  ///< waypoint index (-1: approach start)
  int to = 0;    ///< waypoint index (n: retract end)
  std::array<int, kStepReasonCount> rejected{};  ///< pairs refused, per reason
};

/// Why a seam has no solution. No program may be produced from it.
struct SeamReport {
  std::string name;
  std::string source;
  int waypoint_count = 0;
  /// Every blocked waypoint, in order (empty when the problem is a step).
  std::vector<BlockedWaypoint> blocked;
  /// Runs of consecutive blocked indices, [first, last] inclusive.
  std::vector<std::pair<int, int>> stretches;
  std::optional<BlockedStep> step;
  SolverCounts counts;

  /// A readable multi-line account (angles in degrees).
  std::string text() const;
};

}  // namespace tw::planner
