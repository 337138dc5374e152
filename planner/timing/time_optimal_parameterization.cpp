#include "planner/timing/time_optimal_parameterization.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <sstream>
#include <stdexcept>

namespace tw::planner {
namespace {

constexpr double kInfinity = std::numeric_limits<double>::infinity();

// Rounding in the pair elimination can leave an interval whose ends cross by
// a few ulps (e.g. when K_{i+1} is a single point). Crossings up to this
// relative size are treated as a single point, larger ones as empty.
constexpr double kRelativeSetTolerance = 1e-9;
constexpr double kAbsoluteSetTolerance = 1e-15;

/// One half-plane of a stage: e·u + d·x ≥ c when it bounds u from below,
/// e·u + d·x ≤ c when it bounds u from above; e > 0 always (constraints
/// without u are turned into bounds on x before they get here).
struct HalfPlane {
  double e;
  double d;
  double c;
};

/// The constraints of one stage i in (u, x) = (u_i, x_i), without the
/// K_{i+1} rows, which are appended by the callers. Capacity is fixed at
/// construction so that filling never allocates.
struct StageConstraints {
  explicit StageConstraints(std::size_t joint_count)
      : lower(2 * joint_count + 1), upper(2 * joint_count + 1) {}

  std::vector<HalfPlane> lower;
  std::vector<HalfPlane> upper;
  std::size_t lower_count = 0;
  std::size_t upper_count = 0;
  /// Bound on x_i from velocity limits, the path speed cap and acceleration
  /// rows in which u does not appear.
  double x_max = kInfinity;

  /// Adds −bound ≤ a·u + b·x ≤ bound.
  void addSymmetricSlab(double a, double b, double bound) {
    if (a == 0.0) {
      // Only x appears: |b|·x ≤ bound (x ≥ 0 makes the other side void).
      if (b != 0.0) x_max = std::min(x_max, bound / std::abs(b));
      return;
    }
    const double sign = a > 0.0 ? 1.0 : -1.0;
    lower[lower_count++] = {sign * a, sign * b, -bound};
    upper[upper_count++] = {sign * a, sign * b, bound};
  }

  /// Rows that say x_i + 2Δ_i u_i ∈ [lo, hi] (the next controllable set).
  void addNextSet(double two_delta, double lo, double hi) {
    lower[lower_count++] = {two_delta, 1.0, lo};
    // An unbounded next set adds no upper row: its constant would be +inf,
    // and inf·0 in the pair elimination would produce NaN.
    if (hi < kInfinity) upper[upper_count++] = {two_delta, 1.0, hi};
  }
};

struct Interval {
  double lo;
  double hi;
};

double squared(double value) { return value * value; }

/// Bound on x = ṡ² at grid point i from the joint velocity limits and the
/// path speed cap; +inf when no joint moves and no cap applies.
double velocityBoundOnX(const PathDerivatives& path, const TimeOptimalLimits& limits,
                        std::size_t i) {
  double x_max = limits.max_path_speed.empty() ? kInfinity : squared(limits.max_path_speed[i]);
  const Eigen::VectorXd& dq = path.dq_ds[i];
  for (Eigen::Index j = 0; j < dq.size(); ++j) {
    if (dq[j] != 0.0) x_max = std::min(x_max, squared(limits.max_velocity[j] / dq[j]));
  }
  return x_max;
}

/// Fills the constraints of stage i (interval [s_i, s_{i+1}]) by first-order
/// interpolation: the acceleration limits at s_i with (u_i, x_i) and at
/// s_{i+1} with (u_i, x_i + 2Δ_i u_i), i.e. coefficient q'_{i+1} + 2Δ_i q''_{i+1}
/// on u and q''_{i+1} on x.
void fillStage(const PathDerivatives& path, const TimeOptimalLimits& limits, std::size_t i,
               StageConstraints& stage) {
  stage.lower_count = 0;
  stage.upper_count = 0;
  stage.x_max = velocityBoundOnX(path, limits, i);
  const double two_delta = 2.0 * (path.s[i + 1] - path.s[i]);
  const Eigen::VectorXd& dq_here = path.dq_ds[i];
  const Eigen::VectorXd& d2q_here = path.d2q_ds2[i];
  const Eigen::VectorXd& dq_next = path.dq_ds[i + 1];
  const Eigen::VectorXd& d2q_next = path.d2q_ds2[i + 1];
  for (Eigen::Index j = 0; j < dq_here.size(); ++j) {
    const double a_max = limits.max_acceleration[j];
    stage.addSymmetricSlab(dq_here[j], d2q_here[j], a_max);
    stage.addSymmetricSlab(dq_next[j] + two_delta * d2q_next[j], d2q_next[j], a_max);
  }
}

/// Projection of the stage polygon {(u, x) : rows, 0 ≤ x ≤ x_max} onto x.
/// Every pair (lower row k, upper row l) must admit some u, which is the
/// linear condition x·(d_l e_k − d_k e_l) ≤ c_l e_k − c_k e_l; the x-extreme
/// vertices of the polygon are exactly where such a pair is tight.
/// Returns nullopt for an empty polygon.
std::optional<Interval> projectOnX(const StageConstraints& stage) {
  double lo = 0.0;
  double hi = stage.x_max;
  for (std::size_t k = 0; k < stage.lower_count; ++k) {
    const HalfPlane& below = stage.lower[k];
    for (std::size_t l = 0; l < stage.upper_count; ++l) {
      const HalfPlane& above = stage.upper[l];
      const double alpha = above.d * below.e - below.d * above.e;
      const double beta = above.c * below.e - below.c * above.e;
      if (alpha > 0.0) {
        hi = std::min(hi, beta / alpha);
      } else if (alpha < 0.0) {
        lo = std::max(lo, beta / alpha);
      } else if (beta < 0.0) {
        return std::nullopt;
      }
    }
  }
  if (lo > hi) {
    const double tolerance =
        kRelativeSetTolerance * std::max(std::abs(lo), std::abs(hi)) + kAbsoluteSetTolerance;
    if (lo - hi > tolerance) return std::nullopt;
    lo = hi;
  }
  return Interval{lo, hi};
}

/// Range of u admitted by the rows of a stage at a given x (e > 0 in all rows).
Interval admissibleU(const StageConstraints& stage, double x) {
  Interval u{-kInfinity, kInfinity};
  for (std::size_t k = 0; k < stage.lower_count; ++k) {
    const HalfPlane& row = stage.lower[k];
    u.lo = std::max(u.lo, (row.c - row.d * x) / row.e);
  }
  for (std::size_t l = 0; l < stage.upper_count; ++l) {
    const HalfPlane& row = stage.upper[l];
    u.hi = std::min(u.hi, (row.c - row.d * x) / row.e);
  }
  return u;
}

std::string formatNumber(double value) {
  std::ostringstream text;
  text.precision(17);
  text << value;
  return text.str();
}

[[noreturn]] void throwInvalid(const std::string& what) {
  throw std::invalid_argument("parameterizeTimeOptimal: " + what);
}

void validate(const PathDerivatives& path, const TimeOptimalLimits& limits) {
  const std::size_t points = path.s.size();
  if (points < 2) {
    throwInvalid("path.s needs at least 2 grid points, got " + std::to_string(points));
  }
  if (path.dq_ds.size() != points || path.d2q_ds2.size() != points) {
    throwInvalid("path.dq_ds and path.d2q_ds2 need one vector per grid point (" +
                 std::to_string(points) + "), got " + std::to_string(path.dq_ds.size()) +
                 " and " + std::to_string(path.d2q_ds2.size()));
  }
  const Eigen::Index joints = limits.max_velocity.size();
  if (joints < 1 || limits.max_acceleration.size() != joints) {
    throwInvalid("limits.max_velocity and limits.max_acceleration need the same size >= 1, got " +
                 std::to_string(joints) + " and " +
                 std::to_string(limits.max_acceleration.size()));
  }
  for (Eigen::Index j = 0; j < joints; ++j) {
    const double v = limits.max_velocity[j];
    const double a = limits.max_acceleration[j];
    if (!(std::isfinite(v) && v > 0.0)) {
      throwInvalid("limits.max_velocity[" + std::to_string(j) + "] must be finite and > 0, got " +
                   formatNumber(v));
    }
    if (!(std::isfinite(a) && a > 0.0)) {
      throwInvalid("limits.max_acceleration[" + std::to_string(j) +
                   "] must be finite and > 0, got " + formatNumber(a));
    }
  }
  for (std::size_t i = 0; i < points; ++i) {
    if (!std::isfinite(path.s[i])) {
      throwInvalid("path.s[" + std::to_string(i) + "] is not finite: " + formatNumber(path.s[i]));
    }
    if (i > 0 && !(path.s[i] > path.s[i - 1])) {
      throwInvalid("path.s must be strictly increasing; s[" + std::to_string(i) +
                   "] = " + formatNumber(path.s[i]) + " is not greater than s[" +
                   std::to_string(i - 1) + "] = " + formatNumber(path.s[i - 1]));
    }
    if (path.dq_ds[i].size() != joints || path.d2q_ds2[i].size() != joints) {
      throwInvalid("path.dq_ds[" + std::to_string(i) + "] and path.d2q_ds2[" + std::to_string(i) +
                   "] need " + std::to_string(joints) + " joints (the size of the limits), got " +
                   std::to_string(path.dq_ds[i].size()) + " and " +
                   std::to_string(path.d2q_ds2[i].size()));
    }
    if (!path.dq_ds[i].allFinite() || !path.d2q_ds2[i].allFinite()) {
      throwInvalid("path.dq_ds[" + std::to_string(i) + "] or path.d2q_ds2[" + std::to_string(i) +
                   "] has a non-finite entry");
    }
  }
  if (!limits.max_path_speed.empty()) {
    if (limits.max_path_speed.size() != points) {
      throwInvalid("limits.max_path_speed must be empty or have one value per grid point (" +
                   std::to_string(points) + "), got " +
                   std::to_string(limits.max_path_speed.size()));
    }
    for (std::size_t i = 0; i < points; ++i) {
      if (!(limits.max_path_speed[i] >= 0.0)) {
        throwInvalid("limits.max_path_speed[" + std::to_string(i) +
                     "] must be >= 0 (+inf for no cap), got " +
                     formatNumber(limits.max_path_speed[i]));
      }
    }
  }
  const auto check_speed = [](double speed, const char* name) {
    if (!(std::isfinite(speed) && speed >= 0.0)) {
      throwInvalid(std::string("limits.") + name + " must be finite and >= 0, got " +
                   formatNumber(speed));
    }
  };
  check_speed(limits.start_path_speed, "start_path_speed");
  check_speed(limits.end_path_speed, "end_path_speed");
}

TimedPath infeasible(std::size_t index, std::string reason) {
  TimedPath result;
  result.feasible = false;
  result.infeasible_index = index;
  result.reason = std::move(reason);
  return result;
}

std::string atGridPoint(const PathDerivatives& path, std::size_t i) {
  return "grid index " + std::to_string(i) + " (s = " + formatNumber(path.s[i]) + ")";
}

/// Where a start speed above K_0 first breaks a limit: brakes as hard as the
/// stage constraints allow (the lowest reachable x at every step, so every
/// other choice breaks a limit no later) and returns the first grid index
/// whose constraints cannot be met, or N if the end speed is overshot.
std::size_t firstIndexBrokenWhileBraking(const PathDerivatives& path,
                                         const TimeOptimalLimits& limits, double x_start,
                                         StageConstraints& stage) {
  const std::size_t last = path.s.size() - 1;
  double x = x_start;
  for (std::size_t i = 0; i < last; ++i) {
    fillStage(path, limits, i, stage);
    const Interval u = admissibleU(stage, x);
    const double tolerance = kRelativeSetTolerance * x + kAbsoluteSetTolerance;
    if (x > stage.x_max + tolerance || u.lo > u.hi + tolerance) return i;
    x = std::max(0.0, x + 2.0 * (path.s[i + 1] - path.s[i]) * u.lo);
  }
  return last;
}

}  // namespace

TimedPath parameterizeTimeOptimal(const PathDerivatives& path, const TimeOptimalLimits& limits) {
  validate(path, limits);
  const std::size_t last = path.s.size() - 1;
  StageConstraints stage(static_cast<std::size_t>(limits.max_velocity.size()));

  // Backward pass: controllable sets K_N, ..., K_0.
  std::vector<Interval> controllable(last + 1);
  const double x_end = squared(limits.end_path_speed);
  if (x_end > velocityBoundOnX(path, limits, last)) {
    return infeasible(last, "end_path_speed " + formatNumber(limits.end_path_speed) +
                                " exceeds a joint velocity limit or the path speed cap at " +
                                atGridPoint(path, last));
  }
  controllable[last] = {x_end, x_end};
  for (std::size_t i = last; i-- > 0;) {
    fillStage(path, limits, i, stage);
    stage.addNextSet(2.0 * (path.s[i + 1] - path.s[i]), controllable[i + 1].lo,
                     controllable[i + 1].hi);
    const std::optional<Interval> set = projectOnX(stage);
    if (!set) {
      return infeasible(i, "no path speed at " + atGridPoint(path, i) +
                               " lets the path reach its end at end_path_speed " +
                               formatNumber(limits.end_path_speed) +
                               " within the joint limits and path speed caps");
    }
    controllable[i] = *set;
  }

  const double x_start = squared(limits.start_path_speed);
  const Interval& start_set = controllable[0];
  const double start_tolerance = kRelativeSetTolerance * x_start + kAbsoluteSetTolerance;
  if (x_start > start_set.hi + start_tolerance) {
    const std::size_t broken = firstIndexBrokenWhileBraking(path, limits, x_start, stage);
    return infeasible(broken, "start_path_speed " + formatNumber(limits.start_path_speed) +
                                  " is too high: the largest start speed that can still meet "
                                  "the limits is " + formatNumber(std::sqrt(start_set.hi)) +
                                  "; braking as hard as allowed from it breaks a limit at " +
                                  atGridPoint(path, broken));
  }
  if (x_start < start_set.lo - start_tolerance) {
    return infeasible(last, "start_path_speed " + formatNumber(limits.start_path_speed) +
                                " is too low: end_path_speed " +
                                formatNumber(limits.end_path_speed) + " at " +
                                atGridPoint(path, last) + " needs a start speed of at least " +
                                formatNumber(std::sqrt(start_set.lo)));
  }

  // Forward pass: greedy maximal u_i, keeping x_{i+1} in K_{i+1}.
  TimedPath result;
  result.s = path.s;
  result.path_speed.resize(last + 1);
  result.path_acceleration.resize(last);
  result.time.resize(last + 1);
  result.path_speed[0] = limits.start_path_speed;
  result.time[0] = 0.0;
  double x = x_start;
  for (std::size_t i = 0; i < last; ++i) {
    const double delta = path.s[i + 1] - path.s[i];
    const Interval& next_set = controllable[i + 1];
    fillStage(path, limits, i, stage);
    stage.addNextSet(2.0 * delta, next_set.lo, next_set.hi);
    const double u_greedy = admissibleU(stage, x).hi;
    // The clamp only absorbs rounding: x ∈ K_i guarantees a u landing in K_{i+1}.
    const double x_next = std::clamp(x + 2.0 * delta * u_greedy, next_set.lo, next_set.hi);
    if (!std::isfinite(x_next)) {
      return infeasible(i + 1, "path speed is unbounded at " + atGridPoint(path, i + 1) +
                                   ": no joint moves there and no max_path_speed caps ds/dt");
    }
    const double speed = std::sqrt(x);
    const double speed_next = std::sqrt(x_next);
    if (speed + speed_next == 0.0) {
      return infeasible(i, "path speed must be 0 at both " + atGridPoint(path, i) + " and " +
                               atGridPoint(path, i + 1) +
                               ", so the interval between them takes infinite time");
    }
    result.path_acceleration[i] = (x_next - x) / (2.0 * delta);
    result.path_speed[i + 1] = speed_next;
    result.time[i + 1] = result.time[i] + 2.0 * delta / (speed + speed_next);
    x = x_next;
  }
  result.duration = result.time[last];
  result.feasible = true;
  return result;
}

PathState samplePathState(const TimedPath& timed, double t) {
  if (!timed.feasible) {
    throw std::invalid_argument("samplePathState: the timed path is not feasible (" +
                                timed.reason + ")");
  }
  if (std::isnan(t)) throw std::invalid_argument("samplePathState: t is NaN");
  const std::size_t last = timed.time.size() - 1;
  if (t >= timed.duration) {
    return {timed.s[last], timed.path_speed[last], timed.path_acceleration[last - 1]};
  }
  const double clamped_t = std::max(t, 0.0);
  // The interval i with time[i] ≤ t < time[i+1].
  const auto after = std::upper_bound(timed.time.begin(), timed.time.end(), clamped_t);
  const std::size_t i = static_cast<std::size_t>(after - timed.time.begin()) - 1;
  const double tau = clamped_t - timed.time[i];
  const double u = timed.path_acceleration[i];
  const double speed = timed.path_speed[i];
  const double s = timed.s[i] + speed * tau + 0.5 * u * tau * tau;
  return {std::min(s, timed.s[i + 1]), std::max(0.0, speed + u * tau), u};
}

}  // namespace tw::planner
