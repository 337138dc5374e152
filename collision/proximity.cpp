#include "collision/proximity.hpp"

#include <fcl/geometry/bvh/BVH_model.h>
#include <fcl/math/bv/OBBRSS.h>
#include <fcl/narrowphase/detail/primitive_shape_algorithm/triangle_distance.h>
#include <fcl/narrowphase/distance.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <utility>

namespace tw::collision {
namespace {

using Mesh = fcl::BVHModel<fcl::OBBRSSd>;

/// Both trees at once; (R, T) is the pose of mesh b in mesh a's frame.
class ProximityWalk {
 public:
  ProximityWalk(const Mesh& a, const Mesh& b, const Eigen::Matrix3d& R, const Eigen::Vector3d& T,
                double threshold)
      : a_(a), b_(b), R_(R), T_(T), threshold_(threshold) {}

  /// The distance of the first triangle pair found nearer than the
  /// threshold, if any. Precondition: the nodes' boxes are nearer than it.
  std::optional<double> near(int node_a, int node_b) const {
    const fcl::BVNode<fcl::OBBRSSd>& bv_a = a_.getBV(node_a);
    const fcl::BVNode<fcl::OBBRSSd>& bv_b = b_.getBV(node_b);
    if (bv_a.isLeaf() && bv_b.isLeaf()) return trianglesNear(bv_a.primitiveId(), bv_b.primitiveId());
    // Split the larger box, as FCL's own traversals do, and try the nearer
    // child first: near contact it leads to a near triangle pair soonest.
    const bool split_a = bv_b.isLeaf() || (!bv_a.isLeaf() && bv_a.bv.size() > bv_b.bv.size());
    int first_a = node_a, first_b = node_b, second_a = node_a, second_b = node_b;
    if (split_a) {
      first_a = bv_a.leftChild();
      second_a = bv_a.rightChild();
    } else {
      first_b = bv_b.leftChild();
      second_b = bv_b.rightChild();
    }
    double first = gap(first_a, first_b);
    double second = gap(second_a, second_b);
    if (second < first) {
      std::swap(first, second);
      std::swap(first_a, second_a);
      std::swap(first_b, second_b);
    }
    if (first >= threshold_) return std::nullopt;
    if (const std::optional<double> found = near(first_a, first_b)) return found;
    if (second >= threshold_) return std::nullopt;
    return near(second_a, second_b);
  }

  /// Distance between the swept-sphere rectangles (RSS) of two nodes, a
  /// lower bound of the distance of their triangles. For rounded meshes
  /// they fit much closer than boxes, so they prune more near contact.
  double gap(int node_a, int node_b) const {
    return fcl::distance(R_, T_, a_.getBV(node_a).bv.rss, b_.getBV(node_b).bv.rss);
  }

 private:
  std::optional<double> trianglesNear(int triangle_a, int triangle_b) const {
    const fcl::Triangle& ta = a_.tri_indices[triangle_a];
    const fcl::Triangle& tb = b_.tri_indices[triangle_b];
    const Eigen::Vector3d corners_a[3] = {a_.vertices[ta[0]], a_.vertices[ta[1]],
                                          a_.vertices[ta[2]]};
    const Eigen::Vector3d corners_b[3] = {b_.vertices[tb[0]], b_.vertices[tb[1]],
                                          b_.vertices[tb[2]]};
    Eigen::Vector3d p, q;
    const double distance =
        fcl::detail::TriangleDistance<double>::triDistance(corners_a, corners_b, R_, T_, p, q);
    if (distance < threshold_) return distance;
    return std::nullopt;
  }

  const Mesh& a_;
  const Mesh& b_;
  const Eigen::Matrix3d& R_;
  const Eigen::Vector3d& T_;
  double threshold_;
};

const Mesh* asMesh(const fcl::CollisionObjectd& object) {
  if (object.getObjectType() != fcl::OT_BVH || object.getNodeType() != fcl::BV_OBBRSS) {
    return nullptr;
  }
  return static_cast<const Mesh*>(object.collisionGeometry().get());
}

/// Counts crossings of the ray origin + t·direction (t > 0) with the mesh.
class RayParity {
 public:
  RayParity(const Mesh& mesh, const Eigen::Vector3d& origin)
      : mesh_(mesh), origin_(origin), direction_(Eigen::Vector3d(0.5773, 0.6129, 0.5398).normalized()) {}

  int crossings(int node) const {
    const fcl::BVNode<fcl::OBBRSSd>& bv = mesh_.getBV(node);
    if (!hitsBox(bv.bv.obb)) return 0;
    if (bv.isLeaf()) return crosses(bv.primitiveId()) ? 1 : 0;
    return crossings(bv.leftChild()) + crossings(bv.rightChild());
  }

 private:
  /// Slab test in the box's axes.
  bool hitsBox(const fcl::OBBd& box) const {
    const Eigen::Vector3d o = box.axis.transpose() * (origin_ - box.To);
    const Eigen::Vector3d d = box.axis.transpose() * direction_;
    double t_min = 0.0;
    double t_max = std::numeric_limits<double>::infinity();
    for (int i = 0; i < 3; ++i) {
      // A small growth keeps rays that graze a box face from being lost.
      const double extent = box.extent[i] * (1.0 + 1e-9) + 1e-12;
      if (std::abs(d[i]) < 1e-300) {
        if (std::abs(o[i]) > extent) return false;
        continue;
      }
      double t0 = (-extent - o[i]) / d[i];
      double t1 = (extent - o[i]) / d[i];
      if (t0 > t1) std::swap(t0, t1);
      t_min = std::max(t_min, t0);
      t_max = std::min(t_max, t1);
      if (t_min > t_max) return false;
    }
    return true;
  }

  /// Möller–Trumbore ray–triangle intersection, hits ahead of the origin.
  bool crosses(int triangle) const {
    const fcl::Triangle& t = mesh_.tri_indices[triangle];
    const Eigen::Vector3d& v0 = mesh_.vertices[t[0]];
    const Eigen::Vector3d e1 = mesh_.vertices[t[1]] - v0;
    const Eigen::Vector3d e2 = mesh_.vertices[t[2]] - v0;
    const Eigen::Vector3d h = direction_.cross(e2);
    const double det = e1.dot(h);
    if (std::abs(det) < 1e-300) return false;
    const Eigen::Vector3d s = origin_ - v0;
    const double u = s.dot(h) / det;
    if (u < 0.0 || u > 1.0) return false;
    const Eigen::Vector3d q = s.cross(e1);
    const double v = direction_.dot(q) / det;
    if (v < 0.0 || u + v > 1.0) return false;
    return e2.dot(q) / det > 0.0;
  }

  const Mesh& mesh_;
  Eigen::Vector3d origin_;
  Eigen::Vector3d direction_;
};

}  // namespace

bool insideClosedMesh(const fcl::CollisionObjectd& object, const Eigen::Vector3d& p_S) {
  const Mesh* mesh = asMesh(object);
  return mesh != nullptr && RayParity(*mesh, p_S).crossings(0) % 2 == 1;
}

std::optional<double> nearerThan(const fcl::CollisionObjectd& a, const fcl::CollisionObjectd& b,
                                 double threshold) {
  const Mesh* mesh_a = asMesh(a);
  const Mesh* mesh_b = asMesh(b);
  if (mesh_a != nullptr && mesh_b != nullptr) {
    const Eigen::Matrix3d R = a.getRotation().transpose() * b.getRotation();
    const Eigen::Vector3d T = a.getRotation().transpose() * (b.getTranslation() - a.getTranslation());
    const ProximityWalk walk(*mesh_a, *mesh_b, R, T, threshold);
    if (walk.gap(0, 0) >= threshold) return std::nullopt;
    return walk.near(0, 0);
  }
  fcl::DistanceRequestd request;
  fcl::DistanceResultd result;
  // Starting at the threshold lets FCL prune everything farther away.
  result.min_distance = threshold;
  fcl::distance(&a, &b, request, result);
  if (result.min_distance < threshold) return std::max(result.min_distance, 0.0);
  return std::nullopt;
}

}  // namespace tw::collision
