#pragma once

#include <Eigen/Geometry>
#include <optional>

namespace tw::planner {

/// The tool pose with its origin at `p_XT`, its z axis along `z` (unit) and
/// its x axis along the part of `travel` perpendicular to z; y = z × x.
/// Returns nullopt when travel is (within 1e-6 rad) parallel to z, where no
/// x axis follows from the travel direction.
std::optional<Eigen::Isometry3d> toolFrameAlong(const Eigen::Vector3d& p_XT,
                                                const Eigen::Vector3d& z,
                                                const Eigen::Vector3d& travel);

}  // namespace tw::planner
