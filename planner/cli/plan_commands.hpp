#pragma once

#include <CLI/CLI.hpp>

namespace tw::cli {

/// Registers `plan JOB` (the whole pipeline: seams, transits, timing, every
/// output the job asks for) and `check JOB` (inputs and the reachability of
/// every seam, without transits or outputs).
void addPlanCommands(CLI::App& app, int& exit_code);

}  // namespace tw::cli
