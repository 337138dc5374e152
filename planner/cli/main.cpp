// tracewright: offline path planning and program generation for 6-axis arms.
#include <CLI/CLI.hpp>
#include <cstdio>
#include <exception>

#include "kinematics/input_error.hpp"
#include "planner/cli/exit_codes.hpp"
#include "planner/cli/kinematics_commands.hpp"
#include "planner/cli/motion_file_commands.hpp"
#include "planner/cli/plan_commands.hpp"
#include "planner/cli/posts_command.hpp"
#include "planner/cli/refit_command.hpp"

int main(int argc, char** argv) {
  CLI::App app{"tracewright: offline path planning and program generation for 6-axis arms"};
  app.require_subcommand(1);
  int exit_code = tw::cli::kExitOk;
  tw::cli::addPlanCommands(app, exit_code);
  tw::cli::addKinematicsCommands(app, exit_code);
  tw::cli::addRefitCommand(app, exit_code);
  tw::cli::addMotionFileCommands(app, exit_code);
  tw::cli::addPostsCommand(app, exit_code);
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& error) {
    const int code = app.exit(error);
    return code == 0 ? tw::cli::kExitOk : tw::cli::kExitBadInput;
  } catch (const tw::InputError& error) {
    std::fprintf(stderr, "error: %s\n", error.what());
    return tw::cli::kExitBadInput;
  } catch (const std::exception& error) {
    std::fprintf(stderr, "internal error: %s\n", error.what());
    return tw::cli::kExitInternalError;
  }
  return exit_code;
}
