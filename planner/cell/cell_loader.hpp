#pragma once

#include <string>

#include "planner/cell/cell.hpp"

namespace tw::planner {

/// Loads a cell file (the project's XML format, documented in
/// planner/CELL_AND_JOB_FORMAT.md; mm and degrees in the file, SI in the
/// result). The arm description it references is loaded with
/// kinematics::loadArmDescription; relative paths resolve against the cell
/// file's folder.
///
/// Throws tw::InputError naming the file, the line and what was expected for
/// every problem: unknown element or attribute, missing or non-finite value,
/// an unknown or cyclic frame, duplicate names, a bad spin range, a home
/// position of the wrong size or outside the joint limits.
/// Thread-safe: it shares no state between calls.
Cell loadCell(const std::string& path);

}  // namespace tw::planner
