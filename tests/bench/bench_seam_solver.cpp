// Seam solve on the demo cell: a 500-waypoint straight seam, tool spin
// sampled every 10°, one thread. Bar (DESIGN.md §5): ≤ 0.25 s on one core.
// Argument 0: the default solve; 1: also the best alternative, as `plan`
// and `check` ask for it (one more lazy search).
// Reported beside the time: candidates generated, IK calls and collision
// state checks of one solve, and, as a reference measured in the same run,
// the time of one closed-form IK solve (ratio = solve time / IK time).
#include <benchmark/benchmark.h>

#include <chrono>

#include "kinematics/common/angles.hpp"
#include "kinematics/ortho_parallel_ik.hpp"
#include "planner/cell/cell_loader.hpp"
#include "planner/motion/seam_moves.hpp"
#include "planner/seam/job_solver.hpp"

namespace {

using namespace tw::planner;

struct Demo {
  Cell cell = loadCell(std::string(TW_SOURCE_DIR) + "/samples/cells/bracket_weld_cell.xml");
  tw::collision::CollisionWorld world = buildCellCollisionWorld(cell, *cell.findTool("torch"));
  ToolPath path;
  SeamSetting setting;

  Demo() {
    // 499 mm along the table's y axis, 1 mm apart, 100 mm in from its edge on
    // the arm's side (clear of the bracket and its clamps) and 100 mm above
    // the top, torch down.
    path.name = "bench-seam";
    path.frame = "table-top";
    path.tool = "torch";
    path.spin = {-tw::kPi, tw::kPi};
    for (int i = 0; i < 500; ++i) {
      Waypoint waypoint;
      waypoint.X_XT = Eigen::Translation3d(-0.300, -0.250 + 0.001 * i, 0.100) *
                      Eigen::AngleAxisd(tw::kPi, Eigen::Vector3d::UnitX());
      waypoint.speed = 0.010;
      path.waypoints.push_back(waypoint);
    }
    path.approach = backedOff(path.waypoints.front().X_XT, 0.030);
    path.retract = backedOff(path.waypoints.back().X_XT, 0.030);
    setting.world = &world;
    setting.X_WB = cell.frames.X_W(cell.arm_frame);
    setting.X_WX = cell.frames.X_W(path.frame);
    setting.X_FT = cell.findTool("torch")->X_FT;
  }
};

Demo& demo() {
  static Demo instance;
  return instance;
}

void BM_IkReference(benchmark::State& state) {
  const Demo& d = demo();
  const tw::kinematics::OrthoParallelSolver ik(d.cell.arm);
  tw::kinematics::IkSolutions solutions;
  const Eigen::Isometry3d X_BF = d.setting.X_WB.inverse() * d.setting.X_WX *
                                 d.path.waypoints[250].X_XT * d.setting.X_FT.inverse();
  for (auto _ : state) {
    ik.solve(X_BF, {}, solutions);
    benchmark::DoNotOptimize(solutions.solutions.data());
  }
}
BENCHMARK(BM_IkReference);

/// state.range(0): 1 also seeks the best alternative (what `plan` reports).
void BM_SeamSolve500(benchmark::State& state) {
  Demo& d = demo();
  tw::collision::CollisionWorkspace workspace(d.world);
  SeamSolverOptions options;
  options.find_alternative = state.range(0) == 1;
  SolverCounts counts;
  double solve_seconds = 0.0;
  for (auto _ : state) {
    const auto start = std::chrono::steady_clock::now();
    const SeamOutcome outcome = solveSeam(d.path, d.setting, options, workspace);
    solve_seconds += std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    const auto* solved = std::get_if<SolvedSeam>(&outcome);
    if (!solved) {
      state.SkipWithError(std::get<SeamReport>(outcome).text().c_str());
      return;
    }
    counts = solved->counts;
  }
  state.counters["waypoints"] = static_cast<double>(d.path.waypoints.size());
  state.counters["candidates"] = static_cast<double>(counts.candidates);
  state.counters["ik_calls"] = static_cast<double>(counts.ik_calls);
  state.counters["state_checks"] = static_cast<double>(counts.state_checks);
  state.counters["edges_validated"] = static_cast<double>(counts.edges_validated);
  state.counters["searches"] = counts.searches;
  state.counters["clearance_queries"] = static_cast<double>(counts.clearance_queries);
  // Reference in the same run: one closed-form IK solve of a seam pose.
  const tw::kinematics::OrthoParallelSolver ik(d.cell.arm);
  tw::kinematics::IkSolutions solutions;
  const Eigen::Isometry3d X_BF = d.setting.X_WB.inverse() * d.setting.X_WX *
                                 d.path.waypoints[250].X_XT * d.setting.X_FT.inverse();
  constexpr int kIkRuns = 20000;
  const auto start = std::chrono::steady_clock::now();
  for (int i = 0; i < kIkRuns; ++i) {
    ik.solve(X_BF, {}, solutions);
    benchmark::DoNotOptimize(solutions.solutions.data());
  }
  const double ik_seconds =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count() / kIkRuns;
  const double solve_each = solve_seconds / static_cast<double>(state.iterations());
  state.counters["ik_ns"] = ik_seconds * 1e9;
  state.counters["solve_in_ik_solves"] = solve_each / ik_seconds;
}
BENCHMARK(BM_SeamSolve500)->Arg(0)->Arg(1)->Unit(benchmark::kMillisecond)->MinTime(1.0);

/// Compaction of the solved 500-waypoint seam into controller moves, each
/// re-checked as the controller interpolates it (compactSolvedSeam), then
/// their TOPP-RA timing. Bar (DESIGN.md §5): compaction + verification
/// ≤ 50 ms on one core. Reference in the same run: the seam solve itself.
void BM_CompactAndVerify500(benchmark::State& state) {
  Demo& d = demo();
  tw::collision::CollisionWorkspace workspace(d.world);
  const auto solve_start = std::chrono::steady_clock::now();
  const SeamOutcome outcome = solveSeam(d.path, d.setting, SeamSolverOptions{}, workspace);
  const double solve_seconds =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - solve_start).count();
  const auto* solved = std::get_if<SolvedSeam>(&outcome);
  if (!solved) {
    state.SkipWithError(std::get<SeamReport>(outcome).text().c_str());
    return;
  }
  FollowSetting setting;
  setting.world = &d.world;
  setting.X_BR = d.setting.X_WB.inverse() * d.setting.X_WX;
  setting.X_FT = d.setting.X_FT;
  setting.branch_index = solved->branch.index();
  std::size_t moves = 0;
  double compact_seconds = 0.0;
  for (auto _ : state) {
    const auto start = std::chrono::steady_clock::now();
    MoveFollower follower(setting, FollowLimits{});
    const auto compacted = compactSolvedSeam(*solved, SeamMoveOptions{}, follower, workspace);
    compact_seconds += std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    const auto* result = std::get_if<std::vector<SeamMove>>(&compacted);
    if (!result) {
      state.SkipWithError(std::get<SeamMoveFailure>(compacted).failure.reason.c_str());
      return;
    }
    moves = result->size();
  }
  state.counters["moves"] = static_cast<double>(moves);
  state.counters["solve_ms"] = solve_seconds * 1e3;
  state.counters["compact_in_solves"] =
      compact_seconds / static_cast<double>(state.iterations()) / solve_seconds;
}
BENCHMARK(BM_CompactAndVerify500)->Unit(benchmark::kMillisecond)->MinTime(1.0);

}  // namespace

BENCHMARK_MAIN();
