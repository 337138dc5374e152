#include "tests/planner/transit_test_world.hpp"

#include <cmath>

#include "kinematics/arm_loader.hpp"

namespace tw::planner::test {

namespace {
kinematics::LinkShape box(const Eigen::Vector3d& size, const Eigen::Vector3d& center) {
  kinematics::LinkShape shape;
  shape.kind = kinematics::LinkShape::Kind::kBox;
  shape.box_size = size;
  shape.X_LS = Eigen::Translation3d(center) * Eigen::Isometry3d::Identity();
  return shape;
}

kinematics::JointVector joints(double j1) {
  kinematics::JointVector q(6);
  q << j1, 0.9, 0.5, 0.0, 0.9, 0.0;
  return q;
}
}  // namespace

const kinematics::ArmModel& sampleArm() {
  static const kinematics::ArmModel arm =
      kinematics::loadArmDescription(std::string(TW_SOURCE_DIR) + "/samples/arms/weld_arm_1400.xml");
  return arm;
}

collision::WorldDescription demoCellDescription(double wall_thickness) {
  collision::WorldDescription description;
  collision::ToolDescription torch;
  torch.name = "torch";
  kinematics::LinkShape barrel;
  barrel.kind = kinematics::LinkShape::Kind::kCylinder;
  barrel.radius = 0.02;
  barrel.length = 0.30;
  barrel.X_LS = Eigen::Translation3d(0, 0, 0.15) * Eigen::Isometry3d::Identity();
  torch.shapes.push_back(barrel);
  torch.X_FT = Eigen::Translation3d(0, 0, 0.30) * Eigen::Isometry3d::Identity();
  description.tool = torch;
  description.bodies.push_back({"table", collision::BodyRole::kObstacle, "",
                                {box(Eigen::Vector3d(1.0, 2.0, 0.05),
                                     Eigen::Vector3d(1.3, 0.0, -0.025))}});
  description.bodies.push_back({"wall", collision::BodyRole::kObstacle, "",
                                {box(Eigen::Vector3d(1.0, wall_thickness, 0.9),
                                     Eigen::Vector3d(1.3, 0.0, 0.45))}});
  return description;
}

collision::WorldDescription thinFenceDescription() {
  collision::WorldDescription description = demoCellDescription();
  description.bodies.pop_back();
  description.bodies.push_back({"fence", collision::BodyRole::kObstacle, "",
                                {box(Eigen::Vector3d(0.8, 0.005, 0.6),
                                     Eigen::Vector3d(1.4, 0.0, 0.3))}});
  return description;
}

kinematics::JointVector demoStart() { return joints(-0.6); }
kinematics::JointVector demoGoal() { return joints(0.6); }

std::optional<int> firstCollidingSegment(const collision::CollisionWorld& world,
                                         const JointPath& path, double step) {
  collision::CollisionWorkspace workspace(world);
  if (path.size() == 1 && !world.checkState(path.front(), workspace).valid()) return 0;
  for (std::size_t i = 0; i + 1 < path.size(); ++i) {
    const double bound = world.motionBound(path[i], path[i + 1]);
    const int pieces = std::max(1, static_cast<int>(std::ceil(bound / step)));
    for (int k = 0; k <= pieces; ++k) {
      const double fraction = static_cast<double>(k) / pieces;
      const kinematics::JointVector q = path[i] + fraction * (path[i + 1] - path[i]);
      if (!world.checkState(q, workspace).valid()) return static_cast<int>(i);
    }
  }
  return std::nullopt;
}

collision::WorldDescription withMargin(collision::WorldDescription description, double factor) {
  description.clearance_margin *= factor;
  description.self_margin *= factor;
  return description;
}

}  // namespace tw::planner::test
