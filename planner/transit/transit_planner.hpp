#pragma once

#include <string>
#include <vector>

#include "collision/collision_world.hpp"
#include "kinematics/joint.hpp"
#include "planner/transit/joint_path.hpp"

namespace tw::planner {

/// What became of one transit request, worst last.
enum class TransitOutcome {
  kSolved,           ///< a re-checked path from the start to one of the goals
  kInvalidStart,     ///< the start is outside the joint limits or not collision-free
  kNoValidGoal,      ///< no goal is within the limits and collision-free
  kTimeout,          ///< the planner found no path within the time limit
  kRecheckFailed,    ///< a path was found but failed the independent re-check (never accepted)
};

/// "solved", "invalid start", "no valid goal", "timeout", "re-check failed".
const char* toString(TransitOutcome outcome);

/// One transit to plan: from `start` to any of `goals` (e.g. every valid IK
/// branch of the next approach pose), joints in chain order [rad] or [m].
/// Options set by field name.
struct TransitRequest {
  kinematics::JointVector start;
  /// At least one. Invalid goals are skipped (and named in the reason of a
  /// failure); the others are tried in this order after the preferred one.
  std::vector<kinematics::JointVector> goals;
  /// Index into `goals` of the one on the seam's chosen branch: tried first
  /// as a direct segment and first among the planner's goal states.
  int preferred_goal = 0;
  /// OMPL planner name, one of transitPlannerNames().
  std::string planner = "RRTConnect";
  /// Planning time limit [s], > 0. Simplification is bounded by OMPL's step
  /// counts (a few times the path's waypoints), not by this limit.
  double time_limit = 1.0;
  /// Seed of OMPL's random numbers, > 0 (OMPL cannot use 0).
  unsigned seed = 1;
  /// Shortcut and smooth the planned path (every change re-validated).
  bool simplify = true;
  /// Let OMPL write its informational messages to the console.
  bool verbose = false;
};

/// The answer to a TransitRequest, as a value. On success `path` runs from
/// the start to goals[goal_index] and has passed recheckPath(); otherwise it
/// is empty and `reason` says why.
struct TransitResult {
  TransitOutcome outcome = TransitOutcome::kTimeout;
  std::string reason;
  JointPath path;
  int goal_index = -1;
  /// The path is the single direct segment start → goal (no planner run).
  bool direct = false;
  std::string planner;
  /// Wall-clock time spent [s]: for the report of a failure and for
  /// benchmarks only; it must not reach an output file (not deterministic).
  double seconds = 0.0;
  /// Joint-space length of the path as planned and as accepted (see
  /// jointPathLength); equal when not simplified or direct.
  double planned_length = 0.0;
  double length = 0.0;
  /// Collision queries spent: states checked (including those inside segment
  /// checks) and segment checks, planning and simplification together,
  /// without the final re-check.
  long state_checks = 0;
  long segment_checks = 0;

  bool solved() const { return outcome == TransitOutcome::kSolved; }
};

/// The planners a TransitRequest may name, default first: "RRTConnect",
/// "PRM", "BiTRRT", "KPIECE1", "LBKPIECE1". (Plain single-tree RRT is left
/// out: with its 5 % goal bias it took seconds on the demo cell.)
const std::vector<std::string>& transitPlannerNames();

/// Plans collision-free joint-space transits in one collision world with
/// OMPL. The state space is a box of the arm's joint limits; states are valid
/// by CollisionWorld::checkState (with the world's cell and self margins) and
/// motions by CollisionWorld::checkSegment, so no thin obstacle is stepped
/// over. Every accepted path is re-checked segment by segment with a
/// workspace of its own (recheckPath) before it is returned; a path that
/// fails is reported, never returned.
///
/// Order of work: the direct segment to each valid goal, preferred goal
/// first; then the named planner towards all valid goals (OMPL GoalStates,
/// preferred first) within the time limit, accepting exact solutions only;
/// then shortcutting and B-spline smoothing, each change re-validated
/// through the same segment check; then the re-check (the planned path is
/// the fall-back should the simplified one fail it).
///
/// Determinism: each call seeds OMPL's random numbers with the request's
/// seed before it builds anything, so the same request gives the same path
/// (for planners that run in one thread; PRM grows its roadmap while another
/// thread looks for a solution, so its path may depend on timing). OMPL's
/// seed and log level are process-wide: calls to plan() are serialised by a
/// process-wide mutex, which makes plan() safe to call from any thread.
class TransitPlanner {
 public:
  /// Keeps a reference: the world must outlive the planner.
  explicit TransitPlanner(const collision::CollisionWorld& world);

  /// Throws tw::InputError for a request that is malformed: joint vectors of
  /// the wrong size or not finite, no goal, preferred_goal out of range, a
  /// non-positive time limit, seed 0, an unknown planner name.
  TransitResult plan(const TransitRequest& request) const;

 private:
  const collision::CollisionWorld& world_;
};

}  // namespace tw::planner
