#include "planner/cli/verify_command.hpp"

#include <cstdio>
#include <memory>
#include <nlohmann/json.hpp>
#include <string>

#include "planner/cli/exit_codes.hpp"
#include "planner/job/job_loader.hpp"
#include "planner/motion/program_verification.hpp"
#include "postproc/motion_text/motion_text_reader.hpp"

namespace tw::cli {
namespace {

struct VerifyArguments {
  std::string program_path;
  std::string job_path;
  bool json = false;
};

int runVerify(const VerifyArguments& arguments) {
  const planner::Program program = postproc::readMotionTextFile(arguments.program_path);
  const planner::Job job = planner::loadJob(arguments.job_path);
  const std::vector<planner::RecordProblem> problems =
      planner::verifyProgram(program, job, planner::VerifyOptions{});
  int motions = 0;
  for (const planner::ProgramRecord& record : program.records) {
    motions += std::holds_alternative<planner::MotionRecord>(record) ? 1 : 0;
  }
  if (arguments.json) {
    nlohmann::ordered_json json;
    json["program"] = arguments.program_path;
    json["job"] = arguments.job_path;
    json["motions"] = motions;
    json["problems"] = nlohmann::ordered_json::array();
    for (const planner::RecordProblem& problem : problems) {
      json["problems"].push_back({{"record", problem.record},
                                  {"kind", problem.kind},
                                  {"seam", problem.seam},
                                  {"reason", problem.reason}});
    }
    std::printf("%s\n", json.dump(2).c_str());
  } else {
    for (const planner::RecordProblem& problem : problems) {
      std::printf("record %d (%s%s): %s\n", problem.record, problem.kind.c_str(),
                  problem.seam.empty() ? "" : (", seam " + problem.seam).c_str(), problem.reason.c_str());
    }
    if (problems.empty()) {
      std::printf("%d motion records replayed in the cell of %s: the program runs as written\n",
                  motions, arguments.job_path.c_str());
    } else {
      std::printf("%zu problem(s) in %d motion records: the program does not run as written\n",
                  problems.size(), motions);
    }
  }
  return problems.empty() ? kExitOk : kExitInfeasible;
}

}  // namespace

void addVerifyCommand(CLI::App& app, int& exit_code) {
  auto arguments = std::make_shared<VerifyArguments>();
  CLI::App* command = app.add_subcommand(
      "verify", "Replay a motion file in a job's cell as the controller interpolates it");
  command->add_option("program", arguments->program_path, "Motion text file (.twm)")->required();
  command->add_option("--job", arguments->job_path, "Job whose cell (and tool) the program runs in")
      ->required();
  command->add_flag("--json", arguments->json, "Print a machine-readable result on stdout");
  command->footer(
      "Exit codes: 0 the program runs as written, 2 bad input, 3 a record does not run.\n"
      "Example: tracewright verify out/bracket-welds/bracket_welds.twm --job samples/jobs/bracket_welds.xml");
  command->callback([arguments, &exit_code] { exit_code = runVerify(*arguments); });
}

}  // namespace tw::cli
