#pragma once

#include <optional>
#include <string>
#include <vector>

#include "kinematics/common/angles.hpp"
#include "planner/program/program.hpp"

namespace tw::postproc {

/// How far apart one matched pair of records is.
struct RecordChange {
  int record_a = 0;  ///< record number in program A (1-based, as in the file)
  int record_b = 0;  ///< record number in program B
  /// q_B − q_A per joint [rad] or [m]; empty for process events.
  std::vector<double> joint_deltas;
  double position_deviation = 0.0;  ///< |p_B − p_A| of the TCP [m]
  double angle_deviation = 0.0;     ///< rotation angle between the TCP orientations [rad]
  /// For a matched pair of circular moves, the same three at the via point
  /// (q_via and X_RV); empty and 0 for other records.
  std::vector<double> via_joint_deltas;
  double via_position_deviation = 0.0;  ///< [m]
  double via_angle_deviation = 0.0;     ///< [rad]
  bool branch_changed = false;
  std::string branch_a, branch_b;
  /// The tool, the reference frame, or (for a process event) the parameter set differs.
  bool tool_frame_or_set_changed = false;
};

/// The largest absolute value of one quantity over all matched records,
/// and where it occurs (record numbers 0 when nothing was matched).
struct LargestChange {
  double value = 0.0;
  int record_a = 0;
  int record_b = 0;
};

/// Limits below which a difference counts as no change.
struct ComparisonTolerances {
  // Defaults: ten times the printed precision of the motion text (0.0001°,
  // 0.001 mm, 0.0001 s), far below what a robot can show.
  double revolute = 0.001 * kPi / 180.0;  ///< [rad]
  double prismatic = 0.00001;                                ///< [m]
  double position = 0.00001;                                 ///< [m]
  double angle = 0.001 * kPi / 180.0;     ///< [rad]
  double time = 0.001;                                       ///< [s]
};

/// What changed from program A to program B.
///
/// Records are matched by their kind, their seam and their ordinal among
/// the records of that kind and seam (transits count as the seam ""), so a
/// seam that gained a waypoint shows one record added at its end and no
/// shift of every later seam. Records of A without a match are `removed`,
/// those of B `added`. A matched pair of circular moves also compares its
/// via points, with the same tolerances.
struct MotionComparison {
  std::vector<int> removed;  ///< record numbers in A
  std::vector<int> added;    ///< record numbers in B
  /// Every matched pair that differs beyond the tolerances, in A's order.
  std::vector<RecordChange> changes;
  int matched = 0;  ///< matched pairs, changed or not
  /// Largest changes over targets and via points alike; the record pair
  /// says where, the pair's RecordChange whether at a via.
  std::vector<LargestChange> largest_joint_delta;  ///< per joint, |q_B − q_A|
  LargestChange largest_position_deviation;        ///< [m]
  LargestChange largest_angle_deviation;           ///< [rad]
  int branch_changes = 0;
  double cycle_time_a = 0.0;  ///< [s]
  double cycle_time_b = 0.0;  ///< [s]
  bool equal = false;         ///< nothing added, removed or changed; cycle time within tolerance
};

/// Compares two programs read from motion text. Throws tw::InputError naming
/// `source_b` when B is for other joints than A (count, names or types), as
/// joint deltas would then mean nothing.
MotionComparison compareMotionPrograms(const planner::Program& a, const planner::Program& b,
                                       const std::string& source_b,
                                       const ComparisonTolerances& tolerances);

}  // namespace tw::postproc
