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

/// A second invented weld program with circular moves and blends, in the
/// frame "fixture_b" with the same arm: a blended joint move to the start,
/// a linear approach, process on, a linear weld, a half circle (radius
/// 25 mm, the torch turning 90° with it), a linear weld back, process off,
/// a blended linear lift, a three-quarter circle (radius 50 mm, in the
/// plane x = 900 mm) and a joint move home. Round numbers, as above.
planner::Program arcProgram();

/// The text of a file under tests/postproc/data/.
std::string readDataFile(const std::string& name);

/// The text of any file.
std::string readWholeFile(const std::string& path);

/// Writes `text` to `path`, replacing it.
void writeWholeFile(const std::string& path, const std::string& text);

}  // namespace tw::postproc::test
