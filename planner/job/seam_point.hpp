#pragma once

#include <Eigen/Geometry>
#include <optional>
#include <string>
#include <vector>

namespace tw::planner {

/// One point of a seam as given by CAD, in the seam's frame X.
struct SeamPoint {
  Eigen::Vector3d p_XP = Eigen::Vector3d::Zero();  ///< position [m]
  /// Unit surface normal, pointing out of the material towards the tool.
  Eigen::Vector3d normal = Eigen::Vector3d::UnitZ();
  /// Unit normal of the second face of a fillet (inside corner) joint.
  std::optional<Eigen::Vector3d> second_normal;
  std::optional<double> speed;  ///< TCP speed at this point [m/s], > 0; interpolated between points
  int line = 0;                 ///< line in the point-list file
};

/// An ordered seam point list: at least two points, no two consecutive
/// points at the same place. Every point has a second normal or none has;
/// the same for speed.
struct SeamPointList {
  std::string source;  ///< the file it came from, for located errors
  std::vector<SeamPoint> points;
};

}  // namespace tw::planner
