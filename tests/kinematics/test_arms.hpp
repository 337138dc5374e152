#pragma once

#include <string>

#include "kinematics/arm_model.hpp"
#include "kinematics/common/angles.hpp"

namespace tw::kinematics::test {

/// The synthetic ortho-parallel arm of the worked check vector in the team's
/// domain-facts reference (§4): (a1, a2, b, c1, c2, c3, c4) =
/// (0.20, 0.10, 0.05, 0.50, 0.70, 0.80, 0.15) m, with the given limits on
/// every joint [rad] and generous rates.
ArmModel referenceOrthoArm(double lower = -kPi,
                           double upper = kPi);

/// Same geometry, with axes 4 and 6 allowed ±350° (multi-turn) and 1–3, 5
/// limited as on an ordinary arm.
ArmModel referenceOrthoArmMultiTurn();

/// The invented sample arm shipped in samples/arms/.
ArmModel sampleArm();

/// Path of a file in the source tree.
std::string sourcePath(const std::string& relative);

}  // namespace tw::kinematics::test

#include <random>

namespace tw::kinematics::test {

/// Joint values drawn uniformly within the arm's limits, from the raw bits of
/// the generator so the sequence is the same on every standard library.
JointVector randomJoints(const ArmModel& arm, std::mt19937_64& generator);

/// A uniform draw in [0, 1).
double unitDraw(std::mt19937_64& generator);

/// The angle [rad] of R_aᵀ R_b.
double rotationAngleBetween(const Eigen::Matrix3d& R_a, const Eigen::Matrix3d& R_b);

}  // namespace tw::kinematics::test
