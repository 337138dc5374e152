#include <algorithm>
#include <catch2/catch.hpp>
#include <cmath>
#include <limits>
#include <random>
#include <stdexcept>

#include "kinematics/common/angles.hpp"
#include "planner/program/motion_path.hpp"

using namespace tw::planner;
using Eigen::Vector3d;

namespace {

// Positions of a few hundred millimetres computed through a handful of
// products and one atan2: 1e-12 m is far above double rounding there and far
// below anything a file can hold (0.5 µm).
constexpr double kLengthTolerance = 1e-12;
// Angles from atan2 of such vectors: double rounding, with margin.
constexpr double kAngleTolerance = 1e-12;

MotionRecord circularMove(const Vector3d& p_via, const Vector3d& p_end) {
  MotionRecord motion;
  motion.kind = MotionKind::kCircularMove;
  motion.X_RT.translation() = p_end;
  motion.via = ViaPoint{};
  motion.via->X_RV.translation() = p_via;
  return motion;
}

}  // namespace

TEST_CASE("A circular arc through three points has the textbook centre, radius and sweep",
          "[motion-path]") {
  SECTION("a half circle in the xy plane") {
    // Radius 0.025 m about (0.950, 0.025, 0.410): start and end opposite,
    // the via a quarter turn on; by construction (common practice, no source).
    const std::optional<CircularArc> arc = CircularArc::through(
        {0.950, 0.0, 0.410}, {0.975, 0.025, 0.410}, {0.950, 0.050, 0.410});
    REQUIRE(arc);
    CHECK((arc->centre() - Vector3d(0.950, 0.025, 0.410)).norm() < kLengthTolerance);
    CHECK(arc->radius() == Approx(0.025).margin(kLengthTolerance));
    CHECK((arc->normal() - Vector3d::UnitZ()).norm() < kLengthTolerance);
    CHECK(arc->sweep() == Approx(tw::kPi).margin(kAngleTolerance));
    CHECK(arc->viaSweep() == Approx(tw::kPi / 2.0).margin(kAngleTolerance));
    CHECK(arc->length() == Approx(0.025 * tw::kPi).margin(kLengthTolerance));
    // A quarter of the arc length is 45° from the start about the centre.
    const Vector3d expected(0.950 + 0.025 * std::sin(tw::kPi / 4.0),
                            0.025 - 0.025 * std::cos(tw::kPi / 4.0), 0.410);
    CHECK((arc->position(0.25) - expected).norm() < kLengthTolerance);
  }
  SECTION("three quarters of a circle: the arc that holds the via, not the shorter one") {
    // Radius 0.05 m about (0.9, 0.05, 0.51) in the plane x = 0.9: bottom, top
    // (via), then the -y side; the short way from bottom to that side would
    // be a quarter turn without the via.
    const std::optional<CircularArc> arc = CircularArc::through(
        {0.9, 0.05, 0.46}, {0.9, 0.05, 0.56}, {0.9, 0.0, 0.51});
    REQUIRE(arc);
    CHECK(arc->sweep() == Approx(1.5 * tw::kPi).margin(kAngleTolerance));
    CHECK(arc->viaSweep() == Approx(tw::kPi).margin(kAngleTolerance));
    // Halfway between start and via (a quarter turn) lies the +y side.
    CHECK((arc->position(1.0 / 3.0) - Vector3d(0.9, 0.10, 0.51)).norm() < kLengthTolerance);
  }
}

TEST_CASE("Random arcs pass through their three points and have the length of their polyline",
          "[motion-path]") {
  std::mt19937 random(20261205);  // fixed seed: the same arcs on every run
  std::uniform_real_distribution<double> coordinate(-1.0, 1.0);
  int checked = 0;
  for (int trial = 0; trial < 200; ++trial) {
    const Vector3d a(coordinate(random), coordinate(random), coordinate(random));
    const Vector3d b(coordinate(random), coordinate(random), coordinate(random));
    const Vector3d c(coordinate(random), coordinate(random), coordinate(random));
    CAPTURE(trial, a.transpose(), b.transpose(), c.transpose());
    const std::optional<CircularArc> arc = CircularArc::through(a, b, c);
    // Random points in a 2 m cube are almost never within 0.01 mm of a line.
    REQUIRE(arc);
    // Circumradii of random triangles reach metres; 1e-9 m is double
    // rounding through the circumcentre formula with ample margin.
    const double tolerance = 1e-9 * std::max(1.0, arc->radius());
    CHECK((arc->position(0.0) - a).norm() < tolerance);
    CHECK((arc->position(arc->viaSweep() / arc->sweep()) - b).norm() < tolerance);
    CHECK((arc->position(1.0) - c).norm() < tolerance);
    CHECK(arc->viaSweep() > 0.0);
    CHECK(arc->viaSweep() < arc->sweep());
    CHECK(arc->sweep() < 2.0 * tw::kPi);
    // Every point is on the circle, and a fine polyline is as long as the arc:
    // 10,000 chords of an arc of at most 2π fall short by about L·θ²/24
    // with θ ≤ 2π/10^4, i.e. by less than 2e-8 of the length.
    constexpr int kSteps = 10000;
    double polyline = 0.0;
    double off_circle = 0.0;
    Vector3d previous = a;
    for (int k = 1; k <= kSteps; ++k) {
      const Vector3d p = arc->position(static_cast<double>(k) / kSteps);
      off_circle = std::max(off_circle, std::abs((p - arc->centre()).norm() - arc->radius()));
      polyline += (p - previous).norm();
      previous = p;
    }
    CHECK(off_circle < tolerance);
    CHECK(polyline == Approx(arc->length()).epsilon(1e-7));
    ++checked;
  }
  CHECK(checked == 200);
}

TEST_CASE("Three points that define no arc are named as such", "[motion-path]") {
  const Vector3d start(0.5, 0.0, 0.4);
  SECTION("two points closer than 0.01 mm") {
    const auto problem = arcPointProblem(start, {0.5, 0.1, 0.4}, start + Vector3d(0.0, 0.0, 9e-6));
    REQUIRE(problem);
    CHECK_THAT(*problem, Catch::Contains("not distinct"));
    CHECK_FALSE(CircularArc::through(start, {0.5, 0.1, 0.4}, start + Vector3d(0.0, 0.0, 9e-6)));
  }
  SECTION("a via 9 µm off the straight line, then 11 µm off it") {
    const auto flat = arcPointProblem(start, {0.5, 0.05, 0.4 + 9e-6}, {0.5, 0.1, 0.4});
    REQUIRE(flat);
    CHECK_THAT(*flat, Catch::Contains("one straight line"));
    CHECK_FALSE(arcPointProblem(start, {0.5, 0.05, 0.4 + 11e-6}, {0.5, 0.1, 0.4}));
  }
  SECTION("a via beyond the target on the same line") {
    CHECK(arcPointProblem(start, {0.5, 0.2, 0.4}, {0.5, 0.1, 0.4}));
  }
  SECTION("a point that is not finite") {
    CHECK(arcPointProblem(start, {0.5, NAN, 0.4}, {0.5, 0.1, 0.4}));
  }
}

TEST_CASE("Interpolated poses run by path length and slerp the orientation", "[motion-path]") {
  Eigen::Isometry3d X_RS = Eigen::Isometry3d::Identity();
  X_RS.translation() = Vector3d(0.950, 0.0, 0.410);
  SECTION("a linear move: straight, half way at half the fraction") {
    MotionRecord linear;
    linear.kind = MotionKind::kLinearMove;
    linear.X_RT.translation() = Vector3d(0.950, 0.100, 0.410);
    linear.X_RT.linear() = Eigen::AngleAxisd(tw::kPi / 2.0, Vector3d::UnitZ()).toRotationMatrix();
    const Eigen::Isometry3d X_RM = interpolatedPose(X_RS, linear, 0.5);
    CHECK((X_RM.translation() - Vector3d(0.950, 0.050, 0.410)).norm() < kLengthTolerance);
    // Slerp half way between identity and 90° about z is 45° about z.
    CHECK(Eigen::AngleAxisd(X_RM.linear()).angle() == Approx(tw::kPi / 4.0).margin(kAngleTolerance));
    CHECK(pathLength(X_RS.translation(), linear) == Approx(0.1).margin(kLengthTolerance));
  }
  SECTION("a circular move: on the arc, orientation by the fraction of arc length") {
    MotionRecord circular = circularMove({0.975, 0.025, 0.410}, {0.950, 0.050, 0.410});
    circular.X_RT.linear() = Eigen::AngleAxisd(tw::kPi / 2.0, Vector3d::UnitZ()).toRotationMatrix();
    const Eigen::Isometry3d X_RV = interpolatedPose(X_RS, circular, 0.5);
    CHECK((X_RV.translation() - Vector3d(0.975, 0.025, 0.410)).norm() < kLengthTolerance);
    CHECK(Eigen::AngleAxisd(X_RV.linear()).angle() == Approx(tw::kPi / 4.0).margin(kAngleTolerance));
    CHECK(pathLength(X_RS.translation(), circular) == Approx(0.025 * tw::kPi).margin(kLengthTolerance));
    circular.start_time = 2.0;
    circular.duration = 4.0;
    CHECK(viaPassingTime(X_RS.translation(), circular) == Approx(4.0).margin(1e-12));
  }
  SECTION("a joint move has no TCP path of its own") {
    MotionRecord joint;
    CHECK_THROWS_AS(interpolatedPose(X_RS, joint, 0.5), std::invalid_argument);
    CHECK_THROWS_AS(pathLength(X_RS.translation(), joint), std::invalid_argument);
  }
  SECTION("a fraction outside [0, 1] breaks the precondition") {
    const MotionRecord circular = circularMove({0.975, 0.025, 0.410}, {0.950, 0.050, 0.410});
    CHECK_THROWS_AS(interpolatedPose(X_RS, circular, 1.5), std::invalid_argument);
  }
}

TEST_CASE("The blend deviation r·tan(α/4) matches a fillet built point by point", "[motion-path]") {
  // Reference: the fillet constructed directly (tangent points at distance r
  // on both legs, centre where the normals at them meet) and its distance to
  // the corner found by sampling; FORMAT.md derives the closed form.
  const double r = 0.002;
  for (const double alpha_deg : {1.0, 30.0, 60.0, 90.0, 135.0, 170.0}) {
    CAPTURE(alpha_deg);
    const double alpha = alpha_deg * tw::kPi / 180.0;
    // Incoming leg along +x into the corner at the origin, outgoing turned by α.
    const Vector3d in(1.0, 0.0, 0.0);
    const Vector3d out(std::cos(alpha), std::sin(alpha), 0.0);
    const Vector3d A = -r * in;
    const Vector3d B = r * out;
    // The centre lies on the normal of each leg at its tangent point (turning
    // left, the normal is the direction turned by +90°).
    const Vector3d n_in(0.0, 1.0, 0.0);
    const Vector3d n_out(-std::sin(alpha), std::cos(alpha), 0.0);
    // Solve A + t·n_in = B + u·n_out for t (2 × 2, in the xy plane).
    Eigen::Matrix2d m;
    m << n_in.x(), -n_out.x(), n_in.y(), -n_out.y();
    const Eigen::Vector2d tu = m.colPivHouseholderQr().solve((B - A).head<2>());
    const Vector3d C = A + tu[0] * n_in;
    const double rho = (A - C).norm();
    CHECK((B - C).norm() == Approx(rho).epsilon(1e-9));
    // Closest fillet point to the corner, sampled finely along the fillet.
    const double start_angle = std::atan2(A.y() - C.y(), A.x() - C.x());
    double nearest = std::numeric_limits<double>::infinity();
    constexpr int kSteps = 100000;
    for (int k = 0; k <= kSteps; ++k) {
      const double angle = start_angle + alpha * k / kSteps;
      const Vector3d p = C + rho * Vector3d(std::cos(angle), std::sin(angle), 0.0);
      nearest = std::min(nearest, p.norm());
    }
    // Sampling every α/10^5 misses the true minimum by at most ρ·(α/10^5)²/8,
    // below 1e-12 m here; 1e-10 m leaves margin.
    CHECK(blendCornerDeviation(r, alpha) == Approx(nearest).margin(1e-10));
  }
  CHECK(blendCornerDeviation(0.002, 0.0) == 0.0);
  CHECK_THROWS_AS(blendCornerDeviation(-0.001, 0.5), std::invalid_argument);
  CHECK_THROWS_AS(blendCornerDeviation(0.001, tw::kPi), std::invalid_argument);
}
