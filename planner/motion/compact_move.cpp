#include "planner/motion/compact_move.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <string>

#include "planner/motion/move_geometry.hpp"

namespace tw::planner {
namespace {

std::string describe(const CompactMove& move) {
  return std::string(move.shape == MoveShape::kLine ? "line" : "arc") + " move " +
         std::to_string(move.start) + " -> " + std::to_string(move.end) + " (via " +
         std::to_string(move.via) + ")";
}

detail::MoveGeometry geometryOf(const std::vector<Eigen::Isometry3d>& poses,
                                const CompactMove& move) {
  const int count = static_cast<int>(poses.size());
  if (move.start < 0 || move.end >= count || move.start >= move.end) {
    throw std::invalid_argument(describe(move) + ": indices must satisfy 0 <= start < end < " +
                                std::to_string(count));
  }
  std::optional<detail::MoveGeometry> geometry;
  if (move.shape == MoveShape::kLine) {
    if (move.via != -1) throw std::invalid_argument(describe(move) + ": a line has no via");
    geometry = detail::lineGeometry(poses[move.start].translation(), poses[move.end].translation());
  } else {
    if (move.via <= move.start || move.via >= move.end) {
      throw std::invalid_argument(describe(move) + ": the via must lie strictly between start and end");
    }
    geometry = detail::arcGeometry(poses[move.start].translation(), poses[move.via].translation(),
                                   poses[move.end].translation());
  }
  if (!geometry) {
    throw std::invalid_argument(describe(move) +
                                ": its points define no path (coincident, collinear, or an arc "
                                "of radius > 10 m or sweep >= 180 degrees)");
  }
  detail::setOrientation(*geometry, Eigen::Quaterniond(poses[move.start].linear()),
                         Eigen::Quaterniond(poses[move.end].linear()));
  return *geometry;
}

}  // namespace

Eigen::Isometry3d interpolateMove(const std::vector<Eigen::Isometry3d>& poses,
                                  const CompactMove& move, double fraction) {
  const detail::MoveGeometry geometry = geometryOf(poses, move);
  if (!(fraction >= 0.0 && fraction <= 1.0)) {
    throw std::invalid_argument(describe(move) + ": fraction " + std::to_string(fraction) +
                                " is outside [0, 1]");
  }
  if (fraction == 0.0) return poses[move.start];
  if (fraction == 1.0) return poses[move.end];
  Eigen::Isometry3d pose = Eigen::Isometry3d::Identity();
  pose.linear() = (geometry.q_start * geometry.relativeRotationAt(fraction)).toRotationMatrix();
  pose.translation() = geometry.positionAt(fraction);
  return pose;
}

double moveLength(const std::vector<Eigen::Isometry3d>& poses, const CompactMove& move) {
  return geometryOf(poses, move).length;
}

double moveRotationAngle(const std::vector<Eigen::Isometry3d>& poses, const CompactMove& move) {
  return geometryOf(poses, move).rotation_angle;
}

MoveEndTangents moveEndTangents(const std::vector<Eigen::Isometry3d>& poses,
                                const CompactMove& move) {
  const detail::MoveGeometry geometry = geometryOf(poses, move);
  if (geometry.shape == MoveShape::kLine) return {geometry.direction, geometry.direction};
  const Eigen::Vector3d radial_end = (geometry.p_end - geometry.centre) / geometry.radius;
  return {geometry.axis_y, geometry.normal.cross(radial_end)};
}

std::vector<double> moveCheckFractions(const std::vector<Eigen::Isometry3d>& poses,
                                       const CompactMove& move, double max_step,
                                       double max_angle_step) {
  if (!(max_step > 0.0 && std::isfinite(max_step) && max_angle_step > 0.0 &&
        std::isfinite(max_angle_step))) {
    throw std::invalid_argument("moveCheckFractions: steps must be positive and finite (got " +
                                std::to_string(max_step) + " m, " +
                                std::to_string(max_angle_step) + " rad)");
  }
  const detail::MoveGeometry geometry = geometryOf(poses, move);
  const double intervals = std::max({1.0, std::ceil(geometry.length / max_step),
                                     std::ceil(geometry.rotation_angle / max_angle_step)});
  const int count = static_cast<int>(intervals);
  std::vector<double> fractions(count + 1);
  for (int k = 0; k <= count; ++k) fractions[k] = static_cast<double>(k) / count;
  return fractions;
}

}  // namespace tw::planner
