#pragma once

#include <array>

namespace tw::kinematics {

/// The geometric parameters of a 6R arm with an ortho-parallel basis and a
/// spherical wrist, as defined by Brandstötter, Angerer and Hofbaur,
/// "An analytical solution of the inverse kinematics problem of industrial
/// serial manipulators with an ortho-parallel basis and a spherical wrist",
/// Austrian Robotics Workshop 2014. Lengths [m].
///
/// In the zero pose the arm stands upright: axis 1 is the base z axis;
/// axes 2 and 3 are parallel to the base y axis, at height c1 and c1 + c2 and
/// at x = a1; the forearm is offset by a2 along x; axes 4 and 6 are vertical
/// through x = a1 + a2; axis 5 is parallel to y at height c1 + c2 + c3 (the
/// wrist centre); the flange is c4 above the wrist centre, frame axes aligned
/// with the base. b is the lateral (y) offset of the arm plane.
///
/// The geometric angle θi of the paper relates to the joint value qi by
/// θi = sign[i]·qi + zero_offset[i], so a controller's own zero and
/// direction can be matched without changing the geometry.
struct OrthoParallelGeometry {
  double a1 = 0.0;
  double a2 = 0.0;
  double b = 0.0;
  double c1 = 0.0;
  double c2 = 0.0;
  double c3 = 0.0;
  double c4 = 0.0;
  std::array<double, 6> sign{{1, 1, 1, 1, 1, 1}};
  std::array<double, 6> zero_offset{{0, 0, 0, 0, 0, 0}};  ///< [rad]
};

}  // namespace tw::kinematics
