#include "planner/cli/plan_commands.hpp"

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <functional>
#include <iostream>
#include <map>
#include <memory>
#include <nlohmann/json.hpp>
#include <set>
#include <string>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"
#include "planner/cli/exit_codes.hpp"
#include "planner/cli/progress_bar.hpp"
#include "planner/job/job_loader.hpp"
#include "planner/job_planner.hpp"
#include "planner/report_text.hpp"
#include "postproc/atomic_file.hpp"
#include "postproc/motion_text/motion_text_reader.hpp"
#include "postproc/post_processor_registry.hpp"
#include "postproc/report/report_geometry.hpp"
#include "postproc/review_warnings.hpp"
#include "postproc/safety_caution.hpp"
#include "postproc/template/program_template.hpp"

namespace tw::cli {
namespace {

using planner::PlanResult;

struct PlanArguments {
  std::string job_path;
  std::string output_directory;
  int threads = 2;
  unsigned seed = 0;
  bool json = false;
  std::string planner = "RRTConnect";
  /// An earlier motion file whose seams' branches to keep (--like).
  std::string like;
};

/// What an earlier program says about each of its seams: where it started
/// and in which branch.
struct EarlierSeam {
  kinematics::JointVector q;
  std::string branch;
};

/// Reads the earlier program for --like: the first motion of each seam.
/// Throws tw::InputError when it is not a valid motion file or is for
/// another arm.
std::map<std::string, EarlierSeam> earlierSeams(const std::string& path, const planner::Job& job) {
  const planner::Program program = postproc::readMotionTextFile(path);
  if (program.metadata.arm != job.cell.arm.name()) {
    throw InputError(path, 0,
                     "--like: this program is for arm '" + program.metadata.arm + "', the job's arm is '" +
                         job.cell.arm.name() + "'");
  }
  std::map<std::string, EarlierSeam> seams;
  for (const planner::ProgramRecord& record : program.records) {
    const auto* motion = std::get_if<planner::MotionRecord>(&record);
    if (motion != nullptr && !motion->seam.empty() && seams.count(motion->seam) == 0) {
      seams[motion->seam] = {motion->q, motion->branch};
    }
  }
  return seams;
}

/// One line per seam of both programs: kept, or from which branch to which.
std::vector<std::string> branchChanges(const std::map<std::string, EarlierSeam>& earlier,
                                       const planner::Program& program) {
  std::vector<std::string> lines;
  std::set<std::string> seen;
  for (const planner::ProgramRecord& record : program.records) {
    const auto* motion = std::get_if<planner::MotionRecord>(&record);
    if (motion == nullptr || motion->seam.empty() || !seen.insert(motion->seam).second) continue;
    const auto before = earlier.find(motion->seam);
    if (before == earlier.end()) continue;
    if (before->second.branch != motion->branch) {
      lines.push_back("seam " + motion->seam + ": branch changed from " + before->second.branch +
                      " to " + motion->branch);
    }
  }
  return lines;
}


std::string millimetres(double metres) { return formatFixed(metres * 1000.0, 1); }

/// Prints why the job cannot be run: every infeasible seam's report and
/// every failed transit.
void printInfeasible(const PlanResult& result) {
  for (const planner::SeamReport* report : result.seams.reports()) {
    std::printf("%s\n", report->text().c_str());
  }
  for (const planner::TransitFailure& failure : result.transit_failures) {
    std::printf("transit from %s to %s: %s (%s, planner %s)\n", failure.from.c_str(),
                failure.to.c_str(), planner::toString(failure.result.outcome),
                failure.result.reason.c_str(), failure.result.planner.c_str());
  }
  for (const planner::MoveFailure& failure : result.move_failures) {
    std::printf("seam %s, step to waypoint %d: the controller's path cannot be followed at %s of "
                "the step: %s\n",
                failure.seam.c_str(), failure.waypoint,
                formatFixed(failure.failure.fraction, 3).c_str(), failure.failure.reason.c_str());
  }
  std::printf("no program written: the job is infeasible as it stands\n");
}

/// What a kind of review warning is about, for the summary's counts.
const char* warningKindWords(postproc::WarningKind kind) {
  switch (kind) {
    case postproc::WarningKind::kPlanner: return "from the planner";
    case postproc::WarningKind::kReducedSpeed:
      return "moves above the reduced speed (run them first at reduced speed)";
    case postproc::WarningKind::kClearance: return "with little clearance to the cell";
    case postproc::WarningKind::kSingularity: return "near the wrist singularity";
    case postproc::WarningKind::kJointLimit: return "near a joint limit";
  }
  return "other";
}

/// Cycle time and minimum clearance to the cell per seam and in total, from
/// the program.
void printSummary(const planner::Program& program, const std::vector<std::string>& written) {
  struct SeamLine {
    double start = 0.0, end = 0.0, clearance = INFINITY;
    int moves = 0;
    std::string branch;
  };
  std::vector<std::pair<std::string, SeamLine>> seams;
  double min_clearance = INFINITY;
  for (const planner::ProgramRecord& record : program.records) {
    const planner::MotionRecord* motion = std::get_if<planner::MotionRecord>(&record);
    if (motion == nullptr) continue;
    if (motion->clearance) min_clearance = std::min(min_clearance, *motion->clearance);
    if (motion->seam.empty()) continue;
    if (seams.empty() || seams.back().first != motion->seam) {
      seams.push_back({motion->seam, SeamLine{motion->start_time, 0.0, INFINITY, 0, motion->branch}});
    }
    SeamLine& line = seams.back().second;
    line.end = motion->start_time + motion->duration;
    ++line.moves;
    if (motion->clearance) line.clearance = std::min(line.clearance, *motion->clearance);
  }
  std::printf("%-20s %6s %9s %14s  %s\n", "seam", "moves", "time [s]", "clearance [mm]", "branch");
  for (const auto& [name, line] : seams) {
    std::printf("%-20s %6d %9s %14s  %s\n", name.c_str(), line.moves,
                formatFixed(line.end - line.start, 2).c_str(),
                std::isfinite(line.clearance) ? millimetres(line.clearance).c_str() : "-",
                line.branch.c_str());
  }
  // The same warnings as the summary file and the review report: the
  // planner's own and those of the review margins (speed, clearance,
  // singularity, joint limits), so that the count here never disagrees.
  const std::vector<postproc::ReviewWarning> warnings =
      postproc::reviewWarnings(program, postproc::WriteOptions{});
  std::printf("cycle time %s s (estimate), minimum clearance to the cell %s mm, %zu warning(s)\n",
              formatFixed(planner::cycleTime(program), 2).c_str(),
              std::isfinite(min_clearance) ? millimetres(min_clearance).c_str() : "-",
              warnings.size());
  // Counts by kind first: a fast paint job can have a warning on every
  // move, which is one fact, not seventy.
  std::map<postproc::WarningKind, std::size_t> by_kind;
  for (const postproc::ReviewWarning& warning : warnings) ++by_kind[warning.kind];
  for (const auto& [kind, count] : by_kind) {
    std::printf("  %zu %s\n", count, warningKindWords(kind));
  }
  constexpr std::size_t kWarningsShown = 10;
  for (std::size_t i = 0; i < std::min(warnings.size(), kWarningsShown); ++i) {
    std::printf("  warning: %s\n", warnings[i].text.c_str());
  }
  if (warnings.size() > kWarningsShown) {
    std::printf("  ... and %zu more (all are in the summary and the review report)\n",
                warnings.size() - kWarningsShown);
  }
  for (const std::string& path : written) std::printf("wrote %s\n", path.c_str());
  std::printf("%s\n", postproc::safetyCaution(program).front().c_str());
}

/// One path's margins in the JSON outputs, in the file units (deg, mm).
nlohmann::json marginsJson(const planner::PathMargins& margins) {
  constexpr double kDegree = 180.0 / kPi;
  nlohmann::json json{{"branch", margins.branch.toString()},
                      {"spin_deg", margins.spin * kDegree},
                      {"cost", margins.cost},
                      {"motion_cost", margins.motion_cost},
                      {"axis5_margin_deg", margins.wrist_angle * kDegree},
                      {"singular_poses", margins.singular_poses},
                      {"limit_margin_deg", margins.limit_margin * kDegree},
                      {"limit_axis", margins.limit_joint + 1}};
  if (margins.clearance >= 0.0) {
    json["clearance_mm"] = margins.clearance * 1000.0;
    json["clearance_at_least"] = margins.clearance_capped;
  }
  return json;
}

/// Per solved seam: the chosen path's margins and the best alternative's
/// (null when there is none).
nlohmann::json seamChoicesJson(const planner::JobSolution& solution) {
  nlohmann::json json = nlohmann::json::array();
  for (const planner::SeamOutcome& outcome : solution.tasks) {
    const planner::SolvedSeam* seam = std::get_if<planner::SolvedSeam>(&outcome);
    if (seam == nullptr) continue;
    json.push_back({{"seam", seam->name},
                    {"chosen", marginsJson(seam->margins)},
                    {"alternative", seam->alternative ? marginsJson(*seam->alternative)
                                                      : nlohmann::json(nullptr)}});
  }
  return json;
}

void printSeamChoices(const planner::JobSolution& solution) {
  for (const planner::SeamOutcome& outcome : solution.tasks) {
    if (const planner::SolvedSeam* seam = std::get_if<planner::SolvedSeam>(&outcome)) {
      std::printf("seam %s %s\n", seam->name.c_str(), planner::describeMargins(*seam).c_str());
    }
  }
}

nlohmann::json resultJson(const PlanResult& result, const std::vector<std::string>& written) {
  nlohmann::json json;
  json["feasible"] = result.feasible();
  json["infeasible_seams"] = nlohmann::json::array();
  for (const planner::SeamReport* report : result.seams.reports()) {
    json["infeasible_seams"].push_back({{"seam", report->name}, {"report", report->text()}});
  }
  json["failed_transits"] = nlohmann::json::array();
  for (const planner::TransitFailure& failure : result.transit_failures) {
    json["failed_transits"].push_back({{"from", failure.from},
                                       {"to", failure.to},
                                       {"outcome", planner::toString(failure.result.outcome)},
                                       {"reason", failure.result.reason}});
  }
  for (const planner::MoveFailure& failure : result.move_failures) {
    json["failed_moves"].push_back({{"seam", failure.seam},
                                    {"waypoint", failure.waypoint},
                                    {"fraction", failure.failure.fraction},
                                    {"reason", failure.failure.reason}});
  }
  json["seam_choices"] = seamChoicesJson(result.seams);
  if (result.program) {
    json["cycle_time_s"] = planner::cycleTime(*result.program);
    json["records"] = result.program->records.size();
    json["warnings"] = nlohmann::json::array();
    for (const postproc::ReviewWarning& warning :
         postproc::reviewWarnings(*result.program, postproc::WriteOptions{})) {
      json["warnings"].push_back(warning.text);
    }
  }
  json["written"] = written;
  return json;
}

/// Throws tw::InputError at the first output whose writer cannot be used.
/// Called before any planning, so that a bad job costs no time and leaves
/// no partial set of outputs behind.
void requireUsableWriters(const planner::Job& job, const postproc::PostProcessorRegistry& registry) {
  for (const planner::OutputRequest& request : job.outputs) {
    if (!registry.contains(request.writer)) {
      throw InputError(job.source, request.line,
                       "<output writer=\"" + request.writer + "\">: unknown post-processor");
    }
    // A template with an error would otherwise surface only after planning,
    // possibly after other outputs were written; its own errors name its line.
    if (!request.template_path.empty()) postproc::ProgramTemplate::load(request.template_path);
  }
}

/// Writes every output of the job, each file atomically, telling
/// `on_written` of each file.
std::vector<std::string> writeOutputs(const planner::Job& job, const planner::Program& program,
                                      const postproc::PostProcessorRegistry& registry,
                                      const std::string& directory_override,
                                      const std::function<void(const std::string&)>& on_written) {
  postproc::WriteOptions options;
  options.report_cell = postproc::reportCellOf(job.cell, program);
  std::vector<std::string> written;
  for (const planner::OutputRequest& request : job.outputs) {
    // The loader resolved each path against the job's output directory; an
    // override keeps only the file names.
    const std::filesystem::path path =
        directory_override.empty()
            ? std::filesystem::path(request.path)
            : std::filesystem::path(directory_override) / std::filesystem::path(request.path).filename();
    std::filesystem::create_directories(path.parent_path());
    options.output_name = path.string();
    options.template_file = request.template_path;
    postproc::writeProgramFile(registry.get(request.writer), program, options, path);
    written.push_back(path.string());
    on_written(path.filename().string());
  }
  return written;
}

int runPlan(const PlanArguments& arguments) {
  const planner::Job job = planner::loadJob(arguments.job_path);
  postproc::PostProcessorRegistry registry;
  postproc::registerBuiltInPostProcessors(registry);
  requireUsableWriters(job, registry);
  planner::requireOneTool(job);
  // Steps: every seam, every transit (one more than the seams), every output.
  const int seams = static_cast<int>(job.tasks.size());
  ProgressBar bar(stderr, stderrIsTerminal(), seams + (seams + 1) + static_cast<int>(job.outputs.size()));
  planner::PlanOptions options;
  options.solver.threads = arguments.threads;
  options.solver.find_alternative = true;  // printed per seam: what the choice traded
  std::map<std::string, EarlierSeam> earlier;
  if (!arguments.like.empty()) {
    earlier = earlierSeams(arguments.like, job);
    for (const auto& [seam, start] : earlier) options.solver.references[seam] = start.q;
  }
  options.transit_planner = arguments.planner;
  if (arguments.seed > 0) options.seed = arguments.seed;
  options.on_step = [&bar](const std::string& finished) { bar.step(finished); };
  bar.stage("solving seams");
  const PlanResult result = planner::planJob(job, options);
  std::vector<std::string> written;
  if (result.feasible()) {
    bar.stage("writing outputs");
    written = writeOutputs(job, *result.program, registry, arguments.output_directory,
                           [&bar](const std::string& file) { bar.step("wrote " + file); });
  }
  bar.finish();
  std::vector<std::string> changes;
  if (result.feasible() && !arguments.like.empty()) changes = branchChanges(earlier, *result.program);
  if (arguments.json) {
    nlohmann::json json = resultJson(result, written);
    if (!arguments.like.empty()) json["branch_changes"] = changes;
    std::cout << json.dump(2) << "\n";
  } else if (result.feasible()) {
    if (!arguments.like.empty()) {
      std::printf("%s\n", changes.empty()
                              ? ("every seam kept its branch from " + arguments.like).c_str()
                              : ("branches that differ from " + arguments.like + ":").c_str());
      for (const std::string& change : changes) std::printf("  %s\n", change.c_str());
    }
    printSummary(*result.program, written);
    printSeamChoices(result.seams);
  } else {
    printInfeasible(result);
  }
  return result.feasible() ? kExitOk : kExitInfeasible;
}

int runCheck(const PlanArguments& arguments) {
  const planner::Job job = planner::loadJob(arguments.job_path);
  // What plan would refuse, check refuses too.
  planner::requireOneTool(job);
  ProgressBar bar(stderr, stderrIsTerminal(), static_cast<int>(job.tasks.size()));
  planner::SeamSolverOptions options;
  options.threads = arguments.threads;
  options.find_alternative = true;
  bar.stage("solving seams");
  const planner::JobSolution solution = planner::solveJob(
      job, options, {}, [&bar](const std::string& finished) { bar.step(finished); });
  bar.finish();
  if (arguments.json) {
    nlohmann::json json;
    json["feasible"] = solution.feasible();
    json["tasks"] = nlohmann::json::array();
    for (const planner::SeamOutcome& outcome : solution.tasks) {
      if (const planner::SolvedSeam* seam = std::get_if<planner::SolvedSeam>(&outcome)) {
        json["tasks"].push_back({{"seam", seam->name},
                                 {"reachable", true},
                                 {"waypoints", seam->waypoints.size()},
                                 {"branch", seam->branch.toString()},
                                 {"chosen", marginsJson(seam->margins)},
                                 {"alternative", seam->alternative
                                                     ? marginsJson(*seam->alternative)
                                                     : nlohmann::json(nullptr)}});
      } else {
        const planner::SeamReport& report = std::get<planner::SeamReport>(outcome);
        json["tasks"].push_back({{"seam", report.name}, {"reachable", false}, {"report", report.text()}});
      }
    }
    std::cout << json.dump(2) << "\n";
  } else {
    for (const planner::SeamOutcome& outcome : solution.tasks) {
      if (const planner::SolvedSeam* seam = std::get_if<planner::SolvedSeam>(&outcome)) {
        std::printf("%-20s reachable: %zu waypoints, %s, axis 5 at least %s deg from 0\n",
                    seam->name.c_str(), seam->waypoints.size(), seam->branch.toString().c_str(),
                    formatFixed(seam->min_wrist_angle * 180.0 / kPi, 1).c_str());
        std::printf("  %s\n", planner::describeMargins(*seam).c_str());
      } else {
        std::printf("%s\n", std::get<planner::SeamReport>(outcome).text().c_str());
      }
    }
    std::printf(solution.feasible() ? "every seam is reachable (transits not checked)\n"
                                    : "some seams cannot be run as they stand\n");
  }
  return solution.feasible() ? kExitOk : kExitInfeasible;
}

}  // namespace

void addPlanCommands(CLI::App& app, int& exit_code) {
  auto plan = std::make_shared<PlanArguments>();
  CLI::App* plan_command = app.add_subcommand(
      "plan", "Plan a job: solve every seam, plan the transits, time the program, write its outputs");
  plan_command->add_option("job", plan->job_path, "Job file")->required();
  plan_command->add_option("--output", plan->output_directory,
                           "Folder for the outputs (default: the job's <outputs directory>)");
  plan_command->add_option("--threads", plan->threads, "Seams solved at once (results do not depend on it)")
      ->check(CLI::Range(1, 64));
  plan_command->add_option("--seed", plan->seed, "Seed of the transit planner (default: the job's)")
      ->check(CLI::Range(1u, 4294967295u));
  plan_command->add_option("--planner", plan->planner, "Transit planner (OMPL name)")
      ->check(CLI::IsMember(planner::transitPlannerNames()));
  plan_command->add_option("--like", plan->like,
                           "Earlier motion file: keep each seam's branch from it where it still works")
      ->check(CLI::ExistingFile);
  plan_command->add_flag("--json", plan->json, "Print a machine-readable result on stdout");
  plan_command->callback([plan, &exit_code] { exit_code = runPlan(*plan); });

  auto check = std::make_shared<PlanArguments>();
  CLI::App* check_command = app.add_subcommand(
      "check", "Check a job's inputs and the reachability of every seam, without transits or outputs");
  check_command->add_option("job", check->job_path, "Job file")->required();
  check_command->add_option("--threads", check->threads, "Seams solved at once")->check(CLI::Range(1, 64));
  check_command->add_flag("--json", check->json, "Print a machine-readable result on stdout");
  check_command->callback([check, &exit_code] { exit_code = runCheck(*check); });
}

}  // namespace tw::cli
