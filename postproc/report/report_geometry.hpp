#pragma once

#include "planner/cell/cell.hpp"
#include "planner/program/program.hpp"
#include "postproc/report/report_cell.hpp"

namespace tw::postproc {

/// The cell geometry the review report draws: every frame the program's
/// records name, the arm base, and each fixed body as triangles (primitives
/// tessellated, meshes loaded), all in the world frame of the cell. Throws
/// tw::InputError for a mesh that cannot be read.
ReportCell reportCellOf(const planner::Cell& cell, const planner::Program& program);

}  // namespace tw::postproc
