#pragma once

#include <kdl/chain.hpp>
#include <kdl/frames.hpp>
#include <kdl/jntarray.hpp>

#include "kinematics/arm_model.hpp"

namespace tw::kinematics::test {

/// The arm as a KDL chain: a fixed segment to the first joint frame, then one
/// segment per joint whose tip is the next joint frame (the flange after the
/// last joint).
KDL::Chain kdlChain(const ArmModel& arm);
KDL::JntArray kdlJoints(const JointVector& q);
JointVector fromKdl(const KDL::JntArray& q);
KDL::Frame toKdl(const Eigen::Isometry3d& X);
Eigen::Isometry3d fromKdl(const KDL::Frame& frame);

}  // namespace tw::kinematics::test
