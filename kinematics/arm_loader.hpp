#pragma once

#include <string>

#include "kinematics/arm_model.hpp"

namespace tw::kinematics {

/// Loads an arm description file (the project's own XML format, documented in
/// kinematics/ARM_FORMAT.md; lengths in mm and angles in degrees in the file,
/// SI in the model). The file describes the chain in one of three ways:
/// <ortho-parallel> parameters, an explicit <serial-chain>, or a <urdf>
/// reference. Relative file references resolve against the file's folder.
///
/// Throws tw::InputError naming the file, the line and what was expected for
/// every problem: missing file, unknown element or attribute, missing or
/// non-numeric value, negative length, min limit above max, a repeated joint
/// name, unknown joint type, unknown units, an unreadable URDF.
ArmModel loadArmDescription(const std::string& path);

}  // namespace tw::kinematics
