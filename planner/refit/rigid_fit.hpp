#pragma once

#include <Eigen/Core>
#include <Eigen/Geometry>
#include <string>
#include <vector>

namespace tw::planner {

/// The least-squares rigid transform between two sets of corresponding points
/// and how well it fits.
struct RigidFit {
  /// Maps nominal points (frame N) onto measured ones (frame M): the fit
  /// minimises Σ |X_MN · p_N,i − p_M,i|², scale fixed at 1.
  Eigen::Isometry3d X_MN = Eigen::Isometry3d::Identity();
  /// |X_MN · p_N,i − p_M,i| per point, in input order [m].
  std::vector<double> residuals;
  /// sqrt(mean of the squared residuals) [m].
  double rms = 0.0;
};

/// Fits the rigid transform taking `p_N` (nominal points, one per column)
/// onto `p_M` (the same points as measured): the SVD method of Kabsch
/// (1976), Arun, Huang and Blostein (TPAMI 9(5), 1987) and Horn (JOSA A 4,
/// 1987) with Umeyama's reflection correction (TPAMI 13(4), 1991), computed
/// by Eigen::umeyama without scaling. Units are the caller's; the residuals
/// come in the same unit.
///
/// Throws tw::InputError naming `source` when the two sets differ in size,
/// hold fewer than 3 points, or either set is collinear (its spread across
/// the best-fit line is below 1e-3 of its spread along it, or all points
/// coincide): then the rotation about that line is undetermined.
/// Thread-safe, no state.
RigidFit fitRigidTransform(const Eigen::Ref<const Eigen::Matrix3Xd>& p_N,
                           const Eigen::Ref<const Eigen::Matrix3Xd>& p_M,
                           const std::string& source);

}  // namespace tw::planner
