#pragma once

#include <Eigen/Geometry>
#include <string>
#include <vector>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/xml_file.hpp"
#include "kinematics/link_geometry.hpp"

namespace tw::kinematics {

/// Reading helpers shared by the arm, cell and job loaders. Files are in mm and
/// degrees; results are SI. Every problem throws tw::InputError located at
/// the element (through XmlFile::fail).

inline constexpr double kMmToM = 0.001;
inline constexpr double kDegToRad = kPi / 180.0;
inline constexpr int kFormatVersion = 1;

/// Checks format-version="1", length-unit="mm", angle-unit="deg" on a root
/// element, and time-unit="s" when `with_time` is set.
void checkFormatHeader(const XmlFile& file, const tinyxml2::XMLElement& root,
                       bool with_time);

/// A pose from xyz="x y z" [mm] and at most one orientation: rpy="r p y"
/// [deg] (about the fixed x, then y, then z axes: R = Rz·Ry·Rx) or
/// quaternion="w x y z" (unit length within 1e-6). Missing parts are zero.
Eigen::Isometry3d readPose(const XmlFile& file, const tinyxml2::XMLElement& element);

/// Exactly `count` finite numbers separated by spaces.
std::vector<double> readNumbers(const XmlFile& file,
                                const tinyxml2::XMLElement& element, const char* attribute,
                                std::size_t count);

/// A length in mm that must be > 0 (or ≥ 0 when `allow_zero`), returned in m.
double readLength(const XmlFile& file, const tinyxml2::XMLElement& element,
                  const char* attribute, bool allow_zero = false);
/// The same when present, else `fallback` [m].
double readLengthOr(const XmlFile& file, const tinyxml2::XMLElement& element,
                    const char* attribute, double fallback, bool allow_zero = false);

/// A shape element: <mesh file="..." unit="mm|m"/>, <box size="x y z"/>,
/// <cylinder radius length/>, <sphere radius/> or <capsule radius length/>,
/// each with an optional pose (see readPose) in the frame it is attached to.
/// Relative mesh paths resolve against the file's folder; a mesh file that
/// cannot be opened is an error at the element.
LinkShape readShape(const XmlFile& file,
                                const tinyxml2::XMLElement& element);

/// A file reference resolved against the folder of `file`.
std::string resolvePath(const XmlFile& file, const std::string& reference);

}  // namespace tw::kinematics
