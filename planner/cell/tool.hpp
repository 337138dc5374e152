#pragma once

#include <Eigen/Geometry>
#include <string>
#include <vector>

#include "kinematics/link_geometry.hpp"

namespace tw::planner {

/// The allowed rotation of the tool about its own z axis (the tool axis)
/// [rad], relative to the orientation the seam geometry asks for: any
/// X_XT · Rz(θ) with min ≤ θ ≤ max does the same process work. The seam
/// solver samples this range; nothing upstream of it picks a value.
struct SpinRange {
  double min = 0.0;
  double max = 0.0;
  bool fixed() const { return min == max; }
};

/// An end effector mounted on the flange.
struct Tool {
  std::string name;
  /// Pose of the tool centre point T in the flange frame F [m]: where the
  /// process meets the part (a torch's wire end, a bead's foot, a spray
  /// gun's aim point on the surface). The tool's z axis is its working
  /// axis, pointing out of the tool towards the work.
  Eigen::Isometry3d X_FT = Eigen::Isometry3d::Identity();
  /// Collision bodies of the tool, posed in the flange frame F.
  std::vector<kinematics::LinkShape> shapes;
  /// How far [m] from its wire stick-out or bead the tool may touch a
  /// workpiece (collision::TipContact::radius; the length comes from the
  /// job's process). 3 mm: a wire's wander about its axis (common practice,
  /// no source).
  double tip_allowance = 0.003;
  /// True when the process does not care about rotation about the tool axis
  /// (a welding torch, a round spray): the spin is then a free choice.
  bool symmetric = false;
  SpinRange spin;
  int line = 0;  ///< line of the tool's element in the cell file
};

}  // namespace tw::planner
