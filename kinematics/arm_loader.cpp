#include "kinematics/arm_loader.hpp"

#include <map>
#include <set>

#include "kinematics/common/xml_file.hpp"
#include "kinematics/urdf_chain.hpp"
#include "kinematics/xml_values.hpp"

namespace tw::kinematics {
namespace {

using Element = tinyxml2::XMLElement;

/// Reads one description file; keeps the file open for located errors.
class ArmFileReader {
 public:
  explicit ArmFileReader(const std::string& path) : file_(path) {}

  ArmModel read() {
    const Element& root = file_.root("arm-description");
    file_.allowOnly(root, {"format-version", "name", "length-unit", "angle-unit"},
                    {"ortho-parallel", "joints", "serial-chain", "urdf", "flange", "link-geometry"});
    checkFormatHeader(file_, root, false);

    ArmDescription arm;
    arm.name = file_.text(root, "name");
    arm.source = file_.path();

    const Element* ortho = file_.optionalChild(root, "ortho-parallel");
    const Element* chain = file_.optionalChild(root, "serial-chain");
    const Element* urdf = file_.optionalChild(root, "urdf");
    if ((ortho != nullptr) + (chain != nullptr) + (urdf != nullptr) != 1) {
      file_.fail(root, "expected exactly one of <ortho-parallel>, <serial-chain> or <urdf>");
    }
    if (ortho != nullptr) readOrthoParallel(root, *ortho, arm);
    if (chain != nullptr) readSerialChain(root, *chain, arm);
    if (urdf != nullptr) readUrdf(root, *urdf, arm);

    if (const Element* flange = file_.optionalChild(root, "flange")) {
      file_.allowOnly(*flange, {"xyz", "rpy", "quaternion"});
      arm.X_LF = arm.X_LF * readPose(file_, *flange);
    }
    if (const Element* geometry = file_.optionalChild(root, "link-geometry")) {
      readLinkGeometry(*geometry, static_cast<int>(arm.joints.size()), arm);
    }
    return ArmModel(std::move(arm));
  }

 private:
  double length(const Element& element, const char* attribute) const {
    return kMmToM * file_.number(element, attribute);
  }

  /// Reads limits, velocity and acceleration in file units into `joint`,
  /// whose type must already be set, and checks them.
  void readMotionLimits(const Element& element, JointSpec& joint, bool limits_in_file) const {
    const bool revolute = joint.type == JointType::kRevolute;
    const double position_scale = revolute ? kDegToRad : kMmToM;
    if (limits_in_file) {
      joint.lower = position_scale * file_.number(element, "min");
      joint.upper = position_scale * file_.number(element, "max");
      joint.max_velocity = position_scale * file_.number(element, "max-velocity");
    }
    joint.max_acceleration = position_scale * file_.number(element, "max-acceleration");
    if (std::optional<std::string> problem = jointProblem(joint)) file_.fail(element, *problem);
  }

  /// The name of a joint entry; a name already in `names` is an error at this
  /// entry (ArmModel would reject it too, but without the line).
  std::string jointName(const Element& entry, std::set<std::string>& names) const {
    std::string name = file_.text(entry, "name");
    if (!names.insert(name).second) file_.fail(entry, "joint name '" + name + "' is repeated");
    return name;
  }

  /// The <joints> list: one entry per joint name, in order.
  std::vector<const Element*> jointEntries(const Element& root, std::size_t expected) const {
    const Element& list = file_.child(root, "joints");
    file_.allowOnly(list, {}, {"joint"});
    std::vector<const Element*> entries;
    for (const Element* joint = list.FirstChildElement("joint"); joint != nullptr;
         joint = joint->NextSiblingElement("joint")) {
      entries.push_back(joint);
    }
    if (expected != 0 && entries.size() != expected) {
      file_.fail(list, "expected " + std::to_string(expected) + " <joint> entries, found " +
                           std::to_string(entries.size()));
    }
    return entries;
  }

  void readOrthoParallel(const Element& root, const Element& element, ArmDescription& arm) const {
    file_.allowOnly(element, {"a1", "a2", "b", "c1", "c2", "c3", "c4"});
    OrthoParallelGeometry geometry;
    geometry.a1 = length(element, "a1");
    geometry.a2 = length(element, "a2");
    geometry.b = length(element, "b");
    geometry.c1 = length(element, "c1");
    geometry.c2 = length(element, "c2");
    geometry.c3 = length(element, "c3");
    geometry.c4 = length(element, "c4");

    std::vector<JointSpec> limits(6);
    const std::vector<const Element*> entries = jointEntries(root, 6);
    std::set<std::string> names;
    for (int i = 0; i < 6; ++i) {
      const Element& entry = *entries[i];
      file_.allowOnly(entry, {"name", "min", "max", "max-velocity", "max-acceleration", "sign",
                              "zero-offset"});
      limits[i].name = jointName(entry, names);
      readMotionLimits(entry, limits[i], true);
      geometry.sign[i] = file_.optionalNumber(entry, "sign").value_or(1.0);
      geometry.zero_offset[i] = kDegToRad * file_.optionalNumber(entry, "zero-offset").value_or(0.0);
      if (geometry.sign[i] != 1.0 && geometry.sign[i] != -1.0) {
        file_.fail(entry, "sign must be 1 or -1");
      }
    }
    if (std::optional<std::string> problem = orthoParallelProblem(geometry)) {
      file_.fail(element, *problem);
    }
    arm.joints = orthoParallelChain(geometry, limits);
    arm.X_LF = orthoParallelFlange(geometry);
    arm.ortho_parallel = geometry;
  }

  void readSerialChain(const Element& root, const Element& element, ArmDescription& arm) const {
    file_.allowOnly(element, {}, {"joint"});
    if (file_.optionalChild(root, "joints") != nullptr) {
      file_.fail(root, "<joints> is not used with <serial-chain>; limits go on its <joint> entries");
    }
    std::set<std::string> names;
    for (const Element* entry = element.FirstChildElement("joint"); entry != nullptr;
         entry = entry->NextSiblingElement("joint")) {
      file_.allowOnly(*entry, {"name", "type", "xyz", "rpy", "quaternion", "axis", "min", "max",
                               "max-velocity", "max-acceleration"});
      JointSpec joint;
      joint.name = jointName(*entry, names);
      joint.type = file_.choice(*entry, "type", {"revolute", "prismatic"}) == 0
                       ? JointType::kRevolute
                       : JointType::kPrismatic;
      joint.X_PJ = readPose(file_, *entry);
      joint.axis = file_.triple(*entry, "axis");
      if (joint.axis.norm() < 1e-9) file_.fail(*entry, "axis must not be zero");
      readMotionLimits(*entry, joint, true);
      arm.joints.push_back(joint);
    }
    if (arm.joints.empty()) file_.fail(element, "expected at least one <joint>");
  }

  void readUrdf(const Element& root, const Element& element, ArmDescription& arm) const {
    file_.allowOnly(element, {"file", "base-link", "tip-link"});
    const std::string path = resolvePath(file_, file_.text(element, "file"));
    UrdfChain chain =
        loadUrdfChain(path, file_.text(element, "base-link"), file_.text(element, "tip-link"));
    const std::vector<const Element*> entries = jointEntries(root, chain.joints.size());
    std::set<std::string> names;
    for (std::size_t i = 0; i < entries.size(); ++i) {
      file_.allowOnly(*entries[i], {"name", "max-acceleration"});
      const std::string name = jointName(*entries[i], names);
      if (name != chain.joints[i].name) {
        file_.fail(*entries[i], "expected joint '" + chain.joints[i].name +
                                    "' here (the URDF chain's order), found '" + name + "'");
      }
      readMotionLimits(*entries[i], chain.joints[i], false);
    }
    arm.joints = std::move(chain.joints);
    arm.X_LF = chain.X_LF;
  }

  void readLinkGeometry(const Element& element, int joint_count, ArmDescription& arm) const {
    file_.allowOnly(element, {}, {"link"});
    arm.links.assign(joint_count + 1, LinkGeometry{});
    arm.links[0].name = "base";
    for (int i = 1; i <= joint_count; ++i) arm.links[i].name = arm.joints[i - 1].name;
    std::vector<bool> seen(joint_count + 1, false);
    for (const Element* link = element.FirstChildElement("link"); link != nullptr;
         link = link->NextSiblingElement("link")) {
      file_.allowOnly(*link, {"index"}, {"mesh", "box", "cylinder", "sphere", "capsule"});
      const double index = file_.number(*link, "index");
      // Range first: converting a double beyond int's range to int is undefined.
      if (index < 0 || index > joint_count || index != static_cast<int>(index)) {
        file_.fail(*link, "index must be an integer from 0 (base) to " + std::to_string(joint_count));
      }
      if (seen[static_cast<int>(index)]) file_.fail(*link, "link index repeated");
      seen[static_cast<int>(index)] = true;
      for (const Element* shape = link->FirstChildElement(); shape != nullptr;
           shape = shape->NextSiblingElement()) {
        arm.links[static_cast<int>(index)].shapes.push_back(readShape(file_, *shape));
      }
    }
  }

  XmlFile file_;
};

}  // namespace

ArmModel loadArmDescription(const std::string& path) { return ArmFileReader(path).read(); }

}  // namespace tw::kinematics
