#pragma once

#include <string>

#include "collision/collision_world.hpp"
#include "kinematics/common/number_text.hpp"
#include "kinematics/joint.hpp"

namespace tw::planner {

/// Text for the reasons in planning and timing reports; numbers through
/// tw::formatFixed and tw::formatSignificant (C locale, never "-0").

/// "(q0, q1, ...)" with every value to 17 significant digits [rad] or [m], so
/// that a reported configuration can be pasted into a regression test.
std::string formatJoints(const kinematics::JointVector& q);

/// "<body> against <body> (<status>)" for an invalid state found in `world`.
std::string describeState(const collision::CollisionWorld& world,
                          const collision::StateResult& state);

}  // namespace tw::planner
