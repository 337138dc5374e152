#include "postproc/tables/joint_table_post_processor.hpp"

#include <algorithm>
#include <cmath>
#include <optional>
#include <variant>
#include <vector>

#include "kinematics/common/input_error.hpp"
#include "planner/program/motion_path.hpp"
#include "postproc/file_quantities.hpp"
#include "postproc/pose_text.hpp"

namespace tw::postproc {
namespace {

using planner::MotionRecord;
using planner::ProcessEvent;
using planner::Program;

// Controllers interpolate at a few milliseconds; a finer review grid only
// makes the table huge.
constexpr double kShortestSamplePeriod = 0.001;

std::string csvField(const std::string& text) {
  if (text.find_first_of(",\"") == std::string::npos) return text;
  std::string quoted = "\"";
  for (const char c : text) {
    if (c == '"') quoted += '"';
    quoted += c;
  }
  return quoted + '"';
}

/// One table row: the arm at `time` with joints `q` and TCP pose `X_RT`.
struct MotionRow {
  std::size_t record = 0;
  std::string kind;
  double time = 0.0;
  std::optional<double> duration;
  kinematics::JointVector q;
  Eigen::Isometry3d X_RT = Eigen::Isometry3d::Identity();
  const MotionRecord* motion = nullptr;  ///< the record itself, or the one a sample belongs to
  bool is_sample = false;  ///< an interpolated row or a via point: no blend or planner figures
};

class TableWriter {
 public:
  TableWriter(const Program& program, std::ostream& out)
      : program_(program), quantities_(fileQuantities(program.metadata.units)), out_(out) {}

  void header() {
    const std::string& time = quantities_.time.unit;
    const std::string& length = quantities_.length.unit;
    std::string line = "record,kind,time_" + time + ",duration_" + time + ",seam,process_set,branch";
    for (const planner::ProgramJoint& joint : program_.metadata.joints) {
      line += ',' + csvField(joint.name + '_' + quantities_.joint(joint.type).unit);
    }
    line += ",x_" + length + ",y_" + length + ",z_" + length + ",qw,qx,qy,qz";
    line += ",tcp_speed_" + length + "_s,joint_speed_fraction,blend_" + length;
    for (const planner::ProgramJoint& joint : program_.metadata.joints) {
      line += ',' + csvField(joint.name + "_margin_" + quantities_.joint(joint.type).unit);
    }
    line += ",singularity_margin_" + quantities_.angle.unit + ",clearance_" + length;
    out_ << line << '\n';
  }

  void event(std::size_t number, const ProcessEvent& event) {
    std::string line = std::to_string(number) + ',' + toString(event.kind) + ',' +
                       quantities_.time.format(event.time) + ",," + csvField(event.seam) + ',' +
                       csvField(event.parameter_set) + ',';
    // Joints, pose (7), speeds and blend (3), margins, singularity, clearance.
    const std::size_t empty = 2 * program_.metadata.joints.size() + 7 + 3 + 2;
    out_ << line << std::string(empty, ',') << '\n';
  }

  void motion(const MotionRow& row) {
    const MotionRecord& motion = *row.motion;
    std::string line = std::to_string(row.record) + ',' + row.kind + ',' +
                       quantities_.time.format(row.time) + ',' +
                       (row.duration ? quantities_.time.format(*row.duration) : "") + ',' +
                       csvField(motion.seam) + ",," + csvField(motion.branch);
    for (int i = 0; i < row.q.size(); ++i) line += ',' + jointValue(i, row.q[i]);
    const Eigen::Vector3d p_RT = row.X_RT.translation();
    const Eigen::Quaterniond orientation = canonicalQuaternion(row.X_RT);
    for (int i = 0; i < 3; ++i) line += ',' + quantities_.length.format(p_RT[i]);
    for (const double component : {orientation.w(), orientation.x(), orientation.y(), orientation.z()}) {
      line += ',' + quantities_.quaternion.format(component);
    }
    const bool tcp = motion.speed.kind == planner::SpeedKind::kTcpSpeed;
    line += ',' + (tcp ? quantities_.speed.format(motion.speed.value) : "");
    line += ',' + (tcp ? "" : quantities_.fraction.format(motion.speed.value));
    line += ',' + (row.is_sample ? "" : quantities_.length.format(motion.blend_radius));
    const kinematics::JointVector margins = planner::jointLimitMargins(program_.metadata, row.q);
    for (int i = 0; i < margins.size(); ++i) line += ',' + jointValue(i, margins[i]);
    line += ',' + optional(row.is_sample ? std::nullopt : motion.singularity_margin, quantities_.angle);
    line += ',' + optional(row.is_sample ? std::nullopt : motion.clearance, quantities_.length);
    out_ << line << '\n';
  }

 private:
  std::string jointValue(int index, double value) const {
    return quantities_.joint(program_.metadata.joints[index].type).format(value);
  }

  static std::string optional(const std::optional<double>& value, const QuantityFormat& format) {
    return value ? format.format(*value) : std::string();
  }

  const Program& program_;
  FileQuantities quantities_;
  std::ostream& out_;
};

/// Where a circular move passes its via point: the fraction of its arc
/// length, for the via row's time and the joints of the sample rows.
double viaFraction(const MotionRecord& from, const MotionRecord& to) {
  const std::optional<planner::CircularArc> arc = planner::CircularArc::through(
      from.X_RT.translation(), to.via->X_RV.translation(), to.X_RT.translation());
  return arc->viaSweep() / arc->sweep();  // checkProgram() made sure the arc exists
}

/// The via row of circular move `to` (record `number`) that starts at `from`:
/// the via's joints and pose, at the time the move passes it at a uniform
/// speed along its arc.
MotionRow viaRow(const MotionRecord& from, const MotionRecord& to, std::size_t number) {
  MotionRow row;
  row.record = number;
  row.kind = "via";
  row.time = planner::viaPassingTime(from.X_RT.translation(), to);
  row.q = to.via->q_via;
  row.X_RT = to.via->X_RV;
  row.motion = &to;
  row.is_sample = true;
  return row;
}

/// Rows on the global grid k·period strictly inside the motion, at a
/// uniform path speed: the TCP pose as the controller interpolates a linear
/// or circular move (planner::interpolatedPose), linear / slerp for a joint
/// move, whose real TCP path depends on the arm; joints linear in time (on a
/// circular move through the via joints). An approximation for plots.
std::vector<MotionRow> sampleRows(const MotionRecord& from, const MotionRecord& to,
                                  std::size_t number, double period) {
  std::vector<MotionRow> rows;
  if (to.duration <= 0.0) return rows;
  const double end = to.start_time + to.duration;
  const Eigen::Quaterniond q_from(from.X_RT.linear());
  const Eigen::Quaterniond q_to(to.X_RT.linear());
  const bool circular = to.kind == planner::MotionKind::kCircularMove;
  const double via_fraction = circular ? viaFraction(from, to) : 0.0;
  for (auto k = static_cast<long long>(std::floor(to.start_time / period)) + 1;
       static_cast<double>(k) * period < end; ++k) {
    const double time = static_cast<double>(k) * period;
    if (time <= to.start_time) continue;
    const double s = (time - to.start_time) / to.duration;
    MotionRow row;
    row.record = number;
    row.kind = "sample";
    row.time = time;
    if (!circular) {
      row.q = from.q + s * (to.q - from.q);
    } else if (s <= via_fraction) {
      row.q = from.q + (s / via_fraction) * (to.via->q_via - from.q);
    } else {
      row.q = to.via->q_via + ((s - via_fraction) / (1.0 - via_fraction)) * (to.q - to.via->q_via);
    }
    if (to.kind == planner::MotionKind::kJointMove) {
      row.X_RT = Eigen::Isometry3d::Identity();
      row.X_RT.linear() = q_from.slerp(s, q_to).toRotationMatrix();
      row.X_RT.translation() =
          from.X_RT.translation() + s * (to.X_RT.translation() - from.X_RT.translation());
    } else {
      row.X_RT = planner::interpolatedPose(from.X_RT, to, s);
    }
    row.motion = &to;
    row.is_sample = true;
    rows.push_back(std::move(row));
  }
  return rows;
}

}  // namespace

void JointTablePostProcessor::write(const Program& program, const WriteOptions& options,
                                    std::ostream& out) const {
  planner::checkProgram(program, options.output_name);
  if (!std::isfinite(options.sample_period) ||
      (options.sample_period != 0.0 && options.sample_period < kShortestSamplePeriod)) {
    throw InputError(options.output_name, 0,
                     "joint table sample period must be 0 (records only) or at least 1 ms");
  }
  TableWriter table(program, out);
  table.header();
  const MotionRecord* previous = nullptr;
  for (std::size_t i = 0; i < program.records.size(); ++i) {
    const planner::ProgramRecord& record = program.records[i];
    const auto* motion = std::get_if<MotionRecord>(&record);
    if (!motion) {
      table.event(i + 1, std::get<ProcessEvent>(record));
      continue;
    }
    std::vector<MotionRow> inside;
    if (previous && options.sample_period > 0.0) {
      inside = sampleRows(*previous, *motion, i + 1, options.sample_period);
    }
    if (motion->via) {
      // checkProgram() made sure a circular move follows a motion.
      MotionRow via = viaRow(*previous, *motion, i + 1);
      const auto later = std::find_if(inside.begin(), inside.end(),
                                      [&](const MotionRow& row) { return row.time > via.time; });
      inside.insert(later, std::move(via));
    }
    for (const MotionRow& row : inside) table.motion(row);
    MotionRow row;
    row.record = i + 1;
    row.kind = toString(motion->kind);
    row.time = motion->start_time + motion->duration;
    row.duration = motion->duration;
    row.q = motion->q;
    row.X_RT = motion->X_RT;
    row.motion = motion;
    table.motion(row);
    previous = motion;
  }
}

}  // namespace tw::postproc
