#pragma once

#include <string>
#include <vector>

#include "planner/program/program.hpp"
#include "postproc/report/report_cell.hpp"
#include "postproc/report/report_timeline.hpp"

namespace tw::postproc {

/// The orthographic views of the review report, in the cell frame C of
/// `cell`, in the program's length unit, equal scales on both axes:
///   top   — from +z: x to the right, y up;
///   front — from −y: x to the right, z up;
///   side  — from +x: y to the right, z up.
/// Each is a <figure> whose <svg> has `class="view" data-view="top|front|side"`.
/// Drawn: the cell's bodies (union of their projected triangles, farther
/// triangles first), the arm base, the TCP path through the motion targets
/// (process on, other seam moves, moves outside seams in three styles) and
/// each seam's name at its first target.
std::string orthographicViews(const planner::Program& program,
                              const std::vector<TimelineMotion>& timeline,
                              const ReportCell& cell);

}  // namespace tw::postproc
