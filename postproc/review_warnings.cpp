#include "postproc/review_warnings.hpp"

#include <variant>

#include "postproc/file_quantities.hpp"
#include "postproc/safety_caution.hpp"

namespace tw::postproc {
namespace {

std::string withUnit(const QuantityFormat& format, double si_value) {
  return format.format(si_value) + ' ' + format.unit;
}

}  // namespace

double jointLimitWarning(const WriteOptions& options, kinematics::JointType type) {
  return type == kinematics::JointType::kRevolute ? options.revolute_limit_warning
                                                  : options.prismatic_limit_warning;
}

std::vector<ReviewWarning> reviewWarnings(const planner::Program& program,
                                          const WriteOptions& options) {
  const FileQuantities quantities = fileQuantities(program.metadata.units);
  std::vector<ReviewWarning> result;
  for (const std::string& text : program.warnings) {
    result.push_back({WarningKind::kPlanner, std::nullopt, -1, text});
  }
  for (std::size_t i = 0; i < program.records.size(); ++i) {
    const auto* motion = std::get_if<planner::MotionRecord>(&program.records[i]);
    if (!motion) continue;
    const std::string where = "record " + std::to_string(i + 1) +
                              (motion->seam.empty() ? "" : " (" + motion->seam + ")") + ": ";
    if (motion->speed.kind == planner::SpeedKind::kTcpSpeed &&
        motion->speed.value > kReducedSpeedLimit) {
      result.push_back({WarningKind::kReducedSpeed, i, -1,
                        where + "TCP speed " + withUnit(quantities.speed, motion->speed.value) +
                            " is above the reduced-speed limit of " +
                            withUnit(quantities.speed, kReducedSpeedLimit) +
                            "; it cannot be verified at reduced speed without scaling"});
    }
    if (motion->clearance && *motion->clearance < options.clearance_warning) {
      result.push_back({WarningKind::kClearance, i, -1,
                        where + "clearance " + withUnit(quantities.length, *motion->clearance) +
                            " is below " + withUnit(quantities.length, options.clearance_warning)});
    }
    if (motion->singularity_margin && *motion->singularity_margin < options.singularity_warning) {
      result.push_back({WarningKind::kSingularity, i, -1,
                        where + "singularity margin " +
                            withUnit(quantities.angle, *motion->singularity_margin) + " is below " +
                            withUnit(quantities.angle, options.singularity_warning)});
    }
    const kinematics::JointVector margins = planner::jointLimitMargins(program.metadata, motion->q);
    for (int j = 0; j < margins.size(); ++j) {
      const planner::ProgramJoint& joint = program.metadata.joints[j];
      const double limit = jointLimitWarning(options, joint.type);
      if (margins[j] < limit) {
        const QuantityFormat& format = quantities.joint(joint.type);
        result.push_back({WarningKind::kJointLimit, i, j,
                          where + "joint " + joint.name + " is " + withUnit(format, margins[j]) +
                              " from its limit, less than " + withUnit(format, limit)});
      }
    }
  }
  return result;
}

}  // namespace tw::postproc
