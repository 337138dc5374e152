#pragma once

#include <string>
#include <variant>
#include <vector>

#include "planner/cell/cell.hpp"
#include "planner/job/paint_patch.hpp"
#include "planner/job/paint_raster.hpp"
#include "planner/job/process_parameters.hpp"
#include "planner/job/seam_point.hpp"
#include "planner/toolpath/seam_sampler.hpp"

namespace tw::planner {

/// A seam of a job: a point list worked with one process. SI units.
struct SeamSpec {
  std::string name;
  std::string frame;  ///< frame of the cell the points are given in
  std::string tool;   ///< tool of the cell
  /// The points in travel order: the file's order, or its reverse when the
  /// job says direction="reversed" (then `reversed` is true).
  SeamPointList points;
  bool reversed = false;
  ProcessParameters process;
  /// Speed of the point on the seam [m/s] (the TCP is that point), for
  /// points without their own speed.
  double speed = 0.0;
  /// Approach and retract distances along the tool axis [m]. 30 mm: inside
  /// the 10–50 mm of common practice (domain-facts §1, from memory).
  double approach = 0.030;
  double retract = 0.030;
  SamplingOptions sampling;
  /// The controller's process parameter set for this seam (a weld schedule,
  /// a dispense program), named in the process events; empty: the process
  /// kind ("weld", "paint", "dispense").
  std::string parameter_set;
  int line = 0;  ///< line of the <seam> element in the job file
};

/// A planar patch of a job, painted with a zig-zag raster.
struct PatchSpec {
  std::string name;
  std::string frame;
  std::string tool;
  PaintPatch patch;
  RasterParameters raster;
  double speed = 0.0;  ///< gun speed along the passes [m/s]
  double approach = 0.030;
  double retract = 0.030;
  /// Largest distance between waypoints along a pass [m] (see SamplingOptions).
  double step = SamplingOptions{}.step;
  /// As SeamSpec::parameter_set (a spray program); empty: "paint".
  std::string parameter_set;
  int line = 0;
};

/// One item of work, in program order.
using JobTask = std::variant<SeamSpec, PatchSpec>;

/// Settings for the free moves between seams.
struct TransitSettings {
  /// Fraction of each joint's maximum velocity, 0 < f ≤ 1. 0.5: common
  /// practice, no source (a cautious first run).
  double joint_speed_fraction = 0.5;
  /// Distance the arm and tool keep from every cell body (fixture,
  /// workpiece, obstacle) on transits [m]; between the arm's own links and
  /// its tool only the base self margin holds (CellCollisionOptions::
  /// self_margin). 10 mm: common practice, no source (meshes are
  /// approximations of the real equipment).
  double clearance = 0.010;
  /// Planning time limit per transit [s]. 1 s: common practice, no source.
  double time_limit = 1.0;
  /// Seed of the sampling planner, for reproducible output.
  unsigned seed = 1;
};

/// One output the job asks for: a post-processor by its registered name
/// (checked against the registry when the outputs are written) and a file.
struct OutputRequest {
  std::string writer;
  std::string path;  ///< resolved against the output directory
  /// The `template` writer's template file, resolved against the job file;
  /// empty for every other writer.
  std::string template_path;
  int line = 0;
};

/// A job as loaded: the cell it runs in and the work, in program order.
struct Job {
  std::string name;
  std::string source;  ///< the job file
  Cell cell;
  std::vector<JobTask> tasks;
  TransitSettings transit;
  std::string output_directory;  ///< resolved against the job file's folder
  std::vector<OutputRequest> outputs;
};

}  // namespace tw::planner
