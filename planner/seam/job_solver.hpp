#pragma once

#include <string>
#include <vector>

#include "planner/cell/cell_collision_world.hpp"
#include "planner/job/job.hpp"
#include "planner/seam/seam_solver.hpp"
#include "planner/step_callback.hpp"

namespace tw::planner {

/// The seam solver's result for a whole job.
struct JobSolution {
  /// One outcome per job task (seams and paint patches), in program order:
  /// a SolvedSeam, or a SeamReport saying why it cannot be run.
  std::vector<SeamOutcome> tasks;

  /// True when every task is solved (the command line exits 3 otherwise).
  bool feasible() const;
  /// The reports of the infeasible tasks, in program order.
  std::vector<const SeamReport*> reports() const;
};

/// Builds the tool path of every task of `job` (buildToolPath), a collision
/// world per tool and contact length used (buildCellCollisionWorld with
/// `collision` and the path's ToolPath::contact_length in place of
/// collision.contact_length, from the job's cell as loaded, so a frame moved
/// in job.cell.frames moves seams and bodies), and
/// solves the tasks with options.threads worker threads, each with its own
/// collision workspace. The result does not depend on the thread count.
/// `on_step`, when set, hears of each task as it is solved.
/// Throws tw::InputError for bad input (tool path geometry, meshes).
JobSolution solveJob(const Job& job, const SeamSolverOptions& options = {},
                     const CellCollisionOptions& collision = {}, const StepCallback& on_step = {});

}  // namespace tw::planner
