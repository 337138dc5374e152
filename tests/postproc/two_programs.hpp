#pragma once

#include "planner/program/program.hpp"

namespace tw::postproc::test {

/// The postproc tests' sample program (tests/postproc/sample_program.hpp).
planner::Program programA();

/// programA() changed in known ways: record 4 axis_1 +0.5°, record 5 on
/// another branch, record 7's TCP 2 mm higher, the final joint move home
/// (record 8) replaced by one more linear move of seam_1 ending 1 s earlier.
planner::Program programB();

}  // namespace tw::postproc::test
