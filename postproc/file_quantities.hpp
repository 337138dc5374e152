#pragma once

#include <string>

#include "kinematics/joint.hpp"
#include "planner/program/program.hpp"

namespace tw::postproc {

/// How one kind of quantity is written: SI value × scale, in `unit`, with a
/// fixed number of decimals.
struct QuantityFormat {
  double scale = 1.0;
  std::string unit;  ///< "mm", "deg", "s", ... ("" for unitless figures)
  int decimals = 3;

  /// The SI value converted and formatted ("12.500").
  std::string format(double si_value) const;
};

/// The formats of every quantity in the project's output files, for one
/// choice of FileUnits. Decimals: mm 3 (1 µm), m 6, deg 4, rad 6, s 4,
/// quaternion 9, speed fraction 4. The same table serves writers and
/// readers so that "equal within the printed precision" has one meaning.
struct FileQuantities {
  QuantityFormat length;
  QuantityFormat angle;
  QuantityFormat time;
  QuantityFormat speed;       ///< TCP speed, length per second
  QuantityFormat quaternion;  ///< unit quaternion components
  QuantityFormat fraction;    ///< joint speed fraction

  /// `angle` for a revolute joint, `length` for a prismatic one.
  const QuantityFormat& joint(kinematics::JointType type) const;
};

FileQuantities fileQuantities(const planner::FileUnits& units);

}  // namespace tw::postproc
