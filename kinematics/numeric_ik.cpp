#include "kinematics/numeric_ik.hpp"

#include <Eigen/Cholesky>
#include <algorithm>
#include <random>

#include "kinematics/forward_kinematics.hpp"

namespace tw::kinematics {
namespace {

using Error = Eigen::Matrix<double, 6, 1>;
using SquareMatrix = Eigen::Matrix<double, Eigen::Dynamic, Eigen::Dynamic, 0, kMaxJoints, kMaxJoints>;

Error poseError(const Eigen::Isometry3d& X_target, const Eigen::Isometry3d& X_current) {
  Error e;
  e.head<3>() = X_target.translation() - X_current.translation();
  const Eigen::AngleAxisd rotation(X_target.linear() * X_current.linear().transpose());
  e.tail<3>() = rotation.angle() * rotation.axis();
  return e;
}

/// A uniform draw in [0, 1) from the generator's raw bits, the same on every
/// standard library (std::uniform_real_distribution is not specified exactly).
double unitDraw(std::mt19937_64& generator) {
  return static_cast<double>(generator() >> 11) * 0x1.0p-53;
}

}  // namespace

NumericIkResult solveNumericIk(const ArmModel& arm, const Eigen::Isometry3d& X_BF,
                               const JointVector& seed, const NumericIkOptions& options) {
  const int n = arm.jointCount();
  NumericIkResult result;
  result.q = seed.cwiseMax(arm.lowerLimits()).cwiseMin(arm.upperLimits());
  LinkPoses poses;
  computeLinkPoses(arm, result.q, poses);
  Error error = poseError(X_BF, poses.X_BF);
  double damping = options.initial_damping;

  for (; result.iterations < options.max_iterations; ++result.iterations) {
    if (error.head<3>().norm() <= options.position_tolerance &&
        error.tail<3>().norm() <= options.orientation_tolerance) {
      result.converged = true;
      break;
    }
    const Jacobian jacobian = geometricJacobian(arm, poses);
    const SquareMatrix normal = jacobian.transpose() * jacobian;
    const JointVector gradient = jacobian.transpose() * error;
    bool improved = false;
    // Raise the damping until a step lowers the error (Levenberg–Marquardt).
    for (int attempt = 0; attempt < 12 && !improved; ++attempt) {
      const SquareMatrix damped = normal + damping * damping * SquareMatrix::Identity(n, n);
      const JointVector step = damped.ldlt().solve(gradient);
      const JointVector candidate =
          (result.q + step).cwiseMax(arm.lowerLimits()).cwiseMin(arm.upperLimits());
      LinkPoses candidate_poses;
      computeLinkPoses(arm, candidate, candidate_poses);
      const Error candidate_error = poseError(X_BF, candidate_poses.X_BF);
      if (candidate_error.norm() < error.norm()) {
        result.q = candidate;
        poses = candidate_poses;
        error = candidate_error;
        damping = std::max(damping * 0.1, 1e-9);
        improved = true;
      } else {
        damping *= 10.0;
      }
    }
    if (!improved) break;  // stuck, e.g. against a limit or at a local minimum
  }
  result.position_error = error.head<3>().norm();
  result.orientation_error = error.tail<3>().norm();
  return result;
}

std::vector<JointVector> enumerateNumericIk(const ArmModel& arm, const Eigen::Isometry3d& X_BF,
                                            const MultiStartOptions& options) {
  std::mt19937_64 generator(options.seed);
  const int n = arm.jointCount();
  std::vector<JointVector> found;
  for (int start = 0; start < options.starts; ++start) {
    JointVector seed(n);
    for (int j = 0; j < n; ++j) {
      seed[j] = arm.lowerLimits()[j] +
                unitDraw(generator) * (arm.upperLimits()[j] - arm.lowerLimits()[j]);
    }
    const NumericIkResult result = solveNumericIk(arm, X_BF, seed, options.solver);
    if (!result.converged) continue;
    const bool duplicate = std::any_of(found.begin(), found.end(), [&](const JointVector& q) {
      return (q - result.q).cwiseAbs().maxCoeff() < options.duplicate_tolerance;
    });
    if (!duplicate) found.push_back(result.q);
  }
  std::sort(found.begin(), found.end(), [](const JointVector& a, const JointVector& b) {
    return std::lexicographical_compare(a.data(), a.data() + a.size(), b.data(), b.data() + b.size());
  });
  return found;
}

}  // namespace tw::kinematics
