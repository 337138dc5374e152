#pragma once

#include <Eigen/Geometry>

#include "kinematics/arm_model.hpp"

namespace tw::kinematics {

/// The spherical shell about the shoulder (the point of axis 2 in the arm
/// plane) in which the wrist centre of an ortho-parallel arm moves: radii
/// from the geometry alone, |c2 − k| ≤ |C − shoulder| ≤ c2 + k with
/// k = √(a2² + c3²). Joint limits only shrink the shell. A fast reach
/// pre-check before any IK.
class ReachShell {
 public:
  /// Throws tw::InputError unless the arm has ortho-parallel parameters.
  explicit ReachShell(const ArmModel& arm);

  double outerRadius() const { return outer_; }  ///< [m]
  double innerRadius() const { return inner_; }  ///< [m]

  /// Wrist centre of a flange pose X_BF: the origin of the last link frame.
  Eigen::Vector3d wristCentre(const Eigen::Isometry3d& X_BF) const;

  /// Whether some rotation of axis 1 (front or back) puts the wrist centre
  /// p_BC [m, base frame] inside the shell. False means no IK branch can
  /// reach it; true does not promise a solution within joint limits.
  bool mayReach(const Eigen::Vector3d& p_BC) const;

 private:
  OrthoParallelGeometry g_;
  Eigen::Isometry3d X_FL_;
  double outer_ = 0.0;
  double inner_ = 0.0;
};

}  // namespace tw::kinematics
