#include "planner/motion/move_geometry.hpp"

#include <algorithm>
#include <cmath>

namespace tw::planner::detail {
namespace {

constexpr double kTwoPi = 2.0 * kPi;

}  // namespace

Eigen::Vector3d MoveGeometry::positionAt(double fraction) const {
  if (shape == MoveShape::kLine) return p_start + (fraction * length) * direction;
  const double angle = fraction * sweep;
  return centre + radius * (std::cos(angle) * axis_x + std::sin(angle) * axis_y);
}

Eigen::Quaterniond MoveGeometry::relativeRotationAt(double fraction) const {
  const double half = 0.5 * fraction * rotation_angle;
  const Eigen::Vector3d v = std::sin(half) * rotation_axis;
  return Eigen::Quaterniond(std::cos(half), v.x(), v.y(), v.z());
}

PathFoot footOnPath(const MoveGeometry& geometry, const Eigen::Vector3d& p) {
  if (geometry.shape == MoveShape::kLine) {
    const Eigen::Vector3d offset = p - geometry.p_start;
    const double along = std::clamp(offset.dot(geometry.direction), 0.0, geometry.length);
    return {(offset - along * geometry.direction).squaredNorm(), along / geometry.length};
  }
  const Eigen::Vector3d q = p - geometry.centre;
  const double x = q.dot(geometry.axis_x);
  const double y = q.dot(geometry.axis_y);
  const double z = q.dot(geometry.normal);
  double angle = std::atan2(y, x);
  if (angle < 0.0) angle += kTwoPi;
  if (angle <= geometry.sweep) {
    const double radial = std::hypot(x, y) - geometry.radius;
    return {radial * radial + z * z, angle / geometry.sweep};
  }
  // Outside the swept sector the nearest path point is an end point.
  const double to_start = (p - geometry.p_start).squaredNorm();
  const double to_end = (p - geometry.p_end).squaredNorm();
  return to_start <= to_end ? PathFoot{to_start, 0.0} : PathFoot{to_end, 1.0};
}

void setOrientation(MoveGeometry& geometry, const Eigen::Quaterniond& q_start,
                    const Eigen::Quaterniond& q_end) {
  geometry.q_start = q_start.normalized();
  geometry.q_start_inverse = geometry.q_start.conjugate();
  Eigen::Quaterniond relative = geometry.q_start_inverse * q_end.normalized();
  // q and −q are the same rotation; the controller takes the shorter way.
  if (relative.w() < 0.0) relative.coeffs() = -relative.coeffs();
  const double sine_half = relative.vec().norm();
  geometry.rotation_angle = 2.0 * std::atan2(sine_half, relative.w());
  geometry.rotation_axis =
      sine_half > 0.0 ? Eigen::Vector3d(relative.vec() / sine_half) : Eigen::Vector3d::UnitX();
}

std::optional<MoveGeometry> lineGeometry(const Eigen::Vector3d& p_start,
                                         const Eigen::Vector3d& p_end) {
  MoveGeometry geometry;
  geometry.shape = MoveShape::kLine;
  geometry.p_start = p_start;
  geometry.p_end = p_end;
  geometry.length = (p_end - p_start).norm();
  if (!(geometry.length > 0.0)) return std::nullopt;
  geometry.direction = (p_end - p_start) / geometry.length;
  return geometry;
}

std::optional<MoveGeometry> arcGeometry(const Eigen::Vector3d& p_start,
                                        const Eigen::Vector3d& p_via,
                                        const Eigen::Vector3d& p_end) {
  const Eigen::Vector3d to_via = p_via - p_start;
  const Eigen::Vector3d to_end = p_end - p_start;
  const Eigen::Vector3d cross = to_via.cross(to_end);
  const double cross_norm_squared = cross.squaredNorm();
  // |to_via × to_end| / |to_end| is the via's offset from the chord; written
  // without the division so that a zero chord (a closed loop) is rejected too.
  if (!(cross.norm() > kMinViaOffsetRatio * to_end.squaredNorm())) return std::nullopt;

  // Circumcentre of the triangle (common practice, no source; checked in the
  // tests by equal distances to the three points).
  const Eigen::Vector3d centre =
      p_start + (to_via.squaredNorm() * to_end - to_end.squaredNorm() * to_via).cross(cross) /
                    (2.0 * cross_norm_squared);
  MoveGeometry geometry;
  geometry.shape = MoveShape::kArc;
  geometry.p_start = p_start;
  geometry.p_end = p_end;
  geometry.centre = centre;
  geometry.radius = (p_start - centre).norm();
  if (!(geometry.radius <= kMaxArcRadius)) return std::nullopt;
  // start → via → end turns positively about cross, so it is the normal.
  geometry.normal = cross / std::sqrt(cross_norm_squared);
  geometry.axis_x = (p_start - centre) / geometry.radius;
  geometry.axis_y = geometry.normal.cross(geometry.axis_x);
  const Eigen::Vector3d end_offset = p_end - centre;
  double sweep = std::atan2(end_offset.dot(geometry.axis_y), end_offset.dot(geometry.axis_x));
  if (sweep < 0.0) sweep += kTwoPi;
  if (!(sweep < kMaxArcSweep)) return std::nullopt;
  geometry.sweep = sweep;
  geometry.length = geometry.radius * sweep;
  return geometry;
}

}  // namespace tw::planner::detail
