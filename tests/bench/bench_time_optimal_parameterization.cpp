// Speed of TOPP-RA on 1,000-point paths (design bar: ≤ 5 ms), reported next
// to a reference measured in the same run: sampling the analytic derivatives
// q'(s), q''(s) of the same path at the same 1,000 points. The ratio printed
// at the end is machine-independent enough to compare across runs.

#include "planner/timing/time_optimal_parameterization.hpp"

#include "tests/planner/timing/analytic_paths.hpp"

#include <benchmark/benchmark.h>

#include <cstdio>
#include <map>
#include <string>

namespace tw::planner {
namespace {

constexpr std::size_t kGridPoints = 1000;
constexpr unsigned kPathSeed = 7;

TimeOptimalLimits benchLimits(int joints) {
  TimeOptimalLimits limits;
  limits.max_velocity = Eigen::VectorXd::Constant(joints, 2.0);
  limits.max_acceleration = Eigen::VectorXd::Constant(joints, 4.0);
  return limits;
}

void pathDerivativesReference(benchmark::State& state) {
  const int joints = static_cast<int>(state.range(0));
  const test::SinusoidPath path = test::randomSinusoidPath(joints, kPathSeed);
  const std::vector<double> grid = test::uniformGrid(kGridPoints - 1);
  for (auto _ : state) {
    PathDerivatives sampled = test::sampleDerivatives(path, grid);
    benchmark::DoNotOptimize(sampled.d2q_ds2.back().data());
  }
}

void timeOptimalParameterization(benchmark::State& state) {
  const int joints = static_cast<int>(state.range(0));
  const PathDerivatives sampled = test::sampleDerivatives(
      test::randomSinusoidPath(joints, kPathSeed), test::uniformGrid(kGridPoints - 1));
  const TimeOptimalLimits limits = benchLimits(joints);
  for (auto _ : state) {
    TimedPath timed = parameterizeTimeOptimal(sampled, limits);
    benchmark::DoNotOptimize(timed.duration);
  }
}

BENCHMARK(pathDerivativesReference)->Arg(6)->Arg(8)->Unit(benchmark::kMicrosecond);
BENCHMARK(timeOptimalParameterization)->Arg(6)->Arg(8)->Unit(benchmark::kMicrosecond);

/// Console output plus a memory of each benchmark's real and CPU time [s]
/// (the median when repetitions are asked for). The ratio uses CPU time: the
/// machine is shared, and other processes inflate real time unevenly.
class RatioReporter : public benchmark::ConsoleReporter {
 public:
  RatioReporter() : ConsoleReporter(OO_Tabular) {}

  void ReportRuns(const std::vector<Run>& runs) override {
    for (const Run& run : runs) {
      if (run.run_type == Run::RT_Aggregate && run.aggregate_name != "median") continue;
      const double to_seconds = 1.0 / benchmark::GetTimeUnitMultiplier(run.time_unit);
      times_[run.run_name.function_name + "/" + run.run_name.args] = {
          run.GetAdjustedRealTime() * to_seconds, run.GetAdjustedCPUTime() * to_seconds};
    }
    ConsoleReporter::ReportRuns(runs);
  }

  void printRatios() const {
    for (const char* joints : {"6", "8"}) {
      const auto toppra = times_.find(std::string("timeOptimalParameterization/") + joints);
      const auto reference = times_.find(std::string("pathDerivativesReference/") + joints);
      if (toppra == times_.end() || reference == times_.end()) continue;
      std::printf(
          "TOPP-RA, %zu points, %s joints: %.3f ms CPU (%.3f ms real) per path, bar 5 ms; "
          "%.2f x the CPU cost of sampling the path derivatives (%.3f ms CPU)\n",
          kGridPoints, joints, 1e3 * toppra->second.cpu, 1e3 * toppra->second.real,
          toppra->second.cpu / reference->second.cpu, 1e3 * reference->second.cpu);
    }
  }

 private:
  struct Seconds {
    double real;
    double cpu;
  };
  std::map<std::string, Seconds> times_;
};

}  // namespace
}  // namespace tw::planner

int main(int argc, char** argv) {
  benchmark::Initialize(&argc, argv);
  if (benchmark::ReportUnrecognizedArguments(argc, argv)) return 1;
  tw::planner::RatioReporter reporter;
  benchmark::RunSpecifiedBenchmarks(&reporter);
  reporter.printRatios();
  benchmark::Shutdown();
  return 0;
}
