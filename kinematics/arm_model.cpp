#include "kinematics/arm_model.hpp"

#include <cmath>
#include <set>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"

namespace tw::kinematics {
namespace {

// Unit axes are written by hand in files; allow the rounding of six decimals.
constexpr double kUnitAxisTolerance = 1e-6;

}  // namespace

const char* toString(JointType type) {
  switch (type) {
    case JointType::kRevolute: return "revolute";
    case JointType::kPrismatic: return "prismatic";
  }
  return "unknown";
}

const char* toString(LinkShape::Kind kind) {
  switch (kind) {
    case LinkShape::Kind::kMesh: return "mesh";
    case LinkShape::Kind::kBox: return "box";
    case LinkShape::Kind::kCylinder: return "cylinder";
    case LinkShape::Kind::kSphere: return "sphere";
    case LinkShape::Kind::kCapsule: return "capsule";
  }
  return "unknown";
}

std::optional<std::string> jointProblem(const JointSpec& joint) {
  if (joint.name.empty()) return "joint has no name";
  const std::string who = "joint '" + joint.name + "': ";
  if (std::abs(joint.axis.norm() - 1.0) > kUnitAxisTolerance) {
    return who + "axis must be a unit vector";
  }
  if (!(joint.lower <= joint.upper)) return who + "lower limit is above the upper limit";
  if (joint.type == JointType::kRevolute && joint.upper - joint.lower > 4 * kPi + 1e-9) {
    return who + "range exceeds 720 degrees, which is not supported";
  }
  if (!(joint.max_velocity > 0.0)) return who + "maximum velocity must be greater than 0";
  if (!(joint.max_acceleration > 0.0)) return who + "maximum acceleration must be greater than 0";
  return std::nullopt;
}

std::optional<std::string> orthoParallelProblem(const OrthoParallelGeometry& g) {
  if (g.c1 < 0.0) return std::string("c1 is a length and must not be negative");
  if (g.c2 <= 0.0) return std::string("c2 (upper arm length) must be greater than 0");
  if (g.c3 <= 0.0) return std::string("c3 (forearm length) must be greater than 0");
  if (g.c4 < 0.0) return std::string("c4 is a length and must not be negative");
  for (int i = 0; i < 6; ++i) {
    if (g.sign[i] != 1.0 && g.sign[i] != -1.0) {
      return "sign of joint " + std::to_string(i + 1) + " must be 1 or -1";
    }
  }
  return std::nullopt;
}

std::vector<JointSpec> orthoParallelChain(const OrthoParallelGeometry& g,
                                          const std::vector<JointSpec>& limits_from) {
  const Eigen::Vector3d z = Eigen::Vector3d::UnitZ();
  const Eigen::Vector3d y = Eigen::Vector3d::UnitY();
  // Joint origins in the previous joint frame, zero pose (see the geometry's doc).
  const std::array<Eigen::Vector3d, 6> origin{{
      {0, 0, 0}, {g.a1, g.b, g.c1}, {0, 0, g.c2}, {g.a2, 0, 0}, {0, 0, g.c3}, {0, 0, 0}}};
  const std::array<Eigen::Vector3d, 6> axis{{z, y, y, z, y, z}};

  std::vector<JointSpec> chain(limits_from.begin(), limits_from.end());
  for (int i = 0; i < 6; ++i) {
    JointSpec& joint = chain[i];
    joint.type = JointType::kRevolute;
    // θ = sign·q + offset: rotate the joint frame by the offset, flip the axis by the sign.
    joint.X_PJ = Eigen::Translation3d(origin[i]) * Eigen::AngleAxisd(g.zero_offset[i], axis[i]);
    joint.axis = g.sign[i] * axis[i];
  }
  return chain;
}

Eigen::Isometry3d orthoParallelFlange(const OrthoParallelGeometry& g) {
  return Eigen::Isometry3d(Eigen::Translation3d(0, 0, g.c4));
}

ArmModel::ArmModel(ArmDescription description) : description_(std::move(description)) {
  const auto reject = [this](const std::string& message) {
    throw InputError(description_.source, 0, "arm '" + description_.name + "': " + message);
  };
  const int count = jointCount();
  if (count == 0) reject("has no joints");
  if (count > kMaxJoints) {
    reject("has " + std::to_string(count) + " joints; at most " + std::to_string(kMaxJoints) +
           " are supported");
  }
  std::set<std::string> names;
  for (const JointSpec& joint : description_.joints) {
    if (std::optional<std::string> problem = jointProblem(joint)) reject(*problem);
    if (!names.insert(joint.name).second) reject("joint name '" + joint.name + "' is repeated");
  }
  if (!description_.links.empty() && static_cast<int>(description_.links.size()) != count + 1) {
    reject("has geometry for " + std::to_string(description_.links.size()) +
           " links; expected none or " + std::to_string(count + 1) + " (base and one per joint)");
  }
  if (description_.ortho_parallel) {
    if (count != 6) reject("an ortho-parallel arm has exactly 6 joints");
    if (std::optional<std::string> problem = orthoParallelProblem(*description_.ortho_parallel)) {
      reject(*problem);
    }
  }
  lower_.resize(count);
  upper_.resize(count);
  for (int i = 0; i < count; ++i) {
    lower_[i] = description_.joints[i].lower;
    upper_[i] = description_.joints[i].upper;
  }
}

bool ArmModel::withinLimits(const JointVector& q) const {
  return q.size() == jointCount() && (q.array() >= lower_.array()).all() &&
         (q.array() <= upper_.array()).all();
}

}  // namespace tw::kinematics
