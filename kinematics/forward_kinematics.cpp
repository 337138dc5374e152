#include "kinematics/forward_kinematics.hpp"

#include <cassert>

namespace tw::kinematics {

void computeLinkPoses(const ArmModel& arm, const JointVector& q, LinkPoses& poses) {
  assert(q.size() == arm.jointCount());
  const int count = arm.jointCount();
  poses.count = count + 1;
  poses.X_BL[0].setIdentity();
  for (int i = 0; i < count; ++i) {
    const JointSpec& joint = arm.joint(i);
    Eigen::Isometry3d X_BJ = poses.X_BL[i] * joint.X_PJ;
    if (joint.type == JointType::kRevolute) {
      X_BJ.linear() = X_BJ.linear() * Eigen::AngleAxisd(q[i], joint.axis).toRotationMatrix();
    } else {
      X_BJ.translation() += X_BJ.linear() * (joint.axis * q[i]);
    }
    poses.X_BL[i + 1] = X_BJ;
  }
  poses.X_BF = poses.X_BL[count] * arm.flangeInLastLink();
}

Eigen::Isometry3d flangePose(const ArmModel& arm, const JointVector& q) {
  LinkPoses poses;
  computeLinkPoses(arm, q, poses);
  return poses.X_BF;
}

Jacobian geometricJacobian(const ArmModel& arm, const LinkPoses& poses) {
  const int count = arm.jointCount();
  Jacobian jacobian(6, count);
  const Eigen::Vector3d p_BF = poses.X_BF.translation();
  for (int i = 0; i < count; ++i) {
    const Eigen::Isometry3d& X_BJ = poses.X_BL[i + 1];
    // The motion about the axis leaves the axis itself unchanged in J.
    const Eigen::Vector3d axis_B = X_BJ.linear() * arm.joint(i).axis;
    if (arm.joint(i).type == JointType::kRevolute) {
      jacobian.block<3, 1>(0, i) = axis_B.cross(p_BF - X_BJ.translation());
      jacobian.block<3, 1>(3, i) = axis_B;
    } else {
      jacobian.block<3, 1>(0, i) = axis_B;
      jacobian.block<3, 1>(3, i).setZero();
    }
  }
  return jacobian;
}

Jacobian geometricJacobian(const ArmModel& arm, const JointVector& q) {
  LinkPoses poses;
  computeLinkPoses(arm, q, poses);
  return geometricJacobian(arm, poses);
}

}  // namespace tw::kinematics
