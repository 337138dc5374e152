#include <catch2/catch.hpp>

#include <cmath>
#include <limits>
#include <random>

#include "planner/motion/blend_radius.hpp"
#include "planner/motion/move_compaction.hpp"
#include "tests/planner/motion/seam_fixtures.hpp"

namespace tw::planner {
namespace {

constexpr double kDegree = kPi / 180.0;

// Distance from the corner to a fillet built the long way: the circle
// tangent to both legs at distance r from the corner, its centre found by
// intersecting the two legs' normals in the corner's plane, sampled densely.
double filletDeviationByConstruction(double turning, double r) {
  const Eigen::Vector2d corner(0.0, 0.0);
  const Eigen::Vector2d in(1.0, 0.0);
  const Eigen::Vector2d out(std::cos(turning), std::sin(turning));
  const Eigen::Vector2d tangent_in = corner - r * in;
  const Eigen::Vector2d tangent_out = corner + r * out;
  const Eigen::Vector2d normal_in(-in.y(), in.x());
  const Eigen::Vector2d normal_out(-out.y(), out.x());
  // tangent_in + a·normal_in = tangent_out + b·normal_out
  Eigen::Matrix2d system;
  system << normal_in, -normal_out;
  const Eigen::Vector2d ab = system.colPivHouseholderQr().solve(tangent_out - tangent_in);
  const Eigen::Vector2d centre = tangent_in + ab.x() * normal_in;
  const double radius = (tangent_in - centre).norm();
  double nearest = std::numeric_limits<double>::infinity();
  for (int k = 0; k <= 200000; ++k) {
    const double angle = 2.0 * kPi * k / 200000;
    nearest = std::min(nearest, (centre + radius * Eigen::Vector2d(std::cos(angle), std::sin(angle)) - corner).norm());
  }
  return nearest;
}

TEST_CASE("A 90 degree corner with 0.1 mm tolerance gives r = 0.1 mm / tan(22.5 degrees)",
          "[blend]") {
  // δ = r·tan(α/4), derived in blend_radius.hpp: 0.1 / 0.4142136 = 0.2414214 mm,
  // under the 2 mm cap and half of the 10 mm legs.
  const double r = blendRadius(Eigen::Vector3d::UnitX(), Eigen::Vector3d::UnitY(), 10e-3, 10e-3, 0.1e-3);
  CHECK(r == Approx(0.1e-3 / std::tan(22.5 * kDegree)).epsilon(1e-12));
  CHECK(r == Approx(0.2414214e-3).epsilon(1e-6));  // 7 digits of 0.1/0.41421356
}

TEST_CASE("The deviation formula matches a fillet constructed geometrically", "[blend]") {
  // Second route to δ: build the tangent circle and measure (derived here).
  for (const double turning_degrees : {10.0, 45.0, 90.0, 135.0, 170.0}) {
    CAPTURE(turning_degrees);
    const double turning = turning_degrees * kDegree;
    const double r = blendRadius(Eigen::Vector3d::UnitX(), Eigen::Vector3d(std::cos(turning), std::sin(turning), 0.0),
                                 1.0, 1.0, 0.1e-3, 1.0);
    // Sampling the circle at 2π/200000 rad misses its nearest point by
    // < r·(1.6e-5)²: negligible against 1e-9 m.
    CHECK(filletDeviationByConstruction(turning, r) == Approx(0.1e-3).margin(1e-9));
  }
}

TEST_CASE("Blend radius limits", "[blend]") {
  SECTION("straight on: max_radius") {
    CHECK(blendRadius(Eigen::Vector3d::UnitX(), 3.0 * Eigen::Vector3d::UnitX(), 0.1, 0.1, 0.1e-3) == 2e-3);
  }
  SECTION("short legs: half of the shorter") {
    CHECK(blendRadius(Eigen::Vector3d::UnitX(), Eigen::Vector3d::UnitX(), 1e-3, 3e-3, 0.1e-3) == 0.5e-3);
    CHECK(blendRadius(Eigen::Vector3d::UnitX(), Eigen::Vector3d(1.0, 0.01, 0.0), 5e-3, 0.8e-3, 0.1e-3) == 0.4e-3);
  }
  SECTION("a full reversal: r = tolerance, since tan(π/4) = 1") {
    CHECK(blendRadius(Eigen::Vector3d::UnitX(), -Eigen::Vector3d::UnitX(), 1.0, 1.0, 0.1e-3) == Approx(0.1e-3).epsilon(1e-12));
  }
  SECTION("zero tolerance: no blend at a corner") {
    CHECK(blendRadius(Eigen::Vector3d::UnitX(), Eigen::Vector3d::UnitY(), 1.0, 1.0, 0.0) == 0.0);
  }
  SECTION("bad arguments are refused") {
    CHECK_THROWS_AS(blendRadius(Eigen::Vector3d::Zero(), Eigen::Vector3d::UnitY(), 1.0, 1.0, 1e-4), std::invalid_argument);
    CHECK_THROWS_AS(blendRadius(Eigen::Vector3d::UnitX(), Eigen::Vector3d::UnitY(), 0.0, 1.0, 1e-4), std::invalid_argument);
    CHECK_THROWS_AS(blendRadius(Eigen::Vector3d::UnitX(), Eigen::Vector3d::UnitY(), 1.0, 1.0, -1e-4), std::invalid_argument);
    CHECK_THROWS_AS(blendRadius(Eigen::Vector3d::UnitX(), Eigen::Vector3d::UnitY(), 1.0, 1.0, 1e-4, std::nan("")), std::invalid_argument);
  }
}

TEST_CASE("Boundary blend radii use move lengths and arc end tangents", "[blend]") {
  // 20 mm along x, then a 90° arc of radius 10 mm turning left, tangent to
  // the line: the boundary is smooth, so the cap applies; then a line
  // leaving the arc at 90° to its end tangent: 0.241421 mm as above.
  std::vector<Eigen::Isometry3d> poses;
  const Eigen::Quaterniond q = Eigen::Quaterniond::Identity();
  poses.push_back(test::makePose(Eigen::Vector3d(0.0, 0.0, 0.0), q));
  poses.push_back(test::makePose(Eigen::Vector3d(0.02, 0.0, 0.0), q));
  poses.push_back(test::makePose(Eigen::Vector3d(0.02 + 0.01 * std::sin(kPi / 4), 0.01 - 0.01 * std::cos(kPi / 4), 0.0), q));
  poses.push_back(test::makePose(Eigen::Vector3d(0.03, 0.01, 0.0), q));
  poses.push_back(test::makePose(Eigen::Vector3d(0.04, 0.01, 0.0), q));  // leaves the arc (heading +y) along +x
  const std::vector<CompactMove> moves{{MoveShape::kLine, 0, 1, -1}, {MoveShape::kArc, 1, 3, 2}, {MoveShape::kLine, 3, 4, -1}};
  const std::vector<double> radii = boundaryBlendRadii(poses, moves, 0.1e-3);
  REQUIRE(radii.size() == 2);
  CHECK(radii[0] == Approx(2e-3).epsilon(1e-6));  // tangent continuation: the cap (tan(α/4) ≈ 1e-16 here)
  CHECK(radii[1] == Approx(0.1e-3 / std::tan(22.5 * kDegree)).epsilon(1e-9));
  SECTION("a broken chain is refused") {
    const std::vector<CompactMove> broken{{MoveShape::kLine, 0, 1, -1}, {MoveShape::kLine, 2, 4, -1}};
    CHECK_THROWS_AS(boundaryBlendRadii(poses, broken, 0.1e-3), std::invalid_argument);
  }
}

}  // namespace
}  // namespace tw::planner
