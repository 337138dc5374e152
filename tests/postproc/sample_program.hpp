#pragma once

#include <string>

#include "planner/program/program.hpp"

namespace tw::postproc::test {

/// A small invented weld program: a joint move to a start pose, a linear
/// approach, arc on, two linear weld moves, arc off, a linear retract and a
/// joint move home. Six revolute joints with limits ±170°/±120°/±150°/
/// ±190°/±125°/±360°. Figures are round numbers so that golden files are
/// easy to check by hand.
planner::Program sampleProgram();

/// The text of a file under tests/postproc/data/.
std::string readDataFile(const std::string& name);

/// The text of any file.
std::string readWholeFile(const std::string& path);

/// Writes `text` to `path`, replacing it.
void writeWholeFile(const std::string& path, const std::string& text);

}  // namespace tw::postproc::test
