#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "planner/job/job.hpp"
#include "planner/motion/seam_moves.hpp"
#include "planner/program/program.hpp"
#include "planner/seam/job_solver.hpp"
#include "planner/step_callback.hpp"
#include "planner/timing/process_move_timing.hpp"
#include "planner/transit/transit_planner.hpp"

namespace tw::planner {

/// Settings of the whole pipeline, set by field name. SI units.
struct PlanOptions {
  SeamSolverOptions solver;
  CellCollisionOptions collision;
  /// OMPL planner for transits, one of transitPlannerNames().
  std::string transit_planner = "RRTConnect";
  /// Overrides the job's transit seed when set (> 0).
  std::optional<unsigned> seed;
  /// TCP speed of the linear approach and retract moves [m/s]. 50 mm/s: the
  /// final approach at reduced speed (domain-facts §1, common practice).
  double approach_speed = 0.050;
  /// Largest rotation rate of the tool on linear moves [rad/s]; a corner
  /// turned on the spot takes angle / rate. 90°/s: common practice, no
  /// source (slow enough for a torch and its hose package).
  double orientation_speed = 1.5707963267948966;
  /// Measure the clearance to the cell (CollisionWorld::clearance over the
  /// pairs with a cell body) at every motion target for the outputs (costs
  /// about a millisecond per record on the demo cell).
  bool measure_clearance = true;
  /// How solved seams become controller moves: path tolerance and blends.
  SeamMoveOptions moves;
  /// Generator name and version written into every program.
  std::string generator = "tracewright 0.1.0";
  /// Hears of each seam solved and each transit planned (see StepCallback);
  /// a job has tasks + 1 transits.
  StepCallback on_step;
};

/// A transit that could not be planned, with the planner's own words.
struct TransitFailure {
  std::string from;  ///< "home" or the seam the transit leaves
  std::string to;    ///< the seam it goes to, or "home"
  TransitResult result;
};

/// A linear move that could not be run at its programmed TCP speed, and
/// what it gets instead (see timeProcessMove).
struct SpeedLimit {
  std::string seam;
  int waypoint = 0;  ///< index of the move's target in the seam; the retract is waypoints.size()
  LoweredSpeed lowered;
};

/// A seam whose compacted moves could not be followed as the controller
/// interpolates them, even step by step (see compactSolvedSeam).
struct MoveFailure {
  std::string seam;
  int waypoint = 0;  ///< the step from waypoint − 1 to waypoint
  FollowFailure failure;
};

/// The result of planning a job: the seam solutions, then either a program
/// or the reasons there is none.
struct PlanResult {
  JobSolution seams;
  std::vector<TransitFailure> transit_failures;
  std::vector<SpeedLimit> speed_limits;
  std::vector<MoveFailure> move_failures;
  /// Present only when every seam and transit succeeded.
  std::optional<Program> program;

  bool feasible() const { return program.has_value(); }
};

/// Throws tw::InputError, at the line of the first task that differs, when
/// the tasks of `job` do not all use one tool: a program runs with one tool
/// (tool changes within a program are not supported yet). planJob calls it
/// before any work; `check` calls it too, so that both refuse such a job.
void requireOneTool(const Job& job);

/// The full pipeline for a loaded job: solve every seam (solveJob), plan
/// the transits home → seam 1 → … → seam n → home in the job's order with
/// OMPL, time every move (transits with synchronised trapezoidal profiles
/// at the job's joint speed fraction; linear moves at their TCP speed,
/// lowered where a joint would exceed its velocity limit, and reported),
/// and assemble the Program with its metadata (input file hashes, seed) and
/// per-record branch, clearance to the cell and singularity margin. Transits
/// keep the job's transit clearance from every cell body and the base self
/// margin of options.collision between the arm's links and its tool.
///
/// The program starts with a zero-length joint move that states the home
/// position (where the arm is assumed to be), and ends back at home.
/// Throws tw::InputError for bad input; infeasible work is reported in the
/// result. Deterministic for a given job and seed, whatever the thread count.
PlanResult planJob(const Job& job, const PlanOptions& options = {});

}  // namespace tw::planner
