// Speed of compactMoves on 500-sample seams (a helix and an S-shaped seam,
// TCP poses every 2 mm, the tool turning slowly; and a straight seam, the
// longest single verification), on one core.
//
// Bar (the brief for this module; DESIGN.md gives ≤ 50 ms for compaction plus
// verification of a 500-waypoint seam): compactMoves ≤ 10 ms.
//
// Reference measured in the same run: the exact shortest path over every
// pair (i, j) tested with MoveFitter::fit, i.e. the O(N²) fit tests that the
// bounded search avoids. Both report the move count as a counter, so the
// output also shows whether the bounded search reached the exact minimum.

#include <benchmark/benchmark.h>

#include <cmath>
#include <limits>

#include "planner/motion/move_compaction.hpp"
#include "tests/planner/motion/seam_fixtures.hpp"

namespace tw::planner {
namespace {

constexpr int kSampleCount = 500;

// Helix of radius 40 mm and pitch 30 mm per turn: about 3.9 turns in 1 m.
CompactionInput helixSeam() {
  const double radius = 40e-3;
  const double rise_per_radian = 30e-3 / (2.0 * kPi);
  const double step = 2e-3 / std::hypot(radius, rise_per_radian);
  std::vector<Eigen::Isometry3d> poses;
  for (int k = 0; k < kSampleCount; ++k) {
    const double angle = k * step;
    const Eigen::Vector3d p(radius * std::cos(angle), radius * std::sin(angle), rise_per_radian * angle);
    const Eigen::Quaterniond q(Eigen::AngleAxisd(0.2 * std::sin(angle / 3.0), Eigen::Vector3d::UnitX()));
    poses.push_back(test::makePose(p, q));
  }
  return test::inputFrom(poses);
}

// S-shaped seam: x advances, y = 60 mm·sin(2πx / 400 mm), with a gentle z wave.
CompactionInput sSeam() {
  std::vector<Eigen::Isometry3d> poses;
  double x = 0.0;
  for (int k = 0; k < kSampleCount; ++k) {
    const Eigen::Vector3d p(x, 60e-3 * std::sin(2.0 * kPi * x / 0.4), 5e-3 * std::sin(2.0 * kPi * x / 0.25));
    const Eigen::Quaterniond q(Eigen::AngleAxisd(0.15 * std::sin(2.0 * kPi * x / 0.3), Eigen::Vector3d::UnitY()));
    poses.push_back(test::makePose(p, q));
    // Advance x so that the step along the curve is about 2 mm.
    const double slope = 60e-3 * 2.0 * kPi / 0.4 * std::cos(2.0 * kPi * x / 0.4);
    x += 2e-3 / std::sqrt(1.0 + slope * slope);
  }
  return test::inputFrom(poses);
}

// A straight 998 mm seam whose tool turns 30° uniformly: one move, the
// longest verification the bounded search does (every sample once).
CompactionInput straightSeam() {
  std::vector<Eigen::Isometry3d> poses;
  for (int k = 0; k < kSampleCount; ++k) {
    const Eigen::Quaterniond q(Eigen::AngleAxisd(0.5236 * k / (kSampleCount - 1), Eigen::Vector3d::UnitZ()));
    poses.push_back(test::makePose(Eigen::Vector3d(2e-3 * k, 0.0, 0.0), q));
  }
  return test::inputFrom(poses);
}

int exactMoveCountOverAllPairs(const CompactionInput& input, const CompactionTolerance& tolerance) {
  const MoveFitter fitter(input, tolerance);
  const int count = fitter.sampleCount();
  std::vector<int> fewest(count, std::numeric_limits<int>::max());
  fewest[0] = 0;
  for (int j = 1; j < count; ++j) {
    for (int i = 0; i < j; ++i) {
      if (fewest[i] + 1 < fewest[j] && fitter.fit(i, j)) fewest[j] = fewest[i] + 1;
    }
  }
  return fewest.back();
}

template <CompactionInput (*MakeSeam)()>
void compactMovesOn(benchmark::State& state) {
  const CompactionInput input = MakeSeam();
  std::size_t moves = 0;
  for (auto _ : state) {
    const std::vector<CompactMove> result = compactMoves(input, {});
    moves = result.size();
    benchmark::DoNotOptimize(result.data());
  }
  state.counters["moves"] = static_cast<double>(moves);
}

template <CompactionInput (*MakeSeam)()>
void referenceAllPairsOn(benchmark::State& state) {
  const CompactionInput input = MakeSeam();
  int moves = 0;
  for (auto _ : state) {
    moves = exactMoveCountOverAllPairs(input, {});
    benchmark::DoNotOptimize(moves);
  }
  state.counters["moves"] = moves;
}

BENCHMARK_TEMPLATE(compactMovesOn, helixSeam)->Unit(benchmark::kMillisecond);
BENCHMARK_TEMPLATE(referenceAllPairsOn, helixSeam)->Unit(benchmark::kMillisecond);
BENCHMARK_TEMPLATE(compactMovesOn, sSeam)->Unit(benchmark::kMillisecond);
BENCHMARK_TEMPLATE(referenceAllPairsOn, sSeam)->Unit(benchmark::kMillisecond);
BENCHMARK_TEMPLATE(compactMovesOn, straightSeam)->Unit(benchmark::kMillisecond);
BENCHMARK_TEMPLATE(referenceAllPairsOn, straightSeam)->Unit(benchmark::kMillisecond);

}  // namespace
}  // namespace tw::planner

BENCHMARK_MAIN();
