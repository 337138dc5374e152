#include "planner/transit/collision_validity_checker.hpp"

#include <ompl/base/SpaceInformation.h>

#include "planner/transit/ompl_joint_state.hpp"

namespace tw::planner::detail {

CollisionValidityChecker::CollisionValidityChecker(const ompl::base::SpaceInformationPtr& si,
                                                   GuardedWorkspace& guarded)
    : ompl::base::StateValidityChecker(si), guarded_(guarded) {}

bool CollisionValidityChecker::isValid(const ompl::base::State* state) const {
  if (!si_->satisfiesBounds(state)) return false;
  const kinematics::JointVector q = jointVector(state, si_->getStateDimension());
  std::lock_guard<std::mutex> lock(guarded_.mutex);
  ++guarded_.state_checks;
  return guarded_.world.checkState(q, guarded_.workspace).valid();
}

}  // namespace tw::planner::detail
