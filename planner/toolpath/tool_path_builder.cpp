#include "planner/toolpath/tool_path_builder.hpp"

#include <algorithm>
#include <cmath>

#include "planner/toolpath/normal_tool_poses.hpp"
#include "planner/toolpath/seam_sampler.hpp"
#include "planner/toolpath/tool_frame.hpp"
#include "planner/toolpath/weld_tool_poses.hpp"

namespace tw::planner {
namespace {

void addEnds(ToolPath& path, double approach, double retract) {
  path.approach = backedOff(path.waypoints.front().X_XT, approach);
  path.retract = backedOff(path.waypoints.back().X_XT, retract);
}

}  // namespace

ToolPath buildToolPath(const SeamSpec& seam, const Tool& tool) {
  ToolPath path;
  path.name = seam.name;
  path.frame = seam.frame;
  path.tool = tool.name;
  path.process = kindOf(seam.process);
  path.contact_length = contactLength(seam.process);
  path.spin = tool.spin;
  path.source = seam.points.source;
  const std::vector<SeamSample> samples = sampleSeam(seam.points, seam.sampling);
  for (std::size_t i = 0; i < samples.size(); ++i) {
    const SeamSample& sample = samples[i];
    Waypoint waypoint;
    if (const auto* weld = std::get_if<WeldParameters>(&seam.process)) {
      waypoint.X_XT = weldToolPose(sample, *weld, seam.points.source);
    } else {
      waypoint.X_XT = normalToolPose(sample, seam.points.source);
    }
    waypoint.speed = sample.speed.value_or(seam.speed);
    waypoint.process_on = i + 1 < samples.size();
    waypoint.corner = sample.corner;
    waypoint.line = sample.line;
    path.waypoints.push_back(waypoint);
  }
  addEnds(path, seam.approach, seam.retract);
  return path;
}

ToolPath buildToolPath(const PatchSpec& patch, const Tool& tool, const std::string& source) {
  ToolPath path;
  path.name = patch.name;
  path.frame = patch.frame;
  path.tool = tool.name;
  path.process = ProcessKind::kPaint;
  path.spin = tool.spin;
  path.source = source;
  const Eigen::Vector3d& n = patch.patch.normal;
  const std::vector<RasterPass> passes = paintRaster(patch.patch, patch.raster);
  // Every pass keeps the gun's x axis along the first pass: a flat fan is
  // symmetric end to end, so the return passes need no half turn of the
  // gun (which cost seconds at every turnaround), and the fan stays across
  // every pass because the passes are parallel.
  const Eigen::Vector3d x_axis = passes.empty() ? Eigen::Vector3d::Zero() : passes.front().direction;
  for (std::size_t k = 0; k < passes.size(); ++k) {
    const RasterPass& pass = passes[k];
    const auto add = [&](const Eigen::Vector3d& aim, bool spray_on) {
      Waypoint waypoint;
      // The pass direction lies in the plane, so the frame always exists.
      waypoint.X_XT = *toolFrameAlong(aim, -n, x_axis);
      waypoint.speed = patch.speed;
      waypoint.process_on = spray_on;
      waypoint.pass = static_cast<int>(k);
      waypoint.line = patch.line;
      path.waypoints.push_back(waypoint);
    };
    add(pass.start, false);
    const double across = (pass.edge_out - pass.edge_in).norm();
    const int pieces = std::max(1, static_cast<int>(std::ceil(across / patch.step - 1e-9)));
    for (int j = 0; j < pieces; ++j) {
      add(pass.edge_in + (static_cast<double>(j) / pieces) * (pass.edge_out - pass.edge_in), true);
    }
    add(pass.edge_out, false);
    add(pass.end, false);
  }
  addEnds(path, patch.approach, patch.retract);
  return path;
}

}  // namespace tw::planner
