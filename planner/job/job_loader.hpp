#pragma once

#include <string>

#include "planner/job/job.hpp"

namespace tw::planner {

/// Loads a job file (the project's XML format, documented in
/// planner/CELL_AND_JOB_FORMAT.md; mm, degrees and seconds in the file, SI
/// in the result), the cell it names (loadCell) and every seam point list
/// it references (loadSeamPointsCsv). Relative paths resolve against the
/// job file's folder.
///
/// Throws tw::InputError naming the file (job, cell, arm or point list), the
/// line and what was expected for every problem: unknown element or
/// attribute, missing or non-finite value, a value out of range, an unknown
/// frame or tool, a repeated seam name or output file, no work at all, or
/// a malformed point list or outline.
/// Thread-safe: it shares no state between calls.
Job loadJob(const std::string& path);

}  // namespace tw::planner
