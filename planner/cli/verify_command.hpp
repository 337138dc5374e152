#pragma once

#include <CLI/CLI.hpp>

namespace tw::cli {

/// Registers `verify PROGRAM --job JOB`: replays a motion text file in the
/// job's cell as the controller interpolates it (planner::verifyProgram) and
/// lists every record that no longer runs, with its reason; exit 0 when the
/// program runs as written, 3 when a record does not, 2 for bad input.
void addVerifyCommand(CLI::App& app, int& exit_code);

}  // namespace tw::cli
