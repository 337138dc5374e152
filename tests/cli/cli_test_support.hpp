#pragma once

#include <sys/wait.h>

#include <array>
#include <cstdio>
#include <stdexcept>
#include <string>

#include "tests/planner/test_files.hpp"

namespace tw::cli::test {

/// Scratch files under TW_TEST_OUTPUT_DIR, as in the planner tests.
using planner::test::readText;
using planner::test::sampleCellText;
using planner::test::sourcePath;
using planner::test::writeTestFile;

/// What one run of the built `tracewright` printed and returned.
struct ToolRun {
  int exit_code = -1;
  std::string output;  ///< stdout and stderr together
};

/// Runs `tracewright <arguments>` from the source tree (the paths in
/// `arguments` may be relative to it) through the shell.
inline ToolRun runTool(const std::string& arguments) {
  const std::string command =
      std::string("cd '") + TW_SOURCE_DIR + "' && '" + TW_TRACEWRIGHT + "' " + arguments + " 2>&1";
  FILE* pipe = ::popen(command.c_str(), "r");
  if (pipe == nullptr) throw std::runtime_error("cannot run: " + command);
  ToolRun run;
  std::array<char, 4096> buffer{};
  std::size_t read = 0;
  while ((read = std::fread(buffer.data(), 1, buffer.size(), pipe)) > 0) {
    run.output.append(buffer.data(), read);
  }
  const int status = ::pclose(pipe);
  run.exit_code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  return run;
}

}  // namespace tw::cli::test
