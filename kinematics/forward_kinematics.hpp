#pragma once

#include <Eigen/Geometry>
#include <array>

#include "kinematics/arm_model.hpp"

namespace tw::kinematics {

/// Poses of every link frame and of the flange, in the arm base frame B.
/// Fixed capacity, so computing them never allocates.
struct LinkPoses {
  /// Number of valid entries in X_BL: the base plus one link per joint.
  int count = 0;
  /// X_BL[0] is the base (identity); X_BL[i] is the frame of joint i after
  /// its motion, i.e. the frame of link i. Joint i's axis passes through
  /// the origin of X_BL[i].
  std::array<Eigen::Isometry3d, kMaxJoints + 1> X_BL;
  Eigen::Isometry3d X_BF = Eigen::Isometry3d::Identity();
};

/// Forward kinematics of every link. Precondition: q.size() == jointCount().
/// Thread-safe; no allocation.
void computeLinkPoses(const ArmModel& arm, const JointVector& q, LinkPoses& poses);

/// Pose of the flange F in the arm base frame B.
Eigen::Isometry3d flangePose(const ArmModel& arm, const JointVector& q);

/// The geometric Jacobian of the flange origin in the base frame: rows 0–2
/// map joint rates to the linear velocity of the flange origin [m/s], rows
/// 3–5 to the angular velocity [rad/s] (the same layout as Orocos KDL).
using Jacobian = Eigen::Matrix<double, 6, Eigen::Dynamic, 0, 6, kMaxJoints>;

Jacobian geometricJacobian(const ArmModel& arm, const JointVector& q);
/// The same from link poses already computed for this q.
Jacobian geometricJacobian(const ArmModel& arm, const LinkPoses& poses);

}  // namespace tw::kinematics
