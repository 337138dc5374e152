#include "postproc/template/program_template.hpp"

#include <algorithm>
#include <fstream>
#include <sstream>
#include <stdexcept>
#include <variant>

#include "kinematics/common/input_error.hpp"
#include "kinematics/common/number_text.hpp"
#include "postproc/file_quantities.hpp"
#include "postproc/pose_text.hpp"
#include "postproc/safety_caution.hpp"

namespace tw::postproc {
namespace {

using planner::MotionRecord;
using planner::ProcessEvent;
using planner::Program;
using Section = ProgramTemplate::Section;

constexpr std::array<const char*, ProgramTemplate::kSectionCount> kSectionNames = {
    "header", "joint-move", "linear-move", "circular-move", "process-on", "process-off", "footer"};
constexpr int kMaxDecimals = 12;

enum class Scope { kAnywhere, kHeader, kRecord, kMotion, kVia, kProcess };

struct PlaceholderSpec {
  const char* name;
  Scope scope;
  bool numeric;
};

constexpr PlaceholderSpec kPlaceholders[] = {
    {"job", Scope::kAnywhere, false},         {"arm", Scope::kAnywhere, false},
    {"generator", Scope::kAnywhere, false},   {"seed", Scope::kAnywhere, false},
    {"record_count", Scope::kAnywhere, false}, {"cycle_time", Scope::kAnywhere, true},
    {"length_unit", Scope::kAnywhere, false}, {"angle_unit", Scope::kAnywhere, false},
    {"open", Scope::kAnywhere, false},        {"caution", Scope::kHeader, false},
    {"n", Scope::kRecord, false},             {"seam", Scope::kRecord, false},
    {"start", Scope::kMotion, true},          {"duration", Scope::kMotion, true},
    {"end", Scope::kMotion, true},            {"tool", Scope::kMotion, false},
    {"frame", Scope::kMotion, false},         {"joints", Scope::kMotion, true},
    {"branch", Scope::kMotion, false},
    {"x", Scope::kMotion, true},              {"y", Scope::kMotion, true},
    {"z", Scope::kMotion, true},              {"qw", Scope::kMotion, true},
    {"qx", Scope::kMotion, true},             {"qy", Scope::kMotion, true},
    {"qz", Scope::kMotion, true},             {"tcp_speed", Scope::kMotion, true},
    {"joint_speed", Scope::kMotion, true},    {"blend", Scope::kMotion, true},
    {"clearance", Scope::kMotion, true},      {"singularity_margin", Scope::kMotion, true},
    {"time", Scope::kProcess, true},          {"set", Scope::kProcess, false},
    {"via_joints", Scope::kVia, true},        {"via_x", Scope::kVia, true},
    {"via_y", Scope::kVia, true},             {"via_z", Scope::kVia, true},
    {"via_qw", Scope::kVia, true},            {"via_qx", Scope::kVia, true},
    {"via_qy", Scope::kVia, true},            {"via_qz", Scope::kVia, true},
};

constexpr std::string_view kViaPrefix = "via_";

bool isMotionSection(Section section) {
  return section == Section::kJointMove || section == Section::kLinearMove ||
         section == Section::kCircularMove;
}

bool isProcessSection(Section section) {
  return section == Section::kProcessOn || section == Section::kProcessOff;
}

bool allowedIn(Scope scope, Section section) {
  switch (scope) {
    case Scope::kAnywhere: return true;
    case Scope::kHeader: return section == Section::kHeader;
    case Scope::kRecord: return isMotionSection(section) || isProcessSection(section);
    case Scope::kMotion: return isMotionSection(section);
    case Scope::kVia: return section == Section::kCircularMove;
    case Scope::kProcess: return isProcessSection(section);
  }
  return false;
}

/// Joint placeholders j1 … j8: the joint index from 0, or nullopt.
std::optional<int> jointIndex(const std::string& name) {
  if (name.size() != 2 || name[0] != 'j' || name[1] < '1' ||
      name[1] > static_cast<char>('0' + kinematics::kMaxJoints)) {
    return std::nullopt;
  }
  return name[1] - '1';
}

bool isViaName(const std::string& name) { return name.compare(0, kViaPrefix.size(), kViaPrefix) == 0; }

std::optional<PlaceholderSpec> findPlaceholder(const std::string& name) {
  if (jointIndex(name)) return PlaceholderSpec{"j", Scope::kMotion, true};
  if (isViaName(name) && jointIndex(name.substr(kViaPrefix.size()))) {
    return PlaceholderSpec{"via_j", Scope::kVia, true};
  }
  for (const PlaceholderSpec& spec : kPlaceholders) {
    if (name == spec.name) return spec;
  }
  return std::nullopt;
}

std::string placeholderList() {
  std::string list;
  for (const PlaceholderSpec& spec : kPlaceholders) list += std::string(spec.name) + ", ";
  const std::string last = std::to_string(kinematics::kMaxJoints);
  return list + "j1 to j" + last + ", via_j1 to via_j" + last;
}

class TemplateParser {
 public:
  explicit TemplateParser(const std::string& file) : file_(file) {}

  ProgramTemplate::Segment placeholder(const std::string& inner, Section section, int line) const {
    ProgramTemplate::Segment segment;
    segment.placeholder = true;
    const std::size_t semicolon = inner.find(';');
    segment.text = inner.substr(0, semicolon);
    const std::optional<PlaceholderSpec> spec = findPlaceholder(segment.text);
    if (!spec) {
      fail(line, "unknown placeholder [[" + segment.text + "]]; expected one of " +
                     placeholderList());
    }
    if (!allowedIn(spec->scope, section)) {
      fail(line, "the placeholder [[" + segment.text + "]] cannot be used in the '" +
                     kSectionNames[static_cast<int>(section)] + "' section");
    }
    if (semicolon != std::string::npos) {
      const std::string digits = inner.substr(semicolon + 1);
      if (!spec->numeric) fail(line, "[[" + segment.text + "]] is not a number; it takes no decimals");
      if (digits.empty() || digits.size() > 2 ||
          digits.find_first_not_of("0123456789") != std::string::npos ||
          std::stoi(digits) > kMaxDecimals) {
        fail(line, "expected [[" + segment.text + ";D]] with D from 0 to " +
                       std::to_string(kMaxDecimals) + " decimals, found '" + digits + "'");
      }
      segment.decimals = std::stoi(digits);
    }
    return segment;
  }

  ProgramTemplate::Line line(std::string_view text, Section section, int number) const {
    ProgramTemplate::Line line;
    line.number = number;
    int cautions = 0;
    std::size_t at = 0;
    while (at < text.size()) {
      const std::size_t open = text.find("[[", at);
      if (open == std::string_view::npos) {
        line.segments.push_back({std::string(text.substr(at)), false, std::nullopt});
        break;
      }
      if (open > at) line.segments.push_back({std::string(text.substr(at, open - at)), false, std::nullopt});
      const std::size_t close = text.find("]]", open + 2);
      if (close == std::string_view::npos) {
        fail(number, "'[[' at column " + std::to_string(open + 1) +
                         " has no closing ']]'; write [[open]] for a literal '[['");
      }
      line.segments.push_back(
          placeholder(std::string(text.substr(open + 2, close - open - 2)), section, number));
      if (line.segments.back().text == "caution") ++cautions;
      at = close + 2;
    }
    const auto placeholders = std::count_if(line.segments.begin(), line.segments.end(),
                                            [](const auto& segment) { return segment.placeholder; });
    if (cautions > 0 && placeholders > 1) {
      fail(number, "[[caution]] must be the only placeholder on its line");
    }
    return line;
  }

  [[noreturn]] void fail(int line, const std::string& message) const {
    throw InputError(file_, line, message);
  }

 private:
  const std::string& file_;
};

/// What a record-level placeholder renders from.
struct RenderContext {
  const Program& program;
  FileQuantities quantities;
  std::vector<std::string> caution;
  const planner::ProgramRecord* record = nullptr;
  std::size_t number = 0;  ///< 1-based record number
};

class Renderer {
 public:
  Renderer(const std::string& file, RenderContext& context) : file_(file), context_(context) {}

  void line(const ProgramTemplate::Line& line, std::string& out) const {
    for (const ProgramTemplate::Segment& segment : line.segments) {
      if (segment.placeholder && segment.text == "caution") {
        for (const std::string& caution : context_.caution) out += withCaution(line, caution);
        return;
      }
    }
    for (const ProgramTemplate::Segment& segment : line.segments) {
      out += segment.placeholder ? value(segment, line.number) : segment.text;
    }
    out += '\n';
  }

 private:
  static std::string withCaution(const ProgramTemplate::Line& line, const std::string& caution) {
    std::string text;
    for (const ProgramTemplate::Segment& segment : line.segments) {
      text += segment.placeholder ? caution : segment.text;
    }
    return text + '\n';
  }

  [[noreturn]] void fail(int line, const std::string& message) const {
    throw InputError(file_, line, message);
  }

  std::string number(const ProgramTemplate::Segment& segment, double si_value,
                     const QuantityFormat& format) const {
    return formatFixed(si_value * format.scale, segment.decimals.value_or(format.decimals));
  }

  std::string value(const ProgramTemplate::Segment& segment, int line) const {
    const std::string& name = segment.text;
    const planner::ProgramMetadata& meta = context_.program.metadata;
    const FileQuantities& q = context_.quantities;
    if (name == "job") return meta.job;
    if (name == "arm") return meta.arm;
    if (name == "generator") return meta.generator;
    if (name == "seed") return std::to_string(meta.seed);
    if (name == "record_count") return std::to_string(context_.program.records.size());
    if (name == "cycle_time") return number(segment, planner::cycleTime(context_.program), q.time);
    if (name == "length_unit") return q.length.unit;
    if (name == "angle_unit") return q.angle.unit;
    if (name == "open") return "[[";
    if (name == "n") return std::to_string(context_.number);
    if (const auto* event = std::get_if<ProcessEvent>(context_.record)) {
      if (name == "seam") return event->seam;
      if (name == "set") return event->parameter_set;
      return number(segment, event->time, q.time);  // "time", the only one left
    }
    return motionValue(segment, std::get<MotionRecord>(*context_.record), line);
  }

  std::string motionValue(const ProgramTemplate::Segment& segment, const MotionRecord& motion,
                          int line) const {
    const std::string& name = segment.text;
    const FileQuantities& q = context_.quantities;
    const std::string record = "record " + std::to_string(context_.number) + " (" +
                               toString(motion.kind) + ")";
    if (name == "seam") return motion.seam;
    if (name == "tool") return motion.tool;
    if (name == "frame") return motion.frame;
    if (name == "branch") return motion.branch;
    if (name == "start") return number(segment, motion.start_time, q.time);
    if (name == "duration") return number(segment, motion.duration, q.time);
    if (name == "end") return number(segment, motion.start_time + motion.duration, q.time);
    if (name == "blend") return number(segment, motion.blend_radius, q.length);
    if (isViaName(name)) {
      // Only the circular-move section takes via placeholders, and
      // checkProgram() made sure every circular move has its via point.
      const std::string via_name = name.substr(kViaPrefix.size());
      if (std::optional<std::string> via =
              pointValue(segment, via_name, motion.via->q_via, motion.via->X_RV, line)) {
        return *via;
      }
      throw std::logic_error("the template parser let through the placeholder [[" + name + "]]");
    }
    if (std::optional<std::string> point = pointValue(segment, name, motion.q, motion.X_RT, line)) {
      return *point;
    }
    const bool tcp = motion.speed.kind == planner::SpeedKind::kTcpSpeed;
    if (name == "tcp_speed" || name == "joint_speed") {
      if (tcp != (name == "tcp_speed")) {
        fail(line, "[[" + name + "]] is not set for " + record + ", which has " +
                       (tcp ? "a TCP speed; use [[tcp_speed]]" : "a joint speed fraction; use [[joint_speed]]"));
      }
      return tcp ? number(segment, motion.speed.value, q.speed)
                 : number(segment, motion.speed.value, q.fraction);
    }
    const std::optional<double>& measured =
        name == "clearance" ? motion.clearance : motion.singularity_margin;
    if (!measured) fail(line, "[[" + name + "]] is not known for " + record);
    return number(segment, *measured, name == "clearance" ? q.length : q.angle);
  }

  /// joints, j1 … j8, x, y, z, qw, qx, qy, qz of one point of the path (the
  /// target or the via); nullopt for any other name.
  std::optional<std::string> pointValue(const ProgramTemplate::Segment& segment,
                                        const std::string& name, const kinematics::JointVector& q_point,
                                        const Eigen::Isometry3d& X_RP, int line) const {
    const FileQuantities& q = context_.quantities;
    const std::vector<planner::ProgramJoint>& joints = context_.program.metadata.joints;
    if (name == "joints") {
      std::string list;
      for (int i = 0; i < q_point.size(); ++i) {
        list += (i > 0 ? "," : "") + number(segment, q_point[i], q.joint(joints[i].type));
      }
      return list;
    }
    if (const std::optional<int> index = jointIndex(name)) {
      if (*index >= q_point.size()) {
        fail(line, "[[" + segment.text + "]] names joint " + std::to_string(*index + 1) +
                       " but the arm has " + std::to_string(q_point.size()) + " joints");
      }
      return number(segment, q_point[*index], q.joint(joints[*index].type));
    }
    const Eigen::Vector3d p_RP = X_RP.translation();
    if (name == "x") return number(segment, p_RP.x(), q.length);
    if (name == "y") return number(segment, p_RP.y(), q.length);
    if (name == "z") return number(segment, p_RP.z(), q.length);
    const Eigen::Quaterniond orientation = canonicalQuaternion(X_RP);
    if (name == "qw") return number(segment, orientation.w(), q.quaternion);
    if (name == "qx") return number(segment, orientation.x(), q.quaternion);
    if (name == "qy") return number(segment, orientation.y(), q.quaternion);
    if (name == "qz") return number(segment, orientation.z(), q.quaternion);
    return std::nullopt;
  }

  const std::string& file_;
  RenderContext& context_;
};

Section sectionFor(const planner::ProgramRecord& record) {
  if (const auto* motion = std::get_if<MotionRecord>(&record)) {
    switch (motion->kind) {
      case planner::MotionKind::kJointMove: return Section::kJointMove;
      case planner::MotionKind::kLinearMove: return Section::kLinearMove;
      case planner::MotionKind::kCircularMove: return Section::kCircularMove;
    }
  }
  return std::get<ProcessEvent>(record).kind == planner::ProcessEventKind::kStart
             ? Section::kProcessOn
             : Section::kProcessOff;
}

}  // namespace

ProgramTemplate ProgramTemplate::parse(std::string_view text, const std::string& file) {
  ProgramTemplate result;
  result.file_ = file;
  const TemplateParser parser(result.file_);
  std::optional<Section> section;
  int number = 0;
  std::size_t start = 0;
  while (start < text.size()) {
    const std::size_t end = std::min(text.find('\n', start), text.size());
    std::string_view line = text.substr(start, end - start);
    start = end + 1;
    ++number;
    if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
    if (line.substr(0, 3) == "@@#") continue;
    if (line.substr(0, 2) == "@@") {
      std::string name(line.substr(2));
      name.erase(0, name.find_first_not_of(' '));
      name.erase(name.find_last_not_of(' ') + 1);
      const auto found = std::find(kSectionNames.begin(), kSectionNames.end(), name);
      if (found == kSectionNames.end()) {
        parser.fail(number, "unknown section '@@ " + name +
                                "'; expected header, joint-move, linear-move, circular-move, "
                                "process-on, process-off or footer");
      }
      section = static_cast<Section>(found - kSectionNames.begin());
      auto& lines = result.sections_[static_cast<int>(*section)];
      if (lines) parser.fail(number, "the section '@@ " + name + "' is given twice");
      lines.emplace();
      continue;
    }
    if (!section) {
      if (line.find_first_not_of(' ') == std::string_view::npos) continue;
      parser.fail(number, "text before the first section; expected a line '@@ header'");
    }
    result.sections_[static_cast<int>(*section)]->push_back(parser.line(line, *section, number));
  }
  const auto& header = result.sections_[static_cast<int>(Section::kHeader)];
  if (!header) parser.fail(1, "the template has no '@@ header' section");
  const bool has_caution = std::any_of(header->begin(), header->end(), [](const Line& line) {
    return std::any_of(line.segments.begin(), line.segments.end(), [](const Segment& segment) {
      return segment.placeholder && segment.text == "caution";
    });
  });
  if (!has_caution) {
    parser.fail(1, "the header must hold [[caution]] so that every program carries the "
                   "safety caution (e.g. a comment line '; [[caution]]')");
  }
  return result;
}

ProgramTemplate ProgramTemplate::load(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(path, 0, "cannot open the template file for reading");
  std::ostringstream text;
  text << in.rdbuf();
  return parse(text.str(), path);
}

void ProgramTemplate::render(const Program& program, std::ostream& out) const {
  planner::checkProgram(program, "program for template " + file_);
  RenderContext context{program, fileQuantities(program.metadata.units), safetyCaution(program)};
  const Renderer renderer(file_, context);
  std::string text;
  const auto section = [&](Section which) -> const std::optional<std::vector<Line>>& {
    return sections_[static_cast<int>(which)];
  };
  for (const Line& line : *section(Section::kHeader)) renderer.line(line, text);
  for (std::size_t i = 0; i < program.records.size(); ++i) {
    const Section which = sectionFor(program.records[i]);
    if (!section(which)) {
      throw InputError(file_, 0, "the template has no '@@ " +
                                     std::string(kSectionNames[static_cast<int>(which)]) +
                                     "' section but record " + std::to_string(i + 1) +
                                     " needs one");
    }
    context.record = &program.records[i];
    context.number = i + 1;
    for (const Line& line : *section(which)) renderer.line(line, text);
  }
  if (section(Section::kFooter)) {
    for (const Line& line : *section(Section::kFooter)) renderer.line(line, text);
  }
  out << text;
}

}  // namespace tw::postproc
