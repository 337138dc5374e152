#pragma once

#include <vector>

#include "kinematics/arm_model.hpp"
#include "planner/motion/seam_moves.hpp"
#include "planner/timing/process_move_timing.hpp"

namespace tw::planner {

/// The timing of the moves of one seam as the controller runs them.
struct SeamMoveTiming {
  std::vector<double> durations;  ///< per move [s]
  /// Moves whose TCP speed the limits hold below the programmed one
  /// (LoweredSpeed::segment is the move index), with the reason.
  std::vector<LoweredSpeed> lowered;
};

/// Times `moves` (consecutive moves of one seam) time-optimally under the
/// arm's joint velocity and acceleration limits (TOPP-RA,
/// parameterizeTimeOptimal) along the joint paths the arm takes
/// (SeamMove::joints): the TCP holds speeds[k] on move k where the limits
/// allow, the tool turns at most `speed.orientation_speed`, and the arm
/// runs through blended points (blend > 0) and stops at the others, with
/// acceleration ramps. A turn on the spot (length 0) is timed by its turn.
/// Blended corners are timed along the unblended path: a rounding of at
/// most a few millimetres changes the time by far less than the ramps.
/// A move is reported as lowered where the joint velocity limits alone
/// (not the ramps into a stop) hold the TCP below its programmed speed.
/// Precondition: speeds.size() == moves.size(), each > 0.
SeamMoveTiming timeSeamMoves(const kinematics::ArmModel& arm, const std::vector<SeamMove>& moves,
                             const std::vector<double>& speeds, const ProcessSpeed& speed);

}  // namespace tw::planner
