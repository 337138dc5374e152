#include "tests/planner/motion/seam_fixtures.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <sstream>

namespace tw::planner::test {
namespace {

constexpr double kDenseStep = 0.1e-3;  // [m] the brute-force checker's resolution

double uniform(std::mt19937& rng, double low, double high) {
  return std::uniform_real_distribution<double>(low, high)(rng);
}

Eigen::Vector3d randomUnitVector(std::mt19937& rng) {
  std::normal_distribution<double> normal(0.0, 1.0);
  Eigen::Vector3d v(normal(rng), normal(rng), normal(rng));
  return v.normalized();
}

struct NearestOnPolyline {
  double distance = std::numeric_limits<double>::infinity();
  int segment = 0;
  double along = 0.0;  ///< fraction along that segment
};

NearestOnPolyline nearestOnPolyline(const std::vector<Eigen::Vector3d>& points,
                                    const Eigen::Vector3d& p) {
  NearestOnPolyline best;
  for (std::size_t k = 0; k + 1 < points.size(); ++k) {
    const Eigen::Vector3d chord = points[k + 1] - points[k];
    const double along = std::clamp((p - points[k]).dot(chord) / chord.squaredNorm(), 0.0, 1.0);
    const double distance = (points[k] + along * chord - p).norm();
    if (distance < best.distance) best = {distance, static_cast<int>(k), along};
  }
  return best;
}

}  // namespace

Eigen::Isometry3d makePose(const Eigen::Vector3d& p, const Eigen::Quaterniond& q) {
  Eigen::Isometry3d pose = Eigen::Isometry3d::Identity();
  pose.linear() = q.normalized().toRotationMatrix();
  pose.translation() = p;
  return pose;
}

CompactionInput inputFrom(std::vector<Eigen::Isometry3d> poses) {
  CompactionInput input;
  input.must_keep.assign(poses.size(), false);
  input.poses = std::move(poses);
  return input;
}

std::string WavySeam::describe() const {
  std::ostringstream text;
  text.precision(17);
  text << "spacing " << spacing << " y(" << amplitude_y << ", " << wavelength_y << ", " << phase_y
       << ") z(" << amplitude_z << ", " << wavelength_z << ", " << phase_z << ") tilt(" << tilt
       << ", " << tilt_wavelength << ", axis " << tilt_axis.transpose() << ")";
  return text.str();
}

WavySeam randomWavySeam(std::mt19937& rng) {
  WavySeam seam;
  seam.spacing = uniform(rng, 1.5e-3, 2.5e-3);
  // Wavelength ≥ 30 mm with amplitude ≤ 3 mm keeps the radius of curvature
  // ≥ λ²/(4π²a) ≈ 7.6 mm, so the 0.1 mm checker steps stay accurate.
  seam.amplitude_y = uniform(rng, 0.0, 3e-3);
  seam.wavelength_y = uniform(rng, 30e-3, 300e-3);
  seam.phase_y = uniform(rng, 0.0, 6.283);
  seam.amplitude_z = uniform(rng, 0.0, 1e-3);
  seam.wavelength_z = uniform(rng, 30e-3, 300e-3);
  seam.phase_z = uniform(rng, 0.0, 6.283);
  seam.tilt = uniform(rng, 0.0, 5.0 * kPi / 180.0);
  seam.tilt_wavelength = uniform(rng, 100e-3, 400e-3);
  seam.tilt_axis = randomUnitVector(rng);
  return seam;
}

std::vector<Eigen::Isometry3d> samplePoses(const WavySeam& seam, int sample_count) {
  const Eigen::Quaterniond base(Eigen::AngleAxisd(0.3, Eigen::Vector3d(1.0, 2.0, 3.0).normalized()));
  std::vector<Eigen::Isometry3d> poses;
  for (int k = 0; k < sample_count; ++k) {
    const double t = k * seam.spacing;
    const Eigen::Vector3d p(t, seam.amplitude_y * std::sin(2.0 * kPi * t / seam.wavelength_y + seam.phase_y),
                            seam.amplitude_z * std::sin(2.0 * kPi * t / seam.wavelength_z + seam.phase_z));
    const double angle = seam.tilt * std::sin(2.0 * kPi * t / seam.tilt_wavelength);
    poses.push_back(makePose(p, Eigen::Quaterniond(Eigen::AngleAxisd(angle, seam.tilt_axis)) * base));
  }
  return poses;
}

std::vector<Eigen::Isometry3d> randomPieceSeam(std::mt19937& rng, int sample_count,
                                               double spacing, double noise) {
  // March along the pieces in steps of `spacing` of arc length.
  std::vector<Eigen::Vector3d> points{Eigen::Vector3d::Zero()};
  Eigen::Vector3d position = Eigen::Vector3d::Zero();
  Eigen::Vector3d tangent = Eigen::Vector3d::UnitX();
  while (static_cast<int>(points.size()) < sample_count) {
    const bool straight = uniform(rng, 0.0, 1.0) < 0.35;
    if (straight) {
      const int steps = static_cast<int>(uniform(rng, 5.0, 40.0));
      for (int s = 0; s < steps; ++s) {
        position += spacing * tangent;
        points.push_back(position);
      }
      continue;
    }
    const double radius = uniform(rng, 10e-3, 150e-3);
    const double sweep = uniform(rng, 10.0, 150.0) * kPi / 180.0;
    Eigen::Vector3d binormal = tangent.cross(randomUnitVector(rng)).normalized();
    const Eigen::Vector3d centre = position + radius * binormal.cross(tangent);
    const Eigen::Vector3d radial = position - centre;
    const double step_angle = spacing / radius;
    for (double angle = step_angle; angle <= sweep; angle += step_angle) {
      const Eigen::AngleAxisd turn(angle, binormal);
      points.push_back(centre + turn * radial);
    }
    const Eigen::AngleAxisd turn_all(std::floor(sweep / step_angle) * step_angle, binormal);
    position = points.back();
    tangent = turn_all * tangent;
  }
  points.resize(sample_count);
  const Eigen::Vector3d tool_axis = randomUnitVector(rng);
  const double turn_rate = uniform(rng, -20.0, 20.0) * kPi / 180.0 / 0.1;  // up to 20° per 100 mm
  std::vector<Eigen::Isometry3d> poses;
  double travelled = 0.0;
  for (int k = 0; k < sample_count; ++k) {
    if (k > 0) travelled += (points[k] - points[k - 1]).norm();
    const Eigen::Vector3d jitter(uniform(rng, -noise, noise), uniform(rng, -noise, noise),
                                 uniform(rng, -noise, noise));
    poses.push_back(makePose(points[k] + jitter,
                             Eigen::Quaterniond(Eigen::AngleAxisd(turn_rate * travelled, tool_axis))));
  }
  return poses;
}

double maxRotationRate(const std::vector<Eigen::Isometry3d>& poses) {
  double rate = 0.0;
  for (std::size_t k = 0; k + 1 < poses.size(); ++k) {
    const double angle = Eigen::Quaterniond(poses[k].linear())
                             .angularDistance(Eigen::Quaterniond(poses[k + 1].linear()));
    rate = std::max(rate, angle / (poses[k + 1].translation() - poses[k].translation()).norm());
  }
  return rate;
}

DenseDeviation denseDeviation(const std::vector<Eigen::Isometry3d>& poses,
                              const CompactMove& move) {
  std::vector<Eigen::Vector3d> seam_points;
  std::vector<Eigen::Quaterniond> seam_orientations;
  for (int k = move.start; k <= move.end; ++k) {
    seam_points.push_back(poses[k].translation());
    seam_orientations.emplace_back(poses[k].linear());
  }
  const int intervals = std::max(1, static_cast<int>(std::ceil(moveLength(poses, move) / kDenseStep)));
  std::vector<Eigen::Vector3d> path_points;
  std::vector<Eigen::Quaterniond> path_orientations;
  for (int k = 0; k <= intervals; ++k) {
    const Eigen::Isometry3d pose = interpolateMove(poses, move, static_cast<double>(k) / intervals);
    path_points.push_back(pose.translation());
    path_orientations.emplace_back(pose.linear());
  }

  DenseDeviation worst;
  for (std::size_t k = 0; k < path_points.size(); ++k) {
    const NearestOnPolyline nearest = nearestOnPolyline(seam_points, path_points[k]);
    const Eigen::Quaterniond seam_orientation =
        seam_orientations[nearest.segment].slerp(nearest.along, seam_orientations[nearest.segment + 1]);
    worst.position = std::max(worst.position, nearest.distance);
    worst.angle = std::max(worst.angle, seam_orientation.angularDistance(path_orientations[k]));
  }
  for (std::size_t k = 0; k + 1 < seam_points.size(); ++k) {
    const Eigen::Vector3d chord = seam_points[k + 1] - seam_points[k];
    const int steps = std::max(1, static_cast<int>(std::ceil(chord.norm() / kDenseStep)));
    for (int s = 0; s < steps; ++s) {
      const double along = static_cast<double>(s) / steps;
      const NearestOnPolyline nearest = nearestOnPolyline(path_points, seam_points[k] + along * chord);
      worst.position = std::max(worst.position, nearest.distance);
      if (s == 0) {
        const Eigen::Quaterniond path_orientation = path_orientations[nearest.segment].slerp(
            nearest.along, path_orientations[nearest.segment + 1]);
        worst.angle = std::max(worst.angle, path_orientation.angularDistance(seam_orientations[k]));
      }
    }
  }
  return worst;
}

}  // namespace tw::planner::test
