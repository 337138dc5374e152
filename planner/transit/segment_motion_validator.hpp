#pragma once

#include <ompl/base/MotionValidator.h>

#include "planner/transit/guarded_workspace.hpp"

namespace tw::planner::detail {

/// OMPL motion validation through CollisionWorld::checkSegment: the straight
/// joint-space segment is checked so densely that no body point moves as far
/// as the clearance margin between checked states (Schwarzer–Saha–Latombe
/// bound), so no obstacle, however thin, is stepped over — unlike OMPL's
/// default fixed-resolution DiscreteMotionValidator. Both ends are checked.
/// Thread-safe through the guarded workspace; OMPL's own valid/invalid
/// counters are not kept (they are plain integers, not safe across threads):
/// the guarded workspace counts instead.
class SegmentMotionValidator : public ompl::base::MotionValidator {
 public:
  SegmentMotionValidator(const ompl::base::SpaceInformationPtr& si, GuardedWorkspace& guarded);

  bool checkMotion(const ompl::base::State* s1, const ompl::base::State* s2) const override;

  /// On failure, `last_valid` gets a state on the segment from which the part
  /// back to s1 has been checked valid, and its fraction (0 when none was
  /// found: then the state is s1).
  bool checkMotion(const ompl::base::State* s1, const ompl::base::State* s2,
                   std::pair<ompl::base::State*, double>& last_valid) const override;

 private:
  /// checkSegment under the lock, counted.
  collision::SegmentResult checkSegment(const kinematics::JointVector& q1,
                                        const kinematics::JointVector& q2) const;

  GuardedWorkspace& guarded_;
};

}  // namespace tw::planner::detail
