#include "planner/program/program.hpp"

#include <algorithm>
#include <cmath>
#include <set>

#include "kinematics/arm_model.hpp"
#include "kinematics/common/input_error.hpp"

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

std::optional<std::string> motionProblem(const ProgramMetadata& meta, const MotionRecord& motion) {
  const int joint_count = static_cast<int>(meta.joints.size());
  if (motion.q.size() != joint_count) {
    return "has " + std::to_string(motion.q.size()) + " joint values; the arm has " +
           std::to_string(joint_count) + " joints";
  }
  for (int i = 0; i < joint_count; ++i) {
    const ProgramJoint& joint = meta.joints[i];
    if (!std::isfinite(motion.q[i]) || motion.q[i] < joint.lower || motion.q[i] > joint.upper) {
      return "joint '" + joint.name + "' value is not finite or outside its limits";
    }
  }
  const Eigen::Matrix3d rotation = motion.X_RT.linear();
  if (!motion.X_RT.translation().allFinite() || !rotation.allFinite() ||
      !(rotation.transpose() * rotation).isIdentity(kRotationTolerance) ||
      std::abs(rotation.determinant() - 1.0) > kRotationTolerance) {
    return std::string("TCP pose is not finite or its rotation is not a proper rotation");
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
  return kind == MotionKind::kJointMove ? "joint-move" : "linear-move";
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
      continue;
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
