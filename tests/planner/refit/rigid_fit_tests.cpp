#include <Eigen/Geometry>
#include <Eigen/SVD>
#include <catch2/catch.hpp>
#include <random>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"
#include "planner/refit/reference_points_csv.hpp"
#include "planner/refit/rigid_fit.hpp"

namespace tw::planner {
namespace {

constexpr double kDeg = kPi / 180.0;

Eigen::Isometry3d randomPose(std::mt19937& random) {
  std::normal_distribution<double> normal(0.0, 1.0);
  std::uniform_real_distribution<double> offset(-1.0, 1.0);
  Eigen::Isometry3d X = Eigen::Isometry3d::Identity();
  X.linear() = Eigen::Quaterniond(normal(random), normal(random), normal(random), normal(random))
                   .normalized()
                   .toRotationMatrix();
  X.translation() = Eigen::Vector3d(offset(random), offset(random), offset(random));
  return X;
}

}  // namespace

TEST_CASE("The rigid fit is the least-squares optimum on seeded noisy points", "[rigid-fit]") {
  std::mt19937 random(20261201);
  std::uniform_real_distribution<double> coordinate(-0.5, 0.5);
  std::uniform_real_distribution<double> noise(-1e-4, 1e-4);
  std::uniform_int_distribution<int> count(3, 12);
  for (int trial = 0; trial < 100; ++trial) {
    const Eigen::Isometry3d X_MN = randomPose(random);
    const int n = count(random);
    Eigen::Matrix3Xd p_N(3, n);
    for (int i = 0; i < n; ++i) {
      p_N.col(i) = Eigen::Vector3d(coordinate(random), coordinate(random), coordinate(random));
    }
    // Measuring errors up to 0.1 mm, so the fit is a true least-squares problem.
    Eigen::Matrix3Xd p_M = X_MN * p_N;
    for (int i = 0; i < n; ++i)
      p_M.col(i) += Eigen::Vector3d(noise(random), noise(random), noise(random));
    CAPTURE(trial, n, X_MN.matrix(), p_N);

    const RigidFit fit = fitRigidTransform(p_N, p_M, "random");
    CHECK(fit.X_MN.linear().determinant() == Approx(1.0).margin(1e-12));
    // Optimality, checked without any SVD: no small rotation (1 mrad about
    // each axis, either way) or shift (1 µm) of the fit, and not the true
    // transform either, gives a smaller sum of squares (common practice, no
    // source: a least-squares minimum is a minimum).
    const auto sum_of_squares = [&](const Eigen::Isometry3d& X) {
      return (X * p_N - p_M).colwise().squaredNorm().sum();
    };
    const double best = sum_of_squares(fit.X_MN);
    CHECK(best <= sum_of_squares(X_MN) * (1.0 + 1e-12));
    for (int axis = 0; axis < 3; ++axis) {
      for (const double sign : {-1.0, 1.0}) {
        Eigen::Isometry3d turned = fit.X_MN;
        turned.linear() =
            Eigen::AngleAxisd(sign * 1e-3, Eigen::Vector3d::Unit(axis)).toRotationMatrix() *
            fit.X_MN.linear();
        turned.translation() = fit.X_MN.translation();
        Eigen::Isometry3d shifted = fit.X_MN;
        shifted.translation() += sign * 1e-6 * Eigen::Vector3d::Unit(axis);
        CHECK(best <= sum_of_squares(turned));
        CHECK(best <= sum_of_squares(shifted));
      }
    }
    // The noise bounds the residuals: |error| ≤ √3 · 0.1 mm per point before
    // the fit, and least squares only lowers the sum.
    REQUIRE(fit.residuals.size() == static_cast<std::size_t>(n));
    double sum = 0.0;
    for (const double residual : fit.residuals) sum += residual * residual;
    CHECK(fit.rms == Approx(std::sqrt(sum / n)).epsilon(1e-12));
    CHECK(fit.rms <= std::sqrt(3.0) * 1e-4);
  }
}

TEST_CASE("Exact points give the transform back with zero residuals", "[rigid-fit]") {
  std::mt19937 random(7);
  const Eigen::Isometry3d X_MN = randomPose(random);
  Eigen::Matrix3Xd p_N(3, 4);
  p_N << 0.0, 0.3, 0.0, 0.1,  //
      0.0, 0.0, 0.2, 0.1,     //
      0.0, 0.0, 0.0, 0.1;
  const RigidFit fit = fitRigidTransform(p_N, X_MN * p_N, "exact");
  CAPTURE(X_MN.matrix());
  // Rounding of a few operations on numbers of order 1.
  CHECK(fit.X_MN.isApprox(X_MN, 1e-12));
  CHECK(fit.rms < 1e-12);
}

TEST_CASE("Umeyama's example: the plain SVD answer is a reflection, the fit's method a rotation",
          "[rigid-fit][reference]") {
  // Umeyama, TPAMI 13(4), 1991, the worked example of section IV:
  // X = {(0,0),(1,0),(0,2)}, Y = {(0,0),(-1,0),(0,2)}.
  // Dynamic sizes: g++ 12 warns wrongly inside Eigen's umeyama on 2x3 fixed ones.
  Eigen::MatrixXd x(2, 3);
  x << 0, 1, 0,  //
      0, 0, 2;
  Eigen::MatrixXd y(2, 3);
  y << 0, -1, 0,  //
      0, 0, 2;
  const Eigen::VectorXd mean_x = x.rowwise().mean();
  const Eigen::VectorXd mean_y = y.rowwise().mean();
  const Eigen::Matrix2d covariance =
      (y.colwise() - mean_y) * (x.colwise() - mean_x).transpose() / 3.0;

  const Eigen::JacobiSVD<Eigen::Matrix2d> svd(covariance,
                                              Eigen::ComputeFullU | Eigen::ComputeFullV);
  const Eigen::Matrix2d plain = svd.matrixU() * svd.matrixV().transpose();
  // The uncorrected solution is a reflection (Umeyama's point of the example).
  CHECK(plain.determinant() == Approx(-1.0).margin(1e-12));

  // Eigen::umeyama, which the fit calls, with scaling reproduces the paper's
  // answer: R below, c = 0.721110, t = (-0.8, 0.4).
  const Eigen::MatrixXd reference = Eigen::umeyama(x, y, true);
  const double scale = std::sqrt(reference.topLeftCorner(2, 2).determinant());
  const Eigen::Matrix2d rotation = reference.topLeftCorner(2, 2) / scale;
  CHECK(rotation.determinant() == Approx(1.0).margin(1e-12));
  // R from the paper, printed to 4 decimals: 0.8321 = 3/√13, 0.5547 = 2/√13.
  constexpr double kPrinted = 5e-5;  // half a unit in the 4th decimal
  CHECK(rotation(0, 0) == Approx(0.8321).margin(kPrinted));
  CHECK(rotation(0, 1) == Approx(0.5547).margin(kPrinted));
  CHECK(rotation(1, 0) == Approx(-0.5547).margin(kPrinted));
  CHECK(rotation(1, 1) == Approx(0.8321).margin(kPrinted));
  CHECK(scale == Approx(0.721110).margin(5e-7));        // printed to 6 decimals
  CHECK(reference(0, 2) == Approx(-0.8).margin(5e-4));  // printed to 3 decimals
  CHECK(reference(1, 2) == Approx(0.4).margin(5e-4));
}

TEST_CASE("Mirrored measured points give the best proper rotation, never a reflection",
          "[rigid-fit]") {
  // A tetrahedron and its mirror image in the yz plane: no rotation maps one
  // onto the other, and an unguarded SVD fit would return the mirror.
  Eigen::Matrix3Xd p_N(3, 4);
  p_N << 0.1, 0.4, 0.0, 0.1,  //
      0.0, 0.0, 0.3, 0.1,     //
      0.0, 0.0, 0.0, 0.2;
  Eigen::Matrix3Xd p_M = p_N;
  p_M.row(0) *= -1.0;
  const RigidFit fit = fitRigidTransform(p_N, p_M, "mirror");
  CHECK(fit.X_MN.linear().determinant() == Approx(1.0).margin(1e-12));
  CHECK(fit.rms > 0.01);  // a mirror cannot be fitted: the residuals say so
}

TEST_CASE("Too few, mismatched, collinear or coincident points are refused", "[rigid-fit]") {
  const auto refused = [](const Eigen::Matrix3Xd& p_N, const Eigen::Matrix3Xd& p_M,
                          const std::string& message) {
    CAPTURE(p_N, p_M, message);
    try {
      fitRigidTransform(p_N, p_M, "points.csv");
      FAIL("expected an InputError");
    } catch (const InputError& error) {
      CHECK(error.file() == "points.csv");
      CHECK_THAT(error.message(), Catch::Contains(message));
    }
  };
  Eigen::Matrix3Xd two(3, 2);
  two << 0, 1, 0, 0, 0, 0;
  refused(two, two, "at least 3 reference points");

  Eigen::Matrix3Xd three(3, 3);
  three << 0, 1, 0, 0, 0, 1, 0, 0, 0;
  Eigen::Matrix3Xd four(3, 4);
  four << 0, 1, 0, 1, 0, 0, 1, 1, 0, 0, 0, 0;
  refused(three, four, "as many measured points as nominal ones");

  // On a line, but for 1e-5 of its length across: below the 1e-3 ratio.
  Eigen::Matrix3Xd line(3, 4);
  line << 0, 0.1, 0.2, 0.3, 0, 1e-6, 0, 0, 0, 0, 0, 0;
  refused(line, line, "nominal points lie on one line");
  refused(three, Eigen::Matrix3Xd(line.leftCols(3)), "measured points lie on one line");
  refused(Eigen::Matrix3Xd::Zero(3, 3), three, "nominal points lie on one line (or coincide)");
}

TEST_CASE("The sample fixture-move points give back the documented move", "[rigid-fit][samples]") {
  const ReferencePointList list = loadReferencePointsCsv(
      std::string(TW_SOURCE_DIR) + "/samples/fixture_moved/bracket_reference_points.csv");
  REQUIRE(list.points.size() == 5);
  Eigen::Matrix3Xd p_N(3, 5);
  Eigen::Matrix3Xd p_M(3, 5);
  for (int i = 0; i < 5; ++i) {
    p_N.col(i) = list.points[i].p_N;
    p_M.col(i) = list.points[i].p_M;
  }
  const RigidFit fit = fitRigidTransform(p_N, p_M, list.source);
  // The file's comment: xyz 100 -25 0 mm, rpy 0 0 93 deg, measuring errors
  // of at most 0.04 mm per point (invented). Bounds: errors of 0.04 mm can
  // shift the origin by about that much and tilt the frame by about
  // 0.04 mm over the 108 mm height of the part, 0.02 deg.
  CHECK((fit.X_MN.translation() - Eigen::Vector3d(0.100, -0.025, 0.0)).norm() < 5e-5);
  const Eigen::Matrix3d R_expected(Eigen::AngleAxisd(93.0 * kDeg, Eigen::Vector3d::UnitZ()));
  CHECK(Eigen::AngleAxisd(fit.X_MN.linear() * R_expected.transpose()).angle() < 0.03 * kDeg);
  // Each error is at most 0.04 mm; the fit spreads them, 0.1 mm leaves room.
  for (const double residual : fit.residuals) CHECK(residual < 1e-4);
}

}  // namespace tw::planner
