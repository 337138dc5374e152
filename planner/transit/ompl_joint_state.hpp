#pragma once

#include <ompl/base/State.h>
#include <ompl/base/spaces/RealVectorStateSpace.h>

#include "kinematics/joint.hpp"

namespace tw::planner::detail {

/// The joint vector held by a RealVectorStateSpace state of `dimension`
/// joints, in chain order.
inline kinematics::JointVector jointVector(const ompl::base::State* state, unsigned dimension) {
  const double* values = state->as<ompl::base::RealVectorStateSpace::StateType>()->values;
  kinematics::JointVector q(static_cast<int>(dimension));
  for (unsigned j = 0; j < dimension; ++j) q[j] = values[j];
  return q;
}

/// Writes q into a RealVectorStateSpace state of q.size() dimensions.
inline void setJointVector(const kinematics::JointVector& q, ompl::base::State* state) {
  double* values = state->as<ompl::base::RealVectorStateSpace::StateType>()->values;
  for (int j = 0; j < q.size(); ++j) values[j] = q[j];
}

}  // namespace tw::planner::detail
