#pragma once

#include <Eigen/Geometry>
#include <string>
#include <vector>

namespace tw::kinematics {

/// One collision body attached to a link, as written in the arm description.
/// The kinematics module only carries these references; the collision module
/// loads meshes and builds the bodies.
struct LinkShape {
  enum class Kind { kMesh, kBox, kCylinder, kSphere, kCapsule };
  Kind kind = Kind::kBox;
  /// Pose of the shape in its link frame. Cylinders and capsules are along
  /// the shape's z axis, centred at its origin; boxes are centred too.
  Eigen::Isometry3d X_LS = Eigen::Isometry3d::Identity();
  std::string mesh_path;         ///< kMesh: absolute or relative to the working folder
  double mesh_scale = 0.001;     ///< kMesh: file units to metres (mm by default)
  Eigen::Vector3d box_size = Eigen::Vector3d::Zero();  ///< kBox: full edge lengths [m]
  double radius = 0.0;           ///< kCylinder, kSphere, kCapsule [m]
  double length = 0.0;           ///< kCylinder, kCapsule: length of the axis [m]
};

const char* toString(LinkShape::Kind kind);

/// The shapes of one link. Link 0 is the arm base, link i (i ≥ 1) the body
/// moved by joint i.
struct LinkGeometry {
  std::string name;
  std::vector<LinkShape> shapes;
};

}  // namespace tw::kinematics
