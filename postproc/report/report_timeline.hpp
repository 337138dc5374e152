#pragma once

#include <Eigen/Geometry>
#include <optional>
#include <string>
#include <vector>

#include "planner/program/program.hpp"
#include "postproc/report/report_cell.hpp"

namespace tw::postproc {

/// One motion of a program as the review report plots it.
struct TimelineMotion {
  std::size_t record = 0;  ///< index into Program::records
  const planner::MotionRecord* motion = nullptr;
  double end_time = 0.0;  ///< [s] start + duration: when the arm is at the target
  /// Target TCP position in the cell frame C [m]: X_CR of the record's frame
  /// applied when ReportCell knows it, otherwise the position in R as it stands.
  Eigen::Vector3d p_CT = Eigen::Vector3d::Zero();
  bool frame_known = false;  ///< the record's frame has a pose in ReportCell
  bool process_on = false;   ///< the process is on during this motion
  /// Straight-line distance from the previous target over the duration
  /// [m/s]: a lower bound of the mean TCP speed (exact for a linear move);
  /// for a circular move its arc length over the duration (exact too).
  /// Empty for the first motion, a zero duration, or when either target's
  /// frame has no known pose and the two frames differ.
  std::optional<double> chord_speed;
  /// For a circular move: points along its arc in the cell frame C [m], from
  /// the previous target to this one, at most 5° of arc apart (so that the
  /// views draw the arc, not its chord); empty for other motions.
  std::vector<Eigen::Vector3d> arc_C;
};

/// The motions of `program` in record order. Precondition: checkProgram() passed.
std::vector<TimelineMotion> reportTimeline(const planner::Program& program, const ReportCell& cell);

/// The seams in order of first appearance.
std::vector<std::string> seamNames(const std::vector<TimelineMotion>& timeline);

/// The motions one set of plots covers: the whole program or one seam.
struct ReportScope {
  std::string seam;  ///< empty for the whole program
  /// For a seam: the motion before its first, where the arm comes from
  /// (plotted as the starting value only), when there is one.
  std::optional<std::size_t> lead_in;
  std::vector<std::size_t> motions;  ///< indices into the timeline, in order
};

/// The scope of `seam` (every motion for an empty name).
ReportScope reportScope(const std::vector<TimelineMotion>& timeline, const std::string& seam);

}  // namespace tw::postproc
