// Transit planning on the demo cell (tests/planner/transit_test_world.hpp:
// the sample arm with a torch, a table and an 8 cm wall between the two
// demo configurations), RRT-Connect with shortcutting and smoothing, over
// 50 seeds, one plan per benchmark iteration (manual time: the plan call
// only, the dense re-check is outside it).
//
// Bars (../shared/DESIGN.md): 100 % success, 0 of 50 final paths colliding
// on the dense re-check (every point of arm and tool moving ≤ 1 mm between
// checked states, 0.4 of the margin), median ≤ 20 ms. Reported as counters:
// success_rate, colliding, median_ms, p90_ms (wall), cpu_median_ms,
// cpu_p90_ms (this thread's CPU time), checks per plan, joint-space
// path length before and after simplification. Reference in the same run:
// one checkSegment of the straight 0.3 rad swing of axis 1 at the start
// configuration (BM_ReferenceSegmentCheck), and median_segment_checks_equiv,
// the plan's median time in units of that reference.

#include <benchmark/benchmark.h>

#include <algorithm>
#include <chrono>
#include <ctime>
#include <vector>

#include "planner/transit/transit_planner.hpp"
#include "tests/planner/transit_test_world.hpp"

namespace tw::planner {
namespace {

constexpr int kSeeds = 50;

const collision::CollisionWorld& demoWorld() {
  static const collision::CollisionWorld world(test::sampleArm(), test::demoCellDescription());
  return world;
}

kinematics::JointVector referenceEnd() {
  kinematics::JointVector q = test::demoStart();
  q[0] += 0.3;
  return q;
}

double referenceSegmentSeconds() {
  collision::CollisionWorkspace workspace(demoWorld());
  const int repeats = 200;
  const std::chrono::steady_clock::time_point began = std::chrono::steady_clock::now();
  for (int i = 0; i < repeats; ++i) {
    benchmark::DoNotOptimize(demoWorld().checkSegment(test::demoStart(), referenceEnd(), workspace));
  }
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - began).count() / repeats;
}

/// CPU time of this thread [s]: RRT-Connect plans in the calling thread, and
/// on a shared machine wall time also counts other people's builds.
double threadSeconds() {
  timespec now{};
  clock_gettime(CLOCK_THREAD_CPUTIME_ID, &now);
  return static_cast<double>(now.tv_sec) + 1e-9 * static_cast<double>(now.tv_nsec);
}

double quantile(std::vector<double> values, double q) {
  std::sort(values.begin(), values.end());
  const std::size_t index = static_cast<std::size_t>(q * static_cast<double>(values.size() - 1) + 0.5);
  return values[index];
}

void BM_ReferenceSegmentCheck(benchmark::State& state) {
  collision::CollisionWorkspace workspace(demoWorld());
  int states = 0;
  for (auto _ : state) {
    const collision::SegmentResult result =
        demoWorld().checkSegment(test::demoStart(), referenceEnd(), workspace);
    states = result.states_checked;
    benchmark::DoNotOptimize(result);
  }
  state.counters["states_per_segment"] = states;
}
BENCHMARK(BM_ReferenceSegmentCheck)->Unit(benchmark::kMicrosecond);

void BM_TransitPlanDemoCell(benchmark::State& state) {
  const TransitPlanner planner(demoWorld());
  const collision::CollisionWorld dense(test::sampleArm(),
                                        test::withMargin(test::demoCellDescription(), 0.4));
  std::vector<double> seconds;
  std::vector<double> cpu_seconds;
  int solved = 0, colliding = 0;
  double checks = 0, segments = 0, planned_length = 0, length = 0;
  unsigned seed = 0;
  for (auto _ : state) {
    TransitRequest request;
    request.start = test::demoStart();
    request.goals = {test::demoGoal()};
    request.seed = ++seed;
    const double cpu_began = threadSeconds();
    const std::chrono::steady_clock::time_point began = std::chrono::steady_clock::now();
    const TransitResult result = planner.plan(request);
    cpu_seconds.push_back(threadSeconds() - cpu_began);
    const double elapsed =
        std::chrono::duration<double>(std::chrono::steady_clock::now() - began).count();
    state.SetIterationTime(elapsed);
    seconds.push_back(elapsed);
    if (!result.solved()) continue;
    ++solved;
    if (test::firstCollidingSegment(dense, result.path).has_value()) ++colliding;
    checks += static_cast<double>(result.state_checks);
    segments += static_cast<double>(result.segment_checks);
    planned_length += result.planned_length;
    length += result.length;
  }
  const double runs = static_cast<double>(seconds.size());
  const double median = quantile(seconds, 0.5);
  state.counters["success_rate"] = solved / runs;
  state.counters["colliding"] = colliding;
  state.counters["median_ms"] = 1e3 * median;
  state.counters["p90_ms"] = 1e3 * quantile(seconds, 0.9);
  state.counters["cpu_median_ms"] = 1e3 * quantile(cpu_seconds, 0.5);
  state.counters["cpu_p90_ms"] = 1e3 * quantile(cpu_seconds, 0.9);
  state.counters["state_checks_per_plan"] = checks / std::max(solved, 1);
  state.counters["segment_checks_per_plan"] = segments / std::max(solved, 1);
  state.counters["length_planned_rad"] = planned_length / std::max(solved, 1);
  state.counters["length_simplified_rad"] = length / std::max(solved, 1);
  state.counters["median_segment_checks_equiv"] = median / referenceSegmentSeconds();
}
BENCHMARK(BM_TransitPlanDemoCell)->Iterations(kSeeds)->UseManualTime()->Unit(benchmark::kMillisecond);

}  // namespace
}  // namespace tw::planner

BENCHMARK_MAIN();
