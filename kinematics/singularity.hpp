#pragma once

#include <Eigen/Core>
#include <optional>

#include "kinematics/arm_model.hpp"

namespace tw::kinematics {

/// How far a configuration is from the singularities of the arm.
struct SingularityMeasures {
  /// Yoshikawa's manipulability w = √det(J Jᵀ) of the flange Jacobian
  /// (Yoshikawa, IJRR 4(2), 1985); 0 at any singularity. Mixed units, so
  /// compare it only between configurations of one arm.
  double manipulability = 0.0;
  /// Ortho-parallel arms only: angle [rad] of axis 5 from 0 or ±180°, where
  /// axes 4 and 6 line up (wrist singularity).
  std::optional<double> wrist;
  /// Ortho-parallel arms only: angle [rad] of the elbow from fully stretched
  /// or fully folded (elbow singularity), θ3 + atan2(a2, c3) from 0 or ±180°.
  std::optional<double> elbow;
  /// Ortho-parallel arms only: distance [m] of the wrist centre from the
  /// cylinder of radius |b| about axis 1, on which axis 1 cannot move the
  /// wrist centre sideways (shoulder singularity).
  std::optional<double> shoulder;
};

/// Yoshikawa's w = √det(J Jᵀ) for a Jacobian with no more rows than columns,
/// √det(Jᵀ J) otherwise (the product of the singular values either way).
double manipulability(const Eigen::Ref<const Eigen::MatrixXd>& jacobian);

SingularityMeasures singularityMeasures(const ArmModel& arm, const JointVector& q);

/// Per joint, the distance to the nearer limit [rad] or [m]: min(q − lower,
/// upper − q); negative when the joint is outside its limits.
JointVector jointLimitMargins(const ArmModel& arm, const JointVector& q);

}  // namespace tw::kinematics
