#include "kinematics/xml_values.hpp"

#include <cmath>
#include <fstream>
#include <sstream>

#include "kinematics/common/number_text.hpp"
#include "kinematics/common/rotations.hpp"
#include "kinematics/urdf_chain.hpp"

namespace tw::kinematics {

using tinyxml2::XMLElement;

void checkFormatHeader(const XmlFile& file, const XMLElement& root, bool with_time) {
  const double version = file.number(root, "format-version");
  if (version != kFormatVersion) {
    file.fail(root, "format-version " + file.text(root, "format-version") +
                        " is not supported; this build reads version 1");
  }
  if (file.text(root, "length-unit") != "mm") file.fail(root, "length-unit must be \"mm\"");
  if (file.text(root, "angle-unit") != "deg") file.fail(root, "angle-unit must be \"deg\"");
  if (with_time && file.text(root, "time-unit") != "s") {
    file.fail(root, "time-unit must be \"s\"");
  }
}

std::vector<double> readNumbers(const XmlFile& file, const XMLElement& element,
                                const char* attribute, std::size_t count) {
  const std::string text = file.text(element, attribute);
  std::istringstream words(text);
  std::vector<double> values;
  std::string word;
  while (words >> word) {
    const std::optional<double> value = parseNumber(word);
    if (!value) {
      file.fail(element, std::string("attribute '") + attribute + "': \"" + word +
                             "\" is not a finite number");
    }
    values.push_back(*value);
  }
  if (values.size() != count) {
    file.fail(element, std::string("attribute '") + attribute + "' = \"" + text + "\" must be " +
                           std::to_string(count) + " numbers separated by spaces, found " +
                           std::to_string(values.size()));
  }
  return values;
}

Eigen::Isometry3d readPose(const XmlFile& file, const XMLElement& element) {
  Eigen::Isometry3d X = Eigen::Isometry3d::Identity();
  X.translation() = kMmToM * file.optionalTriple(element, "xyz").value_or(Eigen::Vector3d::Zero());
  const std::optional<Eigen::Vector3d> rpy = file.optionalTriple(element, "rpy");
  const bool has_quaternion = element.Attribute("quaternion") != nullptr;
  if (rpy && has_quaternion) {
    file.fail(element, "give the orientation as either rpy or quaternion, not both");
  }
  if (rpy) X.linear() = rotationFromRollPitchYaw(kDegToRad * *rpy);
  if (has_quaternion) {
    const std::vector<double> q = readNumbers(file, element, "quaternion", 4);
    const Eigen::Quaterniond quaternion(q[0], q[1], q[2], q[3]);
    // Files carry about 7 significant digits; a larger error is a typo, not rounding.
    if (std::abs(quaternion.norm() - 1.0) > 1e-6) {
      file.fail(element, "quaternion=\"w x y z\" must have unit length (within 1e-6)");
    }
    X.linear() = quaternion.normalized().toRotationMatrix();
  }
  return X;
}

double readLength(const XmlFile& file, const XMLElement& element, const char* attribute,
                  bool allow_zero) {
  const double value = kMmToM * file.number(element, attribute);
  if (value < 0.0 || (!allow_zero && value == 0.0)) {
    file.fail(element, std::string(attribute) + (allow_zero ? " must be ≥ 0" : " must be > 0"));
  }
  return value;
}

double readLengthOr(const XmlFile& file, const XMLElement& element, const char* attribute,
                    double fallback, bool allow_zero) {
  if (element.Attribute(attribute) == nullptr) return fallback;
  return readLength(file, element, attribute, allow_zero);
}

std::string resolvePath(const XmlFile& file, const std::string& reference) {
  return !reference.empty() && reference.front() == '/' ? reference
                                                        : file.directory() + "/" + reference;
}

LinkShape readShape(const XmlFile& file, const XMLElement& element) {
  using Kind = LinkShape::Kind;
  LinkShape shape;
  const std::string kind = element.Name();
  if (kind == "mesh") {
    file.allowOnly(element, {"file", "unit", "xyz", "rpy", "quaternion"});
    shape.kind = Kind::kMesh;
    shape.mesh_path = resolvePath(file, file.text(element, "file"));
    // Only opened here; the collision module reads it, but a wrong name is
    // reported now, at its line.
    if (!std::ifstream(shape.mesh_path)) {
      file.fail(element, "cannot open the mesh file '" + shape.mesh_path + "'");
    }
    shape.mesh_scale = file.choice(element, "unit", {"mm", "m"}) == 0 ? kMmToM : 1.0;
  } else if (kind == "box") {
    file.allowOnly(element, {"size", "xyz", "rpy", "quaternion"});
    shape.kind = Kind::kBox;
    shape.box_size = kMmToM * file.triple(element, "size");
    if ((shape.box_size.array() <= 0.0).any()) file.fail(element, "every size must be > 0");
  } else if (kind == "sphere") {
    file.allowOnly(element, {"radius", "xyz", "rpy", "quaternion"});
    shape.kind = Kind::kSphere;
    shape.radius = readLength(file, element, "radius");
  } else if (kind == "cylinder" || kind == "capsule") {
    file.allowOnly(element, {"radius", "length", "xyz", "rpy", "quaternion"});
    shape.kind = kind == "cylinder" ? Kind::kCylinder : Kind::kCapsule;
    shape.radius = readLength(file, element, "radius");
    shape.length = readLength(file, element, "length");
  } else {
    file.fail(element, "unknown shape; expected one of: mesh, box, cylinder, sphere, capsule");
  }
  shape.X_LS = readPose(file, element);
  return shape;
}

}  // namespace tw::kinematics
