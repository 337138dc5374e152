#include "postproc/motion_text/motion_text_reader.hpp"

#include <charconv>
#include <cmath>
#include <fstream>
#include <optional>
#include <sstream>
#include <vector>

#include "kinematics/common/input_error.hpp"
#include "kinematics/common/number_text.hpp"
#include "planner/program/sha256.hpp"
#include "postproc/file_quantities.hpp"
#include "postproc/motion_text/key_value_line.hpp"
#include "postproc/motion_text/motion_text_format.hpp"

namespace tw::postproc {
namespace {

using planner::MotionRecord;
using planner::ProcessEvent;
using planner::Program;

// Quaternions are written with 9 decimals, so a written unit quaternion has
// a norm within about 2e-9 of 1; 1e-6 tells rounding from a wrong value.
constexpr double kUnitQuaternionTolerance = 1e-6;

struct TextLine {
  std::string_view text;
  std::size_t offset = 0;  ///< byte offset of the line in the file
  int number = 0;          ///< 1-based
};

std::vector<TextLine> splitLines(std::string_view text) {
  std::vector<TextLine> lines;
  std::size_t start = 0;
  while (start < text.size()) {
    const std::size_t end = text.find('\n', start);
    const std::size_t stop = end == std::string_view::npos ? text.size() : end;
    lines.push_back({text.substr(start, stop - start), start, static_cast<int>(lines.size()) + 1});
    start = stop + 1;
  }
  return lines;
}

/// The fields of one parsed line, taken one by one so that a missing or an
/// unknown field is reported with the line it belongs to.
class FieldReader {
 public:
  FieldReader(KeyValueLine line, const std::string& file, int number)
      : line_(std::move(line)), file_(file), number_(number), used_(line_.fields.size(), false) {}

  [[noreturn]] void fail(const std::string& message) const {
    throw InputError(file_, number_, message);
  }

  bool has(const std::string& key) const { return find(key) != nullptr; }

  std::string text(const std::string& key) {
    const KeyValueField& field = require(key);
    if (!field.quoted) fail("field '" + key + "' expects quoted text, e.g. " + key + "=\"...\"");
    return field.value;
  }

  std::optional<std::string> optionalText(const std::string& key) {
    if (!has(key)) return std::nullopt;
    return text(key);
  }

  std::string bare(const std::string& key) {
    const KeyValueField& field = require(key);
    if (field.quoted) fail("field '" + key + "' expects a bare value, not quoted text");
    return field.value;
  }

  /// Index of the bare value among `words`; anything else is an error
  /// listing them.
  std::size_t choice(const std::string& key, const std::vector<std::string>& words) {
    const std::string value = bare(key);
    for (std::size_t i = 0; i < words.size(); ++i) {
      if (value == words[i]) return i;
    }
    std::string list;
    for (const std::string& word : words) list += (list.empty() ? "" : " or ") + word;
    fail("field '" + key + "' is '" + value + "'; expected " + list);
  }

  /// A number in the file's unit, converted to SI by dividing by the scale.
  double number(const std::string& key, const QuantityFormat& format) {
    return numbers(key, 1, format).front();
  }

  std::optional<double> optionalNumber(const std::string& key, const QuantityFormat& format) {
    if (!has(key)) return std::nullopt;
    return number(key, format);
  }

  /// `count` comma-separated numbers, as written (not converted).
  std::vector<double> numbers(const std::string& key, std::size_t count,
                              const QuantityFormat& format) {
    const std::string value = bare(key);
    std::vector<double> result;
    std::size_t start = 0;
    while (true) {
      const std::size_t comma = value.find(',', start);
      const std::string_view item =
          std::string_view(value).substr(start, comma == std::string::npos ? std::string::npos
                                                                            : comma - start);
      const std::optional<double> parsed = parseNumber(item);
      if (!parsed) {
        fail("field '" + key + "' expects " + std::to_string(count) +
             " comma-separated number(s) in " + unitName(format) + "; '" + std::string(item) +
             "' is not a number");
      }
      result.push_back(*parsed / format.scale);
      if (comma == std::string::npos) break;
      start = comma + 1;
    }
    if (result.size() != count) {
      fail("field '" + key + "' expects " + std::to_string(count) +
           " comma-separated number(s), found " + std::to_string(result.size()));
    }
    return result;
  }

  /// Every field must have been taken.
  void finish() const {
    for (std::size_t i = 0; i < used_.size(); ++i) {
      if (!used_[i]) {
        fail("unknown field '" + line_.fields[i].key + "' in a '" + line_.keyword + "' line");
      }
    }
  }

 private:
  static std::string unitName(const QuantityFormat& format) {
    return format.unit.empty() ? std::string("no unit") : format.unit;
  }

  const KeyValueField* find(const std::string& key) const {
    for (const KeyValueField& field : line_.fields) {
      if (field.key == key) return &field;
    }
    return nullptr;
  }

  const KeyValueField& require(const std::string& key) {
    for (std::size_t i = 0; i < line_.fields.size(); ++i) {
      if (line_.fields[i].key == key) {
        used_[i] = true;
        return line_.fields[i];
      }
    }
    fail("a '" + line_.keyword + "' line needs the field '" + key + "'");
  }

  KeyValueLine line_;
  const std::string& file_;
  int number_;
  std::vector<bool> used_;
};

/// Order of the line kinds in a file; a line may not come after one of a
/// later kind.
enum class Section { kUnits, kProgram, kInputs, kJoints, kWarnings, kRecords, kEnd };

std::optional<Section> sectionOf(const std::string& keyword) {
  if (keyword == "units") return Section::kUnits;
  if (keyword == "program") return Section::kProgram;
  if (keyword == "input") return Section::kInputs;
  if (keyword == "joint") return Section::kJoints;
  if (keyword == "warning") return Section::kWarnings;
  if (keyword == "joint-move" || keyword == "linear-move" || keyword == "circular-move" ||
      keyword == "process-on" || keyword == "process-off") {
    return Section::kRecords;
  }
  if (keyword == "end") return Section::kEnd;
  return std::nullopt;
}

class MotionTextParser {
 public:
  MotionTextParser(std::string_view text, const std::string& file) : text_(text), file_(file) {}

  Program parse() {
    if (text_.empty()) fail(1, "the file is empty; expected the first line '" + firstLine() + "'");
    const std::vector<TextLine> lines = splitLines(text_);
    checkFirstLine(lines.front());
    checkIntegrity(lines);
    for (std::size_t i = 1; i + 1 < lines.size(); ++i) readLine(lines[i]);
    if (!seen_end_) {
      fail(lines.back().number, "expected an 'end records=N' line before the integrity line");
    }
    if (const auto problem = planner::findProgramProblem(program_)) {
      const int line = problem->record >= 0 ? record_lines_[problem->record] : program_line_;
      fail(line, "inconsistent program: " + problem->message);
    }
    return std::move(program_);
  }

 private:
  [[noreturn]] void fail(int line, const std::string& message) const {
    throw InputError(file_, line, message);
  }

  static std::string firstLine() {
    return std::string(kMotionTextKeyword) + " version=" + std::to_string(kMotionTextVersion);
  }

  void checkFirstLine(const TextLine& line) {
    if (line.text.substr(0, std::string_view(kMotionTextKeyword).size()) != kMotionTextKeyword) {
      fail(line.number, "not a tracewright motion text file; expected the first line '" +
                            firstLine() + "'");
    }
    const KeyValueLine parsed = parseKeyValueLine(line.text, file_, line.number);
    FieldReader fields(parsed, file_, line.number);
    if (parsed.keyword != kMotionTextKeyword || !fields.has("version")) {
      fail(line.number, "not a tracewright motion text file; expected the first line '" +
                            firstLine() + "'");
    }
    const std::string version = fields.bare("version");
    if (version != std::to_string(kMotionTextVersion)) {
      fail(line.number, "unsupported motion text version '" + version +
                            "'; this reader reads version " +
                            std::to_string(kMotionTextVersion));
    }
    fields.finish();
  }

  void checkIntegrity(const std::vector<TextLine>& lines) {
    const TextLine& last = lines.back();
    const std::string expected = "expected the final line 'integrity sha256=<64 hex digits>'";
    if (text_.back() != '\n') {
      fail(last.number, "the last line has no line end: the file is truncated; " + expected);
    }
    const KeyValueLine parsed = parseKeyValueLine(last.text, file_, last.number);
    FieldReader fields(parsed, file_, last.number);
    if (lines.size() < 2 || parsed.keyword != "integrity" || !fields.has("sha256")) {
      fail(last.number, expected + ": the file is truncated or was edited");
    }
    const std::string written = fields.bare("sha256");
    fields.finish();
    const std::string actual = planner::sha256Hex(text_.substr(0, last.offset));
    if (written != actual) {
      fail(last.number, "integrity check failed: the SHA-256 of the lines above is " + actual +
                            " but the file says " + written +
                            "; the file was edited or damaged after it was written");
    }
  }

  void readLine(const TextLine& line) {
    if (line.text.empty() || line.text.front() == '#') return;
    const KeyValueLine parsed = parseKeyValueLine(line.text, file_, line.number);
    const std::optional<Section> section = sectionOf(parsed.keyword);
    if (!section) {
      fail(line.number, "unknown line keyword '" + parsed.keyword +
                            "'; expected units, program, input, joint, warning, joint-move, "
                            "linear-move, circular-move, process-on, process-off or end");
    }
    if (seen_end_) fail(line.number, "nothing but comments may follow the 'end' line");
    const bool repeated = (*section == Section::kUnits && seen_units_) ||
                          (*section == Section::kProgram && program_line_ != 0);
    if (*section < section_ || repeated) {
      fail(line.number, "a '" + parsed.keyword +
                            "' line is out of place; the order is units, program, input "
                            "lines, joint lines, warning lines, records, end");
    }
    if (*section > Section::kUnits && !seen_units_) {
      fail(line.number, "expected the 'units' line before '" + parsed.keyword + "'");
    }
    if (*section > Section::kProgram && program_line_ == 0) {
      fail(line.number, "expected the 'program' line before '" + parsed.keyword + "'");
    }
    if (*section > Section::kJoints && program_.metadata.joints.empty()) {
      fail(line.number, "expected at least one 'joint' line before '" + parsed.keyword + "'");
    }
    section_ = *section;
    FieldReader fields(parsed, file_, line.number);
    switch (*section) {
      case Section::kUnits: readUnits(fields); break;
      case Section::kProgram: readProgram(fields, line.number); break;
      case Section::kInputs: readInput(fields); break;
      case Section::kJoints: readJoint(fields); break;
      case Section::kWarnings: program_.warnings.push_back(fields.text("text")); break;
      case Section::kRecords: readRecord(parsed.keyword, fields, line.number); break;
      case Section::kEnd: readEnd(fields); break;
    }
    fields.finish();
  }

  void readUnits(FieldReader& fields) {
    planner::FileUnits units;
    units.length = fields.choice("length", {"mm", "m"}) == 0 ? planner::LengthUnit::kMillimetre
                                                             : planner::LengthUnit::kMetre;
    units.angle = fields.choice("angle", {"deg", "rad"}) == 0 ? planner::AngleUnit::kDegree
                                                              : planner::AngleUnit::kRadian;
    fields.choice("time", {"s"});
    program_.metadata.units = units;
    quantities_ = fileQuantities(units);
    seen_units_ = true;
  }

  void readProgram(FieldReader& fields, int line) {
    planner::ProgramMetadata& meta = program_.metadata;
    meta.job = fields.text("job");
    meta.arm = fields.text("arm");
    meta.generator = fields.text("generator");
    const std::string seed = fields.bare("seed");
    const auto [end, error] = std::from_chars(seed.data(), seed.data() + seed.size(), meta.seed);
    if (error != std::errc() || end != seed.data() + seed.size()) {
      fields.fail("field 'seed' expects a whole number from 0 to 2^64-1, found '" + seed + "'");
    }
    program_line_ = line;
  }

  void readInput(FieldReader& fields) {
    planner::InputFileHash input;
    input.path = fields.text("path");
    input.sha256 = fields.bare("sha256");
    program_.metadata.inputs.push_back(std::move(input));
  }

  void readJoint(FieldReader& fields) {
    planner::ProgramJoint joint;
    joint.name = fields.text("name");
    joint.type = fields.choice("type", {"revolute", "prismatic"}) == 0
                     ? kinematics::JointType::kRevolute
                     : kinematics::JointType::kPrismatic;
    if (static_cast<int>(program_.metadata.joints.size()) == kinematics::kMaxJoints) {
      fields.fail("too many joints; at most " + std::to_string(kinematics::kMaxJoints));
    }
    const QuantityFormat& format = quantities_.joint(joint.type);
    joint.lower = fields.number("lower", format);
    joint.upper = fields.number("upper", format);
    program_.metadata.joints.push_back(std::move(joint));
  }

  void readRecord(const std::string& keyword, FieldReader& fields, int line) {
    const std::size_t number = program_.records.size() + 1;
    if (fields.bare("n") != std::to_string(number)) {
      fields.fail("expected record number n=" + std::to_string(number) +
                  " (records count up from 1)");
    }
    record_lines_.push_back(line);
    if (keyword == "process-on" || keyword == "process-off") {
      ProcessEvent event;
      event.kind = keyword == "process-on" ? planner::ProcessEventKind::kStart
                                           : planner::ProcessEventKind::kStop;
      event.time = fields.number("time", quantities_.time);
      event.parameter_set = fields.text("set");
      event.seam = fields.optionalText("seam").value_or("");
      program_.records.emplace_back(std::move(event));
      return;
    }
    program_.records.emplace_back(readMotion(keyword, fields));
  }

  kinematics::JointVector readJoints(FieldReader& fields, const std::string& key) {
    const std::vector<planner::ProgramJoint>& joints = program_.metadata.joints;
    const std::vector<double> written =
        fields.numbers(key, joints.size(), QuantityFormat{1.0, "the joints' units", 0});
    kinematics::JointVector q(static_cast<int>(joints.size()));
    for (std::size_t i = 0; i < joints.size(); ++i) {
      q[static_cast<int>(i)] = written[i] / quantities_.joint(joints[i].type).scale;
    }
    return q;
  }

  /// The pose of the fields `<prefix>position` and `<prefix>orientation`.
  Eigen::Isometry3d readPose(FieldReader& fields, const std::string& prefix) {
    const std::vector<double> p = fields.numbers(prefix + "position", 3, quantities_.length);
    const std::vector<double> w = fields.numbers(prefix + "orientation", 4, quantities_.quaternion);
    Eigen::Quaterniond orientation(w[0], w[1], w[2], w[3]);
    if (std::abs(orientation.norm() - 1.0) > kUnitQuaternionTolerance) {
      fields.fail("field '" + prefix + "orientation' expects a unit quaternion w,x,y,z; its norm is " +
                  std::to_string(orientation.norm()));
    }
    orientation.normalize();
    Eigen::Isometry3d X = Eigen::Isometry3d::Identity();
    X.linear() = orientation.toRotationMatrix();
    X.translation() = Eigen::Vector3d(p[0], p[1], p[2]);
    return X;
  }

  MotionRecord readMotion(const std::string& keyword, FieldReader& fields) {
    MotionRecord motion;
    motion.kind = keyword == "joint-move"    ? planner::MotionKind::kJointMove
                  : keyword == "linear-move" ? planner::MotionKind::kLinearMove
                                             : planner::MotionKind::kCircularMove;
    motion.start_time = fields.number("start", quantities_.time);
    motion.duration = fields.number("duration", quantities_.time);
    motion.tool = fields.text("tool");
    motion.frame = fields.text("frame");
    motion.q = readJoints(fields, "joints");
    motion.X_RT = readPose(fields, "");
    // Only a circular move takes via fields; on another kind they stay
    // unread and finish() reports them as unknown.
    if (motion.kind == planner::MotionKind::kCircularMove) {
      planner::ViaPoint via;
      via.q_via = readJoints(fields, "via_joints");
      via.X_RV = readPose(fields, "via_");
      motion.via = std::move(via);
    }
    const bool tcp = fields.has("tcp_speed");
    if (tcp == fields.has("joint_speed")) {
      fields.fail("a motion needs exactly one of the fields 'tcp_speed' [" + quantities_.speed.unit +
                  "] and 'joint_speed' [fraction of the maximum]");
    }
    motion.speed.kind = tcp ? planner::SpeedKind::kTcpSpeed : planner::SpeedKind::kJointSpeedFraction;
    motion.speed.value = tcp ? fields.number("tcp_speed", quantities_.speed)
                             : fields.number("joint_speed", quantities_.fraction);
    motion.blend_radius = fields.number("blend", quantities_.length);
    motion.seam = fields.optionalText("seam").value_or("");
    motion.branch = fields.optionalText("branch").value_or("");
    motion.clearance = fields.optionalNumber("clearance", quantities_.length);
    motion.singularity_margin = fields.optionalNumber("singularity_margin", quantities_.angle);
    return motion;
  }

  void readEnd(FieldReader& fields) {
    const std::string count = fields.bare("records");
    if (count != std::to_string(program_.records.size())) {
      fields.fail("the 'end' line counts " + count + " records but the file holds " +
                  std::to_string(program_.records.size()));
    }
    seen_end_ = true;
  }

  std::string_view text_;
  const std::string& file_;
  Program program_;
  FileQuantities quantities_ = fileQuantities(planner::FileUnits{});
  Section section_ = Section::kUnits;
  bool seen_units_ = false;
  bool seen_end_ = false;
  int program_line_ = 0;
  std::vector<int> record_lines_;
};

}  // namespace

Program readMotionText(std::string_view text, const std::string& file) {
  return MotionTextParser(text, file).parse();
}

Program readMotionTextFile(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(path, 0, "cannot open the motion text file for reading");
  std::ostringstream content;
  content << in.rdbuf();
  return readMotionText(content.str(), path);
}

}  // namespace tw::postproc
