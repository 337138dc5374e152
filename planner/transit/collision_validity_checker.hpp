#pragma once

#include <ompl/base/StateValidityChecker.h>

#include "planner/transit/guarded_workspace.hpp"

namespace tw::planner::detail {

/// OMPL state validity from CollisionWorld::checkState with the world's
/// margins, for a RealVectorStateSpace whose dimensions are the arm's
/// joints in chain order [rad] or [m]. States outside the space's bounds (the
/// joint limits) are invalid. Thread-safe through the guarded workspace.
class CollisionValidityChecker : public ompl::base::StateValidityChecker {
 public:
  CollisionValidityChecker(const ompl::base::SpaceInformationPtr& si, GuardedWorkspace& guarded);
  bool isValid(const ompl::base::State* state) const override;

 private:
  GuardedWorkspace& guarded_;
};

}  // namespace tw::planner::detail
