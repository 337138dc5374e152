#pragma once

#include <algorithm>
#include <array>
#include <cmath>

#include "kinematics/common/angles.hpp"

namespace tw::kinematics {

/// atan2(y, x) in [−π, π] for finite arguments, within a few units in the
/// last place of the C library's, without its branches for special inputs.
/// Inline because the closed-form IK calls it ~18 times per pose and the
/// library call dominated its time.
///
/// Method (common practice; e.g. Muller, "Elementary Functions", from
/// memory): fold the ratio into t = min/max ∈ [0, 1]; take the nearest table
/// point c = k/16 and atan(t) = atan(c) + atan(u), u = (t − c)/(1 + t c),
/// |u| ≤ 1/32, where five terms of the Taylor series leave < 3e-18.
/// Like std::atan2, (±0, +0) gives ±0 and (±0, −0) gives ±π.
inline double arcTangent2(double y, double x) {
  // atan(k/16), k = 0..16, correctly rounded doubles.
  static constexpr std::array<double, 17> kTableAngles = {
      0.0,
      0.06241880999595735,
      0.12435499454676144,
      0.18534794999569476,
      0.24497866312686414,
      0.3028848683749714,
      0.35877067027057225,
      0.4124104415973873,
      0.4636476090008061,
      0.5123894603107377,
      0.5585993153435624,
      0.6022873461349642,
      0.6435011087932844,
      0.6823165548747481,
      0.7188299996216245,
      0.7531512809621944,
      0.7853981633974483,
  };
  if (std::isnan(x) || std::isnan(y)) return x + y;
  const double ax = std::abs(x);
  const double ay = std::abs(y);
  // The octant decides only sums with 0/1 factors, never a branch: the IK
  // meets every octant at random, and mispredicted branches cost more than
  // the arithmetic. Each fold is exact or rounds once, as the branches did.
  const double steep = static_cast<double>(ay > ax);
  const double behind = static_cast<double>(std::signbit(x));
  const double larger = std::max(ax, ay);
  const double smaller = std::min(ax, ay);
  double angle = 0.0;
  if (larger > 0.0) {
    const double t = smaller / larger;
    // Both infinite gives a NaN ratio: take the last entry so that the cast
    // stays defined (the result is then NaN; finite arguments are the contract).
    const int k = static_cast<int>((t < 1.0 ? t : 1.0) * 16.0 + 0.5);
    const double c = k * (1.0 / 16.0);
    const double u = (t - c) / (1.0 + t * c);
    const double u2 = u * u;
    const double series =
        u * (1.0 + u2 * (-1.0 / 3.0 + u2 * (1.0 / 5.0 + u2 * (-1.0 / 7.0 + u2 * (1.0 / 9.0)))));
    angle = kTableAngles[static_cast<std::size_t>(k)] + series;
  }
  angle = steep * (0.5 * kPi) + (1.0 - 2.0 * steep) * angle;
  angle = behind * kPi + (1.0 - 2.0 * behind) * angle;
  return std::copysign(angle, y);
}

}  // namespace tw::kinematics
