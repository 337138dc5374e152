#pragma once

#include <CLI/CLI.hpp>

namespace tw::cli {

/// Registers `posts`: lists the registered post-processors (name, file
/// extension, description), the names a job's `<output writer="...">` takes.
void addPostsCommand(CLI::App& app, int& exit_code);

}  // namespace tw::cli
