#include "planner/program/motion_path.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "kinematics/common/angles.hpp"

namespace tw::planner {
namespace {

/// Distance of `p` from the line through `a` and `b` (a ≠ b).
double distanceFromLine(const Eigen::Vector3d& p, const Eigen::Vector3d& a,
                        const Eigen::Vector3d& b) {
  const Eigen::Vector3d direction = (b - a).normalized();
  return (p - a).cross(direction).norm();
}

/// Angle [rad] in [0, 2π) from `from` to `to`, both in the plane normal to
/// the unit vector `normal`, turning positively about it.
double angleAbout(const Eigen::Vector3d& from, const Eigen::Vector3d& to,
                  const Eigen::Vector3d& normal) {
  const double angle = std::atan2(normal.dot(from.cross(to)), from.dot(to));
  return angle < 0.0 ? angle + 2.0 * kPi : angle;
}

void requireFraction(double fraction) {
  if (!(fraction >= 0.0 && fraction <= 1.0)) {
    throw std::invalid_argument("path fraction must be in [0, 1]");
  }
}

CircularArc requireArc(const Eigen::Vector3d& p_RS, const MotionRecord& motion) {
  if (!motion.via) throw std::invalid_argument("a circular move without a via point");
  const std::optional<CircularArc> arc =
      CircularArc::through(p_RS, motion.via->X_RV.translation(), motion.X_RT.translation());
  if (!arc) throw std::invalid_argument("a circular move whose points define no arc");
  return *arc;
}

}  // namespace

std::optional<std::string> arcPointProblem(const Eigen::Vector3d& p_start,
                                           const Eigen::Vector3d& p_via,
                                           const Eigen::Vector3d& p_end) {
  if (!p_start.allFinite() || !p_via.allFinite() || !p_end.allFinite()) {
    return std::string("start, via or target position is not finite");
  }
  if ((p_via - p_start).norm() < kArcPointSeparation ||
      (p_end - p_via).norm() < kArcPointSeparation ||
      (p_end - p_start).norm() < kArcPointSeparation) {
    return std::string("start, via and target are not distinct (two closer than 0.01 mm); "
                       "a full circle takes two circular moves");
  }
  // With all three distinct, the smallest distance of a point from the line
  // through the other two is the triangle's height over its longest side.
  const double height = std::min({distanceFromLine(p_via, p_start, p_end),
                                  distanceFromLine(p_start, p_via, p_end),
                                  distanceFromLine(p_end, p_start, p_via)});
  if (height < kArcPointSeparation) {
    return std::string("start, via and target lie on one straight line (within 0.01 mm); "
                       "write a linear move");
  }
  return std::nullopt;
}

std::optional<CircularArc> CircularArc::through(const Eigen::Vector3d& p_start,
                                                const Eigen::Vector3d& p_via,
                                                const Eigen::Vector3d& p_end) {
  if (arcPointProblem(p_start, p_via, p_end)) return std::nullopt;
  // Circumcentre of the triangle with a corner at the start (e.g. the
  // "circumscribed circle" entry of any geometry handbook; from memory):
  // c = start + ((|u|² v − |v|² u) × (u × v)) / (2 |u × v|²).
  const Eigen::Vector3d u = p_via - p_start;
  const Eigen::Vector3d v = p_end - p_start;
  const Eigen::Vector3d w = u.cross(v);
  CircularArc arc;
  arc.centre_ = p_start + (u.squaredNorm() * v - v.squaredNorm() * u).cross(w) /
                              (2.0 * w.squaredNorm());
  arc.normal_ = w.normalized();
  arc.start_radial_ = p_start - arc.centre_;
  arc.radius_ = arc.start_radial_.norm();
  // A triangle whose corners run positively about its normal meets them in
  // the same order on its circumcircle, so via comes before the target.
  arc.via_sweep_ = angleAbout(arc.start_radial_, p_via - arc.centre_, arc.normal_);
  arc.sweep_ = angleAbout(arc.start_radial_, p_end - arc.centre_, arc.normal_);
  return arc;
}

Eigen::Vector3d CircularArc::position(double fraction) const {
  requireFraction(fraction);
  const double angle = fraction * sweep_;
  return centre_ + std::cos(angle) * start_radial_ +
         std::sin(angle) * normal_.cross(start_radial_);
}

double pathLength(const Eigen::Vector3d& p_RS, const MotionRecord& motion) {
  switch (motion.kind) {
    case MotionKind::kLinearMove: return (motion.X_RT.translation() - p_RS).norm();
    case MotionKind::kCircularMove: return requireArc(p_RS, motion).length();
    case MotionKind::kJointMove: break;
  }
  throw std::invalid_argument("a joint move has no TCP path of its own (it depends on the arm)");
}

Eigen::Isometry3d interpolatedPose(const Eigen::Isometry3d& X_RS, const MotionRecord& motion,
                                   double fraction) {
  requireFraction(fraction);
  Eigen::Isometry3d X_RT = Eigen::Isometry3d::Identity();
  switch (motion.kind) {
    case MotionKind::kLinearMove:
      X_RT.translation() = X_RS.translation() +
                           fraction * (motion.X_RT.translation() - X_RS.translation());
      break;
    case MotionKind::kCircularMove:
      X_RT.translation() = requireArc(X_RS.translation(), motion).position(fraction);
      break;
    case MotionKind::kJointMove:
      throw std::invalid_argument("a joint move interpolates in joint space, not the TCP pose");
  }
  // Eigen's slerp takes the shorter way (it flips a quaternion whose dot
  // product with the other is negative).
  const Eigen::Quaterniond start(X_RS.linear());
  const Eigen::Quaterniond target(motion.X_RT.linear());
  X_RT.linear() = start.slerp(fraction, target).toRotationMatrix();
  return X_RT;
}

double viaPassingTime(const Eigen::Vector3d& p_RS, const MotionRecord& motion) {
  if (motion.kind != MotionKind::kCircularMove) {
    throw std::invalid_argument("only a circular move has a via point");
  }
  const CircularArc arc = requireArc(p_RS, motion);
  return motion.start_time + motion.duration * arc.viaSweep() / arc.sweep();
}

double blendCornerDeviation(double blend_radius, double deflection) {
  if (!(blend_radius >= 0.0) || !std::isfinite(blend_radius) || !(deflection >= 0.0) ||
      !(deflection < kPi)) {
    throw std::invalid_argument("blend radius must be finite and >= 0, deflection in [0, pi)");
  }
  return blend_radius * std::tan(deflection / 4.0);
}

}  // namespace tw::planner
