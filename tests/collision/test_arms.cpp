#include "tests/collision/test_arms.hpp"

#include "kinematics/common/angles.hpp"

namespace tw::collision::test {
namespace {


kinematics::JointSpec joint(const std::string& name, kinematics::JointType type, double limit) {
  kinematics::JointSpec spec;
  spec.name = name;
  spec.type = type;
  spec.axis = type == kinematics::JointType::kPrismatic ? Eigen::Vector3d::UnitX()
                                                         : Eigen::Vector3d::UnitZ();
  spec.lower = -limit;
  spec.upper = limit;
  spec.max_velocity = 1.0;
  spec.max_acceleration = 1.0;
  return spec;
}

}  // namespace

kinematics::LinkShape sphereShape(double radius, const Eigen::Vector3d& center) {
  kinematics::LinkShape shape;
  shape.kind = kinematics::LinkShape::Kind::kSphere;
  shape.radius = radius;
  shape.X_LS.translation() = center;
  return shape;
}

kinematics::LinkShape boxShape(const Eigen::Vector3d& size, const Eigen::Vector3d& center) {
  kinematics::LinkShape shape;
  shape.kind = kinematics::LinkShape::Kind::kBox;
  shape.box_size = size;
  shape.X_LS.translation() = center;
  return shape;
}

kinematics::LinkShape cylinderShape(double radius, double length, const Eigen::Isometry3d& X_PS) {
  kinematics::LinkShape shape;
  shape.kind = kinematics::LinkShape::Kind::kCylinder;
  shape.radius = radius;
  shape.length = length;
  shape.X_LS = X_PS;
  return shape;
}

kinematics::LinkShape meshShape(const std::string& path, const Eigen::Isometry3d& X_PS) {
  kinematics::LinkShape shape;
  shape.kind = kinematics::LinkShape::Kind::kMesh;
  shape.mesh_path = path;
  shape.mesh_scale = 0.001;
  shape.X_LS = X_PS;
  return shape;
}

kinematics::ArmModel sliderArm(const std::vector<kinematics::LinkShape>& shapes,
                               const std::vector<kinematics::LinkShape>& base_shapes) {
  kinematics::ArmDescription description;
  description.name = "slider";
  description.joints.push_back(joint("slide", kinematics::JointType::kPrismatic, 2.0));
  description.links.resize(2);
  description.links[0].name = "base";
  description.links[0].shapes = base_shapes;
  description.links[1].name = "carriage";
  description.links[1].shapes = shapes;
  return kinematics::ArmModel(std::move(description));
}

kinematics::ArmModel planarArm(const std::vector<std::vector<kinematics::LinkShape>>& shapes,
                               double spacing) {
  kinematics::ArmDescription description;
  description.name = "planar";
  const int joints = static_cast<int>(shapes.size()) - 1;
  description.links.resize(shapes.size());
  description.links[0].name = "base";
  description.links[0].shapes = shapes[0];
  for (int i = 1; i <= joints; ++i) {
    kinematics::JointSpec spec =
        joint("j" + std::to_string(i), kinematics::JointType::kRevolute, kPi);
    if (i > 1) spec.X_PJ.translation() = Eigen::Vector3d(spacing, 0, 0);
    description.joints.push_back(spec);
    description.links[i].name = "link" + std::to_string(i);
    description.links[i].shapes = shapes[i];
  }
  return kinematics::ArmModel(std::move(description));
}

}  // namespace tw::collision::test
