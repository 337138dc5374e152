#pragma once

// Joint-space paths with closed-form derivatives, shared by the TOPP-RA tests
// and benchmark. Invented example data; joint units [rad].

#include "planner/timing/time_optimal_parameterization.hpp"

#include <Eigen/Core>

#include <cmath>
#include <cstddef>
#include <random>
#include <vector>

#include "kinematics/common/angles.hpp"

namespace tw::planner::test {


/// q(s) = q0 + s·(q1 − q0): constant q', zero q''.
struct StraightLinePath {
  Eigen::VectorXd q0;
  Eigen::VectorXd q1;

  Eigen::VectorXd position(double s) const { return q0 + s * (q1 - q0); }
  Eigen::VectorXd firstDerivative(double /*s*/) const { return q1 - q0; }
  Eigen::VectorXd secondDerivative(double /*s*/) const {
    return Eigen::VectorXd::Zero(q0.size());
  }
};

/// q_j(s) = offset_j + slope_j·s + amplitude_j·sin(frequency_j·s + phase_j).
struct SinusoidPath {
  Eigen::VectorXd offset;
  Eigen::VectorXd slope;
  Eigen::VectorXd amplitude;
  Eigen::VectorXd frequency;  ///< [rad per unit s]
  Eigen::VectorXd phase;      ///< [rad]

  Eigen::VectorXd position(double s) const {
    Eigen::VectorXd q(offset.size());
    for (Eigen::Index j = 0; j < q.size(); ++j) {
      q[j] = offset[j] + slope[j] * s + amplitude[j] * std::sin(frequency[j] * s + phase[j]);
    }
    return q;
  }
  Eigen::VectorXd firstDerivative(double s) const {
    Eigen::VectorXd dq(offset.size());
    for (Eigen::Index j = 0; j < dq.size(); ++j) {
      dq[j] = slope[j] + amplitude[j] * frequency[j] * std::cos(frequency[j] * s + phase[j]);
    }
    return dq;
  }
  Eigen::VectorXd secondDerivative(double s) const {
    Eigen::VectorXd d2q(offset.size());
    for (Eigen::Index j = 0; j < d2q.size(); ++j) {
      d2q[j] = -amplitude[j] * frequency[j] * frequency[j] *
               std::sin(frequency[j] * s + phase[j]);
    }
    return d2q;
  }
};

/// A random sinusoid path on s ∈ [0, 1] drawn from a fixed-seed generator:
/// slopes in [−1, 1] rad, amplitudes in [0.1, 0.5] rad, frequencies in
/// [1, 6] rad per unit s (up to about one period on the path).
inline SinusoidPath randomSinusoidPath(int joints, unsigned seed) {
  std::mt19937 generator(seed);
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  const auto draw = [&](double lo, double hi) { return lo + (hi - lo) * unit(generator); };
  SinusoidPath path{Eigen::VectorXd(joints), Eigen::VectorXd(joints), Eigen::VectorXd(joints),
                    Eigen::VectorXd(joints), Eigen::VectorXd(joints)};
  for (int j = 0; j < joints; ++j) {
    path.offset[j] = draw(-1.0, 1.0);
    path.slope[j] = draw(-1.0, 1.0);
    path.amplitude[j] = draw(0.1, 0.5);
    path.frequency[j] = draw(1.0, 6.0);
    path.phase[j] = draw(0.0, 2.0 * kPi);
  }
  return path;
}

/// A uniform grid of `intervals` intervals on [0, 1].
inline std::vector<double> uniformGrid(std::size_t intervals) {
  std::vector<double> s(intervals + 1);
  for (std::size_t i = 0; i <= intervals; ++i) {
    s[i] = static_cast<double>(i) / static_cast<double>(intervals);
  }
  return s;
}

/// Samples the derivatives of `path` on `grid`.
template <class Path>
PathDerivatives sampleDerivatives(const Path& path, const std::vector<double>& grid) {
  PathDerivatives sampled;
  sampled.s = grid;
  sampled.dq_ds.reserve(grid.size());
  sampled.d2q_ds2.reserve(grid.size());
  for (const double s : grid) {
    sampled.dq_ds.push_back(path.firstDerivative(s));
    sampled.d2q_ds2.push_back(path.secondDerivative(s));
  }
  return sampled;
}

}  // namespace tw::planner::test
