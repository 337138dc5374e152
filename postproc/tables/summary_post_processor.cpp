#include "postproc/tables/summary_post_processor.hpp"

#include <algorithm>
#include <cmath>
#include <nlohmann/json.hpp>
#include <optional>
#include <variant>

#include "kinematics/common/input_error.hpp"
#include "postproc/file_quantities.hpp"
#include "postproc/review_warnings.hpp"
#include "postproc/safety_caution.hpp"

namespace tw::postproc {
namespace {

using nlohmann::ordered_json;
using planner::MotionRecord;
using planner::ProcessEvent;
using planner::Program;

/// The SI value converted and rounded to the printed decimals, so that the
/// JSON shows the same digits as the other files.
double rounded(const QuantityFormat& format, double si_value) {
  const double factor = std::pow(10.0, format.decimals);
  const double value = std::round(si_value * format.scale * factor) / factor;
  return value == 0.0 ? 0.0 : value;  // no "-0.0"
}

/// The smallest value seen and the record (1-based) it belongs to.
struct Minimum {
  std::optional<double> value;
  std::size_t record = 0;
  int joint = -1;

  void offer(double candidate, std::size_t number, int joint_index = -1) {
    if (!value || candidate < *value) {
      value = candidate;
      record = number;
      joint = joint_index;
    }
  }
};

class SummaryBuilder {
 public:
  SummaryBuilder(const Program& program, const WriteOptions& options)
      : program_(program),
        options_(options),
        quantities_(fileQuantities(program.metadata.units)),
        has_circular_moves_(std::any_of(
            program.records.begin(), program.records.end(), [](const planner::ProgramRecord& r) {
              const auto* motion = std::get_if<MotionRecord>(&r);
              return motion && motion->kind == planner::MotionKind::kCircularMove;
            })) {}

  /// Figures over the records whose seam is `seam`, or over all records.
  ordered_json figures(const std::optional<std::string>& seam) const {
    std::size_t waypoints = 0;
    std::size_t circular_moves = 0;
    std::optional<double> first_time;
    double last_time = 0.0;
    double process_time = 0.0;
    std::optional<double> process_on_since;
    Minimum clearance;
    Minimum singularity;
    Minimum relative_limit;  // margin over joint range, comparable across joint types
    for (std::size_t i = 0; i < program_.records.size(); ++i) {
      const planner::ProgramRecord& record = program_.records[i];
      if (const auto* event = std::get_if<ProcessEvent>(&record)) {
        if (seam && event->seam != *seam) continue;
        if (event->kind == planner::ProcessEventKind::kStart) {
          process_on_since = event->time;
        } else if (process_on_since) {
          process_time += event->time - *process_on_since;
          process_on_since.reset();
        }
        continue;
      }
      const auto& motion = std::get<MotionRecord>(record);
      if (seam && motion.seam != *seam) continue;
      ++waypoints;
      if (motion.kind == planner::MotionKind::kCircularMove) ++circular_moves;
      if (!first_time) first_time = motion.start_time;
      last_time = std::max(last_time, motion.start_time + motion.duration);
      if (motion.clearance) clearance.offer(*motion.clearance, i + 1);
      if (motion.singularity_margin) singularity.offer(*motion.singularity_margin, i + 1);
      const kinematics::JointVector margins = planner::jointLimitMargins(program_.metadata, motion.q);
      for (int j = 0; j < margins.size(); ++j) {
        const planner::ProgramJoint& joint = program_.metadata.joints[j];
        relative_limit.offer(margins[j] / (joint.upper - joint.lower), i + 1, j);
      }
    }
    ordered_json result;
    if (seam) result["seam"] = *seam;
    result["waypoints"] = waypoints;
    // Only in summaries of programs with arcs, so that those of programs
    // without them stay byte for byte as before circular moves existed.
    if (has_circular_moves_) result["circular_moves"] = circular_moves;
    const double span = seam ? last_time - first_time.value_or(0.0) : planner::cycleTime(program_);
    result[seam ? "time" : "cycle_time"] = rounded(quantities_.time, span);
    result["process_time"] = rounded(quantities_.time, process_time);
    result["air_time"] = rounded(quantities_.time, span - process_time);
    result["min_clearance"] = located(clearance, quantities_.length);
    result["min_singularity_margin"] = located(singularity, quantities_.angle);
    if (relative_limit.value) {
      const planner::ProgramJoint& joint = program_.metadata.joints[relative_limit.joint];
      const double range = joint.upper - joint.lower;
      ordered_json limit = located(relative_limit, quantities_.joint(joint.type), range);
      limit["joint"] = joint.name;
      limit["unit"] = quantities_.joint(joint.type).unit;
      result["tightest_joint_limit_margin"] = limit;
    } else {
      result["tightest_joint_limit_margin"] = nullptr;
    }
    return result;
  }

  std::vector<std::string> seams() const {
    std::vector<std::string> names;
    for (const planner::ProgramRecord& record : program_.records) {
      const auto* motion = std::get_if<MotionRecord>(&record);
      if (motion && !motion->seam.empty() &&
          std::find(names.begin(), names.end(), motion->seam) == names.end()) {
        names.push_back(motion->seam);
      }
    }
    return names;
  }

  std::vector<std::string> warnings() const {
    std::vector<std::string> result;
    for (const ReviewWarning& warning : reviewWarnings(program_, options_)) {
      result.push_back(warning.text);
    }
    return result;
  }

 private:
  /// {"value": v, "record": n} or null; `scale` turns a relative minimum
  /// back into the quantity.
  static ordered_json located(const Minimum& minimum, const QuantityFormat& format,
                              double scale = 1.0) {
    if (!minimum.value) return nullptr;
    ordered_json result;
    result["value"] = rounded(format, *minimum.value * scale);
    result["record"] = minimum.record;
    return result;
  }

  const Program& program_;
  const WriteOptions& options_;
  FileQuantities quantities_;
  bool has_circular_moves_;
};

}  // namespace

void SummaryPostProcessor::write(const Program& program, const WriteOptions& options,
                                 std::ostream& out) const {
  planner::checkProgram(program, options.output_name);
  const SummaryBuilder builder(program, options);
  const FileQuantities quantities = fileQuantities(program.metadata.units);
  ordered_json summary;
  summary["format"] = "tracewright-summary";
  summary["version"] = 1;
  summary["units"] = {{"length", quantities.length.unit},
                      {"angle", quantities.angle.unit},
                      {"time", quantities.time.unit}};
  summary["job"] = program.metadata.job;
  summary["arm"] = program.metadata.arm;
  summary["generator"] = program.metadata.generator;
  summary["seed"] = program.metadata.seed;
  summary["caution"] = safetyCaution(program);
  summary["cycle_time_note"] =
      "times are the planner's estimate from its timing model, not a measurement on the robot";
  summary["total"] = builder.figures(std::nullopt);
  ordered_json seams = ordered_json::array();
  for (const std::string& seam : builder.seams()) seams.push_back(builder.figures(seam));
  summary["seams"] = seams;
  summary["warnings"] = builder.warnings();
  std::string text;
  try {
    text = summary.dump(2);
  } catch (const nlohmann::json::type_error& error) {
    throw InputError(options.output_name, 0,
                     std::string("the program holds text that is not valid UTF-8: ") + error.what());
  }
  out << text << '\n';
}

}  // namespace tw::postproc
