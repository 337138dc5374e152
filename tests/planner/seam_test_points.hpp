#pragma once

#include <Eigen/Geometry>
#include <cmath>
#include <optional>
#include <vector>

#include "kinematics/common/angles.hpp"
#include "planner/job/seam_point.hpp"

namespace tw::planner::test {

/// A point list built in code, lines numbered from 2 like a CSV after its header.
inline SeamPointList pointList(const std::vector<Eigen::Vector3d>& positions,
                               const std::vector<Eigen::Vector3d>& normals,
                               const std::vector<Eigen::Vector3d>& second_normals = {}) {
  SeamPointList list;
  list.source = "test.csv";
  for (std::size_t i = 0; i < positions.size(); ++i) {
    SeamPoint point;
    point.p_XP = positions[i];
    point.normal = normals[i].normalized();
    if (!second_normals.empty()) point.second_normal = second_normals[i].normalized();
    point.line = static_cast<int>(i) + 2;
    list.points.push_back(point);
  }
  return list;
}

/// A fillet where a vertical pipe of `radius` [m] stands on a floor: points
/// every `step_deg` around a quarter circle, floor normal +z, pipe normal
/// radially outwards.
inline SeamPointList pipeFillet(double radius, double step_deg) {
  std::vector<Eigen::Vector3d> p, n1, n2;
  for (double deg = 0.0; deg <= 90.0 + 1e-9; deg += step_deg) {
    const double a = deg * kPi / 180.0;
    const Eigen::Vector3d radial(std::cos(a), std::sin(a), 0.0);
    p.push_back(radius * radial);
    n1.push_back(Eigen::Vector3d::UnitZ());
    n2.push_back(radial);
  }
  return pointList(p, n1, n2);
}

/// An L-shaped inside corner seam: along +x, then a 90° turn to +y, on a
/// floor (+z) against a wall whose normal faces the open side.
inline SeamPointList cornerFillet() {
  return pointList(
      {{0, 0, 0}, {0.05, 0, 0}, {0.05, 0.04, 0}},
      {Eigen::Vector3d::UnitZ(), Eigen::Vector3d::UnitZ(), Eigen::Vector3d::UnitZ()},
      {Eigen::Vector3d::UnitY(), Eigen::Vector3d(-1, 1, 0), -Eigen::Vector3d::UnitX()});
}

}  // namespace tw::planner::test
