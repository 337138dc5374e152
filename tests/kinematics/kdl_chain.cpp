#include "tests/kinematics/kdl_chain.hpp"

namespace tw::kinematics::test {

KDL::Frame toKdl(const Eigen::Isometry3d& X) {
  const Eigen::Matrix3d& R = X.linear();
  return KDL::Frame(KDL::Rotation(R(0, 0), R(0, 1), R(0, 2), R(1, 0), R(1, 1), R(1, 2), R(2, 0),
                                  R(2, 1), R(2, 2)),
                    KDL::Vector(X.translation().x(), X.translation().y(), X.translation().z()));
}

Eigen::Isometry3d fromKdl(const KDL::Frame& frame) {
  Eigen::Isometry3d X = Eigen::Isometry3d::Identity();
  for (int r = 0; r < 3; ++r) {
    for (int c = 0; c < 3; ++c) X.linear()(r, c) = frame.M(r, c);
    X.translation()[r] = frame.p[r];
  }
  return X;
}

KDL::Chain kdlChain(const ArmModel& arm) {
  KDL::Chain chain;
  chain.addSegment(KDL::Segment(KDL::Joint(KDL::Joint::None), toKdl(arm.joint(0).X_PJ)));
  for (int i = 0; i < arm.jointCount(); ++i) {
    const JointSpec& joint = arm.joint(i);
    const KDL::Vector axis(joint.axis.x(), joint.axis.y(), joint.axis.z());
    const KDL::Joint kdl_joint(joint.name, KDL::Vector::Zero(), axis,
                               joint.type == JointType::kRevolute ? KDL::Joint::RotAxis
                                                                  : KDL::Joint::TransAxis);
    const Eigen::Isometry3d tip =
        i + 1 < arm.jointCount() ? arm.joint(i + 1).X_PJ : arm.flangeInLastLink();
    chain.addSegment(KDL::Segment(kdl_joint, toKdl(tip)));
  }
  return chain;
}

KDL::JntArray kdlJoints(const JointVector& q) {
  KDL::JntArray array(q.size());
  for (int i = 0; i < q.size(); ++i) array(i) = q[i];
  return array;
}

JointVector fromKdl(const KDL::JntArray& q) {
  JointVector values(q.rows());
  for (unsigned i = 0; i < q.rows(); ++i) values[i] = q(i);
  return values;
}

}  // namespace tw::kinematics::test
