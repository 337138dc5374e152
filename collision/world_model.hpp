#pragma once

#include <Eigen/Geometry>
#include <fcl/geometry/collision_geometry.h>

#include <memory>
#include <string>
#include <vector>

#include "collision/triangle_mesh.hpp"
#include "collision/world_description.hpp"
#include "kinematics/arm_model.hpp"

namespace tw::collision::detail {

/// Which frame a piece hangs from and which rules apply to it.
enum class PieceKind {
  kLink,           ///< on an arm link
  kTool,           ///< the whole tool, on the flange; against workpieces only without a tip contact
  kToolBeyondTip,  ///< the tool without its tip contact zone; checked against workpieces only
  kCell,           ///< a cell body in the world or a fixture frame
};

/// One FCL shape of a body, with its place. Geometry is shared, never mutated.
struct Piece {
  int body = -1;
  PieceKind kind = PieceKind::kCell;
  /// kLink: link index (0 = arm base). kCell: fixture index, -1 for the world.
  int frame = -1;
  BodyRole role = BodyRole::kObstacle;
  std::shared_ptr<fcl::CollisionGeometryd> geometry;
  /// The geometry is a closed mesh, so a body inside it must be tested for.
  bool closed = false;
  /// Pose of the shape in its parent frame (link, flange, fixture or world).
  Eigen::Isometry3d X_PS = Eigen::Isometry3d::Identity();
  /// A point of the piece in its shape frame, for containment tests.
  Eigen::Vector3d p_S_probe = Eigen::Vector3d::Zero();
  /// Moving pieces: per joint, the most any point of the piece moves per
  /// unit of that joint's motion [m/rad or m/m] (0 for joints after it).
  std::vector<double> lever;
  /// Moving pieces: the first joint (0-based) that moves this piece relative
  /// to a piece it is checked against on an earlier link, or lever.size()
  /// when there is none. Joints before it move both alike, so they do not
  /// change their distance.
  std::size_t self_joint_from = 0;
};

/// The immutable part of a collision world, shared by the world, its
/// fixture-moved copies and their workspaces.
struct WorldModel {
  explicit WorldModel(const kinematics::ArmModel& arm_model) : arm(arm_model) {}

  kinematics::ArmModel arm;
  Eigen::Isometry3d X_WB = Eigen::Isometry3d::Identity();
  /// WorldDescription::clearance_margin and self_margin [m].
  double cell_margin = 0.0;
  double self_margin = 0.0;
  /// Broad-phase box growth [m] of the moving and the cell objects: two
  /// moving boxes grown by half the self margin each meet whenever their
  /// pieces are nearer than it, and a moving and a cell box whenever their
  /// pieces are nearer than the cell margin (more, when the cell margin is
  /// below half the self margin: a box never shrinks).
  double moving_growth = 0.0;
  double cell_growth = 0.0;
  std::vector<std::string> body_names;
  std::vector<std::string> fixture_names;
  /// Arm and tool pieces, in body order.
  std::vector<Piece> moving;
  /// Cell pieces, in body order; their world pose depends on the fixtures.
  std::vector<Piece> cell;
  /// allowed[a * body_count + b]: the pair (a, b) is never checked.
  std::vector<char> allowed;
  std::vector<std::string> notes;
  /// The tool has a tip contact (ToolDescription::tip_contact): against
  /// workpieces its kToolBeyondTip piece (if any is left) stands for it.
  bool tool_tip_contact = false;

  bool isAllowed(int a, int b) const {
    return allowed[static_cast<std::size_t>(a) * body_names.size() + b] != 0;
  }

  /// Does the pair rule of CollisionWorld (see its header) check these two?
  bool checks(const Piece& a, const Piece& b) const {
    if (isAllowed(a.body, b.body)) return false;
    const Piece& moving = a.kind == PieceKind::kCell ? b : a;
    const Piece& other = a.kind == PieceKind::kCell ? a : b;
    if (other.kind == PieceKind::kCell) {
      if (moving.kind == PieceKind::kLink) return moving.frame != 0;
      const bool workpiece = other.role == BodyRole::kWorkpiece;
      if (moving.kind == PieceKind::kTool) return !workpiece || !tool_tip_contact;
      return workpiece;
    }
    // Between moving pieces the whole tool stands for the tool.
    return a.kind != PieceKind::kToolBeyondTip && b.kind != PieceKind::kToolBeyondTip;
  }
};

}  // namespace tw::collision::detail

namespace tw::collision::detail {

/// Loads and checks everything a CollisionWorld needs (see its constructor
/// for the errors thrown).
std::shared_ptr<const WorldModel> buildWorldModel(const kinematics::ArmModel& arm,
                                                  const WorldDescription& description);

}  // namespace tw::collision::detail
