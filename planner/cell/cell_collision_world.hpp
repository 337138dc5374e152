#pragma once

#include <optional>

#include "collision/collision_world.hpp"
#include "collision/world_description.hpp"
#include "planner/cell/cell.hpp"
#include "planner/cell/tool.hpp"

namespace tw::planner {

/// How a cell becomes a collision world for process moves. Lengths [m].
struct CellCollisionOptions {
  /// Closest allowed distance of the arm and tool to a cell body (fixture,
  /// workpiece, obstacle). 10 mm: common practice, no source (meshes only
  /// approximate the real equipment; DESIGN.md §6 asks for a margin by
  /// default). planJob replaces it with the job's transit clearance.
  double clearance_margin = 0.010;
  /// Closest allowed distance between checked arm links, and between the
  /// tool and a link: the arm's own geometry is known, so it does not grow
  /// with the cell margin. 10 mm: common practice, no source (the link
  /// meshes or primitives only approximate the castings and hose package).
  double self_margin = 0.010;
  /// Length of the tool's contact part from the TCP back along its axis
  /// (contactLength() of the process: the wire stick-out, the bead); the
  /// tool may touch a workpiece within Tool::tip_allowance of it. nullopt:
  /// no part of the tool may (paint, free moves). Fixtures and obstacles
  /// count against the whole tool regardless.
  std::optional<double> contact_length;
};

/// The collision description of `cell` with `tool` on the flange: the arm
/// base at X_WB = frames.X_W(arm_frame); every frame that carries a body
/// becomes a fixture frame (name = frame name, pose X_W of that frame), so
/// that CollisionWorld::withFixturePose moves it; "world" bodies stay in the
/// world. Workpieces keep their role (the tool's contact part, if
/// options.contact_length says it has one, may touch them); fixtures and
/// obstacles both count against the whole arm and tool.
/// Pure; thread-safe.
collision::WorldDescription cellWorldDescription(const Cell& cell, const Tool& tool,
                                                 const CellCollisionOptions& options = {});

/// The collision world built from cellWorldDescription. Keeps a reference to
/// cell.arm, which must outlive it. Throws tw::InputError (naming the cell
/// file) for geometry the collision module refuses.
collision::CollisionWorld buildCellCollisionWorld(const Cell& cell, const Tool& tool,
                                                  const CellCollisionOptions& options = {});

}  // namespace tw::planner
