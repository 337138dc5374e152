#pragma once

#include <Eigen/Geometry>

namespace tw::planner {

/// Measurements of a torch axis against the seam, for reports and checks.
/// `tool_z` is the unit tool axis pointing towards the work, `tangent` the
/// unit travel direction, `face_normal` the unit normal of the face the
/// angle is measured from. Angles in [rad].

/// Work angle: the angle between the torch axis and the face, measured in
/// the plane perpendicular to the seam (the torch axis projected into it).
double measuredWorkAngle(const Eigen::Vector3d& tool_z, const Eigen::Vector3d& tangent,
                         const Eigen::Vector3d& face_normal);

/// Travel angle: the angle between the torch axis and the plane
/// perpendicular to the seam; positive when the wire points along travel
/// (push), negative against it (drag).
double measuredTravelAngle(const Eigen::Vector3d& tool_z, const Eigen::Vector3d& tangent);

/// The raw angle between the torch axis (reversed, pointing away from the
/// work) and a face normal, without projecting: it differs from the work
/// angle's complement once the torch leans along the seam.
double rawAngleToNormal(const Eigen::Vector3d& tool_z, const Eigen::Vector3d& face_normal);

}  // namespace tw::planner
