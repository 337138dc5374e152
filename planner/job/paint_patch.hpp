#pragma once

#include <Eigen/Geometry>
#include <optional>
#include <string>
#include <vector>

namespace tw::planner {

/// A planar area to paint, in its frame X.
struct PaintPatch {
  /// Corners of the outline in order (either winding), on one plane [m].
  std::vector<Eigen::Vector3d> outline;
  /// Unit normal of the plane, on the side the gun works from.
  Eigen::Vector3d normal = Eigen::Vector3d::UnitZ();
  /// Direction of the first pass (projected into the plane; unit).
  Eigen::Vector3d pass_direction = Eigen::Vector3d::UnitX();
};

/// What is wrong with a patch, or nullopt: fewer than 3 corners, no area,
/// corners off the plane by more than 0.1 mm, a normal more than 1° from
/// the outline's plane normal, a pass direction within 1° of the normal.
std::optional<std::string> paintPatchProblem(const PaintPatch& patch);

}  // namespace tw::planner
