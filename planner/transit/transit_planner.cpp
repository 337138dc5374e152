#include "planner/transit/transit_planner.hpp"

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
#include <stdexcept>

#include "kinematics/common/input_error.hpp"
#include "planner/report_text.hpp"
#include "planner/transit/collision_validity_checker.hpp"
#include "planner/transit/ompl_joint_state.hpp"
#include "planner/transit/segment_motion_validator.hpp"

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
    throw std::invalid_argument(what + " has " + std::to_string(q.size()) + " joint values; the arm has " +
                     std::to_string(joints));
  }
  if (!q.allFinite()) throw std::invalid_argument(what + " has a value that is not finite");
}

void checkRequest(const TransitRequest& request, int joints) {
  checkJointVector(request.start, joints, "transit start");
  if (request.goals.empty()) throw std::invalid_argument("transit request without a goal");
  for (std::size_t i = 0; i < request.goals.size(); ++i) {
    checkJointVector(request.goals[i], joints, "transit goal " + std::to_string(i));
  }
  if (request.preferred_goal < 0 ||
      request.preferred_goal >= static_cast<int>(request.goals.size())) {
    throw std::invalid_argument("preferred transit goal " + std::to_string(request.preferred_goal) +
                     " is not one of the " + std::to_string(request.goals.size()) + " goals");
  }
  if (!(request.time_limit > 0.0) || !std::isfinite(request.time_limit)) {
    throw std::invalid_argument("transit time limit must be a positive number of seconds");
  }
  if (request.seed == 0) throw std::invalid_argument("transit seed must be positive (OMPL cannot use 0)");
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

/// One call of TransitPlanner::plan, in its phases: the ends checked, the
/// direct segment tried, then the OMPL search, simplification and the
/// independent re-check. Each phase returns the finished result when it
/// decides the outcome, or nothing to go on.
class TransitSearch {
 public:
  TransitSearch(const collision::CollisionWorld& world, const TransitRequest& request)
      : world_(world),
        request_(request),
        joints_(world.arm().jointCount()),
        began_(std::chrono::steady_clock::now()),
        guarded_(world),
        recheck_workspace_(world),
        start_text_("start " + formatJoints(request.start)) {
    result_.planner = request.planner;
  }

  std::optional<TransitResult> checkEnds() {
    if (const std::string problem = stateProblem(world_, request_.start, guarded_); !problem.empty()) {
      return finish(TransitOutcome::kInvalidStart, start_text_ + " is invalid: " + problem);
    }
    std::vector<int> order = {request_.preferred_goal};
    for (int i = 0; i < static_cast<int>(request_.goals.size()); ++i) {
      if (i != request_.preferred_goal) order.push_back(i);
    }
    for (int index : order) {
      const std::string problem = stateProblem(world_, request_.goals[index], guarded_);
      if (problem.empty()) {
        valid_goals_.push_back(index);
      } else {
        rejected_ += "; goal " + std::to_string(index) + " " +
                     formatJoints(request_.goals[index]) + " is invalid: " + problem;
      }
    }
    if (valid_goals_.empty()) {
      return finish(TransitOutcome::kNoValidGoal, "no valid goal from " + start_text_ + rejected_);
    }
    return std::nullopt;
  }

  std::optional<TransitResult> tryDirectSegment() {
    for (int index : valid_goals_) {
      ++guarded_.segment_checks;
      const collision::SegmentResult direct =
          world_.checkSegment(request_.start, request_.goals[index], guarded_.workspace);
      guarded_.state_checks += direct.states_checked;
      if (!direct.valid()) continue;
      const JointPath path = {request_.start, request_.goals[index]};
      if (const std::optional<PathCheckFailure> failure = accept(path)) {
        return finish(TransitOutcome::kRecheckFailed, "direct segment from " + start_text_ +
                                                          " failed the re-check: " + failure->reason);
      }
      result_.goal_index = index;
      result_.direct = true;
      result_.planned_length = result_.length = jointPathLength(path);
      return finish(TransitOutcome::kSolved, "direct segment to goal " + std::to_string(index));
    }
    return std::nullopt;
  }

  TransitResult searchWithOmpl() {
    std::lock_guard<std::mutex> ompl_lock(omplMutex());
    const OmplLogLevel log_level(request_.verbose ? ompl::msg::LOG_INFO : ompl::msg::LOG_NONE);
    // Seeded before any OMPL object of this call exists, so that every
    // generator they create starts from this seed.
    ompl::RNG::setSeed(request_.seed);
    const ob::SpaceInformationPtr si = makeSpaceInformation();
    const ob::ProblemDefinitionPtr problem = makeProblem(si);
    const ob::PlannerPtr planner = makePlanner(request_.planner, si);
    planner->setProblemDefinition(problem);
    planner->setup();
    const ob::PlannerStatus status =
        planner->solve(ob::timedPlannerTerminationCondition(request_.time_limit));
    if (status != ob::PlannerStatus::EXACT_SOLUTION) {
      std::string goals_text;
      for (int index : valid_goals_) {
        goals_text += (goals_text.empty() ? "goal " : ", goal ") + std::to_string(index) + " " +
                      formatJoints(request_.goals[index]);
      }
      return finish(TransitOutcome::kTimeout,
                    request_.planner + " found no path from " + start_text_ + " to " + goals_text +
                        " within " + formatFixed(request_.time_limit, 3) + " s (" +
                        status.asString() + ")" + rejected_);
    }
    og::PathGeometric path(*problem->getSolutionPath()->as<og::PathGeometric>());
    return simplifyAndRecheck(si, path);
  }

 private:
  TransitResult finish(TransitOutcome outcome, std::string reason) {
    result_.outcome = outcome;
    result_.reason = std::move(reason);
    if (outcome != TransitOutcome::kSolved) result_.path.clear();
    result_.state_checks = guarded_.state_checks;
    result_.segment_checks = guarded_.segment_checks;
    result_.seconds =
        std::chrono::duration<double>(std::chrono::steady_clock::now() - began_).count();
    return result_;
  }

  /// Accepts a candidate path only after the independent re-check, with a
  /// workspace of its own.
  std::optional<PathCheckFailure> accept(const JointPath& path) {
    const std::optional<PathCheckFailure> failure = recheckPath(world_, path, recheck_workspace_);
    if (!failure) result_.path = path;
    return failure;
  }

  ob::SpaceInformationPtr makeSpaceInformation() {
    const kinematics::ArmModel& arm = world_.arm();
    const auto space = std::make_shared<ob::RealVectorStateSpace>(static_cast<unsigned>(joints_));
    ob::RealVectorBounds bounds(static_cast<unsigned>(joints_));
    for (int j = 0; j < joints_; ++j) {
      bounds.setLow(j, arm.lowerLimits()[j]);
      bounds.setHigh(j, arm.upperLimits()[j]);
    }
    space->setBounds(bounds);
    const auto si = std::make_shared<ob::SpaceInformation>(space);
    si->setStateValidityChecker(std::make_shared<detail::CollisionValidityChecker>(si, guarded_));
    si->setMotionValidator(std::make_shared<detail::SegmentMotionValidator>(si, guarded_));
    si->setup();
    return si;
  }

  ob::ProblemDefinitionPtr makeProblem(const ob::SpaceInformationPtr& si) const {
    const auto problem = std::make_shared<ob::ProblemDefinition>(si);
    ob::ScopedState<> start_state(si->getStateSpace());
    detail::setJointVector(request_.start, start_state.get());
    problem->addStartState(start_state);
    const auto goal = std::make_shared<ob::GoalStates>(si);
    for (int index : valid_goals_) {
      ob::ScopedState<> goal_state(si->getStateSpace());
      detail::setJointVector(request_.goals[index], goal_state.get());
      goal->addState(goal_state);
    }
    problem->setGoal(goal);
    // Any path satisfies the objective, so that optimising planners (PRM)
    // stop at their first solution instead of running out the clock.
    const auto objective = std::make_shared<ob::PathLengthOptimizationObjective>(si);
    objective->setCostThreshold(objective->infiniteCost());
    problem->setOptimizationObjective(objective);
    return problem;
  }

  TransitResult simplifyAndRecheck(const ob::SpaceInformationPtr& si, og::PathGeometric& path) {
    const JointPath planned = toJointPath(path, static_cast<unsigned>(joints_));
    for (int index : valid_goals_) {
      if ((planned.back() - request_.goals[index]).lpNorm<Eigen::Infinity>() <= kGoalMatchTolerance) {
        result_.goal_index = index;
        break;
      }
    }
    if (result_.goal_index < 0) {
      return finish(TransitOutcome::kRecheckFailed,
                    request_.planner + " returned a path from " + start_text_ + " ending at " +
                        formatJoints(planned.back()) + ", which is none of the goals");
    }
    result_.planned_length = jointPathLength(planned);

    JointPath simplified = planned;
    if (request_.simplify) {
      og::PathSimplifier simplifier(si);
      simplifyPath(simplifier, path);
      simplified = toJointPath(path, static_cast<unsigned>(joints_));
      // Exact ends, whatever rounding the interpolation left.
      simplified.front() = request_.start;
      simplified.back() = request_.goals[result_.goal_index];
    }
    std::optional<PathCheckFailure> failure = accept(simplified);
    std::string note;
    if (failure && request_.simplify) {
      note = "; the simplified path failed the re-check (" + failure->reason +
             "), the path as planned is used";
      failure = accept(planned);
    }
    if (failure) {
      return finish(TransitOutcome::kRecheckFailed, request_.planner + " path from " + start_text_ +
                                                        " failed the re-check: " + failure->reason);
    }
    result_.length = jointPathLength(result_.path);
    return finish(TransitOutcome::kSolved, "planned by " + request_.planner + " to goal " +
                                               std::to_string(result_.goal_index) + note);
  }

  const collision::CollisionWorld& world_;
  const TransitRequest& request_;
  const int joints_;
  const std::chrono::steady_clock::time_point began_;
  detail::GuardedWorkspace guarded_;
  collision::CollisionWorkspace recheck_workspace_;
  const std::string start_text_;
  TransitResult result_;
  std::vector<int> valid_goals_;
  std::string rejected_;
};

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
  checkRequest(request, world_.arm().jointCount());
  TransitSearch search(world_, request);
  if (std::optional<TransitResult> done = search.checkEnds()) return *done;
  if (std::optional<TransitResult> done = search.tryDirectSegment()) return *done;
  return search.searchWithOmpl();
}

}  // namespace tw::planner
