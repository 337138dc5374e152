#pragma once

#include <CLI/CLI.hpp>

namespace tw::cli {

/// Registers `refit`: re-registers a moved fixture frame of a cell from
/// nominal and measured reference points (planner/refit/rigid_fit.hpp), reports
/// the new frame, the residual of every point and the RMS, and with
/// `--write-cell` rewrites that frame's pose in the cell file atomically.
/// Exit codes: 0 done; 2 bad input (nothing written); 3 when `--write-cell`
/// was asked for but a residual exceeds the tolerance (nothing written).
void addRefitCommand(CLI::App& app, int& exit_code);

}  // namespace tw::cli
