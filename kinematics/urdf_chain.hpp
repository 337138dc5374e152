#pragma once

#include <Eigen/Geometry>
#include <string>
#include <vector>

#include "kinematics/joint.hpp"

namespace tw::kinematics {

/// The serial chain between two links of a URDF file (an open format; SI
/// units: metres, radians). Fixed joints are folded into the next moving
/// joint's frame; fixed joints after the last moving joint form X_LF.
/// URDF carries no acceleration limits, so max_acceleration is left at 0 for
/// the caller to fill in. A continuous joint gets the range ±360°.
struct UrdfChain {
  std::vector<JointSpec> joints;
  Eigen::Isometry3d X_LF = Eigen::Isometry3d::Identity();
};

/// Reads the chain from `base_link` to `tip_link`. Throws tw::InputError with
/// file and line on a missing file, malformed XML, unknown links, a tip that
/// does not descend from the base, an unsupported joint type (floating,
/// planar) or missing limits.
UrdfChain loadUrdfChain(const std::string& path, const std::string& base_link,
                        const std::string& tip_link);

}  // namespace tw::kinematics
