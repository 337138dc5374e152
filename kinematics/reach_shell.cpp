#include "kinematics/reach_shell.hpp"

#include <cmath>

#include "kinematics/common/input_error.hpp"

namespace tw::kinematics {

ReachShell::ReachShell(const ArmModel& arm) {
  if (!arm.orthoParallel()) {
    throw InputError(arm.source(), 0,
                     "arm '" + arm.name() + "' has no ortho-parallel parameters; no reach shell");
  }
  g_ = *arm.orthoParallel();
  X_FL_ = arm.flangeInLastLink().inverse();
  const double forearm = std::hypot(g_.a2, g_.c3);
  outer_ = g_.c2 + forearm;
  inner_ = std::abs(g_.c2 - forearm);
}

Eigen::Vector3d ReachShell::wristCentre(const Eigen::Isometry3d& X_BF) const {
  return (X_BF * X_FL_).translation();
}

bool ReachShell::mayReach(const Eigen::Vector3d& p_BC) const {
  const double radial_squared = p_BC.x() * p_BC.x() + p_BC.y() * p_BC.y() - g_.b * g_.b;
  if (radial_squared < 0.0) return false;
  const double radial = std::sqrt(radial_squared);
  const double height = p_BC.z() - g_.c1;
  for (const double forward : {radial - g_.a1, -(radial + g_.a1)}) {
    const double distance = std::hypot(forward, height);
    if (distance >= inner_ && distance <= outer_) return true;
  }
  return false;
}

}  // namespace tw::kinematics
