#pragma once

#include <string>
#include <string_view>

#include "planner/program/program.hpp"

namespace tw::postproc {

/// Parses and validates motion text (postproc/FORMAT.md) back into a
/// program, converting to SI units.
///
/// Checks, in this order: the first line names the format and version 1;
/// the last line is the integrity line and its SHA-256 matches everything
/// before it (a truncated or edited file fails here); every line in the
/// order the format gives, with every required field, no unknown field and
/// numbers in the C locale; record numbers counting up from 1; the `end`
/// count; and finally planner::findProgramProblem(). The first problem
/// throws tw::InputError naming `file`, the line and what was expected.
planner::Program readMotionText(std::string_view text, const std::string& file);

/// Reads the file at `path` and calls readMotionText(); a file that cannot
/// be opened throws tw::InputError too.
planner::Program readMotionTextFile(const std::string& path);

}  // namespace tw::postproc
