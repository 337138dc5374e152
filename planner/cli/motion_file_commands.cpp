#include "planner/cli/motion_file_commands.hpp"

#include <unistd.h>

#include <algorithm>
#include <cstdio>
#include <iostream>
#include <memory>
#include <nlohmann/json.hpp>
#include <string>
#include <variant>
#include <vector>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"
#include "kinematics/common/number_text.hpp"
#include "planner/cli/exit_codes.hpp"
#include "planner/program/motion_path.hpp"
#include "postproc/atomic_file.hpp"
#include "postproc/compare/motion_comparison.hpp"
#include "postproc/file_quantities.hpp"
#include "postproc/motion_text/motion_text_reader.hpp"
#include "postproc/pose_text.hpp"
#include "postproc/tables/joint_table_post_processor.hpp"

namespace tw::cli {
namespace {

using nlohmann::ordered_json;
using planner::MotionRecord;
using planner::ProcessEvent;
using planner::Program;
using postproc::FileQuantities;
using postproc::ComparisonTolerances;
using postproc::compareMotionPrograms;
using postproc::LargestChange;
using postproc::MotionComparison;
using postproc::QuantityFormat;
using postproc::RecordChange;

constexpr double kDegree = kPi / 180.0;

// ---------------------------------------------------------------- compare

struct CompareArguments {
  std::string file_a;
  std::string file_b;
  bool json = false;
  bool records = false;
  bool fail_on_change = false;
  double joint_tolerance = 0.001;  ///< [deg] or [mm]
  double tcp_tolerance = 0.001;    ///< [mm] and [deg]
  double time_tolerance = 0.001;   ///< [s]
};

/// The value as the file formats print it, as a JSON number.
double jsonNumber(const QuantityFormat& format, double si_value) {
  return *parseNumber(format.format(si_value));
}

/// Where a largest change occurs, or "unchanged" when nothing changed.
std::string recordPair(const LargestChange& change) {
  if (change.value == 0.0) return "unchanged";
  return "A " + std::to_string(change.record_a) + " / B " + std::to_string(change.record_b);
}

ordered_json located(const QuantityFormat& format, const LargestChange& change) {
  return ordered_json{{"value", jsonNumber(format, change.value)},
                      {"record_a", change.record_a},
                      {"record_b", change.record_b}};
}

ordered_json fileJson(const std::string& path, const Program& program, const FileQuantities& q) {
  return ordered_json{{"file", path},
                      {"job", program.metadata.job},
                      {"records", program.records.size()},
                      {"cycle_time", jsonNumber(q.time, planner::cycleTime(program))}};
}

void printCompareJson(const CompareArguments& arguments, const Program& a, const Program& b,
                      const MotionComparison& result, const FileQuantities& q) {
  ordered_json json;
  json["format"] = "tracewright-comparison";
  json["version"] = 1;
  json["units"] = {{"length", q.length.unit}, {"angle", q.angle.unit}, {"time", "s"}};
  json["a"] = fileJson(arguments.file_a, a, q);
  json["b"] = fileJson(arguments.file_b, b, q);
  json["equal"] = result.equal;
  json["matched"] = result.matched;
  json["removed"] = result.removed;
  json["added"] = result.added;
  ordered_json joints = ordered_json::array();
  for (std::size_t j = 0; j < result.largest_joint_delta.size(); ++j) {
    const QuantityFormat& format = q.joint(a.metadata.joints[j].type);
    ordered_json joint = located(format, result.largest_joint_delta[j]);
    joint["joint"] = a.metadata.joints[j].name;
    joint["unit"] = format.unit;
    joints.push_back(joint);
  }
  json["largest_joint_delta"] = joints;
  json["largest_tcp_position_deviation"] = located(q.length, result.largest_position_deviation);
  json["largest_tcp_angle_deviation"] = located(q.angle, result.largest_angle_deviation);
  json["branch_changes"] = result.branch_changes;
  json["cycle_time_change"] = jsonNumber(q.time, result.cycle_time_b - result.cycle_time_a);
  ordered_json changes = ordered_json::array();
  for (const RecordChange& change : result.changes) {
    ordered_json deltas = ordered_json::array();
    for (std::size_t j = 0; j < change.joint_deltas.size(); ++j) {
      deltas.push_back(jsonNumber(q.joint(a.metadata.joints[j].type), change.joint_deltas[j]));
    }
    ordered_json entry{{"record_a", change.record_a},
                       {"record_b", change.record_b},
                       {"joint_deltas", deltas},
                       {"tcp_position_deviation", jsonNumber(q.length, change.position_deviation)},
                       {"tcp_angle_deviation", jsonNumber(q.angle, change.angle_deviation)},
                       {"branch_changed", change.branch_changed},
                       {"tool_frame_or_set_changed", change.tool_frame_or_set_changed}};
    if (change.branch_changed) {
      entry["branch_a"] = change.branch_a;
      entry["branch_b"] = change.branch_b;
    }
    if (!change.via_joint_deltas.empty()) {
      ordered_json via_deltas = ordered_json::array();
      for (std::size_t j = 0; j < change.via_joint_deltas.size(); ++j) {
        via_deltas.push_back(
            jsonNumber(q.joint(a.metadata.joints[j].type), change.via_joint_deltas[j]));
      }
      entry["via_joint_deltas"] = via_deltas;
      entry["via_tcp_position_deviation"] = jsonNumber(q.length, change.via_position_deviation);
      entry["via_tcp_angle_deviation"] = jsonNumber(q.angle, change.via_angle_deviation);
    }
    changes.push_back(entry);
  }
  json["changes"] = changes;
  std::cout << json.dump(2) << '\n';
}

std::string numberList(const std::vector<int>& numbers) {
  std::string text;
  for (const int n : numbers) text += (text.empty() ? "" : ", ") + std::to_string(n);
  return text;
}

void printCompareText(const CompareArguments& arguments, const Program& a, const Program& b,
                      const MotionComparison& result, const FileQuantities& q) {
  std::printf("A: %s (job \"%s\", %zu records, cycle time %s s)\n", arguments.file_a.c_str(),
              a.metadata.job.c_str(), a.records.size(), q.time.format(result.cycle_time_a).c_str());
  std::printf("B: %s (job \"%s\", %zu records, cycle time %s s)\n", arguments.file_b.c_str(),
              b.metadata.job.c_str(), b.records.size(), q.time.format(result.cycle_time_b).c_str());
  std::printf("records: %d matched, %zu changed, %zu removed, %zu added\n", result.matched,
              result.changes.size(), result.removed.size(), result.added.size());
  if (!result.removed.empty()) std::printf("removed (A): %s\n", numberList(result.removed).c_str());
  if (!result.added.empty()) std::printf("added (B): %s\n", numberList(result.added).c_str());
  std::printf("largest joint change:\n");
  for (std::size_t j = 0; j < result.largest_joint_delta.size(); ++j) {
    const QuantityFormat& format = q.joint(a.metadata.joints[j].type);
    const LargestChange& change = result.largest_joint_delta[j];
    std::printf("  %-12s %12s %-3s (%s)\n", a.metadata.joints[j].name.c_str(),
                format.format(change.value).c_str(), format.unit.c_str(),
                recordPair(change).c_str());
  }
  std::printf("largest TCP deviation: %s %s (%s), %s %s (%s)\n",
              q.length.format(result.largest_position_deviation.value).c_str(),
              q.length.unit.c_str(), recordPair(result.largest_position_deviation).c_str(),
              q.angle.format(result.largest_angle_deviation.value).c_str(), q.angle.unit.c_str(),
              recordPair(result.largest_angle_deviation).c_str());
  std::printf("branch changes: %d\n", result.branch_changes);
  for (const RecordChange& change : result.changes) {
    if (change.branch_changed) {
      std::printf("  A %d \"%s\" -> B %d \"%s\"\n", change.record_a, change.branch_a.c_str(),
                  change.record_b, change.branch_b.c_str());
    }
  }
  std::printf("cycle time: %s s -> %s s (%s s)\n", q.time.format(result.cycle_time_a).c_str(),
              q.time.format(result.cycle_time_b).c_str(),
              q.time.format(result.cycle_time_b - result.cycle_time_a).c_str());
  if (arguments.records) {
    for (const RecordChange& change : result.changes) {
      std::printf("A %d / B %d:", change.record_a, change.record_b);
      for (std::size_t j = 0; j < change.joint_deltas.size(); ++j) {
        std::printf(" %s",
                    q.joint(a.metadata.joints[j].type).format(change.joint_deltas[j]).c_str());
      }
      std::printf("  TCP %s %s %s %s", q.length.format(change.position_deviation).c_str(),
                  q.length.unit.c_str(), q.angle.format(change.angle_deviation).c_str(),
                  q.angle.unit.c_str());
      if (!change.via_joint_deltas.empty()) {
        std::printf("  via:");
        for (std::size_t j = 0; j < change.via_joint_deltas.size(); ++j) {
          std::printf(" %s", q.joint(a.metadata.joints[j].type)
                                 .format(change.via_joint_deltas[j])
                                 .c_str());
        }
        std::printf("  TCP %s %s %s %s", q.length.format(change.via_position_deviation).c_str(),
                    q.length.unit.c_str(), q.angle.format(change.via_angle_deviation).c_str(),
                    q.angle.unit.c_str());
      }
      std::printf("%s%s\n", change.branch_changed ? "  branch changed" : "",
                  change.tool_frame_or_set_changed ? "  tool, frame or set changed" : "");
    }
  }
  std::printf("%s\n", result.equal ? "the programs are equal within the tolerances"
                                   : "the programs differ");
}

int runCompare(const CompareArguments& arguments) {
  if (!(arguments.joint_tolerance >= 0.0 && arguments.tcp_tolerance >= 0.0 &&
        arguments.time_tolerance >= 0.0)) {
    throw InputError("--joint-tolerance, --tcp-tolerance, --time-tolerance: expected values >= 0");
  }
  const Program a = postproc::readMotionTextFile(arguments.file_a);
  const Program b = postproc::readMotionTextFile(arguments.file_b);
  const FileQuantities q = postproc::fileQuantities(a.metadata.units);
  ComparisonTolerances tolerances;
  tolerances.revolute = arguments.joint_tolerance * kDegree;
  tolerances.prismatic = arguments.joint_tolerance * 0.001;
  tolerances.position = arguments.tcp_tolerance * 0.001;
  tolerances.angle = arguments.tcp_tolerance * kDegree;
  tolerances.time = arguments.time_tolerance;
  const MotionComparison result = compareMotionPrograms(a, b, arguments.file_b, tolerances);
  if (arguments.json) {
    printCompareJson(arguments, a, b, result, q);
  } else {
    printCompareText(arguments, a, b, result, q);
  }
  return arguments.fail_on_change && !result.equal ? kExitInfeasible : kExitOk;
}

// ------------------------------------------------------------------ table

struct TableArguments {
  std::string file;
  std::vector<std::string> columns{"record", "kind", "time", "seam", "joints"};
  std::string length_unit = "mm";
  std::string angle_unit = "deg";
  double margin_warning = 5.0;  ///< [deg] or [mm], as WriteOptions' joint-limit warning
  std::string colour = "auto";
  std::string csv;
  double sample_period = 0.0;
};

constexpr const char* kYellow = "\033[33m";
constexpr const char* kReset = "\033[0m";

/// One table cell: its text and whether it is to be highlighted.
struct Cell {
  std::string text;
  bool warn = false;
};

class TablePrinter {
 public:
  TablePrinter(const Program& program, const TableArguments& arguments, bool colour)
      : program_(program),
        arguments_(arguments),
        colour_(colour),
        q_(postproc::fileQuantities(program.metadata.units)) {}

  void print() const {
    std::vector<std::vector<Cell>> rows(1);
    for (const std::string& column : arguments_.columns) appendHeader(column, rows.front());
    const MotionRecord* previous = nullptr;
    for (std::size_t i = 0; i < program_.records.size(); ++i) {
      const auto* motion = std::get_if<MotionRecord>(&program_.records[i]);
      if (motion && motion->via) {
        // A row of its own for the via point, before the target it leads to;
        // the reader made sure a circular move follows a motion.
        const double time = planner::viaPassingTime(previous->X_RT.translation(), *motion);
        rows.emplace_back();
        for (const std::string& column : arguments_.columns) {
          appendViaCells(column, i, *motion, time, rows.back());
        }
      }
      rows.emplace_back();
      for (const std::string& column : arguments_.columns) appendCells(column, i, rows.back());
      if (motion) previous = motion;
    }
    std::vector<std::size_t> widths(rows.front().size(), 0);
    for (const std::vector<Cell>& row : rows) {
      for (std::size_t c = 0; c < row.size(); ++c)
        widths[c] = std::max(widths[c], row[c].text.size());
    }
    for (const std::vector<Cell>& row : rows) printRow(row, widths);
    std::printf(
        "! marks a joint within %s %s (%s for linear joints) of a limit, or a singularity "
        "margin or clearance below the review thresholds (%s %s, %s %s)\n",
        formatFixed(arguments_.margin_warning, 3).c_str(), q_.angle.unit.c_str(),
        q_.length.unit.c_str(), q_.angle.format(singularityWarning()).c_str(),
        q_.angle.unit.c_str(), q_.length.format(clearanceWarning()).c_str(),
        q_.length.unit.c_str());
  }

 private:
  void appendHeader(const std::string& column, std::vector<Cell>& cells) const {
    if (column == "joints" || column == "margins") {
      for (const planner::ProgramJoint& joint : program_.metadata.joints) {
        cells.push_back(
            {joint.name + (column == "margins" ? "_margin_" : "_") + q_.joint(joint.type).unit});
      }
    } else if (column == "tcp") {
      for (const char* name : {"x_", "y_", "z_"}) cells.push_back({name + q_.length.unit});
      for (const char* name : {"qw", "qx", "qy", "qz"}) cells.push_back({name});
    } else if (column == "time") {
      cells.push_back({"time_s"});
    } else if (column == "speed") {
      cells.push_back({"speed"});
    } else if (column == "singularity") {
      cells.push_back({"singularity_" + q_.angle.unit});
    } else if (column == "clearance") {
      cells.push_back({"clearance_" + q_.length.unit});
    } else {
      cells.push_back({column});
    }
  }

  /// The via row of circular move `motion` (record index `index`), passed at `time`.
  void appendViaCells(const std::string& column, std::size_t index, const MotionRecord& motion,
                      double time, std::vector<Cell>& cells) const {
    if (column == "record") {
      cells.push_back({std::to_string(index + 1)});
    } else if (column == "kind") {
      cells.push_back({"via"});
    } else if (column == "time") {
      cells.push_back({q_.time.format(time)});
    } else if (column == "seam") {
      cells.push_back({motion.seam});
    } else if (column == "branch") {
      cells.push_back({motion.branch});
    } else if (column == "joints" || column == "margins") {
      appendJointCells(column, motion.via->q_via, cells);
    } else if (column == "tcp") {
      appendPoseCells(motion.via->X_RV, cells);
    } else {
      cells.emplace_back();  // speed, singularity, clearance: a target's figures
    }
  }

  void appendJointCells(const std::string& column, const kinematics::JointVector& q,
                        std::vector<Cell>& cells) const {
    const kinematics::JointVector margins = planner::jointLimitMargins(program_.metadata, q);
    for (int j = 0; j < q.size(); ++j) {
      const QuantityFormat& format = q_.joint(program_.metadata.joints[j].type);
      const double value = column == "joints" ? q[j] : margins[j];
      cells.push_back({format.format(value), margins[j] * format.scale < arguments_.margin_warning});
    }
  }

  void appendPoseCells(const Eigen::Isometry3d& X_RT, std::vector<Cell>& cells) const {
    const postproc::PoseText pose = postproc::poseText(X_RT, q_);
    for (const std::string& text : {pose.position, pose.orientation}) {
      std::size_t begin = 0;
      for (std::size_t comma = text.find(',');; comma = text.find(',', begin)) {
        cells.push_back({text.substr(begin, comma - begin)});
        if (comma == std::string::npos) break;
        begin = comma + 1;
      }
    }
  }

  void appendCells(const std::string& column, std::size_t index, std::vector<Cell>& cells) const {
    const planner::ProgramRecord& record = program_.records[index];
    const auto* motion = std::get_if<MotionRecord>(&record);
    const auto* event = std::get_if<ProcessEvent>(&record);
    const std::size_t joints = program_.metadata.joints.size();
    if (column == "record") {
      cells.push_back({std::to_string(index + 1)});
    } else if (column == "kind") {
      cells.push_back({motion ? planner::toString(motion->kind) : planner::toString(event->kind)});
    } else if (column == "time") {
      cells.push_back(
          {q_.time.format(motion ? motion->start_time + motion->duration : event->time)});
    } else if (column == "seam") {
      cells.push_back({motion ? motion->seam : event->seam});
    } else if (column == "branch") {
      cells.push_back({motion ? motion->branch : event->parameter_set});
    } else if (!motion) {
      const std::size_t blanks = column == "joints" || column == "margins" ? joints
                                 : column == "tcp"                         ? 7
                                                                           : 1;
      cells.insert(cells.end(), blanks, Cell{});
    } else if (column == "joints" || column == "margins") {
      appendJointCells(column, motion->q, cells);
    } else if (column == "tcp") {
      appendPoseCells(motion->X_RT, cells);
    } else if (column == "speed") {
      cells.push_back({motion->speed.kind == planner::SpeedKind::kTcpSpeed
                           ? q_.speed.format(motion->speed.value) + " " + q_.length.unit + "/s"
                           : q_.fraction.format(motion->speed.value) + " of max"});
    } else if (column == "singularity") {
      cells.push_back(optionalCell(motion->singularity_margin, q_.angle, singularityWarning()));
    } else if (column == "clearance") {
      cells.push_back(optionalCell(motion->clearance, q_.length, clearanceWarning()));
    }
  }

  static Cell optionalCell(const std::optional<double>& value, const QuantityFormat& format,
                           double warning) {
    if (!value) return Cell{};
    return Cell{format.format(*value), *value < warning};
  }
  // The summary's review thresholds, so that both flag the same records.
  static double singularityWarning() { return postproc::WriteOptions().singularity_warning; }
  static double clearanceWarning() { return postproc::WriteOptions().clearance_warning; }

  /// Cells right-aligned to their column's width, each followed by '!' when
  /// highlighted or a space, so that marked and unmarked values line up.
  void printRow(const std::vector<Cell>& cells, const std::vector<std::size_t>& widths) const {
    std::string line;
    for (std::size_t c = 0; c < cells.size(); ++c) {
      const Cell& cell = cells[c];
      const std::string padded = std::string(widths[c] - cell.text.size(), ' ') + cell.text;
      if (cell.warn && colour_) {
        line += std::string(" ") + kYellow + padded + "!" + kReset;
      } else {
        line += " " + padded + (cell.warn ? "!" : " ");
      }
    }
    line.erase(line.find_last_not_of(' ') + 1);
    std::printf("%s\n", line.c_str());
  }

  const Program& program_;
  const TableArguments& arguments_;
  bool colour_;
  FileQuantities q_;
};

int runTable(const TableArguments& arguments) {
  Program program = postproc::readMotionTextFile(arguments.file);
  program.metadata.units.length =
      arguments.length_unit == "m" ? planner::LengthUnit::kMetre : planner::LengthUnit::kMillimetre;
  program.metadata.units.angle =
      arguments.angle_unit == "rad" ? planner::AngleUnit::kRadian : planner::AngleUnit::kDegree;
  if (!arguments.csv.empty()) {
    postproc::WriteOptions options;
    options.sample_period = arguments.sample_period;
    postproc::writeProgramFile(postproc::JointTablePostProcessor(), program, options,
                               arguments.csv);
    std::printf("wrote the joint table of %s to %s\n", arguments.file.c_str(),
                arguments.csv.c_str());
    return kExitOk;
  }
  const bool colour =
      arguments.colour == "always" || (arguments.colour == "auto" && ::isatty(STDOUT_FILENO) == 1);
  TablePrinter(program, arguments, colour).print();
  return kExitOk;
}

}  // namespace

void addMotionFileCommands(CLI::App& app, int& exit_code) {
  auto compare = std::make_shared<CompareArguments>();
  CLI::App* compare_command =
      app.add_subcommand("compare", "What changed between two motion text files");
  compare_command->add_option("a", compare->file_a, "The earlier motion text file")->required();
  compare_command->add_option("b", compare->file_b, "The later motion text file")->required();
  compare_command->add_flag("--json", compare->json, "Print the comparison as JSON");
  compare_command->add_flag("--records", compare->records,
                            "Also list every changed record with its joint deltas");
  compare_command->add_flag("--fail-on-change", compare->fail_on_change,
                            "Exit with code 3 when the programs differ beyond the tolerances");
  compare_command
      ->add_option("--joint-tolerance", compare->joint_tolerance,
                   "Joint change counted as none [deg, or mm for linear joints]")
      ->capture_default_str();
  compare_command
      ->add_option("--tcp-tolerance", compare->tcp_tolerance,
                   "TCP change counted as none [mm for position, deg for orientation]")
      ->capture_default_str();
  compare_command
      ->add_option("--time-tolerance", compare->time_tolerance,
                   "Cycle-time change counted as none [s]")
      ->capture_default_str();
  compare_command->callback([compare, &exit_code] { exit_code = runCompare(*compare); });

  auto table = std::make_shared<TableArguments>();
  CLI::App* table_command = app.add_subcommand(
      "table", "Print a motion text file as a joint-value table, or write it as CSV");
  table_command->add_option("file", table->file, "Motion text file")->required();
  table_command
      ->add_option("--columns", table->columns,
                   "Columns, comma-separated: record, kind, time, seam, branch, joints, margins, "
                   "tcp, speed, singularity, clearance")
      ->delimiter(',')
      ->check(CLI::IsMember({"record", "kind", "time", "seam", "branch", "joints", "margins", "tcp",
                             "speed", "singularity", "clearance"}))
      ->capture_default_str();
  table_command->add_option("--length-unit", table->length_unit, "mm or m")
      ->check(CLI::IsMember({"mm", "m"}))
      ->capture_default_str();
  table_command->add_option("--angle-unit", table->angle_unit, "deg or rad")
      ->check(CLI::IsMember({"deg", "rad"}))
      ->capture_default_str();
  table_command
      ->add_option("--margin-warning", table->margin_warning,
                   "Mark joints closer than this to a limit [in the table's joint unit]")
      ->capture_default_str();
  table_command
      ->add_option("--colour", table->colour,
                   "auto (colour only when printing to a terminal), always or never")
      ->check(CLI::IsMember({"auto", "always", "never"}))
      ->capture_default_str();
  CLI::Option* csv = table_command->add_option(
      "--csv", table->csv, "Write the joint-table CSV (all columns) to this file instead");
  table_command
      ->add_option("--sample-period", table->sample_period,
                   "With --csv: also an interpolated row every this many seconds")
      ->needs(csv);
  table_command->callback([table, &exit_code] { exit_code = runTable(*table); });
}

}  // namespace tw::cli
