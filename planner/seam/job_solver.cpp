#include "planner/seam/job_solver.hpp"

#include <atomic>
#include <exception>
#include <map>
#include <memory>
#include <mutex>
#include <optional>
#include <thread>
#include <utility>

#include "kinematics/common/input_error.hpp"
#include "planner/toolpath/tool_path_builder.hpp"

namespace tw::planner {

bool JobSolution::feasible() const {
  for (const SeamOutcome& task : tasks) {
    if (!std::holds_alternative<SolvedSeam>(task)) return false;
  }
  return true;
}

std::vector<const SeamReport*> JobSolution::reports() const {
  std::vector<const SeamReport*> out;
  for (const SeamOutcome& task : tasks) {
    if (const auto* report = std::get_if<SeamReport>(&task)) out.push_back(report);
  }
  return out;
}

JobSolution solveJob(const Job& job, const SeamSolverOptions& options,
                     const CellCollisionOptions& collision, const StepCallback& on_step) {
  const Cell& cell = job.cell;
  std::vector<ToolPath> paths;
  for (const JobTask& task : job.tasks) {
    if (const auto* seam = std::get_if<SeamSpec>(&task)) {
      paths.push_back(buildToolPath(*seam, *cell.findTool(seam->tool)));
    } else {
      const PatchSpec& patch = std::get<PatchSpec>(task);
      paths.push_back(buildToolPath(patch, *cell.findTool(patch.tool), job.source));
    }
  }
  for (const auto& [seam, reference] : options.references) {
    if (reference.size() != static_cast<Eigen::Index>(cell.arm.jointCount())) {
      throw InputError(job.source, 0,
                       "the configuration to stay near for seam '" + seam + "' has " +
                           std::to_string(reference.size()) + " joint values; arm '" +
                           cell.arm.name() + "' has " + std::to_string(cell.arm.jointCount()));
    }
  }
  // One world per tool and contact length (the part of the tool that may
  // touch the workpiece), built before the workers start (the expensive part).
  using WorldKey = std::pair<std::string, std::optional<double>>;
  const auto keyOf = [](const ToolPath& path) { return WorldKey(path.tool, path.contact_length); };
  std::map<WorldKey, std::unique_ptr<collision::CollisionWorld>> worlds;
  for (const ToolPath& path : paths) {
    if (worlds.count(keyOf(path)) == 0) {
      CellCollisionOptions with_contact = collision;
      with_contact.contact_length = path.contact_length;
      worlds.emplace(keyOf(path), std::make_unique<collision::CollisionWorld>(buildCellCollisionWorld(
                                      cell, *cell.findTool(path.tool), with_contact)));
    }
  }
  JobSolution solution;
  solution.tasks.resize(paths.size());
  std::atomic<std::size_t> next{0};
  std::exception_ptr failure;
  std::mutex failure_mutex;
  std::mutex step_mutex;
  const auto work = [&]() {
    try {
      std::map<WorldKey, std::unique_ptr<collision::CollisionWorkspace>> workspaces;
      for (std::size_t i = next++; i < paths.size(); i = next++) {
        const ToolPath& path = paths[i];
        const collision::CollisionWorld& world = *worlds.at(keyOf(path));
        auto& workspace = workspaces[keyOf(path)];
        if (!workspace) workspace = std::make_unique<collision::CollisionWorkspace>(world);
        SeamSetting setting;
        setting.world = &world;
        setting.X_WB = cell.frames.X_W(cell.arm_frame);
        setting.X_WX = cell.frames.X_W(path.frame);
        setting.X_FT = cell.findTool(path.tool)->X_FT;
        const auto earlier = options.references.find(path.name);
        setting.reference = earlier != options.references.end() ? earlier->second : cell.home;
        solution.tasks[i] = solveSeam(path, setting, options, *workspace);
        if (on_step) {
          const std::lock_guard<std::mutex> lock(step_mutex);
          on_step("seam " + path.name);
        }
      }
    } catch (...) {
      const std::lock_guard<std::mutex> lock(failure_mutex);
      if (!failure) failure = std::current_exception();
    }
  };
  const int threads = std::max(1, std::min<int>(options.threads, static_cast<int>(paths.size())));
  std::vector<std::thread> workers;
  for (int t = 1; t < threads; ++t) workers.emplace_back(work);
  work();
  for (std::thread& worker : workers) worker.join();
  if (failure) std::rethrow_exception(failure);
  return solution;
}

}  // namespace tw::planner
