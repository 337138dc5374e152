#pragma once

#include <Eigen/Geometry>
#include <optional>
#include <string>
#include <vector>

#include "kinematics/joint.hpp"
#include "kinematics/link_geometry.hpp"
#include "kinematics/ortho_parallel_geometry.hpp"

namespace tw::kinematics {

/// Everything needed to build an ArmModel; plain data, checked by ArmModel.
struct ArmDescription {
  std::string name;
  /// Where the description came from, for error messages ("" when built in code).
  std::string source;
  std::vector<JointSpec> joints;
  /// Pose of the flange F in the frame of the last link L.
  Eigen::Isometry3d X_LF = Eigen::Isometry3d::Identity();
  /// Collision geometry per link: empty, or one entry per link (base + joints).
  std::vector<LinkGeometry> links;
  /// Present when the chain is an ortho-parallel spherical-wrist arm; the
  /// joints are then the chain built from it by orthoParallelChain().
  std::optional<OrthoParallelGeometry> ortho_parallel;
};

/// The kinematic model of one arm: a serial chain of revolute and prismatic
/// joints from the arm base frame B to the flange F, with limits.
///
/// Immutable once built and safe to share between threads. Units are SI:
/// lengths [m], angles [rad], velocities [rad/s] or [m/s].
///
/// An external linear track carrying the arm base is meant to enter as a
/// prismatic joint ahead of the arm's own joints (the closed-form solver then
/// works in the frame the track carries); nothing here assumes six joints
/// except the ortho-parallel closed form, which requires exactly six.
class ArmModel {
 public:
  /// Checks the description and throws tw::InputError (naming `source`) on
  /// the first problem: no joints, too many, a duplicate or empty name, a
  /// non-unit axis, lower limit above upper, a revolute range over 720°,
  /// non-positive velocity or acceleration, a wrong count of link
  /// geometries, or ortho-parallel parameters that do not form an arm.
  explicit ArmModel(ArmDescription description);

  const std::string& name() const { return description_.name; }
  const std::string& source() const { return description_.source; }
  int jointCount() const { return static_cast<int>(description_.joints.size()); }
  const JointSpec& joint(int index) const { return description_.joints[index]; }
  const std::vector<JointSpec>& joints() const { return description_.joints; }
  const Eigen::Isometry3d& flangeInLastLink() const { return description_.X_LF; }
  const std::vector<LinkGeometry>& links() const { return description_.links; }
  const std::optional<OrthoParallelGeometry>& orthoParallel() const {
    return description_.ortho_parallel;
  }

  const JointVector& lowerLimits() const { return lower_; }
  const JointVector& upperLimits() const { return upper_; }
  /// True when every joint value lies within its limits (inclusive).
  bool withinLimits(const JointVector& q) const;

 private:
  ArmDescription description_;
  JointVector lower_;
  JointVector upper_;
};

/// What is wrong with one joint as written, or nullopt when it is valid.
/// Shared by ArmModel and the loaders so that both say the same thing.
std::optional<std::string> jointProblem(const JointSpec& joint);

/// What is wrong with ortho-parallel parameters, or nullopt when valid:
/// c1 and c4 must be ≥ 0, c2 and c3 > 0 (a1, a2 and b are signed offsets),
/// every sign ±1.
std::optional<std::string> orthoParallelProblem(const OrthoParallelGeometry& geometry);

/// The serial chain of an ortho-parallel arm (see OrthoParallelGeometry) with
/// zero offsets and signs folded into the joint frames and axes. Limits,
/// velocities and accelerations are copied from `limits_from`, which must
/// hold six joints; names too.
std::vector<JointSpec> orthoParallelChain(const OrthoParallelGeometry& geometry,
                                          const std::vector<JointSpec>& limits_from);

/// Pose of the flange in the last link frame of an ortho-parallel arm.
Eigen::Isometry3d orthoParallelFlange(const OrthoParallelGeometry& geometry);

}  // namespace tw::kinematics
