#include <catch2/catch.hpp>

#include <cmath>
#include <limits>
#include <random>

#include "kinematics/arc_tangent.hpp"
#include "kinematics/common/angles.hpp"

namespace tw::kinematics {
namespace {

// Reference: the C library's std::atan2 (glibc, accurate to < 1 ulp). Four
// ulps of π bound our error: the table entry, the series and the folding
// by π/2 and π each round once.
constexpr double kTolerance = 4.0 * std::numeric_limits<double>::epsilon() * kPi;

TEST_CASE("arcTangent2 agrees with std::atan2 over the whole circle", "[kinematics][arc_tangent]") {
  std::mt19937_64 generator(11);
  std::uniform_real_distribution<double> angle(-kPi, kPi);
  std::uniform_real_distribution<double> log_scale(-12.0, 12.0);
  double worst = 0.0;
  for (int i = 0; i < 1'000'000; ++i) {
    const double a = angle(generator);
    const double r = std::pow(10.0, log_scale(generator));
    const double y = r * std::sin(a);
    const double x = r * std::cos(a);
    worst = std::max(worst, std::abs(arcTangent2(y, x) - std::atan2(y, x)));
  }
  CHECK(worst <= kTolerance);
}

TEST_CASE("arcTangent2 is exact where std::atan2 is, and keeps its signed zeros",
          "[kinematics][arc_tangent]") {
  // The axes, the diagonals and the folding points of the table, each in all
  // four quadrants; C99 Annex F.9.1.4 (via std::atan2) for the zeros.
  const double values[] = {0.0, 1.0, 0.5, 1.0 / 32.0, 3.0 / 32.0, 31.0 / 32.0, 1e-300, 1e300};
  for (const double y : values) {
    for (const double x : values) {
      for (const double sy : {1.0, -1.0}) {
        for (const double sx : {1.0, -1.0}) {
          CAPTURE(sy * y, sx * x);
          const double expected = std::atan2(sy * y, sx * x);
          const double got = arcTangent2(sy * y, sx * x);
          CHECK(std::abs(got - expected) <= kTolerance);
          CHECK(std::signbit(got) == std::signbit(expected));
        }
      }
    }
  }
  CHECK(arcTangent2(0.0, -1.0) == kPi);
  CHECK(arcTangent2(1.0, 0.0) == 0.5 * kPi);
  CHECK(std::isnan(arcTangent2(std::nan(""), 1.0)));
  CHECK(std::isnan(arcTangent2(1.0, std::nan(""))));
}

}  // namespace
}  // namespace tw::kinematics
