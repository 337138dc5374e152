#pragma once

#include <Eigen/Geometry>

#include <random>
#include <string>
#include <vector>

#include "planner/motion/compact_move.hpp"
#include "planner/motion/move_compaction.hpp"

namespace tw::planner::test {

Eigen::Isometry3d makePose(const Eigen::Vector3d& p, const Eigen::Quaterniond& q);

/// Poses with every must_keep false.
CompactionInput inputFrom(std::vector<Eigen::Isometry3d> poses);

/// A seam that wiggles about the x axis: p(t) = (t, a_y sin(2πt/λ_y + φ_y),
/// a_z sin(2πt/λ_z + φ_z)), sampled at t = k·spacing; the tool turns about a
/// fixed axis by tilt·sin(2πt/λ_tilt) from a base orientation.
struct WavySeam {
  double spacing = 2e-3;
  double amplitude_y = 0.0, wavelength_y = 0.1, phase_y = 0.0;
  double amplitude_z = 0.0, wavelength_z = 0.1, phase_z = 0.0;
  double tilt = 0.0, tilt_wavelength = 0.1;
  Eigen::Vector3d tilt_axis = Eigen::Vector3d::UnitZ();
  std::string describe() const;
};
WavySeam randomWavySeam(std::mt19937& rng);
std::vector<Eigen::Isometry3d> samplePoses(const WavySeam& seam, int sample_count);

/// A tangent-continuous chain of straight pieces and circular arcs (radius
/// 10–150 mm, 10–150°, each in a randomly tilted plane) sampled every
/// `spacing`, the tool turning slowly about a fixed axis, plus uniform noise
/// of ±noise on each coordinate. Deterministic for a given rng state.
std::vector<Eigen::Isometry3d> randomPieceSeam(std::mt19937& rng, int sample_count,
                                               double spacing, double noise);

/// Largest rotation between consecutive samples per metre of seam [rad/m].
double maxRotationRate(const std::vector<Eigen::Isometry3d>& poses);

/// Worst deviation between a move as interpolateMove evaluates it and the
/// seam polyline between the move's start and end samples, found by brute
/// force independently of the compaction's own check:
/// - path → seam: the move evaluated every ≤ 0.1 mm of its length; each
///   point's distance to the nearest point of the seam polyline, and the
///   angle between the move's orientation there and the seam's (slerp of
///   the two samples at that nearest point);
/// - seam → path: points every ≤ 0.1 mm along the seam polyline; each one's
///   distance to the move's evaluated points joined as a polyline; and at
///   each sample the angle to the move's orientation at its nearest point.
struct DenseDeviation {
  double position = 0.0;  ///< [m]
  double angle = 0.0;     ///< [rad]
};
DenseDeviation denseDeviation(const std::vector<Eigen::Isometry3d>& poses,
                              const CompactMove& move);

}  // namespace tw::planner::test
