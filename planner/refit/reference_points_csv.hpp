#pragma once

#include <Eigen/Core>
#include <istream>
#include <string>
#include <vector>

namespace tw::planner {

/// One reference point of a fixture: where the drawing puts it and where it
/// was measured.
struct ReferencePoint {
  std::string name;
  Eigen::Vector3d p_N = Eigen::Vector3d::Zero();  ///< nominal, in the fixture frame [m]
  Eigen::Vector3d p_M = Eigen::Vector3d::Zero();  ///< measured, in the measuring frame [m]
  int line = 0;                                   ///< line in the file, for messages
};

struct ReferencePointList {
  std::string source;  ///< the file, for messages
  std::vector<ReferencePoint> points;
};

/// Reads a reference point list (CSV, planner/CELL_AND_JOB_FORMAT.md,
/// "Reference point list"): a header naming the columns point,
/// nominal_x_mm, nominal_y_mm, nominal_z_mm, measured_x_mm, measured_y_mm,
/// measured_z_mm in any order, then one row per point. Lines starting with
/// '#' and blank lines are skipped; numbers use '.' in any locale.
///
/// Throws tw::InputError naming `source`, the line and what was expected for
/// an unknown, repeated or missing column, a row with the wrong number of
/// fields, an empty or repeated point name, a number that is not finite, or
/// fewer than 3 points.
ReferencePointList parseReferencePointsCsv(std::istream& input, const std::string& source);

/// parseReferencePointsCsv on the file at `path`; throws when it cannot be opened.
ReferencePointList loadReferencePointsCsv(const std::string& path);

}  // namespace tw::planner
