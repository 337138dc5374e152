#pragma once

// Independent reference for the TOPP-RA tests: the classic numerical
// integration (NI) method in the phase plane (s, x = ṡ²) of Bobrow, Dubowsky
// & Gibson, "Time-optimal control of robotic manipulators along specified
// paths", IJRR 4(3), 1985, and Shin & McKay, "Minimum-time control of robotic
// manipulators with geometric path constraints", IEEE TAC 30(6), 1985 (both
// from memory): integrate maximum deceleration backward from the end and
// maximum acceleration forward from the start, never above the maximum
// velocity curve (MVC).
//
// Variant used here, written for robustness rather than speed:
// * The MVC at each node is found by bisection on x: the admissible range of
//   s̈ at (s, x) is non-empty exactly for x in [0, MVC(s)] (the admissible
//   (s̈, x) set is convex and contains (0, 0)).
// * Instead of searching for switching points on the MVC, the backward
//   max-deceleration curve is clamped to the MVC wherever it would cross it.
//   By the comparison principle for x' = 2·s̈_min(s, x), the clamped curve is
//   the lower envelope of the max-deceleration curves started from every MVC
//   point, which is what the switching-point construction builds; the forward
//   max-acceleration curve is then clamped to that envelope.
// * Heun's method (second order) on a fine uniform grid of the analytic path;
//   the error is O(h) near clamps and O(h²) elsewhere.
//
// It shares no code with the TOPP-RA implementation: it evaluates the
// continuous constraints node by node with divisions, not stage LPs.

#include <Eigen/Core>

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <limits>
#include <vector>

namespace tw::planner::test {

struct PhasePlaneProblem {
  Eigen::VectorXd max_velocity;
  Eigen::VectorXd max_acceleration;
  double start_path_speed = 0.0;
  double end_path_speed = 0.0;
};

namespace detail {

struct PathAccelerationRange {
  double lo;
  double hi;
  bool admissible;  ///< false when a joint with q' = 0 breaks its limit through q''·x
};

inline PathAccelerationRange pathAccelerationRange(const Eigen::VectorXd& dq,
                                                   const Eigen::VectorXd& d2q,
                                                   const Eigen::VectorXd& max_acceleration,
                                                   double x) {
  constexpr double kInf = std::numeric_limits<double>::infinity();
  PathAccelerationRange range{-kInf, kInf, true};
  for (Eigen::Index j = 0; j < dq.size(); ++j) {
    const double a = max_acceleration[j];
    if (dq[j] == 0.0) {
      if (std::abs(d2q[j]) * x > a) range.admissible = false;
      continue;
    }
    const double bound_1 = (-a - d2q[j] * x) / dq[j];
    const double bound_2 = (a - d2q[j] * x) / dq[j];
    range.lo = std::max(range.lo, std::min(bound_1, bound_2));
    range.hi = std::min(range.hi, std::max(bound_1, bound_2));
  }
  return range;
}

inline bool isAdmissible(const Eigen::VectorXd& dq, const Eigen::VectorXd& d2q,
                         const Eigen::VectorXd& max_acceleration, double x) {
  const PathAccelerationRange range = pathAccelerationRange(dq, d2q, max_acceleration, x);
  return range.admissible && range.lo <= range.hi;
}

inline double maximumVelocityCurve(const Eigen::VectorXd& dq, const Eigen::VectorXd& d2q,
                                   const PhasePlaneProblem& problem) {
  double velocity_bound = std::numeric_limits<double>::infinity();
  for (Eigen::Index j = 0; j < dq.size(); ++j) {
    if (dq[j] != 0.0) {
      velocity_bound =
          std::min(velocity_bound, std::pow(problem.max_velocity[j] / dq[j], 2));
    }
  }
  double lo = 0.0;
  double hi = std::isfinite(velocity_bound) ? velocity_bound : 1.0;
  if (isAdmissible(dq, d2q, problem.max_acceleration, hi)) {
    if (std::isfinite(velocity_bound)) return velocity_bound;
    while (isAdmissible(dq, d2q, problem.max_acceleration, hi)) {
      lo = hi;
      hi *= 2.0;
    }
  }
  for (int iteration = 0; iteration < 200 && hi - lo > 1e-14 * hi; ++iteration) {
    const double mid = 0.5 * (lo + hi);
    (isAdmissible(dq, d2q, problem.max_acceleration, mid) ? lo : hi) = mid;
  }
  return lo;
}

}  // namespace detail

/// Duration of the time-optimal timing of `path` on s ∈ [0, s_end] computed
/// with `steps` uniform integration steps. Path needs firstDerivative(s) and
/// secondDerivative(s) returning Eigen::VectorXd.
template <class Path>
double phasePlaneIntegrationDuration(const Path& path, double s_end,
                                     const PhasePlaneProblem& problem, std::size_t steps) {
  const double h = s_end / static_cast<double>(steps);
  std::vector<Eigen::VectorXd> dq(steps + 1);
  std::vector<Eigen::VectorXd> d2q(steps + 1);
  std::vector<double> mvc(steps + 1);
  for (std::size_t k = 0; k <= steps; ++k) {
    const double s = h * static_cast<double>(k);
    dq[k] = path.firstDerivative(s);
    d2q[k] = path.secondDerivative(s);
    mvc[k] = detail::maximumVelocityCurve(dq[k], d2q[k], problem);
  }
  const auto lowest = [&](std::size_t k, double x) {
    return detail::pathAccelerationRange(dq[k], d2q[k], problem.max_acceleration, x).lo;
  };
  const auto highest = [&](std::size_t k, double x) {
    return detail::pathAccelerationRange(dq[k], d2q[k], problem.max_acceleration, x).hi;
  };

  std::vector<double> backward(steps + 1);
  backward[steps] = std::min(problem.end_path_speed * problem.end_path_speed, mvc[steps]);
  for (std::size_t k = steps; k > 0; --k) {
    const double x = backward[k];
    const double slope_here = lowest(k, x);
    const double predicted = std::clamp(x - 2.0 * h * slope_here, 0.0, mvc[k - 1]);
    const double x_previous = x - h * (slope_here + lowest(k - 1, predicted));
    backward[k - 1] = std::clamp(std::isnan(x_previous) ? mvc[k - 1] : x_previous, 0.0,
                                 mvc[k - 1]);
  }

  double x = std::min(problem.start_path_speed * problem.start_path_speed, backward[0]);
  double duration = 0.0;
  for (std::size_t k = 0; k < steps; ++k) {
    const double slope_here = highest(k, x);
    const double predicted = std::clamp(x + 2.0 * h * slope_here, 0.0, backward[k + 1]);
    const double x_next_free = x + h * (slope_here + highest(k + 1, predicted));
    const double x_next =
        std::clamp(std::isnan(x_next_free) ? backward[k + 1] : x_next_free, 0.0, backward[k + 1]);
    duration += 2.0 * h / (std::sqrt(x) + std::sqrt(x_next));
    x = x_next;
  }
  return duration;
}

}  // namespace tw::planner::test
