#include "planner/timing/time_optimal_parameterization.hpp"

#include "planner/timing/trapezoid_profile.hpp"

#include "tests/planner/timing/analytic_paths.hpp"
#include "tests/planner/timing/phase_plane_integration.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>

namespace tw::planner {
namespace {


using test::PhasePlaneProblem;
using test::phasePlaneIntegrationDuration;
using test::randomSinusoidPath;
using test::sampleDerivatives;
using test::SinusoidPath;
using test::StraightLinePath;
using test::uniformGrid;

constexpr double kInf = std::numeric_limits<double>::infinity();

TimeOptimalLimits boxLimits(const Eigen::VectorXd& velocity, const Eigen::VectorXd& acceleration) {
  TimeOptimalLimits limits;
  limits.max_velocity = velocity;
  limits.max_acceleration = acceleration;
  return limits;
}

Eigen::VectorXd vector1(double value) { return Eigen::VectorXd::Constant(1, value); }

/// The oracle: the project's rest-to-rest trapezoid over distance h with
/// bounds v and a (planner/timing/trapezoid_profile.hpp, which cites
/// Biagiotti & Melchiorri, "Trajectory Planning for Automatic Machines and
/// Robots", Springer 2008, ch. 3: T = h/v + v/a when h ≥ v²/a, otherwise
/// T = 2·√(h/a)), the timing the process moves had before TOPP-RA.
double trapezoidDuration(double h, double v, double a) { return TrapezoidProfile(h, v, a).duration(); }

// Limits for the curved 6-joint paths (invented).
const Eigen::VectorXd kCurvedVelocity = (Eigen::VectorXd(6) << 1.5, 1.5, 2.0, 2.5, 3.0, 3.0).finished();
const Eigen::VectorXd kCurvedAcceleration = (Eigen::VectorXd(6) << 3.0, 3.0, 4.0, 6.0, 8.0, 8.0).finished();

TEST_CASE("A straight joint-space segment reproduces the analytic trapezoid", "[toppra][trapezoid]") {
  // With q' constant and q'' = 0 the joint limits become constant bounds
  // ṡ ≤ v_s = min_j v_j/|Δq_j| and |s̈| ≤ a_s = min_j a_j/|Δq_j|, so the
  // optimum is the trapezoid in s (reference above). Constant-s̈ intervals
  // represent it exactly when the two switching points s = v_s²/(2 a_s) and
  // 1 − v_s²/(2 a_s) (or the apex s = 1/2 of a short move) are grid points.
  // Tolerance 1e-6 s: the bar of the task; aligned grids are exact to rounding.
  SECTION("long move, 1 joint, grids through the switching points") {
    // Check value from /work/shared/reference/domain-facts.md: h = 1, v = 0.5,
    // a = 1 → T = 2.5 s; switching at s = 0.125 and 0.875.
    const StraightLinePath line{vector1(0.0), vector1(1.0)};
    const TimeOptimalLimits limits = boxLimits(vector1(0.5), vector1(1.0));
    for (const std::size_t intervals : {8u, 1000u}) {
      CAPTURE(intervals);
      const TimedPath timed = parameterizeTimeOptimal(sampleDerivatives(line, uniformGrid(intervals)), limits);
      REQUIRE(timed.feasible);
      CHECK(timed.duration == Approx(2.5).margin(1e-6));
      CHECK(trapezoidDuration(1.0, 0.5, 1.0) == Approx(2.5).margin(1e-12));
      // Cruise at exactly v (the plateau of the trapezoid).
      CHECK(*std::max_element(timed.path_speed.begin(), timed.path_speed.end()) ==
            Approx(0.5).margin(1e-12));
    }
  }
  SECTION("short move, no cruise") {
    // Check value from domain-facts.md: h = 0.1, v = 0.5, a = 1 →
    // T = 2·√0.1 = 0.6325 s, peak 0.3162 [joint units/s]. Apex at s = 1/2.
    const StraightLinePath line{vector1(0.0), vector1(0.1)};
    const TimeOptimalLimits limits = boxLimits(vector1(0.5), vector1(1.0));
    const TimedPath timed = parameterizeTimeOptimal(sampleDerivatives(line, uniformGrid(1000)), limits);
    REQUIRE(timed.feasible);
    CHECK(timed.duration == Approx(trapezoidDuration(0.1, 0.5, 1.0)).margin(1e-6));
    CHECK(timed.duration == Approx(0.6325).margin(1e-4));  // domain-facts.md, 4 digits
    // Peak joint speed 0.3162 = path speed 3.162 times |q'| = 0.1.
    CHECK(0.1 * timed.path_speed[500] == Approx(0.3162).margin(1e-4));
  }
  SECTION("three joints, one of them still (q' = q'' = 0)") {
    // Δq = (0.8, 1.2, 0): v_s = min(0.5/0.8, 0.9/1.2) = 0.625,
    // a_s = min(1.0/0.8, 2.0/1.2) = 1.25; T = 1/0.625 + 0.625/1.25 = 2.1 s.
    // Switching at s = 0.625²/2.5 = 5/32, so N = 32·k aligns.
    const StraightLinePath line{(Eigen::VectorXd(3) << 0.2, -0.4, 1.0).finished(),
                                (Eigen::VectorXd(3) << 1.0, 0.8, 1.0).finished()};
    const TimeOptimalLimits limits = boxLimits((Eigen::VectorXd(3) << 0.5, 0.9, 0.1).finished(),
                                               (Eigen::VectorXd(3) << 1.0, 2.0, 0.05).finished());
    for (const std::size_t intervals : {32u, 1024u}) {
      CAPTURE(intervals);
      const TimedPath timed = parameterizeTimeOptimal(sampleDerivatives(line, uniformGrid(intervals)), limits);
      REQUIRE(timed.feasible);
      CHECK(timed.duration == Approx(trapezoidDuration(1.0, 0.625, 1.25)).margin(1e-6));
      CHECK(timed.duration == Approx(2.1).margin(1e-12));
    }
  }
  SECTION("a grid that misses the switching points needs about 1,000 intervals") {
    // On a misaligned grid the interval holding a switching point gets a
    // blended s̈, costing O(Δ²) per corner. Measured (this implementation,
    // h = 1, v = 0.5, a = 1): error 2.0e-4 s at N = 100, 1.45e-6 s at
    // N = 777, 8.7e-7 s at N = 1001 — the first of these below 1e-6.
    const StraightLinePath line{vector1(0.0), vector1(1.0)};
    const TimeOptimalLimits limits = boxLimits(vector1(0.5), vector1(1.0));
    const TimedPath coarse = parameterizeTimeOptimal(sampleDerivatives(line, uniformGrid(100)), limits);
    const TimedPath fine = parameterizeTimeOptimal(sampleDerivatives(line, uniformGrid(1001)), limits);
    REQUIRE(coarse.feasible);
    REQUIRE(fine.feasible);
    CHECK(fine.duration == Approx(2.5).margin(1e-6));
    // Every discrete solution is a feasible continuous timing of a straight
    // line, so it cannot beat the analytic optimum (rounding margin 1e-12 s).
    CHECK(coarse.duration >= 2.5 - 1e-12);
    CHECK(fine.duration >= 2.5 - 1e-12);
    CHECK(coarse.duration - 2.5 > fine.duration - 2.5);
  }
}

TEST_CASE("Sampled every 1 ms along a curved 6-joint path, no joint exceeds its limits", "[toppra][limits]") {
  // Tolerance 0.1 %: the limits are enforced at the grid points with both
  // neighbouring interval accelerations (first-order interpolation), so the
  // only excess is the O(Δ²) curvature of q'(s)·s̈ + q''(s)·ṡ² inside an
  // interval, here ≈ 1e-7 relative. The second difference of q(s(t)) with
  // h = 1 ms is exactly a triangle-weighted average of q̈ over [t−h, t+h]
  // (q(s(t)) is C¹ with piecewise-continuous q̈), so it never exceeds the true
  // peak; its rounding error is ≈ 4·eps·|q|/h² ≈ 1e-9 rad/s².
  constexpr double kSampleStep = 1e-3;
  constexpr double kTolerance = 1e-3;
  for (const unsigned seed : {11u, 12u, 13u}) {
    CAPTURE(seed);
    const SinusoidPath path = randomSinusoidPath(6, seed);
    CAPTURE(path.slope.transpose(), path.amplitude.transpose(), path.frequency.transpose(),
            path.phase.transpose());
    const TimedPath timed = parameterizeTimeOptimal(sampleDerivatives(path, uniformGrid(1000)),
                                                    boxLimits(kCurvedVelocity, kCurvedAcceleration));
    REQUIRE(timed.feasible);
    double worst_velocity_ratio = 0.0;
    double worst_acceleration_ratio = 0.0;
    const auto positionAt = [&](double t) { return path.position(samplePathState(timed, t).s); };
    const int samples = static_cast<int>(std::floor(timed.duration / kSampleStep));
    REQUIRE(samples > 100);
    for (int k = 0; k <= samples; ++k) {
      const double t = k * kSampleStep;
      const PathState state = samplePathState(timed, t);
      const Eigen::VectorXd velocity = path.firstDerivative(state.s) * state.path_speed;
      worst_velocity_ratio =
          std::max(worst_velocity_ratio, velocity.cwiseAbs().cwiseQuotient(kCurvedVelocity).maxCoeff());
      if (k == 0 || k == samples) continue;
      const Eigen::VectorXd acceleration =
          (positionAt(t + kSampleStep) - 2.0 * positionAt(t) + positionAt(t - kSampleStep)) /
          (kSampleStep * kSampleStep);
      const double ratio = acceleration.cwiseAbs().cwiseQuotient(kCurvedAcceleration).maxCoeff();
      if (ratio > worst_acceleration_ratio) worst_acceleration_ratio = ratio;
    }
    CAPTURE(worst_velocity_ratio, worst_acceleration_ratio);
    CHECK(worst_velocity_ratio <= 1.0 + kTolerance);
    CHECK(worst_acceleration_ratio <= 1.0 + kTolerance);
    // A time-optimal timing saturates some limit almost all the time; 0.99
    // leaves room for the 1 ms sampling missing the exact peak.
    CHECK(std::max(worst_velocity_ratio, worst_acceleration_ratio) >= 0.99);
  }
}

TEST_CASE("Total time is within 2 % of the phase-plane numerical-integration optimum", "[toppra][optimality]") {
  // Reference: tests/phase_plane_integration.hpp, the NI method of Bobrow,
  // Dubowsky & Gibson (IJRR 1985) and Shin & McKay (IEEE TAC 1985), with the
  // MVC found by bisection, 20,000 Heun steps. Tolerance 2 %: the task's bar;
  // TOPP-RA's own discretisation error is O(Δ) (measured ≤ 0.16 % at N = 1000).
  constexpr std::size_t kReferenceSteps = 20000;
  constexpr double kTolerance = 0.02;

  SECTION("the reference itself reproduces the trapezoid") {
    // Biagiotti & Melchiorri 2008 ch. 3 (from memory): h = 1, v = 0.5, a = 1 → 2.5 s.
    // Tolerance 1e-6 s: Heun is exact for a constant s̈ and the switching
    // points 0.125, 0.875 fall on the reference grid.
    const StraightLinePath line{vector1(0.0), vector1(1.0)};
    const PhasePlaneProblem problem{vector1(0.5), vector1(1.0)};
    CHECK(phasePlaneIntegrationDuration(line, 1.0, problem, kReferenceSteps) ==
          Approx(2.5).margin(1e-6));
  }
  SECTION("random curved 6-joint paths, rest to rest") {
    for (const unsigned seed : {1u, 2u, 3u, 4u, 5u}) {
      CAPTURE(seed);
      const SinusoidPath path = randomSinusoidPath(6, seed);
      CAPTURE(path.slope.transpose(), path.amplitude.transpose(), path.frequency.transpose(),
              path.phase.transpose());
      const double reference = phasePlaneIntegrationDuration(
          path, 1.0, PhasePlaneProblem{kCurvedVelocity, kCurvedAcceleration}, kReferenceSteps);
      const TimedPath timed = parameterizeTimeOptimal(sampleDerivatives(path, uniformGrid(1000)),
                                                      boxLimits(kCurvedVelocity, kCurvedAcceleration));
      REQUIRE(timed.feasible);
      CAPTURE(reference, timed.duration);
      CHECK(std::abs(timed.duration - reference) <= kTolerance * reference);
      // Refining the grid tenfold brings TOPP-RA closer to the continuous
      // optimum (convergence of the discretisation; common practice, no source).
      const TimedPath finer = parameterizeTimeOptimal(sampleDerivatives(path, uniformGrid(10000)),
                                                      boxLimits(kCurvedVelocity, kCurvedAcceleration));
      REQUIRE(finer.feasible);
      CHECK(std::abs(finer.duration - reference) < std::abs(timed.duration - reference));
    }
  }
  SECTION("non-zero start and end path speeds") {
    const SinusoidPath path = randomSinusoidPath(6, 21u);
    const PhasePlaneProblem problem{kCurvedVelocity, kCurvedAcceleration, 0.3, 0.2};
    TimeOptimalLimits limits = boxLimits(kCurvedVelocity, kCurvedAcceleration);
    limits.start_path_speed = 0.3;
    limits.end_path_speed = 0.2;
    const double reference = phasePlaneIntegrationDuration(path, 1.0, problem, kReferenceSteps);
    const TimedPath timed = parameterizeTimeOptimal(sampleDerivatives(path, uniformGrid(1000)), limits);
    REQUIRE(timed.feasible);
    CAPTURE(reference, timed.duration);
    CHECK(std::abs(timed.duration - reference) <= kTolerance * reference);
    // Boundary speeds are met exactly, not approximately.
    CHECK(timed.path_speed.front() == 0.3);
    CHECK(timed.path_speed.back() == Approx(0.2).margin(1e-12));
  }
  SECTION("a joint that turns around (q' = 0, q'' != 0 at grid points)") {
    // Joint 0: q = 0.5·(1 − cos 2πs), q' = π·sin 2πs vanishes at s = 0, 1/2, 1
    // where q'' = ±2π², so only its acceleration limit bounds ṡ there:
    // ṡ² ≤ a/(2π²). Joint 1 moves linearly.
    SinusoidPath path{(Eigen::VectorXd(2) << 0.5, 0.0).finished(),
                      (Eigen::VectorXd(2) << 0.0, 0.8).finished(),
                      (Eigen::VectorXd(2) << 0.5, 0.0).finished(),
                      (Eigen::VectorXd(2) << 2.0 * kPi, 1.0).finished(),
                      (Eigen::VectorXd(2) << -0.5 * kPi, 0.0).finished()};
    const Eigen::VectorXd velocity = (Eigen::VectorXd(2) << 2.0, 2.0).finished();
    const Eigen::VectorXd acceleration = (Eigen::VectorXd(2) << 3.0, 3.0).finished();
    const std::vector<double> grid = uniformGrid(1000);
    PathDerivatives sampled = sampleDerivatives(path, grid);
    sampled.dq_ds[500][0] = 0.0;  // sin(π) in floating point is 1.2e-16, make the zero exact
    const TimedPath timed = parameterizeTimeOptimal(sampled, boxLimits(velocity, acceleration));
    REQUIRE(timed.feasible);
    // The turnaround is the bottleneck of this path, so the optimum rides the
    // bound there (1e-6 relative: rounding of the pair elimination and sqrt).
    CHECK(timed.path_speed[500] == Approx(std::sqrt(3.0 / (2.0 * kPi * kPi))).epsilon(1e-6));
    const double reference =
        phasePlaneIntegrationDuration(path, 1.0, PhasePlaneProblem{velocity, acceleration}, kReferenceSteps);
    CAPTURE(reference, timed.duration);
    CHECK(std::abs(timed.duration - reference) <= kTolerance * reference);
  }
}

TEST_CASE("Path speed caps are honoured", "[toppra][caps]") {
  const SinusoidPath path = randomSinusoidPath(6, 31u);
  const std::vector<double> grid = uniformGrid(1000);
  const PathDerivatives sampled = sampleDerivatives(path, grid);
  const TimeOptimalLimits uncapped = boxLimits(kCurvedVelocity, kCurvedAcceleration);
  const TimedPath free_timing = parameterizeTimeOptimal(sampled, uncapped);
  REQUIRE(free_timing.feasible);
  const double peak = *std::max_element(free_timing.path_speed.begin(), free_timing.path_speed.end());

  SECTION("a cap on the middle third slows the path there and nowhere exceeds it") {
    TimeOptimalLimits capped = uncapped;
    capped.max_path_speed.assign(grid.size(), kInf);
    const double cap = 0.3 * peak;
    for (std::size_t i = 333; i <= 666; ++i) capped.max_path_speed[i] = cap;
    const TimedPath timed = parameterizeTimeOptimal(sampled, capped);
    REQUIRE(timed.feasible);
    bool cap_reached = false;
    for (std::size_t i = 0; i < grid.size(); ++i) {
      CAPTURE(i);
      // Rounding margin 1e-12 relative: ṡ = √x of a clamped x.
      REQUIRE(timed.path_speed[i] <= capped.max_path_speed[i] * (1.0 + 1e-12));
      if (std::abs(timed.path_speed[i] - cap) <= 1e-9 * cap) cap_reached = true;
    }
    CHECK(cap_reached);
    CHECK(timed.duration > free_timing.duration);
    // Between grid points x = ṡ² is linear in s, so ṡ(t) stays below the
    // larger cap of the interval's ends.
    for (double t = 0.0; t <= timed.duration; t += 1e-3) {
      const PathState state = samplePathState(timed, t);
      const auto after = std::upper_bound(grid.begin(), grid.end(), state.s);
      const std::size_t i = std::min<std::size_t>(after - grid.begin(), grid.size() - 1);
      const double interval_cap = std::max(capped.max_path_speed[i - 1], capped.max_path_speed[i]);
      CAPTURE(t, state.s);
      REQUIRE(state.path_speed <= interval_cap * (1.0 + 1e-12));
    }
  }
  SECTION("+inf caps are the same as no caps") {
    TimeOptimalLimits infinite_caps = uncapped;
    infinite_caps.max_path_speed.assign(grid.size(), kInf);
    const TimedPath timed = parameterizeTimeOptimal(sampled, infinite_caps);
    REQUIRE(timed.feasible);
    CHECK(timed.duration == free_timing.duration);
  }
  SECTION("a zero cap at one grid point makes the path stop there") {
    TimeOptimalLimits stop = uncapped;
    stop.max_path_speed.assign(grid.size(), kInf);
    stop.max_path_speed[400] = 0.0;
    const TimedPath timed = parameterizeTimeOptimal(sampled, stop);
    REQUIRE(timed.feasible);
    CHECK(timed.path_speed[400] == 0.0);
    CHECK(timed.path_speed[399] > 0.0);
    CHECK(std::isfinite(timed.duration));
  }
  SECTION("zero caps at two neighbouring grid points are reported as infeasible") {
    TimeOptimalLimits stuck = uncapped;
    stuck.max_path_speed.assign(grid.size(), kInf);
    stuck.max_path_speed[400] = 0.0;
    stuck.max_path_speed[401] = 0.0;
    const TimedPath timed = parameterizeTimeOptimal(sampled, stuck);
    CHECK_FALSE(timed.feasible);
    REQUIRE(timed.infeasible_index.has_value());
    CHECK(*timed.infeasible_index == 400);
    CHECK_THAT(timed.reason, Catch::Contains("grid index 400") && Catch::Contains("infinite time"));
  }
}

TEST_CASE("Infeasible requests are reported with the grid index, never adjusted", "[toppra][infeasible]") {
  // One joint q = s on s ∈ [0, 1], v = 1, a = 0.2 (invented).
  const StraightLinePath line{vector1(0.0), vector1(1.0)};
  const PathDerivatives sampled = sampleDerivatives(line, uniformGrid(100));
  TimeOptimalLimits limits = boxLimits(vector1(1.0), vector1(0.2));

  SECTION("start speed too high to stop by the end") {
    // Braking distance v²/(2a) = 0.81/0.4 = 2.025 > 1 (elementary kinematics).
    limits.start_path_speed = 0.9;
    const TimedPath timed = parameterizeTimeOptimal(sampled, limits);
    CHECK_FALSE(timed.feasible);
    CHECK(timed.path_speed.empty());
    REQUIRE(timed.infeasible_index.has_value());
    CHECK(*timed.infeasible_index == 100);
    CHECK_THAT(timed.reason, Catch::Contains("start_path_speed 0.9") && Catch::Contains("too high"));
    // The largest stoppable start speed, √(2·a·h) = √0.4, is quoted.
    CHECK_THAT(timed.reason, Catch::Contains("0.632455"));
  }
  SECTION("start speed above the joint velocity limit") {
    limits.start_path_speed = 1.5;
    const TimedPath timed = parameterizeTimeOptimal(sampled, limits);
    CHECK_FALSE(timed.feasible);
    REQUIRE(timed.infeasible_index.has_value());
    CHECK(*timed.infeasible_index == 0);
  }
  SECTION("end speed above the joint velocity limit") {
    limits.end_path_speed = 1.5;
    const TimedPath timed = parameterizeTimeOptimal(sampled, limits);
    CHECK_FALSE(timed.feasible);
    REQUIRE(timed.infeasible_index.has_value());
    CHECK(*timed.infeasible_index == 100);
    CHECK_THAT(timed.reason, Catch::Contains("end_path_speed"));
  }
  SECTION("end speed too high to reach from rest") {
    // From rest over h = 1 at a = 0.2 the speed reaches at most √0.4 < 0.9.
    limits.end_path_speed = 0.9;
    const TimedPath timed = parameterizeTimeOptimal(sampled, limits);
    CHECK_FALSE(timed.feasible);
    REQUIRE(timed.infeasible_index.has_value());
    CHECK(*timed.infeasible_index == 100);
    CHECK_THAT(timed.reason, Catch::Contains("too low"));
  }
  SECTION("rest to rest over a single interval") {
    // One constant s̈ cannot leave rest and return to it: x_1 = x_0 + 2Δu = 0
    // forces u = 0 (TOPP-RA's discretisation, x_{i+1} = x_i + 2Δ_i u_i).
    const TimedPath timed = parameterizeTimeOptimal(sampleDerivatives(line, uniformGrid(1)), limits);
    CHECK_FALSE(timed.feasible);
    REQUIRE(timed.infeasible_index.has_value());
    CHECK(*timed.infeasible_index == 0);
    CHECK_THAT(timed.reason, Catch::Contains("infinite time"));
  }
  SECTION("a path on which nothing moves and no cap bounds the speed") {
    const StraightLinePath still{vector1(0.3), vector1(0.3)};
    const TimedPath timed = parameterizeTimeOptimal(sampleDerivatives(still, uniformGrid(10)), limits);
    CHECK_FALSE(timed.feasible);
    CHECK_THAT(timed.reason, Catch::Contains("unbounded"));
  }
}

TEST_CASE("Bad arguments throw std::invalid_argument naming the field", "[toppra][arguments]") {
  const StraightLinePath line{vector1(0.0), vector1(1.0)};
  PathDerivatives path = sampleDerivatives(line, uniformGrid(10));
  TimeOptimalLimits limits = boxLimits(vector1(1.0), vector1(1.0));
  const auto call = [&] { return parameterizeTimeOptimal(path, limits); };

  SECTION("fewer than two grid points") {
    path = sampleDerivatives(line, {0.0});
    CHECK_THROWS_AS(call(), std::invalid_argument);
    CHECK_THROWS_WITH(call(), Catch::Contains("at least 2 grid points"));
  }
  SECTION("derivative count differs from the grid") {
    path.d2q_ds2.pop_back();
    CHECK_THROWS_AS(call(), std::invalid_argument);
    CHECK_THROWS_WITH(call(), Catch::Contains("one vector per grid point"));
  }
  SECTION("joint count differs from the limits") {
    path.dq_ds[4] = Eigen::VectorXd::Ones(2);
    CHECK_THROWS_WITH(call(), Catch::Contains("path.dq_ds[4]") && Catch::Contains("1 joints"));
  }
  SECTION("non-increasing s") {
    path.s[6] = path.s[5];
    CHECK_THROWS_AS(call(), std::invalid_argument);
    CHECK_THROWS_WITH(call(), Catch::Contains("strictly increasing") && Catch::Contains("s[6]"));
  }
  SECTION("non-finite derivative") {
    path.d2q_ds2[3][0] = std::nan("");
    CHECK_THROWS_WITH(call(), Catch::Contains("non-finite"));
  }
  SECTION("zero velocity limit") {
    limits.max_velocity[0] = 0.0;
    CHECK_THROWS_AS(call(), std::invalid_argument);
    CHECK_THROWS_WITH(call(), Catch::Contains("max_velocity[0] must be finite and > 0"));
  }
  SECTION("negative acceleration limit") {
    limits.max_acceleration[0] = -1.0;
    CHECK_THROWS_WITH(call(), Catch::Contains("max_acceleration[0] must be finite and > 0"));
  }
  SECTION("limit sizes differ") {
    limits.max_acceleration = Eigen::VectorXd::Ones(2);
    CHECK_THROWS_WITH(call(), Catch::Contains("same size"));
  }
  SECTION("path speed cap of the wrong length or negative") {
    limits.max_path_speed.assign(5, 1.0);
    CHECK_THROWS_WITH(call(), Catch::Contains("max_path_speed must be empty or have one value per grid point"));
    limits.max_path_speed.assign(path.s.size(), 1.0);
    limits.max_path_speed[2] = -0.1;
    CHECK_THROWS_WITH(call(), Catch::Contains("max_path_speed[2] must be >= 0"));
  }
  SECTION("negative or infinite boundary speeds") {
    limits.start_path_speed = -0.1;
    CHECK_THROWS_WITH(call(), Catch::Contains("start_path_speed must be finite and >= 0"));
    limits.start_path_speed = 0.0;
    limits.end_path_speed = kInf;
    CHECK_THROWS_WITH(call(), Catch::Contains("end_path_speed must be finite and >= 0"));
  }
}

TEST_CASE("samplePathState follows the constant path acceleration of each interval", "[toppra][sample]") {
  // Trapezoid h = 1, v = 0.5, a = 1 (Biagiotti & Melchiorri 2008 ch. 3, from
  // memory): accelerate for 0.5 s to s = 0.125, cruise to t = 2.0, brake.
  const StraightLinePath line{vector1(0.0), vector1(1.0)};
  const TimedPath timed = parameterizeTimeOptimal(sampleDerivatives(line, uniformGrid(1000)),
                                                  boxLimits(vector1(0.5), vector1(1.0)));
  REQUIRE(timed.feasible);
  // Tolerances 1e-9: the grid contains the switching points, so the samples
  // are exact up to rounding accumulated over 1000 intervals.
  SECTION("accelerating phase: s = a t²/2") {
    const PathState state = samplePathState(timed, 0.3);
    CHECK(state.s == Approx(0.045).margin(1e-9));
    CHECK(state.path_speed == Approx(0.3).margin(1e-9));
    CHECK(state.path_acceleration == Approx(1.0).margin(1e-9));
  }
  SECTION("cruise: s = 0.125 + v (t − 0.5)") {
    const PathState state = samplePathState(timed, 1.0);
    CHECK(state.s == Approx(0.375).margin(1e-9));
    CHECK(state.path_speed == Approx(0.5).margin(1e-9));
    CHECK(state.path_acceleration == Approx(0.0).margin(1e-9));
  }
  SECTION("braking: s = 1 − a (T − t)²/2") {
    const PathState state = samplePathState(timed, 2.3);
    CHECK(state.s == Approx(1.0 - 0.5 * 0.2 * 0.2).margin(1e-9));
    CHECK(state.path_speed == Approx(0.2).margin(1e-9));
    CHECK(state.path_acceleration == Approx(-1.0).margin(1e-9));
  }
  SECTION("t outside [0, T] is clamped") {
    CHECK(samplePathState(timed, -1.0).s == 0.0);
    CHECK(samplePathState(timed, 10.0).s == 1.0);
    CHECK(samplePathState(timed, 10.0).path_speed == 0.0);
  }
  SECTION("misuse throws") {
    CHECK_THROWS_AS(samplePathState(timed, std::nan("")), std::invalid_argument);
    TimedPath failed;
    failed.reason = "example";
    CHECK_THROWS_WITH(samplePathState(failed, 0.0), Catch::Contains("not feasible"));
  }
}

}  // namespace
}  // namespace tw::planner
