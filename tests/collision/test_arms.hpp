#pragma once

#include <string>
#include <vector>

#include "kinematics/arm_model.hpp"
#include "kinematics/link_geometry.hpp"

namespace tw::collision::test {

/// Small invented arms and shapes for collision tests, lengths [m].

kinematics::LinkShape sphereShape(double radius, const Eigen::Vector3d& center);
kinematics::LinkShape boxShape(const Eigen::Vector3d& size, const Eigen::Vector3d& center);
kinematics::LinkShape cylinderShape(double radius, double length, const Eigen::Isometry3d& X_PS);
kinematics::LinkShape meshShape(const std::string& path, const Eigen::Isometry3d& X_PS);

/// One prismatic joint "slide" along the base x axis (±2 m) carrying the
/// link "carriage" with `shapes`; the flange is at the carriage origin,
/// axes aligned with the base. The base (link "base") carries `base_shapes`.
kinematics::ArmModel sliderArm(const std::vector<kinematics::LinkShape>& shapes,
                               const std::vector<kinematics::LinkShape>& base_shapes = {});

/// Revolute joints about z, each `spacing` along the previous link's x
/// axis (the first at the base origin), ±π; link i carries shapes[i]
/// (shapes[0] is the base).
kinematics::ArmModel planarArm(const std::vector<std::vector<kinematics::LinkShape>>& shapes,
                               double spacing);

}  // namespace tw::collision::test
