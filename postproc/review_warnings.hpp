#pragma once

#include <optional>
#include <string>
#include <vector>

#include "planner/program/program.hpp"
#include "postproc/write_options.hpp"

namespace tw::postproc {

enum class WarningKind {
  kPlanner,       ///< passed on from Program::warnings, not tied to a record
  kReducedSpeed,  ///< TCP speed above the reduced-speed limit (ISO 10218-1)
  kClearance,     ///< clearance below WriteOptions::clearance_warning
  kSingularity,   ///< singularity margin below WriteOptions::singularity_warning
  kJointLimit,    ///< a joint nearer its limit than the WriteOptions margin
};

/// One warning for the reader of a program, with what it is about so that a
/// report can mark it where it belongs.
struct ReviewWarning {
  WarningKind kind = WarningKind::kPlanner;
  /// Index into Program::records of the motion concerned; empty for kPlanner.
  std::optional<std::size_t> record;
  int joint = -1;    ///< metadata joint index for kJointLimit, else -1
  std::string text;  ///< the sentence the summary writes, in the file units
};

/// The joint-limit warning margin of `options` for a joint of `type`:
/// [rad] for a revolute joint, [m] for a prismatic one.
double jointLimitWarning(const WriteOptions& options, kinematics::JointType type);

/// The planner's warnings, then per motion in record order: above the
/// reduced speed, clearance, singularity margin and joint-limit margins
/// below the thresholds of `options`. Precondition: checkProgram() passed.
std::vector<ReviewWarning> reviewWarnings(const planner::Program& program,
                                          const WriteOptions& options);

}  // namespace tw::postproc
