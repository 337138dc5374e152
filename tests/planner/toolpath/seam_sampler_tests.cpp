#include "kinematics/common/angles.hpp"
#include "planner/toolpath/seam_sampler.hpp"

#include <catch2/catch.hpp>
#include <cmath>

#include "kinematics/common/input_error.hpp"
#include "tests/planner/seam_test_points.hpp"

namespace tw::planner {
namespace {

// Sums of a few mm-sized steps: rounding stays near 1e-17 m.
constexpr double kExact = 1e-12;

TEST_CASE("A straight seam is divided evenly, never coarser than the step", "[planner][sampler]") {
  const SeamPointList list = test::pointList({{0, 0, 0}, {0.1, 0, 0}},
                                             {Eigen::Vector3d::UnitZ(), Eigen::Vector3d::UnitZ()});
  const std::vector<SeamSample> samples = sampleSeam(list, SamplingOptions{0.03, 0.3});
  // 100 mm at most 30 mm apart: ceil(100/30) = 4 pieces of 25 mm (common practice, no source).
  REQUIRE(samples.size() == 5);
  for (std::size_t i = 0; i < samples.size(); ++i) {
    CAPTURE(i);
    CHECK((samples[i].p_XP - Eigen::Vector3d(0.025 * i, 0, 0)).norm() < kExact);
    CHECK(samples[i].arc_length == Approx(0.025 * i).margin(kExact));
    CHECK(samples[i].tangent == Eigen::Vector3d::UnitX());
    CHECK_FALSE(samples[i].corner);
  }
  SECTION("an exact multiple of the step gets no extra sample") {
    CHECK(sampleSeam(list, SamplingOptions{0.025, 0.3}).size() == 5);
  }
}

TEST_CASE("A sample on a listed point names that point's line, one between names the line before",
          "[planner][sampler]") {
  // 200 points 2 mm apart on a straight line sampled every 2 mm (the
  // default): every sample lands on a listed point, most of them at the
  // end of the previous segment as the sampler walks the polyline. Also a
  // list at 0.7 mm spacing, whose points mostly fall between samples.
  for (const double spacing : {0.002, 0.0007}) {
    std::vector<Eigen::Vector3d> positions;
    std::vector<Eigen::Vector3d> normals;
    for (int i = 0; i < 200; ++i) {
      positions.emplace_back(spacing * i, 0.0, 0.0);
      normals.push_back(Eigen::Vector3d::UnitZ());
    }
    const SeamPointList list = test::pointList(positions, normals);
    const std::vector<SeamSample> samples = sampleSeam(list, SamplingOptions{});
    REQUIRE(samples.size() > 2);
    int on_points = 0;
    for (std::size_t k = 0; k < samples.size(); ++k) {
      const double x = samples[k].p_XP.x();
      // The listed point at or before the sample, found from its position.
      const int before = static_cast<int>(std::floor(x / spacing + 1e-6));
      const bool on_point = std::abs(x - spacing * before) < 1e-9;
      on_points += on_point;
      CAPTURE(spacing, k, x, before, on_point);
      // pointList numbers point i at line i + 2 (after a header).
      CHECK(samples[k].line == std::min(before, 199) + 2);
    }
    // At 2 mm every sample is on a listed point (the case of the report);
    // at 0.7 mm (199 × 0.7 mm in 70 pieces) only the two ends are.
    CHECK(on_points == (spacing == 0.002 ? static_cast<int>(samples.size()) : 2));
  }
}

TEST_CASE("A corner is kept exactly, once arriving and once leaving", "[planner][sampler]") {
  const std::vector<SeamSample> samples =
      sampleSeam(test::cornerFillet(), SamplingOptions{0.01, 0.3});
  // 50 mm in 5 pieces (6 samples) and 40 mm in 4 pieces (5 samples).
  REQUIRE(samples.size() == 11);
  const SeamSample& arriving = samples[5];
  const SeamSample& leaving = samples[6];
  CHECK(arriving.corner);
  CHECK(leaving.corner);
  CHECK((arriving.p_XP - Eigen::Vector3d(0.05, 0, 0)).norm() < kExact);
  CHECK((leaving.p_XP - arriving.p_XP).norm() < kExact);
  CHECK(arriving.tangent == Eigen::Vector3d::UnitX());
  CHECK(leaving.tangent == Eigen::Vector3d::UnitY());
  CHECK(arriving.arc_length == Approx(0.05).margin(kExact));
  CHECK(samples.back().arc_length == Approx(0.09).margin(kExact));
  int corners = 0;
  for (const SeamSample& sample : samples) corners += sample.corner;
  CHECK(corners == 2);
  SECTION("a larger corner angle treats the turn as smooth") {
    const std::vector<SeamSample> smooth = sampleSeam(
        test::cornerFillet(), SamplingOptions{0.01, 100.0 * kPi / 180.0});
    CHECK(smooth.size() == 10);
    CHECK(smooth[5].tangent.isApprox(Eigen::Vector3d(1, 1, 0).normalized(), 1e-12));
  }
}

TEST_CASE("A curved seam gets unit tangents and normals that follow the curve",
          "[planner][sampler]") {
  const SeamPointList list = test::pipeFillet(0.1, 5.0);
  const std::vector<SeamSample> samples = sampleSeam(list, SamplingOptions{});
  REQUIRE(samples.size() > list.points.size());
  double previous_s = -1.0;
  for (std::size_t i = 0; i < samples.size(); ++i) {
    const SeamSample& sample = samples[i];
    CAPTURE(i, sample.p_XP.transpose());
    CHECK_FALSE(sample.corner);
    // Unit length to rounding (1e-12): they are normalised on construction.
    CHECK(sample.tangent.norm() == Approx(1.0).margin(1e-12));
    CHECK(sample.second_normal->norm() == Approx(1.0).margin(1e-12));
    // The chords of a 5° polygon stay within 1 - cos(2.5°) = 0.1 % of the radius.
    CHECK(sample.p_XP.norm() == Approx(0.1).epsilon(1e-3));
    // The tangent turns with the circle: within 2.5° of the true tangent.
    const Eigen::Vector3d circle_tangent(-sample.p_XP.y(), sample.p_XP.x(), 0.0);
    CHECK(sample.tangent.dot(circle_tangent.normalized()) >
          std::cos(2.5 * kPi / 180.0));
    if (i > 0) CHECK((sample.p_XP - samples[i - 1].p_XP).norm() <= SamplingOptions{}.step + kExact);
    CHECK(sample.arc_length > previous_s);
    previous_s = sample.arc_length;
  }
}

TEST_CASE("Per-point speeds are interpolated along the seam", "[planner][sampler]") {
  SeamPointList list = test::pointList({{0, 0, 0}, {0.01, 0, 0}},
                                       {Eigen::Vector3d::UnitZ(), Eigen::Vector3d::UnitZ()});
  list.points[0].speed = 0.010;
  list.points[1].speed = 0.020;
  const std::vector<SeamSample> samples = sampleSeam(list, SamplingOptions{0.0025, 0.3});
  REQUIRE(samples.size() == 5);
  // Linear in arc length (common practice, no source).
  CHECK(*samples[2].speed == Approx(0.015).margin(1e-15));
  CHECK(*samples[4].speed == Approx(0.020).margin(1e-15));
}

TEST_CASE("Seams that cannot be sampled are located errors", "[planner][sampler][errors]") {
  const Eigen::Vector3d z = Eigen::Vector3d::UnitZ();
  SECTION("a normal turning by more than 90 degrees between neighbouring points") {
    const SeamPointList list = test::pointList({{0, 0, 0}, {0.01, 0, 0}, {0.02, 0, 0}}, {z, z, -z});
    CHECK_THROWS_WITH(sampleSeam(list, SamplingOptions{}),
                      Catch::StartsWith("test.csv:4: the surface normal turns"));
  }
  SECTION("a seam that turns back on itself") {
    const SeamPointList list = test::pointList({{0, 0, 0}, {0.01, 0, 0}, {0.0, 0, 0}}, {z, z, z});
    CHECK_THROWS_WITH(sampleSeam(list, SamplingOptions{}),
                      Catch::StartsWith("test.csv:3: the seam turns back"));
  }
  SECTION("a point list built in code with a repeated point") {
    const SeamPointList list = test::pointList({{0, 0, 0}, {0, 0, 0}}, {z, z});
    CHECK_THROWS_WITH(sampleSeam(list, SamplingOptions{}),
                      Catch::StartsWith("test.csv:3: this point repeats"));
  }
  SECTION("a non-positive step") {
    const SeamPointList list = test::pointList({{0, 0, 0}, {0.01, 0, 0}}, {z, z});
    CHECK_THROWS_AS(sampleSeam(list, SamplingOptions{0.0, 0.3}), InputError);
  }
}

}  // namespace
}  // namespace tw::planner
