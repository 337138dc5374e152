#pragma once

#include <sys/wait.h>

#include <array>
#include <cstdio>
#include <fstream>
#include <sstream>
#include <stdexcept>
#include <string>

#include "tests/planner/test_files.hpp"

namespace tw::cli::test {

/// Scratch files under TW_TEST_OUTPUT_DIR, as in the planner tests.
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

inline std::string readText(const std::string& path) {
  std::ifstream input(path, std::ios::binary);
  if (!input) throw std::runtime_error("cannot read " + path);
  std::ostringstream text;
  text << input.rdbuf();
  return text.str();
}

/// The text of the sample welding cell with its arm and mesh files named by
/// absolute path, so that a copy loads from anywhere.
inline std::string sampleCellText() {
  std::string text = readText(std::string(TW_SOURCE_DIR) + "/samples/cells/bracket_weld_cell.xml");
  const auto make_absolute = [&text](const std::string& from, const std::string& to) {
    const std::size_t at = text.find(from);
    if (at == std::string::npos) throw std::runtime_error("the sample cell lacks " + from);
    text.replace(at, from.size(), to);
  };
  make_absolute("file=\"../arms/weld_arm_1400.xml\"",
                std::string("file=\"") + TW_SOURCE_DIR + "/samples/arms/weld_arm_1400.xml\"");
  make_absolute("file=\"meshes/gusset.obj\"",
                std::string("file=\"") + TW_SOURCE_DIR + "/samples/cells/meshes/gusset.obj\"");
  return text;
}

}  // namespace tw::cli::test
