#include "collision/world_model.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <utility>

#include "collision/fcl_geometry.hpp"
#include "collision/mesh_loader.hpp"
#include "collision/mesh_trimming.hpp"
#include "collision/proximity.hpp"
#include "collision/tessellation.hpp"
#include "kinematics/common/input_error.hpp"
#include "kinematics/forward_kinematics.hpp"

namespace tw::collision::detail {
namespace {

using kinematics::LinkShape;

struct LoadedMesh {
  std::shared_ptr<const TriangleMesh> mesh;
  std::shared_ptr<fcl::CollisionGeometryd> geometry;
};

/// Builds pieces from shapes, loading each mesh file (per scale) once.
class PieceFactory {
 public:
  explicit PieceFactory(WorldModel& model) : model_(model) {}

  Piece make(const LinkShape& shape, int body, PieceKind kind, int frame) {
    Piece piece;
    piece.body = body;
    piece.kind = kind;
    piece.frame = frame;
    piece.X_PS = shape.X_LS;
    if (shape.kind == LinkShape::Kind::kMesh) {
      const LoadedMesh& loaded = load(shape.mesh_path, shape.mesh_scale);
      piece.geometry = loaded.geometry;
      piece.closed = loaded.mesh->closed;
      piece.p_S_probe = loaded.mesh->vertices.front();
    } else {
      piece.geometry = makePrimitiveGeometry(shape);
    }
    return piece;
  }

  /// The shape as a mesh in its parent frame (primitives tessellated).
  TriangleMesh meshInParent(const LinkShape& shape, int segments) {
    const TriangleMesh mesh = shape.kind == LinkShape::Kind::kMesh
                                  ? *load(shape.mesh_path, shape.mesh_scale).mesh
                                  : tessellateShape(shape, segments);
    return transformedMesh(mesh, shape.X_LS);
  }

  /// Farthest distance of any point of the shape from its parent origin.
  double reach(const LinkShape& shape) {
    switch (shape.kind) {
      case LinkShape::Kind::kMesh: {
        double farthest = 0.0;
        for (const Eigen::Vector3d& v : load(shape.mesh_path, shape.mesh_scale).mesh->vertices) {
          farthest = std::max(farthest, (shape.X_LS * v).norm());
        }
        return farthest;
      }
      case LinkShape::Kind::kBox:
        return shape.X_LS.translation().norm() + 0.5 * shape.box_size.norm();
      case LinkShape::Kind::kSphere:
        return shape.X_LS.translation().norm() + shape.radius;
      case LinkShape::Kind::kCylinder:
        return shape.X_LS.translation().norm() + std::hypot(shape.radius, 0.5 * shape.length);
      case LinkShape::Kind::kCapsule:
        return shape.X_LS.translation().norm() + shape.radius + 0.5 * shape.length;
    }
    return 0.0;
  }

 private:
  const LoadedMesh& load(const std::string& path, double scale) {
    const auto key = std::make_pair(path, scale);
    auto found = cache_.find(key);
    if (found != cache_.end()) return found->second;
    auto mesh = std::make_shared<const TriangleMesh>(loadMesh(path, scale));
    if (mesh->degenerate_triangles > 0) {
      model_.notes.push_back(path + ": " + std::to_string(mesh->degenerate_triangles) +
                             " degenerate triangles (no area) ignored");
    }
    LoadedMesh loaded{mesh, makeMeshGeometry(*mesh)};
    return cache_.emplace(key, std::move(loaded)).first->second;
  }

  WorldModel& model_;
  std::map<std::pair<std::string, double>, LoadedMesh> cache_;
};

int addBody(WorldModel& model, const std::string& name) {
  if (name.empty()) throw InputError("collision world: a body has an empty name");
  if (std::find(model.body_names.begin(), model.body_names.end(), name) !=
      model.body_names.end()) {
    throw InputError("collision world: body name \"" + name + "\" is used twice");
  }
  model.body_names.push_back(name);
  return static_cast<int>(model.body_names.size()) - 1;
}

int bodyIndex(const WorldModel& model, const std::string& name) {
  const auto found = std::find(model.body_names.begin(), model.body_names.end(), name);
  if (found == model.body_names.end()) {
    throw InputError("collision world: allowed pair names unknown body \"" + name + "\"");
  }
  return static_cast<int>(found - model.body_names.begin());
}

/// Per joint j, an upper bound on the distance from joint j's axis to any
/// point of a body on link k that reaches `reach` from the link-k origin:
/// the chain of link-origin offsets from link j to link k plus that reach
/// (prismatic joints in between add their largest travel). Zero for joints
/// after link k; 1 for a prismatic joint at or before k (a point moves
/// exactly the joint's travel).
std::vector<double> leverArms(const kinematics::ArmModel& arm, int link, double reach) {
  const int joints = arm.jointCount();
  std::vector<double> lever(joints, 0.0);
  for (int j = 1; j <= std::min(link, joints); ++j) {
    const kinematics::JointSpec& joint = arm.joint(j - 1);
    if (joint.type == kinematics::JointType::kPrismatic) {
      lever[j - 1] = 1.0;
      continue;
    }
    double arm_length = reach;
    for (int i = j + 1; i <= link; ++i) {
      const kinematics::JointSpec& next = arm.joint(i - 1);
      arm_length += next.X_PJ.translation().norm();
      if (next.type == kinematics::JointType::kPrismatic) {
        arm_length += std::max(std::abs(next.lower), std::abs(next.upper));
      }
    }
    lever[j - 1] = arm_length;
  }
  return lever;
}

void allow(WorldModel& model, int a, int b) {
  const std::size_t n = model.body_names.size();
  model.allowed[a * n + b] = 1;
  model.allowed[b * n + a] = 1;
}

/// Checked pairs of arm and tool bodies nearer than the self margin at the zero
/// joint vector (clamped into the limits) are most likely a geometry
/// mistake or a pair to allow: near that pose every state would be invalid.
/// Each goes into the notes, once, in body order.
void noteSelfContactsAtRest(WorldModel& model) {
  const kinematics::ArmModel& arm = model.arm;
  const kinematics::JointVector q = kinematics::JointVector::Zero(arm.jointCount())
                                        .cwiseMax(arm.lowerLimits())
                                        .cwiseMin(arm.upperLimits());
  kinematics::LinkPoses poses;
  kinematics::computeLinkPoses(arm, q, poses);
  std::vector<fcl::CollisionObjectd> objects;
  objects.reserve(model.moving.size());
  for (const Piece& piece : model.moving) {
    objects.emplace_back(piece.geometry, poses.X_BL[piece.frame] * piece.X_PS);
  }
  std::vector<std::pair<int, int>> noted;
  for (std::size_t i = 0; i < objects.size(); ++i) {
    for (std::size_t j = i + 1; j < objects.size(); ++j) {
      const Piece& a = model.moving[i];
      const Piece& b = model.moving[j];
      const std::pair<int, int> bodies(std::min(a.body, b.body), std::max(a.body, b.body));
      if (!model.checks(a, b) || std::find(noted.begin(), noted.end(), bodies) != noted.end()) {
        continue;
      }
      if (!nearerThan(objects[i], objects[j], model.self_margin)) continue;
      noted.push_back(bodies);
      model.notes.push_back("\"" + model.body_names[bodies.first] + "\" and \"" +
                            model.body_names[bodies.second] +
                            "\" are nearer than the self margin at the zero joint "
                            "vector: fix their geometry or allow the pair");
    }
  }
}

/// Sets every moving piece's self_joint_from from the pairs it is checked in.
void findSelfJoints(WorldModel& model) {
  for (Piece& piece : model.moving) {
    piece.self_joint_from = piece.lever.size();
    for (const Piece& other : model.moving) {
      if (other.frame < piece.frame && model.checks(piece, other)) {
        piece.self_joint_from =
            std::min(piece.self_joint_from, static_cast<std::size_t>(other.frame));
      }
    }
  }
}

double positiveMargin(double margin, const std::string& what) {
  if (!(margin > 0.0) || !std::isfinite(margin)) {
    throw InputError("collision world: the " + what + " must be a positive length, got " +
                     std::to_string(margin) + " m");
  }
  return margin;
}

}  // namespace

std::shared_ptr<const WorldModel> buildWorldModel(const kinematics::ArmModel& arm,
                                                  const WorldDescription& description) {
  auto model = std::make_shared<WorldModel>(arm);
  model->X_WB = description.X_WB;
  model->cell_margin = positiveMargin(description.clearance_margin,
                                      "clearance margin (of the arm and tool from the cell)");
  model->self_margin = positiveMargin(description.self_margin,
                                      "self margin (between the arm's links and its tool)");
  model->moving_growth = 0.5 * model->self_margin;
  model->cell_growth = std::max(model->cell_margin - model->moving_growth, 0.0);
  PieceFactory factory(*model);

  const int joints = arm.jointCount();
  std::vector<int> link_body(joints + 1, -1);
  for (int link = 0; link < static_cast<int>(arm.links().size()); ++link) {
    const kinematics::LinkGeometry& geometry = arm.links()[link];
    if (geometry.shapes.empty()) continue;
    link_body[link] = addBody(*model, geometry.name);
    for (const LinkShape& shape : geometry.shapes) {
      Piece piece = factory.make(shape, link_body[link], PieceKind::kLink, link);
      piece.lever = leverArms(arm, link, factory.reach(shape));
      model->moving.push_back(std::move(piece));
    }
  }

  int tool_body = -1;
  if (description.tool) {
    const ToolDescription& tool = *description.tool;
    if (tool.tip_contact) {
      const TipContact& contact = *tool.tip_contact;
      if (!(contact.radius > 0.0) || !std::isfinite(contact.radius) ||
          !(contact.length >= 0.0) || !std::isfinite(contact.length)) {
        throw InputError("collision world: tool \"" + tool.name +
                         "\" needs a positive tip allowance and a non-negative contact length");
      }
    }
    tool_body = addBody(*model, tool.name);
    const Eigen::Isometry3d& X_LF = arm.flangeInLastLink();
    TriangleMesh whole;
    for (const LinkShape& shape : tool.shapes) {
      LinkShape on_link = shape;
      on_link.X_LS = X_LF * shape.X_LS;
      Piece piece = factory.make(on_link, tool_body, PieceKind::kTool, joints);
      piece.lever = leverArms(arm, joints, factory.reach(on_link));
      model->moving.push_back(std::move(piece));

      if (!tool.tip_contact) continue;
      const TriangleMesh part = factory.meshInParent(on_link, tool.tessellation_segments);
      const int offset = static_cast<int>(whole.vertices.size());
      whole.vertices.insert(whole.vertices.end(), part.vertices.begin(), part.vertices.end());
      for (const std::array<int, 3>& t : part.triangles) {
        whole.triangles.push_back({{t[0] + offset, t[1] + offset, t[2] + offset}});
      }
    }
    if (tool.tip_contact) {
      model->tool_tip_contact = true;
      // The contact part runs from the TCP back along the tool's −z axis.
      const Eigen::Isometry3d X_LT = X_LF * tool.X_FT;
      const Eigen::Vector3d p_L_tcp = X_LT.translation();
      const Eigen::Vector3d p_L_back = X_LT * Eigen::Vector3d(0, 0, -tool.tip_contact->length);
      const TriangleMesh beyond =
          meshOutsideCapsule(whole, p_L_tcp, p_L_back, tool.tip_contact->radius);
      if (!beyond.triangles.empty()) {
        Piece piece;
        piece.body = tool_body;
        piece.kind = PieceKind::kToolBeyondTip;
        piece.frame = joints;
        piece.geometry = makeMeshGeometry(beyond);
        piece.p_S_probe = beyond.vertices.front();
        double farthest = 0.0;
        for (const Eigen::Vector3d& v : beyond.vertices) farthest = std::max(farthest, v.norm());
        piece.lever = leverArms(arm, joints, farthest);
        model->moving.push_back(std::move(piece));
      }
    }
  }

  for (const FixtureFrame& fixture : description.fixtures) {
    if (std::find(model->fixture_names.begin(), model->fixture_names.end(), fixture.name) !=
        model->fixture_names.end()) {
      throw InputError("collision world: fixture frame \"" + fixture.name + "\" is defined twice");
    }
    model->fixture_names.push_back(fixture.name);
  }
  for (const CellBody& body : description.bodies) {
    const int index = addBody(*model, body.name);
    int frame = -1;
    if (!body.fixture.empty()) {
      const auto found =
          std::find(model->fixture_names.begin(), model->fixture_names.end(), body.fixture);
      if (found == model->fixture_names.end()) {
        throw InputError("collision world: body \"" + body.name + "\" names unknown fixture \"" +
                         body.fixture + "\"");
      }
      frame = static_cast<int>(found - model->fixture_names.begin());
    }
    for (const LinkShape& shape : body.shapes) {
      Piece piece = factory.make(shape, index, PieceKind::kCell, frame);
      piece.role = body.role;
      model->cell.push_back(std::move(piece));
    }
  }

  const std::size_t n = model->body_names.size();
  model->allowed.assign(n * n, 0);
  // Neighbours along the chain never count; a link without geometry is
  // skipped, so the links on either side of it are neighbours, and the tool
  // is the neighbour of the last link with geometry.
  std::vector<int> chain;
  for (int body : link_body) {
    if (body >= 0) chain.push_back(body);
  }
  if (tool_body >= 0) chain.push_back(tool_body);
  for (std::size_t i = 0; i < chain.size(); ++i) {
    allow(*model, chain[i], chain[i]);
    if (i + 1 < chain.size()) allow(*model, chain[i], chain[i + 1]);
  }
  for (const auto& [first, second] : description.allowed_pairs) {
    allow(*model, bodyIndex(*model, first), bodyIndex(*model, second));
  }
  findSelfJoints(*model);
  noteSelfContactsAtRest(*model);
  return model;
}

}  // namespace tw::collision::detail
