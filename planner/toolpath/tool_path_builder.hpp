#pragma once

#include "planner/cell/tool.hpp"
#include "planner/job/job.hpp"
#include "planner/toolpath/tool_path.hpp"

namespace tw::planner {

/// The tool path of a seam: the point list resampled (sampleSeam), one pose
/// per sample from the process (weldToolPose or normalToolPose), the
/// approach and retract backed off along the first and last tool axes, and
/// the tool's spin range carried along. Speeds come from the points where
/// the list has them, else from seam.speed. The process is on from the first
/// waypoint to the last.
///
/// Throws tw::InputError located in the point list for geometry no tool
/// pose can follow (see weldToolPose, normalToolPose, sampleSeam).
ToolPath buildToolPath(const SeamSpec& seam, const Tool& tool);

/// The tool path of a paint patch: for each raster pass (paintRaster) the
/// gun square to the patch at the stand-off, tool x along the pass
/// direction; waypoints at the lead-in start (spray off), the edge where the
/// fan reaches the part (spray on), every `patch.step` or less across it,
/// the far edge (spray off) and the lead-out end. Passes follow each other
/// directly (the turnaround runs off the part, spray off). `source` names
/// the job file for Waypoint::line.
ToolPath buildToolPath(const PatchSpec& patch, const Tool& tool, const std::string& source);

}  // namespace tw::planner
