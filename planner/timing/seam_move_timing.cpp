#include "planner/timing/seam_move_timing.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/number_text.hpp"
#include "planner/timing/time_optimal_parameterization.hpp"

namespace tw::planner {
namespace {

constexpr double kInfinity = std::numeric_limits<double>::infinity();
constexpr double kRadToDeg = 180.0 / kPi;
/// A speed held this far below the programmed one counts as lowered: the
/// rounding of the time-optimal profile is far smaller.
constexpr double kLoweredRatio = 0.999;

/// One run: consecutive moves from one exact stop to the next.
struct Run {
  std::size_t first = 0;
  std::size_t last = 0;  ///< inclusive
};

std::vector<Run> runsOf(const std::vector<SeamMove>& moves) {
  std::vector<Run> runs;
  std::size_t first = 0;
  for (std::size_t k = 0; k < moves.size(); ++k) {
    const bool turn = moves[k].length == 0.0;
    const bool next_turn = k + 1 < moves.size() && moves[k + 1].length == 0.0;
    if (k + 1 == moves.size() || moves[k].blend == 0.0 || turn || next_turn) {
      runs.push_back({first, k});
      first = k + 1;
    }
  }
  return runs;
}

/// First and second derivatives of q(s) at the grid points by finite
/// differences (central inside, one-sided at the ends), on a grid that may
/// be uneven.
PathDerivatives derivatives(const std::vector<double>& s, const std::vector<kinematics::JointVector>& q) {
  const std::size_t n = s.size();
  PathDerivatives path;
  path.s = s;
  path.dq_ds.resize(n);
  path.d2q_ds2.resize(n);
  for (std::size_t i = 0; i < n; ++i) {
    const std::size_t a = i == 0 ? 0 : i - 1;
    const std::size_t b = i + 1 == n ? n - 1 : i + 1;
    const std::size_t lo = i == 0 ? 0 : (i + 1 == n ? n - 3 : i - 1);
    const std::size_t hi = lo + 2;
    path.dq_ds[i] = Eigen::VectorXd((q[b] - q[a]) / (s[b] - s[a]));
    if (n < 3) {  // a straight joint step: no curvature
      path.d2q_ds2[i] = Eigen::VectorXd::Zero(q[i].size());
      continue;
    }
    // The parabola through lo, lo + 1, hi.
    const double h1 = s[lo + 1] - s[lo];
    const double h2 = s[hi] - s[lo + 1];
    path.d2q_ds2[i] = Eigen::VectorXd(2.0 * ((q[hi] - q[lo + 1]) / h2 - (q[lo + 1] - q[lo]) / h1) / (h1 + h2));
  }
  return path;
}

}  // namespace

SeamMoveTiming timeSeamMoves(const kinematics::ArmModel& arm, const std::vector<SeamMove>& moves,
                             const std::vector<double>& speeds, const ProcessSpeed& speed) {
  if (speeds.size() != moves.size()) throw std::invalid_argument("seam move timing: one speed per move");
  const int joints = arm.jointCount();
  TimeOptimalLimits limits;
  limits.max_velocity = Eigen::VectorXd(joints);
  limits.max_acceleration = Eigen::VectorXd(joints);
  for (int j = 0; j < joints; ++j) {
    limits.max_velocity[j] = speed.joint_velocity_fraction * arm.joint(j).max_velocity;
    limits.max_acceleration[j] = arm.joint(j).max_acceleration;
  }
  SeamMoveTiming timing;
  timing.durations.assign(moves.size(), 0.0);
  for (const Run& run : runsOf(moves)) {
    std::vector<double> s;
    std::vector<kinematics::JointVector> q;
    std::vector<double> cap;
    std::vector<std::size_t> move_of;  ///< move index of each grid point (its end for shared points)
    std::vector<std::size_t> move_start(moves.size(), 0);
    for (std::size_t k = run.first; k <= run.last; ++k) {
      const SeamMove& move = moves[k];
      // Travel moves are parameterised by TCP path length [m], a turn on the
      // spot by its angle [rad].
      const double extent = move.length > 0.0 ? move.length : move.turn;
      double move_cap = move.length > 0.0 ? speeds[k] : speed.orientation_speed;
      if (move.length > 0.0 && move.turn > 0.0) {
        move_cap = std::min(move_cap, speed.orientation_speed * move.length / move.turn);
      }
      const double s0 = s.empty() ? 0.0 : s.back();
      const std::size_t begin = s.empty() ? 0 : 1;
      move_start[k] = s.empty() ? 0 : s.size() - 1;
      for (std::size_t i = begin; i < move.joints.fractions.size(); ++i) {
        s.push_back(s0 + move.joints.fractions[i] * extent);
        q.push_back(move.joints.q[i]);
        cap.push_back(move_cap);
        move_of.push_back(k);
      }
      if (begin == 1) cap[move_start[k]] = std::min(cap[move_start[k]], move_cap);
    }
    limits.max_path_speed = cap;
    const PathDerivatives path = derivatives(s, q);
    const TimedPath timed = parameterizeTimeOptimal(path, limits);
    if (!timed.feasible) {
      throw std::logic_error("seam move timing: a path from a stop to a stop has no timing (" +
                             timed.reason + ")");
    }
    for (std::size_t k = run.first; k <= run.last; ++k) {
      const std::size_t end = k == run.last ? s.size() - 1 : move_start[k + 1];
      timing.durations[k] = timed.time[end] - timed.time[move_start[k]];
      if (moves[k].length == 0.0) continue;
      // The speed the joint velocity limits allow, against the programmed one.
      double allowed = kInfinity;
      int limiting = -1;
      for (std::size_t i = move_start[k]; i <= end; ++i) {
        for (int j = 0; j < joints; ++j) {
          const double rate = std::abs(path.dq_ds[i][j]);
          if (rate > 0.0 && limits.max_velocity[j] / rate < allowed) {
            allowed = limits.max_velocity[j] / rate;
            limiting = j;
          }
        }
      }
      if (allowed < kLoweredRatio * cap[end] && limiting >= 0) {
        const bool revolute = arm.joint(limiting).type == kinematics::JointType::kRevolute;
        LoweredSpeed lowered;
        lowered.segment = static_cast<int>(k);
        lowered.programmed_speed = speeds[k];
        lowered.speed = allowed;
        lowered.cause = SpeedLimitCause::kJointVelocity;
        lowered.joint = limiting;
        lowered.reason = "TCP speed lowered from " + formatFixed(speeds[k] * 1000.0, 1) + " to " +
                         formatFixed(allowed * 1000.0, 1) + " mm/s; joint " + arm.joint(limiting).name +
                         " at most " +
                         formatFixed(limits.max_velocity[limiting] * (revolute ? kRadToDeg : 1000.0), 1) +
                         (revolute ? " deg/s" : " mm/s");
        timing.lowered.push_back(lowered);
      }
    }
  }
  return timing;
}

}  // namespace tw::planner
