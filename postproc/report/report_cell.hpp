#pragma once

#include <Eigen/Geometry>
#include <array>
#include <map>
#include <optional>
#include <string>
#include <vector>

namespace tw::postproc {

/// One body of the cell drawn in the review report's views (fixture, table,
/// clamp, fence), as triangles in the cell frame C [m].
struct ReportBody {
  std::string name;  ///< label in the views; may be empty
  std::vector<std::array<Eigen::Vector3d, 3>> triangles_C;
};

/// Optional geometry for the orthographic views of the review report; the
/// program itself holds none. Every field may stay empty: the views then
/// show what they can (the TCP path in the records' own frames) and say
/// what is missing.
struct ReportCell {
  /// Pose X_CR of each reference frame R that records name in `frame`,
  /// in the cell frame C. A record whose frame is not here is drawn with
  /// its positions taken as cell coordinates, and the page says so.
  std::map<std::string, Eigen::Isometry3d> X_CR;
  /// Pose of the arm base B in the cell frame, drawn as a marker.
  std::optional<Eigen::Isometry3d> X_CB;
  /// Bodies drawn as the union of their projected triangles.
  std::vector<ReportBody> bodies;

  bool empty() const { return X_CR.empty() && !X_CB && bodies.empty(); }
};

}  // namespace tw::postproc
