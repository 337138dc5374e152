#pragma once

#include <Eigen/Geometry>
#include <string>

#include "planner/toolpath/seam_sampler.hpp"

namespace tw::planner {

/// The pose of a tool held square to the surface, for paint strokes and
/// dispensed beads along a seam, in the seam frame X: the tool z axis along
/// the negative surface normal (the negative bisector of the two normals of
/// a fillet), x along travel (perpendicular to z), the TCP on the seam point
/// (the gun or nozzle tip stands the process's stand-off back from it).
///
/// Throws tw::InputError located at the sample's line in `source` when the
/// normal lies along the seam or the two normals are opposite.
/// A pure function, safe to call from several threads.
Eigen::Isometry3d normalToolPose(const SeamSample& sample, const std::string& source);

}  // namespace tw::planner
