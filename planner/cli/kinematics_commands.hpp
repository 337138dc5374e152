#pragma once

#include <CLI/CLI.hpp>

namespace tw::cli {

/// Registers `reach` (every IK branch for a flange pose) and `pose` (the
/// flange pose and singularity measures for joint values) on `app`. Both
/// read an arm description; lengths in mm and angles in degrees on the
/// command line, as in the files.
void addKinematicsCommands(CLI::App& app, int& exit_code);

}  // namespace tw::cli
