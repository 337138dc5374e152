// Closed-form IK (all branches, limits, multi-turn expansion) against one
// solve of Orocos KDL's ChainIkSolverPos_LMA on the same arm and targets, in
// the same run. Prints the ratio of the medians at the end.
#include <benchmark/benchmark.h>

#include <iostream>
#include <kdl/chainiksolverpos_lma.hpp>
#include <map>
#include <random>

#include "kinematics/arm_loader.hpp"
#include "kinematics/common/angles.hpp"
#include "kinematics/forward_kinematics.hpp"
#include "kinematics/ortho_parallel_ik.hpp"
#include "tests/kinematics/kdl_chain.hpp"

using namespace tw::kinematics;

namespace {

constexpr int kTargets = 1024;

double unitDraw(std::mt19937_64& generator) {
  return static_cast<double>(generator() >> 11) * 0x1.0p-53;
}

struct Fixture {
  ArmModel arm = loadArmDescription(std::string(TW_SOURCE_DIR) + "/samples/arms/weld_arm_1400.xml");
  std::vector<Eigen::Isometry3d> targets;
  std::vector<JointVector> seeds;

  Fixture() {
    std::mt19937_64 generator(7);
    for (int i = 0; i < kTargets; ++i) {
      JointVector q(6);
      JointVector seed(6);
      for (int j = 0; j < 6; ++j) {
        q[j] = arm.lowerLimits()[j] + unitDraw(generator) * (arm.upperLimits()[j] - arm.lowerLimits()[j]);
        seed[j] = -tw::kPi + 2 * tw::kPi * unitDraw(generator);
      }
      targets.push_back(flangePose(arm, q));
      seeds.push_back(seed);
    }
  }
};

const Fixture& fixture() {
  static const Fixture instance;
  return instance;
}

void BM_ik_closed_form_all_branches(benchmark::State& state) {
  const Fixture& f = fixture();
  const OrthoParallelSolver solver(f.arm);
  IkSolutions solutions;
  solutions.solutions.reserve(64);
  const IkOptions options;
  std::size_t i = 0;
  std::size_t found = 0;
  for (auto _ : state) {
    solver.solve(f.targets[i++ % kTargets], options, solutions);
    found += solutions.solutions.size();
    benchmark::DoNotOptimize(solutions.solutions.data());
  }
  state.counters["solutions_per_pose"] =
      static_cast<double>(found) / static_cast<double>(state.iterations());
}

void BM_ik_kdl_lma_one_solve(benchmark::State& state) {
  const Fixture& f = fixture();
  const KDL::Chain chain = test::kdlChain(f.arm);
  KDL::ChainIkSolverPos_LMA lma(chain);  // default tolerances
  std::vector<KDL::Frame> targets;
  std::vector<KDL::JntArray> seeds;
  for (int k = 0; k < kTargets; ++k) {
    targets.push_back(test::toKdl(f.targets[k]));
    seeds.push_back(test::kdlJoints(f.seeds[k]));
  }
  KDL::JntArray answer(6);
  std::size_t i = 0;
  std::size_t converged = 0;
  for (auto _ : state) {
    const std::size_t k = i++ % kTargets;
    converged += lma.CartToJnt(seeds[k], targets[k], answer) >= 0;
    benchmark::DoNotOptimize(answer.data.data());
  }
  state.counters["converged_share"] =
      static_cast<double>(converged) / static_cast<double>(state.iterations());
}

BENCHMARK(BM_ik_closed_form_all_branches)->Repetitions(5)->ReportAggregatesOnly(true);
BENCHMARK(BM_ik_kdl_lma_one_solve)->Repetitions(5)->ReportAggregatesOnly(true);

/// Keeps the median time per iteration of each benchmark for the ratio.
class MedianCollector : public benchmark::ConsoleReporter {
 public:
  void ReportRuns(const std::vector<Run>& runs) override {
    for (const Run& run : runs) {
      if (run.aggregate_name == "median") medians_[run.run_name.function_name] = run.GetAdjustedRealTime();
    }
    ConsoleReporter::ReportRuns(runs);
  }
  const std::map<std::string, double>& medians() const { return medians_; }

 private:
  std::map<std::string, double> medians_;
};

}  // namespace

int main(int argc, char** argv) {
  benchmark::Initialize(&argc, argv);
  MedianCollector reporter;
  benchmark::RunSpecifiedBenchmarks(&reporter);
  const auto& medians = reporter.medians();
  const auto closed = medians.find("BM_ik_closed_form_all_branches");
  const auto lma = medians.find("BM_ik_kdl_lma_one_solve");
  if (closed != medians.end() && lma != medians.end()) {
    std::cout << "median per pose: closed form (all branches) " << closed->second
              << " ns, KDL LMA (one solve) " << lma->second << " ns, ratio "
              << lma->second / closed->second << "x (bar: >= 150x, closed form <= 1000 ns)\n";
  }
  benchmark::Shutdown();
  return 0;
}
