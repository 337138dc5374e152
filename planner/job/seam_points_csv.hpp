#pragma once

#include <istream>
#include <string>

#include "planner/job/seam_point.hpp"

namespace tw::planner {

/// Reads a seam point list (CSV, documented in planner/CELL_AND_JOB_FORMAT.md).
///
/// The first non-comment line is a header naming the columns, in any order:
/// x_mm, y_mm, z_mm, nx, ny, nz (required); n2x, n2y, n2z (optional, all
/// three, the second normal of a fillet); speed_mm_s (optional). Units are in
/// the names, so a file cannot be read in the wrong unit. Lines starting with
/// '#' and blank lines are skipped. Numbers use '.' as the decimal point, in
/// any locale. Normals need not be unit length; they are normalised.
///
/// Throws tw::InputError naming `source`, the line and what was expected for
/// an unknown, repeated or missing column, a row with the wrong number of
/// fields, a non-finite number, a zero-length normal (below 1e-9), a speed
/// ≤ 0, a point equal to the one before it (within 1e-6 mm), or fewer than
/// two points.
SeamPointList parseSeamPointsCsv(std::istream& input, const std::string& source);

/// parseSeamPointsCsv on the file at `path`; throws when it cannot be opened.
SeamPointList loadSeamPointsCsv(const std::string& path);

}  // namespace tw::planner
