#include "planner/motion/blend_radius.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <string>

namespace tw::planner {

double blendRadius(const Eigen::Vector3d& incoming_dir, const Eigen::Vector3d& outgoing_dir,
                   double incoming_length, double outgoing_length, double position_tolerance,
                   double max_radius) {
  const double incoming_norm = incoming_dir.norm();
  const double outgoing_norm = outgoing_dir.norm();
  if (!(incoming_norm > 0.0 && std::isfinite(incoming_norm) && outgoing_norm > 0.0 &&
        std::isfinite(outgoing_norm))) {
    throw std::invalid_argument("blendRadius: leg directions must be non-zero and finite");
  }
  if (!(incoming_length > 0.0 && std::isfinite(incoming_length) && outgoing_length > 0.0 &&
        std::isfinite(outgoing_length))) {
    throw std::invalid_argument("blendRadius: leg lengths must be positive and finite (got " +
                                std::to_string(incoming_length) + ", " +
                                std::to_string(outgoing_length) + " m)");
  }
  if (!(position_tolerance >= 0.0 && std::isfinite(position_tolerance) && max_radius >= 0.0 &&
        std::isfinite(max_radius))) {
    throw std::invalid_argument(
        "blendRadius: tolerance and max_radius must be non-negative and finite");
  }
  const Eigen::Vector3d in = incoming_dir / incoming_norm;
  const Eigen::Vector3d out = outgoing_dir / outgoing_norm;
  // atan2 of |sin| and cos keeps the angle accurate near 0 and π.
  const double turning = std::atan2(in.cross(out).norm(), in.dot(out));
  double radius = std::min({max_radius, 0.5 * incoming_length, 0.5 * outgoing_length});
  const double deviation_per_radius = std::tan(0.25 * turning);
  if (deviation_per_radius * radius > position_tolerance) {
    radius = position_tolerance / deviation_per_radius;
  }
  return radius;
}

std::vector<double> boundaryBlendRadii(const std::vector<Eigen::Isometry3d>& poses,
                                       const std::vector<CompactMove>& moves,
                                       double position_tolerance, double max_radius) {
  std::vector<double> radii;
  if (moves.size() < 2) return radii;
  radii.reserve(moves.size() - 1);
  for (std::size_t k = 0; k + 1 < moves.size(); ++k) {
    if (moves[k].end != moves[k + 1].start) {
      throw std::invalid_argument("boundaryBlendRadii: move " + std::to_string(k) + " ends at " +
                                  std::to_string(moves[k].end) + " but move " +
                                  std::to_string(k + 1) + " starts at " +
                                  std::to_string(moves[k + 1].start));
    }
    radii.push_back(blendRadius(moveEndTangents(poses, moves[k]).at_end,
                                moveEndTangents(poses, moves[k + 1]).at_start,
                                moveLength(poses, moves[k]), moveLength(poses, moves[k + 1]),
                                position_tolerance, max_radius));
  }
  return radii;
}

}  // namespace tw::planner
