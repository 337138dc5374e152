#include "planner/refit/rigid_fit.hpp"

#include <Eigen/Geometry>
#include <Eigen/SVD>
#include <cmath>

#include "kinematics/common/input_error.hpp"

namespace tw::planner {
namespace {

// A point set whose spread across its best-fit line is below this fraction
// of the spread along it does not fix the rotation about that line: the
// fit would turn noise into a large rotation. 1e-3 is 0.1 mm across 100 mm.
constexpr double kCollinearRatio = 1e-3;
// Points closer together than this (in the caller's units, m or mm) are one
// point: nothing to fit.
constexpr double kCoincident = 1e-12;

void requireNotCollinear(const Eigen::Matrix3Xd& centred, const char* which,
                         const std::string& source) {
  const Eigen::JacobiSVD<Eigen::Matrix3Xd> svd(centred);
  const Eigen::Vector3d spread = svd.singularValues();
  if (spread[0] <= kCoincident || spread[1] < kCollinearRatio * spread[0]) {
    throw InputError(source, 0,
                     std::string("the ") + which +
                         " points lie on one line (or coincide); expected at least 3 points "
                         "that span a plane, so that the rotation is determined");
  }
}

}  // namespace

RigidFit fitRigidTransform(const Eigen::Ref<const Eigen::Matrix3Xd>& p_N,
                           const Eigen::Ref<const Eigen::Matrix3Xd>& p_M,
                           const std::string& source) {
  if (p_N.cols() != p_M.cols()) {
    throw InputError(source, 0,
                     "expected as many measured points as nominal ones, got " +
                         std::to_string(p_M.cols()) + " and " + std::to_string(p_N.cols()));
  }
  const Eigen::Index n = p_N.cols();
  if (n < 3) {
    throw InputError(source, 0,
                     "a rigid fit needs at least 3 reference points (4 or more to check the "
                     "fit), got " +
                         std::to_string(n));
  }
  const Eigen::Vector3d mean_N = p_N.rowwise().mean();
  const Eigen::Vector3d mean_M = p_M.rowwise().mean();
  const Eigen::Matrix3Xd centred_N = p_N.colwise() - mean_N;
  const Eigen::Matrix3Xd centred_M = p_M.colwise() - mean_M;
  requireNotCollinear(centred_N, "nominal", source);
  requireNotCollinear(centred_M, "measured", source);

  RigidFit fit;
  fit.X_MN.matrix() = Eigen::umeyama(p_N, p_M, false);
  double sum_of_squares = 0.0;
  for (Eigen::Index i = 0; i < n; ++i) {
    const Eigen::Vector3d error = fit.X_MN * Eigen::Vector3d(p_N.col(i)) - p_M.col(i);
    fit.residuals.push_back(error.norm());
    sum_of_squares += error.squaredNorm();
  }
  fit.rms = std::sqrt(sum_of_squares / static_cast<double>(n));
  return fit;
}

}  // namespace tw::planner
