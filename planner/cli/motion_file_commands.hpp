#pragma once

#include <CLI/CLI.hpp>

namespace tw::cli {

/// Registers the commands that read motion text files (postproc/FORMAT.md):
/// `compare A B` (what changed between two programs; exit 0, or 3 with
/// `--fail-on-change` when they differ) and `table FILE` (the program as a
/// joint-value table in the terminal, or as the joint-table CSV with
/// `--csv`). A file that fails the reader's checks is bad input: its
/// file:line message and exit code 2, nothing written.
void addMotionFileCommands(CLI::App& app, int& exit_code);

}  // namespace tw::cli
