#include "kinematics/urdf_chain.hpp"

#include <cstring>
#include <map>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/rotations.hpp"
#include "kinematics/common/xml_file.hpp"

namespace tw::kinematics {
namespace {


Eigen::Isometry3d originOf(const XmlFile& file, const tinyxml2::XMLElement& joint) {
  Eigen::Isometry3d X = Eigen::Isometry3d::Identity();
  if (const tinyxml2::XMLElement* origin = file.optionalChild(joint, "origin")) {
    X.translation() = file.optionalTriple(*origin, "xyz").value_or(Eigen::Vector3d::Zero());
    X.linear() = rotationFromRollPitchYaw(
        file.optionalTriple(*origin, "rpy").value_or(Eigen::Vector3d::Zero()));
  }
  return X;
}

}  // namespace

UrdfChain loadUrdfChain(const std::string& path, const std::string& base_link,
                        const std::string& tip_link) {
  const XmlFile file(path);
  const tinyxml2::XMLElement& robot = file.root("robot");

  std::map<std::string, const tinyxml2::XMLElement*> joint_by_child;
  bool base_found = false;
  bool tip_found = false;
  for (const tinyxml2::XMLElement* link = robot.FirstChildElement("link"); link != nullptr;
       link = link->NextSiblingElement("link")) {
    const std::string name = file.text(*link, "name");
    base_found = base_found || name == base_link;
    tip_found = tip_found || name == tip_link;
  }
  if (!base_found) file.fail(robot, "no <link name=\"" + base_link + "\"> (the base link)");
  if (!tip_found) file.fail(robot, "no <link name=\"" + tip_link + "\"> (the tip link)");
  for (const tinyxml2::XMLElement* joint = robot.FirstChildElement("joint"); joint != nullptr;
       joint = joint->NextSiblingElement("joint")) {
    const std::string child = file.text(file.child(*joint, "child"), "link");
    if (!joint_by_child.emplace(child, joint).second) {
      file.fail(*joint, "link '" + child + "' is the child of more than one joint");
    }
  }

  // Walk from the tip up to the base, then read the joints base-first.
  std::vector<const tinyxml2::XMLElement*> path_up;
  for (std::string link = tip_link; link != base_link;) {
    const auto found = joint_by_child.find(link);
    if (found == joint_by_child.end() || path_up.size() > joint_by_child.size()) {
      file.fail(robot, "link '" + tip_link + "' does not descend from link '" + base_link + "'");
    }
    path_up.push_back(found->second);
    link = file.text(file.child(*found->second, "parent"), "link");
  }

  UrdfChain chain;
  Eigen::Isometry3d pending = Eigen::Isometry3d::Identity();
  for (auto it = path_up.rbegin(); it != path_up.rend(); ++it) {
    const tinyxml2::XMLElement& element = **it;
    const int type =
        file.choice(element, "type", {"fixed", "revolute", "continuous", "prismatic"});
    pending = pending * originOf(file, element);
    if (type == 0) continue;

    JointSpec joint;
    joint.name = file.text(element, "name");
    joint.type = type == 3 ? JointType::kPrismatic : JointType::kRevolute;
    joint.X_PJ = pending;
    pending.setIdentity();
    joint.axis = Eigen::Vector3d::UnitX();  // the URDF default axis
    if (const tinyxml2::XMLElement* axis = file.optionalChild(element, "axis")) {
      joint.axis = file.triple(*axis, "xyz");
      if (joint.axis.norm() < 1e-9) file.fail(*axis, "axis must not be zero");
      joint.axis.normalize();
    }
    const tinyxml2::XMLElement* limit = file.optionalChild(element, "limit");
    if (limit == nullptr) file.fail(element, "missing <limit> (velocity and, unless continuous, lower/upper)");
    joint.max_velocity = file.number(*limit, "velocity");
    if (type == 2) {
      joint.lower = -2 * kPi;
      joint.upper = 2 * kPi;
    } else {
      joint.lower = file.number(*limit, "lower");
      joint.upper = file.number(*limit, "upper");
      if (joint.lower > joint.upper) file.fail(*limit, "lower limit is above the upper limit");
    }
    if (joint.max_velocity <= 0.0) file.fail(*limit, "velocity must be greater than 0");
    chain.joints.push_back(joint);
  }
  if (chain.joints.empty()) {
    file.fail(robot, "no moving joint between '" + base_link + "' and '" + tip_link + "'");
  }
  chain.X_LF = pending;
  return chain;
}

}  // namespace tw::kinematics
