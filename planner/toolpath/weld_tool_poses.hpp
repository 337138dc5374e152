#pragma once

#include <Eigen/Geometry>
#include <string>

#include "planner/job/process_parameters.hpp"
#include "planner/toolpath/seam_sampler.hpp"

namespace tw::planner {

/// The torch pose for one seam sample, in the seam frame X.
///
/// In the plane perpendicular to the seam tangent t, the torch axis leaves
/// the first face at the work angle, on the side of the second face (fillet)
/// or to the left of travel seen from the surface side (single normal,
/// u = n × t). It is then leant by the travel angle towards (push) or away
/// from (drag) the travel direction. The tool z axis points along the wire
/// towards the work, x along travel (perpendicular to z), and the TCP (the
/// wire end) is the seam point; the contact tip is weld.contact_tip_distance
/// back from it along z, which only the collision model uses.
///
/// By construction the work angle measured in the plane perpendicular to the
/// seam and the travel angle equal the parameters exactly (see
/// process_angles.hpp to measure them).
///
/// Throws tw::InputError located at the sample's line in `source` when the
/// normal lies along the seam, the two normals are parallel (no fillet), or
/// the work angle would put the torch behind the second face.
/// A pure function, safe to call from several threads.
Eigen::Isometry3d weldToolPose(const SeamSample& sample, const WeldParameters& weld,
                               const std::string& source);

}  // namespace tw::planner
