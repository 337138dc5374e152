#pragma once

#include <Eigen/Geometry>
#include <optional>
#include <string>
#include <vector>

#include "planner/cell/frame_tree.hpp"
#include "planner/cell/tool.hpp"
#include "planner/job/process_parameters.hpp"

namespace tw::planner {

/// One sampled tool pose of a seam or raster.
struct Waypoint {
  /// Pose of the TCP in the path's frame X [m]; z is the tool axis.
  Eigen::Isometry3d X_XT = Eigen::Isometry3d::Identity();
  /// Speed [m/s] on the move arriving here: of the seam point, which the TCP
  /// is, so also of the TCP.
  double speed = 0.0;
  bool process_on = false;  ///< process active on the move leaving this waypoint
  bool corner = false;      ///< the tool turns on the spot here (see SeamSample)
  int pass = 0;             ///< raster pass index from 0; 0 on a seam
  int line = 0;             ///< line of the input it came from (CSV row or job element)
};

/// The tool poses of one seam or paint patch, before any arm is involved:
/// approach, process waypoints, retract, all in the frame `frame` so that a
/// fixture move carries them along. Each pose may be turned about its own z
/// axis by any angle in `spin` (the seam solver's choice).
struct ToolPath {
  std::string name;
  std::string frame;
  std::string tool;
  ProcessKind process = ProcessKind::kWeld;
  /// contactLength() of the process: what of the tool may touch the part
  /// [m] (CellCollisionOptions::contact_length).
  std::optional<double> contact_length;
  /// Where the approach starts: the first waypoint backed off along its axis.
  Eigen::Isometry3d approach = Eigen::Isometry3d::Identity();
  std::vector<Waypoint> waypoints;
  /// Where the retract ends: the last waypoint backed off along its axis.
  Eigen::Isometry3d retract = Eigen::Isometry3d::Identity();
  SpinRange spin;
  std::string source;  ///< file whose lines Waypoint::line refers to
};

/// Every pose of `path` in the world, approach first and retract last:
/// X_WT = frames.X_W(path.frame) · X_XT.
std::vector<Eigen::Isometry3d> worldPoses(const ToolPath& path, const FrameTree& frames);

/// `X_XT` moved `distance` [m] back along its own tool axis (−z), keeping
/// its orientation: the start of an approach or the end of a retract.
Eigen::Isometry3d backedOff(const Eigen::Isometry3d& X_XT, double distance);

}  // namespace tw::planner
