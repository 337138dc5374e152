#include "postproc/motion_text/motion_text_post_processor.hpp"

#include <Eigen/Geometry>
#include <variant>

#include "planner/program/sha256.hpp"
#include "postproc/file_quantities.hpp"
#include "postproc/motion_text/key_value_line.hpp"
#include "postproc/motion_text/motion_text_format.hpp"
#include "postproc/pose_text.hpp"
#include "postproc/safety_caution.hpp"

namespace tw::postproc {
namespace {

using planner::MotionRecord;
using planner::ProcessEvent;
using planner::Program;

std::string jointList(const Program& program, const FileQuantities& quantities,
                      const kinematics::JointVector& q) {
  std::string joints;
  for (int i = 0; i < q.size(); ++i) {
    if (i > 0) joints += ',';
    joints += quantities.joint(program.metadata.joints[i].type).format(q[i]);
  }
  return joints;
}

std::string motionLine(const Program& program, const FileQuantities& quantities,
                       const MotionRecord& motion, std::size_t number) {
  const PoseText pose = poseText(motion.X_RT, quantities);
  const std::string joints = jointList(program, quantities, motion.q);
  std::string line = std::string(toString(motion.kind)) + " n=" + std::to_string(number) +
                     " start=" + quantities.time.format(motion.start_time) +
                     " duration=" + quantities.time.format(motion.duration) +
                     " tool=" + quoteText(motion.tool) + " frame=" + quoteText(motion.frame) +
                     " joints=" + joints + " position=" + pose.position +
                     " orientation=" + pose.orientation;
  if (motion.via) {
    const PoseText via = poseText(motion.via->X_RV, quantities);
    line += " via_joints=" + jointList(program, quantities, motion.via->q_via) +
            " via_position=" + via.position + " via_orientation=" + via.orientation;
  }
  if (motion.speed.kind == planner::SpeedKind::kTcpSpeed) {
    line += " tcp_speed=" + quantities.speed.format(motion.speed.value);
  } else {
    line += " joint_speed=" + quantities.fraction.format(motion.speed.value);
  }
  line += " blend=" + quantities.length.format(motion.blend_radius);
  if (!motion.seam.empty()) line += " seam=" + quoteText(motion.seam);
  if (!motion.branch.empty()) line += " branch=" + quoteText(motion.branch);
  if (motion.clearance) line += " clearance=" + quantities.length.format(*motion.clearance);
  if (motion.singularity_margin) {
    line += " singularity_margin=" + quantities.angle.format(*motion.singularity_margin);
  }
  return line + '\n';
}

std::string eventLine(const FileQuantities& quantities, const ProcessEvent& event,
                      std::size_t number) {
  std::string line = std::string(toString(event.kind)) + " n=" + std::to_string(number) +
                     " time=" + quantities.time.format(event.time) +
                     " set=" + quoteText(event.parameter_set);
  if (!event.seam.empty()) line += " seam=" + quoteText(event.seam);
  return line + '\n';
}

std::string headerText(const Program& program, const FileQuantities& quantities) {
  const planner::ProgramMetadata& meta = program.metadata;
  std::string text = std::string(kMotionTextKeyword) +
                     " version=" + std::to_string(kMotionTextVersion) + '\n';
  text += "# Motion text of the tracewright project; the format is specified in postproc/FORMAT.md.\n";
  for (const std::string& line : safetyCaution(program)) text += "# " + line + '\n';
  text += "units length=" + quantities.length.unit + " angle=" + quantities.angle.unit +
          " time=s\n";
  text += "program job=" + quoteText(meta.job) + " arm=" + quoteText(meta.arm) +
          " generator=" + quoteText(meta.generator) + " seed=" + std::to_string(meta.seed) + '\n';
  for (const planner::InputFileHash& input : meta.inputs) {
    text += "input path=" + quoteText(input.path) + " sha256=" + input.sha256 + '\n';
  }
  for (const planner::ProgramJoint& joint : meta.joints) {
    const QuantityFormat& format = quantities.joint(joint.type);
    text += "joint name=" + quoteText(joint.name) + " type=" + kinematics::toString(joint.type) +
            " lower=" + format.format(joint.lower) + " upper=" + format.format(joint.upper) + '\n';
  }
  for (const std::string& warning : program.warnings) {
    text += "warning text=" + quoteText(warning) + '\n';
  }
  return text;
}

}  // namespace

void MotionTextPostProcessor::write(const Program& program, const WriteOptions& options,
                                    std::ostream& out) const {
  planner::checkProgram(program, options.output_name);
  const FileQuantities quantities = fileQuantities(program.metadata.units);
  std::string text = headerText(program, quantities);
  for (std::size_t i = 0; i < program.records.size(); ++i) {
    const planner::ProgramRecord& record = program.records[i];
    if (const auto* motion = std::get_if<MotionRecord>(&record)) {
      text += motionLine(program, quantities, *motion, i + 1);
    } else {
      text += eventLine(quantities, std::get<ProcessEvent>(record), i + 1);
    }
  }
  text += "end records=" + std::to_string(program.records.size()) + '\n';
  text += "integrity sha256=" + planner::sha256Hex(text) + '\n';
  out << text;
}

}  // namespace tw::postproc
