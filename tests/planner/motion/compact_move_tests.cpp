#include <catch2/catch.hpp>

#include <cmath>

#include "planner/motion/compact_move.hpp"
#include "planner/motion/move_compaction.hpp"
#include "tests/planner/motion/seam_fixtures.hpp"

namespace tw::planner {
namespace {

using test::makePose;

constexpr double kDegree = kPi / 180.0;

TEST_CASE("A linear move interpolates position by length and orientation by slerp",
          "[compact_move]") {
  const Eigen::Quaterniond q_start(Eigen::AngleAxisd(0.4, Eigen::Vector3d(1.0, -2.0, 0.5).normalized()));
  const Eigen::Quaterniond q_end(Eigen::AngleAxisd(-1.1, Eigen::Vector3d(0.3, 0.2, 1.0).normalized()));
  const std::vector<Eigen::Isometry3d> poses{
      makePose(Eigen::Vector3d(0.1, 0.2, 0.3), q_start),
      makePose(Eigen::Vector3d(0.15, 0.2, 0.3), Eigen::Quaterniond::Identity()),
      makePose(Eigen::Vector3d(0.2, 0.1, 0.4), q_end)};
  const CompactMove move{MoveShape::kLine, 0, 2, -1};
  CHECK(moveLength(poses, move) == Approx(std::sqrt(0.03)).epsilon(1e-12));  // one norm: rounding only
  // Reference: Eigen's Quaterniond::slerp (shortest-path slerp).
  // Both are atan2/acos of the same product; 1e-12 covers their rounding.
  CHECK(moveRotationAngle(poses, move) == Approx(q_start.angularDistance(q_end)).epsilon(1e-12));
  for (const double u : {0.0, 0.1, 0.37, 0.5, 0.93, 1.0}) {
    CAPTURE(u);
    const Eigen::Isometry3d pose = interpolateMove(poses, move, u);
    const Eigen::Vector3d expected = (1.0 - u) * poses[0].translation() + u * poses[2].translation();
    CHECK((pose.translation() - expected).norm() < 1e-15);  // rounding of a few operations on 0.1 m
    const Eigen::Quaterniond reference = q_start.slerp(u, q_end);
    CHECK(Eigen::Quaterniond(pose.linear()).angularDistance(reference) < 1e-7);  // acos(·) resolves 1e-8 rad
  }
  SECTION("the end poses are returned bit for bit") {
    CHECK(interpolateMove(poses, move, 0.0).matrix() == poses[0].matrix());
    CHECK(interpolateMove(poses, move, 1.0).matrix() == poses[2].matrix());
  }
  SECTION("a line's tangents are its direction") {
    const MoveEndTangents tangents = moveEndTangents(poses, move);
    const Eigen::Vector3d direction = (poses[2].translation() - poses[0].translation()).normalized();
    // A unit vector from one normalisation: a few ulp.
    CHECK((tangents.at_start - direction).norm() < 1e-15);
    CHECK((tangents.at_end - direction).norm() < 1e-15);
  }
}

TEST_CASE("A circular move follows the circle through start, via and end", "[compact_move]") {
  // A 90° arc of radius 50 mm about centre c in a tilted plane; the via is
  // deliberately off the arc's middle (at 30°) to show that the circle, not
  // the via's place, fixes the interpolation.
  const Eigen::Vector3d centre(0.4, -0.1, 0.25);
  const Eigen::Matrix3d plane = Eigen::AngleAxisd(0.7, Eigen::Vector3d(1.0, 1.0, 0.0).normalized()).toRotationMatrix();
  const double radius = 50e-3;
  const auto onCircle = [&](double angle) {
    return Eigen::Vector3d(centre + plane * (radius * Eigen::Vector3d(std::cos(angle), std::sin(angle), 0.0)));
  };
  const Eigen::Quaterniond q_start = Eigen::Quaterniond::Identity();
  const Eigen::Quaterniond q_end(Eigen::AngleAxisd(40.0 * kDegree, Eigen::Vector3d::UnitY()));
  const std::vector<Eigen::Isometry3d> poses{makePose(onCircle(0.0), q_start),
                                             makePose(onCircle(30.0 * kDegree), q_start),
                                             makePose(onCircle(90.0 * kDegree), q_end)};
  const CompactMove move{MoveShape::kArc, 0, 2, 1};
  // Arc length Rθ (derived here); the circumcentre from three rounded points
  // is good to ~1e-15 m relative to 0.05 m, so 1e-12 is ample.
  CHECK(moveLength(poses, move) == Approx(radius * 0.5 * kPi).epsilon(1e-12));
  for (const double u : {0.25, 0.5, 0.8}) {
    CAPTURE(u);
    const Eigen::Isometry3d pose = interpolateMove(poses, move, u);
    // Position by arc length: angle u·90° on the circle (derived here);
    // 1e-12 m: rounding of the circumcentre and of cos/sin, as above.
    CHECK((pose.translation() - onCircle(u * 0.5 * kPi)).norm() < 1e-12);
    CHECK(Eigen::Quaterniond(pose.linear()).angularDistance(q_start.slerp(u, q_end)) < 1e-7);
  }
  SECTION("tangents are perpendicular to the radius, in the direction of travel") {
    // Unit vectors from the rounded circumcentre: 1e-12 as above.
    const MoveEndTangents tangents = moveEndTangents(poses, move);
    CHECK((tangents.at_start - plane * Eigen::Vector3d::UnitY()).norm() < 1e-12);
    CHECK((tangents.at_end - plane * -Eigen::Vector3d::UnitX()).norm() < 1e-12);
  }
}

TEST_CASE("Check fractions respect both the length and the angle step", "[compact_move]") {
  const Eigen::Quaterniond turned(Eigen::AngleAxisd(30.0 * kDegree, Eigen::Vector3d::UnitZ()));
  SECTION("a long line: 1 mm steps") {
    const std::vector<Eigen::Isometry3d> poses{makePose(Eigen::Vector3d::Zero(), Eigen::Quaterniond::Identity()),
                                               makePose(Eigen::Vector3d(0.3005, 0.0, 0.0), Eigen::Quaterniond::Identity())};
    const std::vector<double> fractions = moveCheckFractions(poses, {MoveShape::kLine, 0, 1, -1});
    REQUIRE(fractions.size() == 302);  // ceil(300.5 mm / 1 mm) = 301 intervals
    CHECK(fractions.front() == 0.0);
    CHECK(fractions.back() == 1.0);
    CHECK((fractions[1] - fractions[0]) * 0.3005 <= 1e-3);
  }
  SECTION("a short line that turns 30 degrees: 2 degree steps") {
    const std::vector<Eigen::Isometry3d> poses{makePose(Eigen::Vector3d::Zero(), Eigen::Quaterniond::Identity()),
                                               makePose(Eigen::Vector3d(0.004, 0.0, 0.0), turned)};
    const std::vector<double> fractions = moveCheckFractions(poses, {MoveShape::kLine, 0, 1, -1});
    REQUIRE(fractions.size() == 16);  // 30° / 2° = 15 intervals beat 4 mm / 1 mm = 4
    for (std::size_t k = 1; k < fractions.size(); ++k) {
      CHECK((fractions[k] - fractions[k - 1]) * 30.0 <= 2.0 + 1e-9);  // 1e-9: rounding of k/15
    }
  }
  SECTION("bad steps are refused") {
    const std::vector<Eigen::Isometry3d> poses{makePose(Eigen::Vector3d::Zero(), Eigen::Quaterniond::Identity()),
                                               makePose(Eigen::Vector3d(0.004, 0.0, 0.0), turned)};
    CHECK_THROWS_AS(moveCheckFractions(poses, {MoveShape::kLine, 0, 1, -1}, 0.0), std::invalid_argument);
  }
}

TEST_CASE("Moves that do not fit their pose list are refused", "[compact_move]") {
  const std::vector<Eigen::Isometry3d> poses{
      makePose(Eigen::Vector3d(0.0, 0.0, 0.0), Eigen::Quaterniond::Identity()),
      makePose(Eigen::Vector3d(0.01, 0.0, 0.0), Eigen::Quaterniond::Identity()),
      makePose(Eigen::Vector3d(0.02, 0.0, 0.0), Eigen::Quaterniond::Identity())};
  CHECK_THROWS_AS(interpolateMove(poses, {MoveShape::kLine, 0, 3, -1}, 0.5), std::invalid_argument);
  CHECK_THROWS_AS(interpolateMove(poses, {MoveShape::kLine, 2, 1, -1}, 0.5), std::invalid_argument);
  CHECK_THROWS_AS(interpolateMove(poses, {MoveShape::kLine, 0, 2, 1}, 0.5), std::invalid_argument);
  CHECK_THROWS_AS(interpolateMove(poses, {MoveShape::kArc, 0, 2, 2}, 0.5), std::invalid_argument);
  // Collinear points define no circle.
  CHECK_THROWS_WITH(interpolateMove(poses, {MoveShape::kArc, 0, 2, 1}, 0.5), Catch::Contains("collinear"));
  CHECK_THROWS_AS(interpolateMove(poses, {MoveShape::kLine, 0, 2, -1}, 1.5), std::invalid_argument);
}

}  // namespace
}  // namespace tw::planner
