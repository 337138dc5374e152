#pragma once

#include <Eigen/Geometry>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "kinematics/link_geometry.hpp"

namespace tw::collision {

/// What a cell body is to the checks: an obstacle counts against every part
/// of the arm and tool; a workpiece counts against the arm and the tool,
/// except the tool's contact part (see ToolDescription::tip_contact).
enum class BodyRole { kObstacle, kWorkpiece };

const char* toString(BodyRole role);

/// A named frame that cell bodies may be attached to (a fixture, a part
/// carrier); moving it moves them.
struct FixtureFrame {
  std::string name;
  Eigen::Isometry3d X_WX = Eigen::Isometry3d::Identity();
};

/// One static body of the cell. Each shape's X_LS is its pose in the parent
/// frame: the world, or the fixture frame named by `fixture`.
struct CellBody {
  std::string name;
  BodyRole role = BodyRole::kObstacle;
  /// "" for the world frame, else the name of a FixtureFrame.
  std::string fixture;
  std::vector<kinematics::LinkShape> shapes;
};

/// The part of a tool that works at the seam and may touch a workpiece: the
/// wire stick-out of a welding torch (from the TCP, the wire end, back to
/// the contact tip) or the bead of a dispensing nozzle (from the TCP on the
/// surface back to the nozzle's tip), with an allowance about it. Lengths [m].
struct TipContact {
  /// From the TCP back along the tool axis, ≥ 0.
  double length = 0.0;
  /// The tip allowance: how far from that segment the tool may touch, > 0.
  double radius = 0.003;
};

/// The tool on the flange. Shape poses are in the flange frame F.
struct ToolDescription {
  std::string name = "tool";
  std::vector<kinematics::LinkShape> shapes;
  /// Tool centre point in the flange frame; its z axis points out of the
  /// tool towards the work.
  Eigen::Isometry3d X_FT = Eigen::Isometry3d::Identity();
  /// The part of the tool that may touch a workpiece, if any: every point
  /// within `radius` of the segment from the TCP back `length` along the
  /// TCP's −z axis. nullopt: no part of the tool may (a spray gun). Contact
  /// of the rest of the tool, or of any arm link, with a workpiece counts,
  /// and the tool keeps the cell margin from it.
  std::optional<TipContact> tip_contact;
  /// Divisions around the axis when a primitive tool shape is turned into a
  /// mesh so that its tip can be cut away.
  int tessellation_segments = 32;
};

/// Everything the collision world is built from, besides the arm (whose
/// link geometry comes from its description). Lengths [m].
struct WorldDescription {
  /// Arm base frame in the world.
  Eigen::Isometry3d X_WB = Eigen::Isometry3d::Identity();
  std::vector<FixtureFrame> fixtures;
  std::vector<CellBody> bodies;
  /// Absent for a bare flange.
  std::optional<ToolDescription> tool;
  /// Cell margin [m]: a state in which an arm link or the tool is nearer
  /// than this to a cell body (fixture, workpiece, obstacle) is invalid. It
  /// covers what is uncertain about the cell model (meshes that only
  /// approximate the equipment, calibration, part tolerances), so it may be
  /// raised for a cautious job. Must be > 0 (the segment check relies on it).
  double clearance_margin = 0.010;
  /// Self margin [m]: a state in which two checked arm links, or the tool and
  /// a link, are nearer than this is invalid. The arm's own geometry is
  /// known exactly up to its meshes, so this stays small whatever the cell
  /// margin is (environment padding kept apart from self-collision padding:
  /// common practice in motion planning, no source). Must be > 0.
  double self_margin = 0.010;
  /// Further pairs of body names never checked against each other, on top of
  /// the built-in rules (adjacent links, the tool and the last link).
  std::vector<std::pair<std::string, std::string>> allowed_pairs;
};

}  // namespace tw::collision
