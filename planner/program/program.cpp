#include "planner/program/program.hpp"

#include <algorithm>
#include <cmath>
#include <set>
#include <stdexcept>
#include <utility>

#include "kinematics/arm_model.hpp"
#include "kinematics/common/input_error.hpp"
#include "planner/program/motion_path.hpp"

namespace tw::planner {
namespace {

// A rotation read back from 9-decimal quaternions is orthonormal to about
// 1e-8; anything beyond 1e-6 is a wrong matrix, not rounding.
constexpr double kRotationTolerance = 1e-6;

bool hasControlCharacter(const std::string& text) {
  return std::any_of(text.begin(), text.end(),
                     [](char c) { return static_cast<unsigned char>(c) < 0x20 || c == 0x7f; });
}

bool isSha256Hex(const std::string& text) {
  return text.size() == 64 && std::all_of(text.begin(), text.end(), [](char c) {
           return (c >= '0' && c <= '9') || (c >= 'a' && c <= 'f');
         });
}

std::optional<std::string> textProblem(const std::string& what, const std::string& text,
                                       bool may_be_empty) {
  if (!may_be_empty && text.empty()) return what + " is empty";
  if (hasControlCharacter(text)) return what + " contains a control character (line break, tab)";
  return std::nullopt;
}

std::optional<std::string> metadataProblem(const Program& program) {
  const ProgramMetadata& meta = program.metadata;
  if (auto problem = textProblem("job name", meta.job, false)) return problem;
  if (auto problem = textProblem("arm id", meta.arm, false)) return problem;
  if (auto problem = textProblem("generator", meta.generator, false)) return problem;
  for (const InputFileHash& input : meta.inputs) {
    if (auto problem = textProblem("input file path", input.path, false)) return problem;
    if (!isSha256Hex(input.sha256)) {
      return "input file '" + input.path + "' has hash '" + input.sha256 +
             "'; expected 64 lower-case hex digits (SHA-256)";
    }
  }
  if (meta.joints.empty()) return std::string("the program names no joints");
  if (static_cast<int>(meta.joints.size()) > kinematics::kMaxJoints) {
    return "the program names " + std::to_string(meta.joints.size()) + " joints; at most " +
           std::to_string(kinematics::kMaxJoints) + " are supported";
  }
  std::set<std::string> names;
  for (const ProgramJoint& joint : meta.joints) {
    if (auto problem = textProblem("joint name", joint.name, false)) return problem;
    if (!names.insert(joint.name).second) return "joint name '" + joint.name + "' is used twice";
    if (!std::isfinite(joint.lower) || !std::isfinite(joint.upper) || !(joint.lower < joint.upper)) {
      return "joint '" + joint.name + "' needs finite limits with lower < upper";
    }
  }
  for (const std::string& warning : program.warnings) {
    if (auto problem = textProblem("warning", warning, false)) return problem;
  }
  return std::nullopt;
}

/// `what` is "" for the target, "via " for a via point.
std::optional<std::string> jointsProblem(const ProgramMetadata& meta,
                                         const kinematics::JointVector& q,
                                         const std::string& what) {
  const int joint_count = static_cast<int>(meta.joints.size());
  if (q.size() != joint_count) {
    return "has " + std::to_string(q.size()) + " " + what + "joint values; the arm has " +
           std::to_string(joint_count) + " joints";
  }
  for (int i = 0; i < joint_count; ++i) {
    const ProgramJoint& joint = meta.joints[i];
    if (!std::isfinite(q[i]) || q[i] < joint.lower || q[i] > joint.upper) {
      return what + "joint '" + joint.name + "' value is not finite or outside its limits";
    }
  }
  return std::nullopt;
}

bool isProperPose(const Eigen::Isometry3d& X) {
  const Eigen::Matrix3d rotation = X.linear();
  return X.translation().allFinite() && rotation.allFinite() &&
         (rotation.transpose() * rotation).isIdentity(kRotationTolerance) &&
         std::abs(rotation.determinant() - 1.0) <= kRotationTolerance;
}

std::optional<std::string> motionProblem(const ProgramMetadata& meta, const MotionRecord& motion) {
  if (auto problem = jointsProblem(meta, motion.q, "")) return problem;
  if (!isProperPose(motion.X_RT)) {
    return std::string("TCP pose is not finite or its rotation is not a proper rotation");
  }
  const bool circular = motion.kind == MotionKind::kCircularMove;
  if (circular != motion.via.has_value()) {
    return std::string(circular ? "needs a via point" : "has a via point; only a circular move has one");
  }
  if (motion.via) {
    if (auto problem = jointsProblem(meta, motion.via->q_via, "via ")) return problem;
    if (!isProperPose(motion.via->X_RV)) {
      return std::string("via TCP pose is not finite or its rotation is not a proper rotation");
    }
  }
  if (auto problem = textProblem("tool id", motion.tool, false)) return problem;
  if (auto problem = textProblem("frame id", motion.frame, false)) return problem;
  if (auto problem = textProblem("seam name", motion.seam, true)) return problem;
  if (auto problem = textProblem("branch", motion.branch, true)) return problem;
  if (!std::isfinite(motion.speed.value) || motion.speed.value <= 0.0) {
    return std::string("speed must be positive");
  }
  if (motion.speed.kind == SpeedKind::kJointSpeedFraction && motion.speed.value > 1.0) {
    return std::string("joint speed fraction must be at most 1");
  }
  if (!std::isfinite(motion.blend_radius) || motion.blend_radius < 0.0) {
    return std::string("blend radius must be zero or positive");
  }
  if (!std::isfinite(motion.duration) || motion.duration < 0.0) {
    return std::string("duration must be zero or positive");
  }
  if (motion.clearance && !std::isfinite(*motion.clearance)) {
    return std::string("clearance is not finite");
  }
  if (motion.singularity_margin &&
      (!std::isfinite(*motion.singularity_margin) || *motion.singularity_margin < 0.0)) {
    return std::string("singularity margin must be zero or positive");
  }
  return std::nullopt;
}

/// A problem between two consecutive motions (`previous` may be null): the
/// message and whether it belongs to the previous record (true) or to
/// `motion` (false).
std::optional<std::pair<bool, std::string>> sequenceProblem(const MotionRecord* previous,
                                                            const MotionRecord& motion) {
  const bool blended = previous && previous->blend_radius > 0.0;
  if (blended && previous->tool != motion.tool) {
    return std::make_pair(true, std::string("has a blend radius but the next motion uses another "
                                            "tool; the radius is measured at the TCP (use 0)"));
  }
  if (motion.kind == MotionKind::kCircularMove) {
    if (!previous) {
      return std::make_pair(false, std::string("is the first motion; a circular move starts at "
                                               "the target of the motion before it"));
    }
    if (previous->tool != motion.tool || previous->frame != motion.frame) {
      return std::make_pair(false, std::string("follows a motion with another tool or frame; a "
                                               "circular move starts at the previous target, "
                                               "which must be in its tool and frame"));
    }
    if (auto problem = arcPointProblem(previous->X_RT.translation(),
                                       motion.via->X_RV.translation(),
                                       motion.X_RT.translation())) {
      return std::make_pair(false, *problem);
    }
  }
  if (previous && previous->frame == motion.frame) {
    const double distance = (motion.X_RT.translation() - previous->X_RT.translation()).norm();
    if (previous->blend_radius + motion.blend_radius > distance + kBlendOverlapSlack) {
      return std::make_pair(false, std::string("and the motion before it have blend radii whose "
                                               "sum exceeds the distance between their targets; "
                                               "their blend zones would overlap"));
    }
  }
  return std::nullopt;
}

double startTime(const ProgramRecord& record) {
  if (const auto* motion = std::get_if<MotionRecord>(&record)) return motion->start_time;
  return std::get<ProcessEvent>(record).time;
}

double endTime(const ProgramRecord& record) {
  if (const auto* motion = std::get_if<MotionRecord>(&record)) {
    return motion->start_time + motion->duration;
  }
  return std::get<ProcessEvent>(record).time;
}

}  // namespace

const char* toString(MotionKind kind) {
  switch (kind) {
    case MotionKind::kJointMove: return "joint-move";
    case MotionKind::kLinearMove: return "linear-move";
    case MotionKind::kCircularMove: return "circular-move";
  }
  throw std::invalid_argument("unknown motion kind");
}

const char* toString(ProcessEventKind kind) {
  return kind == ProcessEventKind::kStart ? "process-on" : "process-off";
}

const char* toString(LengthUnit unit) { return unit == LengthUnit::kMillimetre ? "mm" : "m"; }

const char* toString(AngleUnit unit) { return unit == AngleUnit::kDegree ? "deg" : "rad"; }

std::optional<ProgramProblem> findProgramProblem(const Program& program) {
  if (auto problem = metadataProblem(program)) return ProgramProblem{-1, *problem};
  std::optional<std::string> open_set;  // parameter set of the process that is on
  double previous_start = 0.0;
  int previous_motion = -1;  // index of the last motion record seen
  const auto blendLabel = [](int index, const MotionRecord& motion) {
    return "record " + std::to_string(index + 1) + " (" + toString(motion.kind) + ") ";
  };
  for (std::size_t i = 0; i < program.records.size(); ++i) {
    const ProgramRecord& record = program.records[i];
    const int index = static_cast<int>(i);
    const std::string label = "record " + std::to_string(i + 1) + " ";
    const double start = startTime(record);
    if (!std::isfinite(start) || start < previous_start) {
      return ProgramProblem{index, label + "starts before the record ahead of it (or at a "
                                           "negative or non-finite time)"};
    }
    previous_start = start;
    if (const auto* motion = std::get_if<MotionRecord>(&record)) {
      if (auto problem = motionProblem(program.metadata, *motion)) {
        return ProgramProblem{index, label + "(" + toString(motion->kind) + ") " + *problem};
      }
      const MotionRecord* previous =
          previous_motion >= 0 ? &std::get<MotionRecord>(program.records[previous_motion]) : nullptr;
      if (auto problem = sequenceProblem(previous, *motion)) {
        const bool at_previous = problem->first;
        return ProgramProblem{at_previous ? previous_motion : index,
                              blendLabel(at_previous ? previous_motion : index,
                                         at_previous ? *previous : *motion) +
                                  problem->second};
      }
      previous_motion = index;
      continue;
    }
    if (previous_motion >= 0) {
      const auto& previous = std::get<MotionRecord>(program.records[previous_motion]);
      if (previous.blend_radius > 0.0) {
        return ProgramProblem{previous_motion,
                              blendLabel(previous_motion, previous) +
                                  "has a blend radius but a process event follows it; a blend "
                                  "may not round a corner where the process switches (use 0)"};
      }
    }
    const auto& event = std::get<ProcessEvent>(record);
    if (auto problem = textProblem("parameter set", event.parameter_set, false)) {
      return ProgramProblem{index, label + *problem};
    }
    if (auto problem = textProblem("seam name", event.seam, true)) {
      return ProgramProblem{index, label + *problem};
    }
    if (event.kind == ProcessEventKind::kStart) {
      if (open_set) {
        return ProgramProblem{index, label + "switches the process on while '" + *open_set +
                                         "' is still on"};
      }
      open_set = event.parameter_set;
    } else {
      if (!open_set) {
        return ProgramProblem{index, label + "switches the process off while it is off"};
      }
      if (*open_set != event.parameter_set) {
        return ProgramProblem{index, label + "switches off parameter set '" + event.parameter_set +
                                         "' but '" + *open_set + "' is on"};
      }
      open_set.reset();
    }
  }
  if (open_set) {
    return ProgramProblem{static_cast<int>(program.records.size()) - 1,
                          "the program ends with the process '" + *open_set + "' still on"};
  }
  if (previous_motion >= 0) {
    const auto& last = std::get<MotionRecord>(program.records[previous_motion]);
    if (last.blend_radius > 0.0) {
      return ProgramProblem{previous_motion, blendLabel(previous_motion, last) +
                                                 "is the last motion and has a blend radius; the "
                                                 "program must end with an exact stop (use 0)"};
    }
  }
  return std::nullopt;
}

void checkProgram(const Program& program, const std::string& source) {
  if (auto problem = findProgramProblem(program)) {
    throw InputError(source, 0, "inconsistent program: " + problem->message);
  }
}

double cycleTime(const Program& program) {
  double end = 0.0;
  for (const ProgramRecord& record : program.records) end = std::max(end, endTime(record));
  return end;
}

std::vector<ProgramJoint> programJoints(const kinematics::ArmModel& arm) {
  std::vector<ProgramJoint> joints;
  for (const kinematics::JointSpec& joint : arm.joints()) {
    joints.push_back({joint.name, joint.type, joint.lower, joint.upper});
  }
  return joints;
}

kinematics::JointVector jointLimitMargins(const ProgramMetadata& metadata,
                                          const kinematics::JointVector& q) {
  kinematics::JointVector margins(q.size());
  for (int i = 0; i < q.size(); ++i) {
    const ProgramJoint& joint = metadata.joints[i];
    margins[i] = std::min(q[i] - joint.lower, joint.upper - q[i]);
  }
  return margins;
}

}  // namespace tw::planner
