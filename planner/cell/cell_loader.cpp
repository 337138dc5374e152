#include "planner/cell/cell_loader.hpp"

#include <array>
#include <charconv>
#include <set>

#include "kinematics/arm_loader.hpp"
#include "kinematics/common/xml_file.hpp"
#include "kinematics/xml_values.hpp"

namespace tw::planner {
namespace {

// The shared XML readers and unit constants (kinematics/xml_values.hpp).
using namespace kinematics;
using tinyxml2::XMLElement;

/// Shortest text that reads back as `value`, independent of the locale.
std::string numberText(double value) {
  std::array<char, 32> buffer{};
  const std::to_chars_result result =
      std::to_chars(buffer.data(), buffer.data() + buffer.size(), value);
  return std::string(buffer.data(), result.ptr);
}

/// Reads one cell file; keeps it open for located errors.
class CellFileReader {
 public:
  explicit CellFileReader(const std::string& path) : file_(path) {}

  Cell read() {
    const XMLElement& root = file_.root("cell");
    file_.allowOnly(root, {"format-version", "name", "length-unit", "angle-unit"},
                    {"arm", "home", "frames", "tool", "fixture", "workpiece", "obstacle"});
    checkFormatHeader(file_, root, false);

    const XMLElement& arm_element = file_.child(root, "arm");
    file_.allowOnly(arm_element, {"file", "frame"});
    kinematics::ArmModel arm =
        kinematics::loadArmDescription(resolvePath(file_, file_.text(arm_element, "file")));

    FrameTree frames = readFrames(root);
    const std::string arm_frame = knownFrame(frames, arm_element);
    std::vector<Tool> tools = readTools(root);
    std::vector<CellBody> bodies = readBodies(root, frames);
    kinematics::JointVector home = readHome(file_.child(root, "home"), arm);
    return Cell{file_.text(root, "name"), file_.path(),     std::move(arm),    arm_frame,
                std::move(frames),        std::move(tools), std::move(bodies), home};
  }

 private:
  std::string knownFrame(const FrameTree& frames, const XMLElement& element) const {
    const std::string name = file_.text(element, "frame");
    if (!frames.contains(name)) {
      file_.fail(element,
                 "unknown frame '" + name + "'; expected 'world' or a <frame> of <frames>");
    }
    return name;
  }

  FrameTree readFrames(const XMLElement& root) const {
    std::vector<FrameDefinition> definitions;
    if (const XMLElement* list = file_.optionalChild(root, "frames")) {
      file_.allowOnly(*list, {}, {"frame"});
      for (const XMLElement* frame = list->FirstChildElement("frame"); frame != nullptr;
           frame = frame->NextSiblingElement("frame")) {
        file_.allowOnly(*frame, {"name", "parent", "xyz", "rpy", "quaternion"});
        definitions.push_back(FrameDefinition{file_.text(*frame, "name"),
                                              file_.text(*frame, "parent"), readPose(file_, *frame),
                                              frame->GetLineNum()});
      }
    }
    return FrameTree(definitions, file_.path());
  }

  std::vector<Tool> readTools(const XMLElement& root) const {
    std::vector<Tool> tools;
    std::set<std::string> names;
    for (const XMLElement* element = root.FirstChildElement("tool"); element != nullptr;
         element = element->NextSiblingElement("tool")) {
      file_.allowOnly(*element, {"name", "symmetric", "spin-min", "spin-max", "tip-allowance"},
                      {"tcp", "mesh", "box", "cylinder", "sphere", "capsule"});
      Tool tool;
      tool.name = file_.text(*element, "name");
      tool.line = element->GetLineNum();
      if (!names.insert(tool.name).second) file_.fail(*element, "tool name repeated");
      tool.symmetric = file_.choice(*element, "symmetric", {"false", "true"}) == 1;
      // A symmetric tool may spin freely by default; an asymmetric one keeps
      // its x axis along travel unless the file allows a window.
      const double full_turn = tool.symmetric ? 180.0 : 0.0;
      tool.spin.min = kDegToRad * file_.optionalNumber(*element, "spin-min").value_or(-full_turn);
      tool.spin.max = kDegToRad * file_.optionalNumber(*element, "spin-max").value_or(full_turn);
      if (tool.spin.min > tool.spin.max) file_.fail(*element, "spin-min must not exceed spin-max");
      if (tool.spin.max - tool.spin.min > 2.0 * kPi + 1e-12) {
        file_.fail(*element, "the spin range may span at most 360 degrees");
      }
      tool.tip_allowance = readLengthOr(file_, *element, "tip-allowance", tool.tip_allowance);
      const XMLElement& tcp = file_.child(*element, "tcp");
      file_.allowOnly(tcp, {"xyz", "rpy", "quaternion"});
      tool.X_FT = readPose(file_, tcp);
      for (const XMLElement* shape = element->FirstChildElement(); shape != nullptr;
           shape = shape->NextSiblingElement()) {
        if (shape != &tcp) tool.shapes.push_back(readShape(file_, *shape));
      }
      tools.push_back(std::move(tool));
    }
    if (tools.empty()) file_.fail(root, "expected at least one <tool>");
    return tools;
  }

  std::vector<CellBody> readBodies(const XMLElement& root, const FrameTree& frames) const {
    std::vector<CellBody> bodies;
    std::set<std::string> names;
    for (const XMLElement* element = root.FirstChildElement(); element != nullptr;
         element = element->NextSiblingElement()) {
      const std::string kind = element->Name();
      CellBody body;
      if (kind == "fixture") {
        body.role = CellBody::Role::kFixture;
      } else if (kind == "workpiece") {
        body.role = CellBody::Role::kWorkpiece;
      } else if (kind == "obstacle") {
        body.role = CellBody::Role::kObstacle;
      } else {
        continue;
      }
      file_.allowOnly(*element, {"name", "frame"},
                      {"mesh", "box", "cylinder", "sphere", "capsule"});
      body.name = file_.text(*element, "name");
      body.frame = knownFrame(frames, *element);
      body.line = element->GetLineNum();
      if (!names.insert(body.name).second) file_.fail(*element, "body name repeated");
      for (const XMLElement* shape = element->FirstChildElement(); shape != nullptr;
           shape = shape->NextSiblingElement()) {
        body.shapes.push_back(readShape(file_, *shape));
      }
      if (body.shapes.empty()) file_.fail(*element, "expected at least one shape");
      bodies.push_back(std::move(body));
    }
    return bodies;
  }

  kinematics::JointVector readHome(const XMLElement& element,
                                   const kinematics::ArmModel& arm) const {
    file_.allowOnly(element, {"joints"});
    const std::vector<double> values =
        readNumbers(file_, element, "joints", static_cast<std::size_t>(arm.jointCount()));
    kinematics::JointVector home(arm.jointCount());
    for (int i = 0; i < arm.jointCount(); ++i) {
      const kinematics::JointSpec& joint = arm.joint(i);
      const bool revolute = joint.type == kinematics::JointType::kRevolute;
      home[i] = (revolute ? kDegToRad : kMmToM) * values[i];
      if (home[i] < joint.lower || home[i] > joint.upper) {
        const double scale = revolute ? 1.0 / kDegToRad : 1.0 / kMmToM;
        file_.fail(element, "home value " + std::to_string(i + 1) + " (joint '" + joint.name +
                                "') is outside the joint limits " +
                                numberText(scale * joint.lower) + " to " +
                                numberText(scale * joint.upper) + (revolute ? " deg" : " mm") +
                                " of arm '" + arm.name() + "'");
      }
    }
    return home;
  }

  XmlFile file_;
};

}  // namespace

Cell loadCell(const std::string& path) { return CellFileReader(path).read(); }

}  // namespace tw::planner
