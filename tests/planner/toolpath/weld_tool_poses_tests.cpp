#include "kinematics/common/angles.hpp"
#include "planner/toolpath/weld_tool_poses.hpp"

#include <catch2/catch.hpp>
#include <random>

#include "planner/toolpath/process_angles.hpp"
#include "planner/toolpath/seam_sampler.hpp"
#include "tests/planner/seam_test_points.hpp"

namespace tw::planner {
namespace {

constexpr double kDeg = kPi / 180.0;
// The bar: configured angles and distances reproduced to 1e-9.
constexpr double kBar = 1e-9;

SeamSample torchCheckSample() {
  SeamSample sample;
  sample.p_XP = Eigen::Vector3d(0.1, 0.0, 0.0);
  sample.tangent = Eigen::Vector3d::UnitX();
  sample.normal = Eigen::Vector3d::UnitZ();
  sample.second_normal = Eigen::Vector3d::UnitY();
  return sample;
}

TEST_CASE("The torch frame check vector of the reference file", "[planner][weld][reference]") {
  // domain-facts.md §1 "Torch frame check" [C]: n1 = (0,0,1), n2 = (0,1,0),
  // t = (1,0,0); values given to 5 digits, so each component is checked to
  // half a unit of the last digit (5e-6).
  const SeamSample sample = torchCheckSample();
  SECTION("no lean: the wire runs down the bisector at 45 degrees") {
    WeldParameters weld;
    weld.travel_angle = 0.0;
    const Eigen::Vector3d z = weldToolPose(sample, weld, "check").linear().col(2);
    CHECK((z - Eigen::Vector3d(0.0, -0.7071068, -0.7071068)).cwiseAbs().maxCoeff() < 5e-6);
  }
  SECTION("10 degrees push") {
    WeldParameters weld;
    weld.travel_angle = 10.0 * kDeg;
    weld.tilt = TravelTilt::kPush;
    const Eigen::Vector3d z = weldToolPose(sample, weld, "check").linear().col(2);
    CHECK((z - Eigen::Vector3d(0.17365, -0.69636, -0.69636)).cwiseAbs().maxCoeff() < 5e-6);
    // The work angle in the plane perpendicular to the seam stays 45.000°,
    // while the raw angle to the floor normal is 45.864° (same source; 5e-4°
    // is the half-unit of its last digit).
    CHECK(measuredWorkAngle(z, sample.tangent, sample.normal) / kDeg == Approx(45.0).margin(5e-4));
    CHECK(rawAngleToNormal(z, sample.normal) / kDeg == Approx(45.864).margin(5e-4));
    CHECK(measuredTravelAngle(z, sample.tangent) / kDeg == Approx(10.0).margin(5e-4));
  }
  SECTION("drag leans the other way") {
    WeldParameters weld;
    weld.tilt = TravelTilt::kDrag;
    const Eigen::Vector3d z = weldToolPose(sample, weld, "check").linear().col(2);
    CHECK((z - Eigen::Vector3d(-0.17365, -0.69636, -0.69636)).cwiseAbs().maxCoeff() < 5e-6);
  }
}

/// Checks every property the weld pose promises for one sample.
void checkWeldPose(const SeamSample& sample, const WeldParameters& weld,
                   double expected_work_angle) {
  const Eigen::Isometry3d X_XT = weldToolPose(sample, weld, "test.csv");
  const Eigen::Matrix3d R = X_XT.linear();
  const Eigen::Vector3d x = R.col(0);
  const Eigen::Vector3d z = R.col(2);
  // A proper rotation (rounding of a few products: 1e-12).
  CHECK((R.transpose() * R - Eigen::Matrix3d::Identity()).norm() < 1e-12);
  CHECK(R.determinant() == Approx(1.0).margin(1e-12));
  CHECK(std::abs(measuredWorkAngle(z, sample.tangent, sample.normal) - expected_work_angle) < kBar);
  const double lean = weld.tilt == TravelTilt::kPush ? weld.travel_angle : -weld.travel_angle;
  CHECK(std::abs(measuredTravelAngle(z, sample.tangent) - lean) < kBar);
  // The TCP is the wire end, on the seam point, whatever the contact-tip
  // distance (that only sets the stick-out the collision model allows).
  CHECK((X_XT.translation() - sample.p_XP).norm() < kBar);
  // x along travel: perpendicular to z, in the plane of z and the tangent.
  CHECK(x.dot(sample.tangent) > 0.0);
  CHECK(std::abs(R.col(1).dot(sample.tangent)) < kBar);
  // Seen along the seam, the torch stays on the open side of both faces.
  const auto across = [&](const Eigen::Vector3d& n) -> Eigen::Vector3d {
    return n - n.dot(sample.tangent) * sample.tangent;
  };
  CHECK(-z.dot(across(sample.normal)) > 0.0);
  if (sample.second_normal) CHECK(-z.dot(across(*sample.second_normal)) > 0.0);
}

TEST_CASE("Weld poses reproduce work angle and travel angle, the TCP on the seam, on any seam",
          "[planner][weld]") {
  std::mt19937 random(4242);
  std::uniform_real_distribution<double> travel(0.0, 25.0 * kDeg);
  std::uniform_real_distribution<double> work(20.0 * kDeg, 70.0 * kDeg);
  std::uniform_real_distribution<double> ctwd(0.006, 0.025);
  const std::vector<std::pair<const char*, SeamPointList>> seams = {
      {"straight", test::pointList({{0, 0, 0}, {0.1, 0.02, 0}},
                                   {Eigen::Vector3d::UnitZ(), Eigen::Vector3d::UnitZ()},
                                   {Eigen::Vector3d(-0.2, 1, 0), Eigen::Vector3d(-0.2, 1, 0)})},
      {"curved", test::pipeFillet(0.08, 6.0)},
      {"cornered", test::cornerFillet()},
  };
  for (const auto& [name, list] : seams) {
    const std::vector<SeamSample> samples = sampleSeam(list, SamplingOptions{});
    REQUIRE_FALSE(samples.empty());
    for (int trial = 0; trial < 20; ++trial) {
      WeldParameters weld;
      weld.work_angle = work(random);
      weld.travel_angle = travel(random);
      weld.tilt = trial % 2 == 0 ? TravelTilt::kPush : TravelTilt::kDrag;
      weld.contact_tip_distance = ctwd(random);
      CAPTURE(name, trial, *weld.work_angle, weld.travel_angle, weld.contact_tip_distance);
      for (const SeamSample& sample : samples) {
        CAPTURE(sample.p_XP.transpose(), sample.corner);
        checkWeldPose(sample, weld, *weld.work_angle);
      }
    }
  }
}

TEST_CASE("Without a work angle the torch bisects the faces, or stands square to one",
          "[planner][weld]") {
  SECTION("a 90 degree T-joint: 45 degrees (domain-facts §1, Goodheart-Willcox §8.11.2)") {
    checkWeldPose(torchCheckSample(), WeldParameters{}, 45.0 * kDeg);
  }
  SECTION("a 120 degree opening: the bisector lies 60 degrees from each face") {
    SeamSample sample = torchCheckSample();
    // Second face leaning back 30° from vertical: normals 60° apart, opening
    // 120° (plane geometry, common practice, no source).
    sample.second_normal = Eigen::Vector3d(0.0, std::cos(30.0 * kDeg), std::sin(30.0 * kDeg));
    checkWeldPose(sample, WeldParameters{}, 60.0 * kDeg);
  }
  SECTION("a single normal: square to the surface") {
    SeamSample sample = torchCheckSample();
    sample.second_normal.reset();
    checkWeldPose(sample, WeldParameters{}, 90.0 * kDeg);
    WeldParameters leaning;
    leaning.work_angle = 70.0 * kDeg;
    // Leans to the left of travel seen from above: towards +y for t = x, n = z.
    const Eigen::Vector3d z = weldToolPose(sample, leaning, "test.csv").linear().col(2);
    CHECK(z.y() < 0.0);
    checkWeldPose(sample, leaning, 70.0 * kDeg);
  }
}

TEST_CASE("Weld geometry no torch can follow is a located error", "[planner][weld][errors]") {
  SeamSample sample = torchCheckSample();
  sample.line = 17;
  SECTION("a work angle past the second face") {
    WeldParameters weld;
    weld.work_angle = 95.0 * kDeg;
    CHECK_THROWS_WITH(weldToolPose(sample, weld, "seam.csv"),
                      Catch::StartsWith("seam.csv:17: the work angle points the torch into"));
  }
  SECTION("two parallel normals") {
    sample.second_normal = Eigen::Vector3d::UnitZ();
    CHECK_THROWS_WITH(weldToolPose(sample, WeldParameters{}, "seam.csv"),
                      Catch::StartsWith("seam.csv:17: the second normal is parallel"));
  }
  SECTION("a normal along the seam") {
    sample.normal = Eigen::Vector3d::UnitX();
    CHECK_THROWS_WITH(weldToolPose(sample, WeldParameters{}, "seam.csv"),
                      Catch::StartsWith("seam.csv:17: the surface normal lies along the seam"));
  }
}

}  // namespace
}  // namespace tw::planner
