#include "collision/fcl_geometry.hpp"

#include <fcl/geometry/bvh/BVH_model.h>
#include <fcl/geometry/shape/box.h>
#include <fcl/geometry/shape/capsule.h>
#include <fcl/geometry/shape/cylinder.h>
#include <fcl/geometry/shape/sphere.h>
#include <fcl/math/bv/OBBRSS.h>
#include <stdexcept>
#include <vector>

#include "kinematics/common/input_error.hpp"


namespace tw::collision {

std::shared_ptr<fcl::CollisionGeometryd> makeMeshGeometry(const TriangleMesh& mesh) {
  std::vector<fcl::Triangle> triangles;
  triangles.reserve(mesh.triangles.size());
  for (const std::array<int, 3>& t : mesh.triangles) triangles.emplace_back(t[0], t[1], t[2]);
  auto model = std::make_shared<fcl::BVHModel<fcl::OBBRSSd>>();
  model->beginModel(static_cast<int>(triangles.size()), static_cast<int>(mesh.vertices.size()));
  model->addSubModel(mesh.vertices, triangles);
  model->endModel();
  model->computeLocalAABB();
  return model;
}

std::shared_ptr<fcl::CollisionGeometryd> makePrimitiveGeometry(const kinematics::LinkShape& shape) {
  using Kind = kinematics::LinkShape::Kind;
  const bool sized = shape.kind == Kind::kBox ? (shape.box_size.array() > 0.0).all()
                                              : shape.radius > 0.0;
  const bool long_enough =
      (shape.kind != Kind::kCylinder && shape.kind != Kind::kCapsule) || shape.length > 0.0;
  if (shape.kind != Kind::kMesh && (!sized || !long_enough)) {
    throw InputError(std::string("a ") + kinematics::toString(shape.kind) +
                     " needs positive sizes");
  }
  std::shared_ptr<fcl::CollisionGeometryd> geometry;
  switch (shape.kind) {
    case Kind::kMesh:
      throw std::invalid_argument(shape.mesh_path + ": " + "a mesh shape is not a primitive");
    case Kind::kBox:
      geometry = std::make_shared<fcl::Boxd>(shape.box_size);
      break;
    case Kind::kCylinder:
      geometry = std::make_shared<fcl::Cylinderd>(shape.radius, shape.length);
      break;
    case Kind::kSphere:
      geometry = std::make_shared<fcl::Sphered>(shape.radius);
      break;
    case Kind::kCapsule:
      geometry = std::make_shared<fcl::Capsuled>(shape.radius, shape.length);
      break;
  }
  geometry->computeLocalAABB();
  return geometry;
}

}  // namespace tw::collision
