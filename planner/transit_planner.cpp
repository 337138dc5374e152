#include "planner/transit_planner.hpp"

#include <ompl/base/ProblemDefinition.h>
#include <ompl/base/ScopedState.h>
#include <ompl/base/SpaceInformation.h>
#include <ompl/base/goals/GoalStates.h>
#include <ompl/base/objectives/PathLengthOptimizationObjective.h>
#include <ompl/base/spaces/RealVectorStateSpace.h>
#include <ompl/geometric/PathGeometric.h>
#include <ompl/geometric/PathSimplifier.h>
#include <ompl/geometric/planners/kpiece/KPIECE1.h>
#include <ompl/geometric/planners/kpiece/LBKPIECE1.h>
#include <ompl/geometric/planners/prm/PRM.h>
#include <ompl/geometric/planners/rrt/BiTRRT.h>
#include <ompl/geometric/planners/rrt/RRTConnect.h>
#include <ompl/util/Console.h>
#include <ompl/util/RandomNumbers.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <mutex>

#include "kinematics/input_error.hpp"
#include "planner/collision_validity_checker.hpp"
#include "planner/ompl_joint_state.hpp"
#include "planner/report_text.hpp"
#include "planner/segment_motion_validator.hpp"

namespace tw::planner {

namespace ob = ompl::base;
namespace og = ompl::geometric;

namespace {

/// How far [rad or m] the end of a planned path may lie from a goal state:
/// OMPL copies goal states into its trees, so only rounding can separate them.
constexpr double kGoalMatchTolerance = 1e-9;
/// B-spline smoothing rounds: each doubles the waypoints and re-checks the
/// whole path. On the demo cell a second round or more shortcut rounds cost
/// 30-45 % more state checks for a path the final vertex reduction brings
/// back to about the same few waypoints.
constexpr unsigned kSmoothingSteps = 1;
/// Rounds of vertex reduction and shortcutting before smoothing (see above).
constexpr int kShortcutRounds = 1;

/// OMPL's seed, log level and seed generator are process-wide.
std::mutex& omplMutex() {
  static std::mutex mutex;
  return mutex;
}

/// Sets OMPL's log level for the lifetime of the object, then restores it.
class OmplLogLevel {
 public:
  explicit OmplLogLevel(ompl::msg::LogLevel level) : previous_(ompl::msg::getLogLevel()) {
    ompl::msg::setLogLevel(level);
  }
  ~OmplLogLevel() { ompl::msg::setLogLevel(previous_); }
  OmplLogLevel(const OmplLogLevel&) = delete;
  OmplLogLevel& operator=(const OmplLogLevel&) = delete;

 private:
  ompl::msg::LogLevel previous_;
};

void checkPlannerName(const std::string& name) {
  const std::vector<std::string>& names = transitPlannerNames();
  if (std::find(names.begin(), names.end(), name) != names.end()) return;
  std::string known;
  for (const std::string& candidate : names) known += (known.empty() ? "" : ", ") + candidate;
  throw InputError("unknown transit planner \"" + name + "\"; expected one of " + known);
}

/// Precondition: checkPlannerName(name) passed.
ob::PlannerPtr makePlanner(const std::string& name, const ob::SpaceInformationPtr& si) {
  if (name == "PRM") return std::make_shared<og::PRM>(si);
  if (name == "BiTRRT") return std::make_shared<og::BiTRRT>(si);
  if (name == "KPIECE1") return std::make_shared<og::KPIECE1>(si);
  if (name == "LBKPIECE1") return std::make_shared<og::LBKPIECE1>(si);
  return std::make_shared<og::RRTConnect>(si);
}

void checkJointVector(const kinematics::JointVector& q, int joints, const std::string& what) {
  if (q.size() != joints) {
    throw InputError(what + " has " + std::to_string(q.size()) + " joint values; the arm has " +
                     std::to_string(joints));
  }
  if (!q.allFinite()) throw InputError(what + " has a value that is not finite");
}

void checkRequest(const TransitRequest& request, int joints) {
  checkJointVector(request.start, joints, "transit start");
  if (request.goals.empty()) throw InputError("transit request without a goal");
  for (std::size_t i = 0; i < request.goals.size(); ++i) {
    checkJointVector(request.goals[i], joints, "transit goal " + std::to_string(i));
  }
  if (request.preferred_goal < 0 ||
      request.preferred_goal >= static_cast<int>(request.goals.size())) {
    throw InputError("preferred transit goal " + std::to_string(request.preferred_goal) +
                     " is not one of the " + std::to_string(request.goals.size()) + " goals");
  }
  if (!(request.time_limit > 0.0) || !std::isfinite(request.time_limit)) {
    throw InputError("transit time limit must be a positive number of seconds");
  }
  if (request.seed == 0) throw InputError("transit seed must be positive (OMPL cannot use 0)");
  checkPlannerName(request.planner);
}

/// Why q is not a valid configuration, or "" when it is.
std::string stateProblem(const collision::CollisionWorld& world, const kinematics::JointVector& q,
                         detail::GuardedWorkspace& guarded) {
  if (!world.arm().withinLimits(q)) return "outside the joint limits";
  ++guarded.state_checks;
  const collision::StateResult state = world.checkState(q, guarded.workspace);
  return state.valid() ? "" : describeState(world, state);
}

JointPath toJointPath(const og::PathGeometric& path, unsigned dimension) {
  JointPath joints;
  joints.reserve(path.getStateCount());
  for (std::size_t i = 0; i < path.getStateCount(); ++i) {
    joints.push_back(detail::jointVector(path.getState(i), dimension));
  }
  return joints;
}

/// Shortcutting, then smoothing; every change goes through the space
/// information's motion validator (the segment check).
void simplifyPath(og::PathSimplifier& simplifier, og::PathGeometric& path) {
  for (int round = 0; round < kShortcutRounds; ++round) {
    const bool reduced = simplifier.reduceVertices(path);
    const bool shortened = simplifier.shortcutPath(path);
    if (!reduced && !shortened) break;
  }
  simplifier.smoothBSpline(path, kSmoothingSteps);
  simplifier.reduceVertices(path);
}

}  // namespace

const char* toString(TransitOutcome outcome) {
  switch (outcome) {
    case TransitOutcome::kSolved: return "solved";
    case TransitOutcome::kInvalidStart: return "invalid start";
    case TransitOutcome::kNoValidGoal: return "no valid goal";
    case TransitOutcome::kTimeout: return "timeout";
    case TransitOutcome::kRecheckFailed: return "re-check failed";
  }
  return "unknown";
}

const std::vector<std::string>& transitPlannerNames() {
  static const std::vector<std::string> names = {"RRTConnect", "PRM", "BiTRRT", "KPIECE1",
                                                 "LBKPIECE1"};
  return names;
}

TransitPlanner::TransitPlanner(const collision::CollisionWorld& world) : world_(world) {}

TransitResult TransitPlanner::plan(const TransitRequest& request) const {
  const kinematics::ArmModel& arm = world_.arm();
  const int joints = arm.jointCount();
  checkRequest(request, joints);
  const std::chrono::steady_clock::time_point began = std::chrono::steady_clock::now();

  TransitResult result;
  result.planner = request.planner;
  detail::GuardedWorkspace guarded(world_);
  const auto finish = [&](TransitOutcome outcome, std::string reason) {
    result.outcome = outcome;
    result.reason = std::move(reason);
    if (outcome != TransitOutcome::kSolved) result.path.clear();
    result.state_checks = guarded.state_checks;
    result.segment_checks = guarded.segment_checks;
    result.seconds =
        std::chrono::duration<double>(std::chrono::steady_clock::now() - began).count();
    return result;
  };
  const std::string start_text = "start " + formatJoints(request.start);

  if (const std::string problem = stateProblem(world_, request.start, guarded); !problem.empty()) {
    return finish(TransitOutcome::kInvalidStart, start_text + " is invalid: " + problem);
  }

  std::vector<int> order = {request.preferred_goal};
  for (int i = 0; i < static_cast<int>(request.goals.size()); ++i) {
    if (i != request.preferred_goal) order.push_back(i);
  }
  std::vector<int> valid_goals;
  std::string rejected;
  for (int index : order) {
    const std::string problem = stateProblem(world_, request.goals[index], guarded);
    if (problem.empty()) {
      valid_goals.push_back(index);
    } else {
      rejected += "; goal " + std::to_string(index) + " " +
                  formatJoints(request.goals[index]) + " is invalid: " + problem;
    }
  }
  if (valid_goals.empty()) {
    return finish(TransitOutcome::kNoValidGoal, "no valid goal from " + start_text + rejected);
  }

  // Accepts a candidate path only after the independent re-check, with a
  // workspace of its own.
  collision::CollisionWorkspace recheck_workspace(world_);
  const auto accept = [&](const JointPath& path) {
    const std::optional<PathCheckFailure> failure = recheckPath(world_, path, recheck_workspace);
    if (!failure) result.path = path;
    return failure;
  };

  for (int index : valid_goals) {
    ++guarded.segment_checks;
    const collision::SegmentResult direct =
        world_.checkSegment(request.start, request.goals[index], guarded.workspace);
    guarded.state_checks += direct.states_checked;
    if (!direct.valid()) continue;
    const JointPath path = {request.start, request.goals[index]};
    if (const std::optional<PathCheckFailure> failure = accept(path)) {
      return finish(TransitOutcome::kRecheckFailed,
                    "direct segment from " + start_text + " failed the re-check: " + failure->reason);
    }
    result.goal_index = index;
    result.direct = true;
    result.planned_length = result.length = jointPathLength(path);
    return finish(TransitOutcome::kSolved, "direct segment to goal " + std::to_string(index));
  }

  std::lock_guard<std::mutex> ompl_lock(omplMutex());
  const OmplLogLevel log_level(request.verbose ? ompl::msg::LOG_INFO : ompl::msg::LOG_NONE);
  // Seeded before any OMPL object of this call exists, so that every
  // generator they create starts from this seed.
  ompl::RNG::setSeed(request.seed);

  const auto space = std::make_shared<ob::RealVectorStateSpace>(static_cast<unsigned>(joints));
  ob::RealVectorBounds bounds(static_cast<unsigned>(joints));
  for (int j = 0; j < joints; ++j) {
    bounds.setLow(j, arm.lowerLimits()[j]);
    bounds.setHigh(j, arm.upperLimits()[j]);
  }
  space->setBounds(bounds);
  const auto si = std::make_shared<ob::SpaceInformation>(space);
  si->setStateValidityChecker(std::make_shared<detail::CollisionValidityChecker>(si, guarded));
  si->setMotionValidator(std::make_shared<detail::SegmentMotionValidator>(si, guarded));
  si->setup();

  const auto problem = std::make_shared<ob::ProblemDefinition>(si);
  ob::ScopedState<> start_state(space);
  detail::setJointVector(request.start, start_state.get());
  problem->addStartState(start_state);
  const auto goal = std::make_shared<ob::GoalStates>(si);
  for (int index : valid_goals) {
    ob::ScopedState<> goal_state(space);
    detail::setJointVector(request.goals[index], goal_state.get());
    goal->addState(goal_state);
  }
  problem->setGoal(goal);
  // Any path satisfies the objective, so that optimising planners (PRM)
  // stop at their first solution instead of running out the clock.
  const auto objective = std::make_shared<ob::PathLengthOptimizationObjective>(si);
  objective->setCostThreshold(objective->infiniteCost());
  problem->setOptimizationObjective(objective);

  const ob::PlannerPtr planner = makePlanner(request.planner, si);
  planner->setProblemDefinition(problem);
  planner->setup();
  const ob::PlannerStatus status =
      planner->solve(ob::timedPlannerTerminationCondition(request.time_limit));
  if (status != ob::PlannerStatus::EXACT_SOLUTION) {
    std::string goals_text;
    for (int index : valid_goals) {
      goals_text += (goals_text.empty() ? "goal " : ", goal ") + std::to_string(index) + " " +
                    formatJoints(request.goals[index]);
    }
    return finish(TransitOutcome::kTimeout,
                  request.planner + " found no path from " + start_text + " to " + goals_text +
                      " within " + formatDecimal(request.time_limit, 3) + " s (" +
                      status.asString() + ")" + rejected);
  }

  og::PathGeometric path(*problem->getSolutionPath()->as<og::PathGeometric>());
  const JointPath planned = toJointPath(path, static_cast<unsigned>(joints));
  for (int index : valid_goals) {
    if ((planned.back() - request.goals[index]).lpNorm<Eigen::Infinity>() <= kGoalMatchTolerance) {
      result.goal_index = index;
      break;
    }
  }
  if (result.goal_index < 0) {
    return finish(TransitOutcome::kRecheckFailed,
                  request.planner + " returned a path from " + start_text + " ending at " +
                      formatJoints(planned.back()) + ", which is none of the goals");
  }
  result.planned_length = jointPathLength(planned);

  JointPath simplified = planned;
  if (request.simplify) {
    og::PathSimplifier simplifier(si);
    simplifyPath(simplifier, path);
    simplified = toJointPath(path, static_cast<unsigned>(joints));
    // Exact ends, whatever rounding the interpolation left.
    simplified.front() = request.start;
    simplified.back() = request.goals[result.goal_index];
  }
  std::optional<PathCheckFailure> failure = accept(simplified);
  std::string note;
  if (failure && request.simplify) {
    note = "; the simplified path failed the re-check (" + failure->reason +
           "), the path as planned is used";
    failure = accept(planned);
  }
  if (failure) {
    return finish(TransitOutcome::kRecheckFailed, request.planner + " path from " + start_text +
                                                      " failed the re-check: " + failure->reason);
  }
  result.length = jointPathLength(result.path);
  return finish(TransitOutcome::kSolved,
                "planned by " + request.planner + " to goal " + std::to_string(result.goal_index) + note);
}

}  // namespace tw::planner
