#include "planner/transit/segment_motion_validator.hpp"

#include <ompl/base/SpaceInformation.h>

#include "planner/transit/ompl_joint_state.hpp"

namespace tw::planner::detail {

namespace {
/// A last valid state nearer the start than this fraction is not worth
/// reporting: the planner gains nothing from a stub of motion.
constexpr double kSmallestUsefulFraction = 0.01;
/// How far back from the invalid state found the next try ends, as a factor
/// on its fraction: close enough to keep most of the free part.
constexpr double kBackOff = 0.9;
}  // namespace

SegmentMotionValidator::SegmentMotionValidator(const ompl::base::SpaceInformationPtr& si,
                                               GuardedWorkspace& guarded)
    : ompl::base::MotionValidator(si), guarded_(guarded) {}

collision::SegmentResult SegmentMotionValidator::checkSegment(
    const kinematics::JointVector& q1, const kinematics::JointVector& q2) const {
  std::lock_guard<std::mutex> lock(guarded_.mutex);
  const collision::SegmentResult result = guarded_.world.checkSegment(q1, q2, guarded_.workspace);
  ++guarded_.segment_checks;
  guarded_.state_checks += result.states_checked;
  return result;
}

bool SegmentMotionValidator::checkMotion(const ompl::base::State* s1,
                                         const ompl::base::State* s2) const {
  // Bounds first: checkSegment does not look at joint limits, and both ends
  // inside a box keep the whole straight segment inside it.
  if (!si_->satisfiesBounds(s1) || !si_->satisfiesBounds(s2)) return false;
  const unsigned n = si_->getStateDimension();
  return checkSegment(jointVector(s1, n), jointVector(s2, n)).valid();
}

bool SegmentMotionValidator::checkMotion(const ompl::base::State* s1, const ompl::base::State* s2,
                                         std::pair<ompl::base::State*, double>& last_valid) const {
  const unsigned n = si_->getStateDimension();
  const kinematics::JointVector q1 = jointVector(s1, n);
  const kinematics::JointVector q2 = jointVector(s2, n);
  double fraction = 0.0;
  if (si_->satisfiesBounds(s1) && si_->satisfiesBounds(s2)) {
    const collision::SegmentResult whole = checkSegment(q1, q2);
    if (whole.valid()) return true;
    // checkSegment reports an invalid state found by bisection, not the
    // first one: shorten the segment until what is left is valid.
    double invalid_at = whole.fraction;
    while (invalid_at * kBackOff >= kSmallestUsefulFraction) {
      const double end = invalid_at * kBackOff;
      const kinematics::JointVector q_end = q1 + end * (q2 - q1);
      const collision::SegmentResult part = checkSegment(q1, q_end);
      if (part.valid()) {
        fraction = end;
        break;
      }
      invalid_at = part.fraction * end;
    }
  }
  if (last_valid.first != nullptr) {
    const kinematics::JointVector q_valid = q1 + fraction * (q2 - q1);
    setJointVector(q_valid, last_valid.first);
  }
  last_valid.second = fraction;
  return false;
}

}  // namespace tw::planner::detail
