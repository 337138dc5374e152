#pragma once

#include <Eigen/Geometry>
#include <cstdint>
#include <vector>

#include "kinematics/arm_model.hpp"

namespace tw::kinematics {

struct NumericIkOptions {
  int max_iterations = 200;
  double position_tolerance = 1e-11;     ///< [m]
  double orientation_tolerance = 1e-11;  ///< [rad]
  /// Starting damping λ of the Levenberg–Marquardt step; adapted per step.
  double initial_damping = 1e-2;
};

struct NumericIkResult {
  bool converged = false;
  JointVector q;  ///< the last iterate, always within the joint limits
  int iterations = 0;
  double position_error = 0.0;     ///< [m]
  double orientation_error = 0.0;  ///< [rad]
};

/// Numeric IK for any serial chain: damped least squares with an adaptive
/// Levenberg–Marquardt damping, Δq = (JᵀJ + λ²I)⁻¹ Jᵀ e (Wampler 1986;
/// Nakamura & Hanafusa 1986), each step projected onto the joint limits.
/// e stacks the position error [m] and the rotation-vector error [rad] of
/// the flange, both in the base frame. Deterministic; thread-safe.
NumericIkResult solveNumericIk(const ArmModel& arm, const Eigen::Isometry3d& X_BF,
                               const JointVector& seed, const NumericIkOptions& options = {});

struct MultiStartOptions {
  int starts = 100;
  std::uint64_t seed = 1;
  /// Solutions closer than this in every joint are one solution [rad] or [m].
  double duplicate_tolerance = 1e-6;
  NumericIkOptions solver;
};

/// Every distinct in-limit solution found from `starts` seeds drawn
/// uniformly within the limits by a seeded generator; sorted
/// lexicographically so the result does not depend on the draw order.
/// Finds branches with high probability, not with certainty.
std::vector<JointVector> enumerateNumericIk(const ArmModel& arm, const Eigen::Isometry3d& X_BF,
                                            const MultiStartOptions& options = {});

}  // namespace tw::kinematics
