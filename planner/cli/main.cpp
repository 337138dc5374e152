// tracewright: offline path planning and program generation for 6-axis arms.
#include <CLI/CLI.hpp>
#include <cstdio>

#include "planner/cli/command_line.hpp"
#include "planner/cli/exit_codes.hpp"

int main(int argc, char** argv) {
  CLI::App app{"tracewright: offline path planning and program generation for 6-axis arms"};
  int exit_code = tw::cli::kExitOk;
  tw::cli::addAllCommands(app, exit_code);
  return tw::cli::runCommandLine(app, argc, argv, exit_code, stderr);
}
