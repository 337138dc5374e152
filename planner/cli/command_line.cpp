#include "planner/cli/command_line.hpp"

#include <exception>

#include "kinematics/common/input_error.hpp"
#include "planner/cli/exit_codes.hpp"
#include "planner/cli/kinematics_commands.hpp"
#include "planner/cli/motion_file_commands.hpp"
#include "planner/cli/plan_commands.hpp"
#include "planner/cli/posts_command.hpp"
#include "planner/cli/refit_command.hpp"
#include "planner/cli/verify_command.hpp"

namespace tw::cli {

void addAllCommands(CLI::App& app, int& exit_code) {
  app.require_subcommand(1);
  addPlanCommands(app, exit_code);
  addKinematicsCommands(app, exit_code);
  addRefitCommand(app, exit_code);
  addMotionFileCommands(app, exit_code);
  addPostsCommand(app, exit_code);
  addVerifyCommand(app, exit_code);
}

int runCommandLine(CLI::App& app, int argc, const char* const* argv, const int& exit_code,
                   std::FILE* errors) {
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& error) {
    // --help lands here too, as CLI11's way of stopping; it is a success.
    const int code = app.exit(error);
    return code == 0 ? kExitOk : kExitBadInput;
  } catch (const InputError& error) {
    std::fprintf(errors, "error: %s\n", error.what());
    return kExitBadInput;
  } catch (const std::exception& error) {
    std::fprintf(errors, "internal error: %s (this is a bug in tracewright; please report it with the inputs)\n",
                 error.what());
    return kExitInternalError;
  }
  return exit_code;
}

}  // namespace tw::cli
