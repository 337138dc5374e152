#include "planner/job/paint_patch.hpp"

#include <cmath>

#include "kinematics/common/angles.hpp"

namespace tw::planner {
namespace {

// CAD exports round corners to about 1e-3 mm; 0.1 mm off-plane is a wrong outline.
constexpr double kPlaneTolerance = 1e-4;
// A normal or pass direction this close to the wrong axis is a typo, not intent.
const double kSinOneDegree = std::sin(kPi / 180.0);

}  // namespace

std::optional<std::string> paintPatchProblem(const PaintPatch& patch) {
  const std::vector<Eigen::Vector3d>& p = patch.outline;
  if (p.size() < 3) return "an outline needs at least 3 corners";
  // Newell's method: twice the vector area, robust for non-convex outlines.
  Eigen::Vector3d area = Eigen::Vector3d::Zero();
  for (std::size_t i = 0; i < p.size(); ++i) area += p[i].cross(p[(i + 1) % p.size()]);
  if (area.norm() < 1e-12) return "the outline encloses no area";
  const Eigen::Vector3d plane = area.normalized();
  for (const Eigen::Vector3d& corner : p) {
    if (std::abs((corner - p[0]).dot(plane)) > kPlaneTolerance) {
      return "the outline's corners do not lie on one plane (within 0.1 mm)";
    }
  }
  if (std::abs(patch.normal.norm() - 1.0) > 1e-9) return "the normal must be a unit vector";
  if (patch.normal.cross(plane).norm() > kSinOneDegree) {
    return "the normal is not perpendicular to the outline's plane (within 1 degree)";
  }
  const Eigen::Vector3d along =
      patch.pass_direction - patch.pass_direction.dot(patch.normal) * patch.normal;
  if (along.norm() < kSinOneDegree * patch.pass_direction.norm()) {
    return "the pass direction lies along the normal; expected a direction in the plane";
  }
  return std::nullopt;
}

}  // namespace tw::planner
