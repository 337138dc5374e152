#pragma once

// Time-optimal path parameterisation by reachability analysis (TOPP-RA).
//
// Source: H. Pham, Q.-C. Pham, "A New Approach to Time-Optimal Path
// Parameterization Based on Reachability Analysis", IEEE Transactions on
// Robotics 34(3), 2018 (arXiv 1707.07239). Section and equation references
// below are from memory and were not checked against the paper's numbering.
//
// Relation to the paper
// ---------------------
// * Problem (paper Sec. II, from memory): a path q(s), s ∈ [0, s_N], is timed
//   by s(t). With x = ṡ² and u = s̈ the joint velocity and acceleration are
//       q̇ = q'(s) ṡ,         q̈ = q'(s) u + q''(s) x,
//   so |q̇_j| ≤ v_j is a bound on x alone and |q̈_j| ≤ a_j is linear in (u, x):
//   the paper's general form a(s) u + b(s) x + c(s) ∈ C(s) with a = q',
//   b = q'', c = 0 and C a box.
// * Discretisation (paper Sec. II/III, from memory): on the grid
//   s_0 < ... < s_N with Δ_i = s_{i+1} − s_i, u is constant on each interval,
//   hence x_{i+1} = x_i + 2 Δ_i u_i (exact for constant s̈, since
//   d(ṡ²)/ds = 2 s̈).
// * Controllable sets (paper Sec. III, from memory): K_N = {x_end} and
//   K_i = Q_i(K_{i+1}) = { x : ∃u, (u, x) admissible at stage i and
//   x + 2 Δ_i u ∈ K_{i+1} }, each an interval [min x, max x] of one
//   two-variable LP pair (the paper's backward pass, Algorithm 1).
// * Forward pass (paper Sec. IV, Algorithm 1, from memory): from x_0 pick the
//   greedy u_i = max{ u : (u, x_i) admissible, x_i + 2 Δ_i u ∈ K_{i+1} }.
//   The paper proves this greedy choice time-optimal for the discretised
//   problem (its optimality theorem, from memory).
//
// Our LP solver: the admissible set of stage i is a convex polygon in (u, x).
// Its extreme x values lie at vertices where one constraint bounding u from
// below meets one bounding u from above (or on the box 0 ≤ x ≤ x_max). We
// therefore enumerate every (lower, upper) constraint pair, which is
// Fourier–Motzkin elimination of u: exact, branch-light, allocation-free, and
// O((2n+1)²) per stage for n joints. No external LP solver.
//
// Collocation versus interpolation (paper's discussion of discretisation
// schemes, from memory): collocation checks the constraints of grid point i
// with (u_i, x_i) only; first-order interpolation additionally checks the
// constraints of grid point i+1 with (u_i, x_i + 2 Δ_i u_i). We use
// INTERPOLATION. Reason: with piecewise-constant u the true joint
// acceleration on interval i is q'(s) u_i + q''(s) x(s), and every grid point
// i > 0 sees two accelerations (u_{i−1} from the left, u_i from the right).
// Collocation checks only the right one, so the timed path violates the
// limits by O(Δ) at the grid points themselves; interpolation checks both
// ends of every interval, leaving only the O(Δ²) curvature of the smooth
// acceleration between grid points. The velocity bound needs no extra care:
// x is linear in s on an interval and is bounded at both ends. The price is
// (2n+1)² instead of (n+1)² pairs per stage. Measured on the 1 ms sampling
// test (6 joints, N = 1000): collocation alone exceeds the acceleration
// limits by up to 0.56 %, interpolation by at most 0.0004 %.
//
// Contract
// --------
// Units: the path parameter s is whatever the caller uses (arc length [m] or
// unitless); q in [rad] or [m] per joint; limits in joint units per [s] and
// per [s²]; path speeds in s-units per [s]. Deterministic; no global state;
// safe to call concurrently. Costs O(N n²) time and O(N) memory.

#include <Eigen/Core>

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

namespace tw::planner {

/// A geometric path sampled on a grid s_0 = 0 < s_1 < ... < s_N, with the
/// joint derivatives q'(s_i) and q''(s_i) at every grid point (n joints).
/// Preconditions (checked): N ≥ 1, s strictly increasing and finite, one
/// derivative vector per grid point, all of the same size n ≥ 1 and finite.
/// s_0 need not be 0; only differences matter.
struct PathDerivatives {
  std::vector<double> s;
  std::vector<Eigen::VectorXd> dq_ds;
  std::vector<Eigen::VectorXd> d2q_ds2;
};

/// Limits for parameterizeTimeOptimal. Preconditions (checked): velocity and
/// acceleration of size n, each finite and > 0; max_path_speed empty or one
/// value per grid point, each ≥ 0 (0 forces a stop there; +inf = no cap);
/// start and end path speed finite and ≥ 0.
struct TimeOptimalLimits {
  Eigen::VectorXd max_velocity;        ///< per joint [unit/s]
  Eigen::VectorXd max_acceleration;    ///< per joint [unit/s²]
  std::vector<double> max_path_speed;  ///< per grid point, upper bound on ds/dt
  double start_path_speed = 0.0;       ///< ds/dt at s_0, met exactly
  double end_path_speed = 0.0;         ///< ds/dt at s_N, met exactly
};

/// Result of parameterizeTimeOptimal. When feasible, path_speed and time have
/// one entry per grid point (time[0] = 0, time[N] = duration) and
/// path_acceleration one per interval (d²s/dt², constant on [s_i, s_{i+1}]).
/// When not feasible, reason says why in words, infeasible_index names the
/// grid point where the limits cannot be met, and the vectors are empty.
struct TimedPath {
  bool feasible = false;
  std::string reason;
  std::optional<std::size_t> infeasible_index;
  std::vector<double> s;
  std::vector<double> path_speed;
  std::vector<double> path_acceleration;
  std::vector<double> time;
  double duration = 0.0;
};

/// The fastest timing s(t) of the path that keeps |q̇_j| ≤ max_velocity_j and
/// |q̈_j| ≤ max_acceleration_j at every grid point (with both neighbouring
/// interval accelerations, see "interpolation" above), ds/dt ≤ max_path_speed
/// at every grid point, and starts and ends at the given path speeds.
///
/// A joint whose q' and q'' vanish is unconstrained there; a joint with q' = 0
/// but q'' ≠ 0 bounds the path speed through its acceleration limit.
/// Infeasible requests (e.g. a start speed too high to stop in time, an end
/// speed above a velocity limit, a stretch where the path speed must be 0 at
/// both ends of an interval — which includes rest to rest over a single
/// interval, since one constant s̈ cannot start and end at rest — or a path
/// speed left unbounded because nothing moves and no cap is given) are
/// returned with feasible = false; no input is ever adjusted silently.
///
/// Throws std::invalid_argument, naming the offending field and index, when a
/// precondition of PathDerivatives or TimeOptimalLimits is broken.
TimedPath parameterizeTimeOptimal(const PathDerivatives& path, const TimeOptimalLimits& limits);

/// The state of the path parameter at one instant of a timed path.
struct PathState {
  double s = 0.0;                  ///< path parameter
  double path_speed = 0.0;         ///< ds/dt
  double path_acceleration = 0.0;  ///< d²s/dt² of the interval containing t
};

/// Samples a feasible timed path at time t [s] using the constant path
/// acceleration of each interval (exact for TOPP-RA's discretisation).
/// t is clamped to [0, duration]; at an interval boundary the acceleration is
/// that of the interval that begins there (the last interval's at the end).
/// Throws std::invalid_argument for an infeasible timed path or a NaN t.
PathState samplePathState(const TimedPath& timed, double t);

}  // namespace tw::planner
