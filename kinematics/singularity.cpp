#include "kinematics/singularity.hpp"

#include <algorithm>
#include <cmath>

#include "kinematics/common/angles.hpp"
#include "kinematics/forward_kinematics.hpp"

namespace tw::kinematics {
namespace {


/// Distance of an angle from the nearest multiple of π.
double fromAligned(double angle) {
  return std::abs(std::remainder(angle, kPi));
}

}  // namespace

double manipulability(const Eigen::Ref<const Eigen::MatrixXd>& jacobian) {
  const double determinant = jacobian.rows() <= jacobian.cols()
                                 ? (jacobian * jacobian.transpose()).determinant()
                                 : (jacobian.transpose() * jacobian).determinant();
  return std::sqrt(std::max(0.0, determinant));
}

SingularityMeasures singularityMeasures(const ArmModel& arm, const JointVector& q) {
  LinkPoses poses;
  computeLinkPoses(arm, q, poses);
  const Jacobian jacobian = geometricJacobian(arm, poses);
  SingularityMeasures measures;
  measures.manipulability = manipulability(jacobian);

  if (const std::optional<OrthoParallelGeometry>& g = arm.orthoParallel()) {
    const auto theta = [&](int j) { return g->sign[j] * q[j] + g->zero_offset[j]; };
    measures.wrist = fromAligned(theta(4));
    measures.elbow = fromAligned(theta(2) + std::atan2(g->a2, g->c3));
    // The last link's origin is the wrist centre.
    const Eigen::Vector3d p_BC = poses.X_BL[6].translation();
    measures.shoulder = std::abs(std::hypot(p_BC.x(), p_BC.y()) - std::abs(g->b));
  }
  return measures;
}

JointVector jointLimitMargins(const ArmModel& arm, const JointVector& q) {
  return (q - arm.lowerLimits()).cwiseMin(arm.upperLimits() - q);
}

}  // namespace tw::kinematics
