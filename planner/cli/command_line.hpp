#pragma once

#include <CLI/CLI.hpp>
#include <cstdio>

namespace tw::cli {

/// Registers every command of the tool on `app`; the command that runs sets
/// `exit_code`.
void addAllCommands(CLI::App& app, int& exit_code);

/// Parses the arguments and runs the chosen command, turning what escapes
/// it into the tool's exit codes (exit_codes.hpp) with one line on
/// `errors`: a usage problem or tw::InputError → 2 (bad input), any other
/// exception → 1 (internal error: a bug, please report it); otherwise the
/// command's own `exit_code`.
int runCommandLine(CLI::App& app, int argc, const char* const* argv, const int& exit_code,
                   std::FILE* errors);

}  // namespace tw::cli
