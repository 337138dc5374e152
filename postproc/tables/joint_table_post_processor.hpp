#pragma once

#include "postproc/post_processor.hpp"

namespace tw::postproc {

/// The joint-value table for review (postproc/FORMAT.md, "Joint table"):
/// CSV with a header row, one row per record and, when
/// WriteOptions::sample_period > 0, interpolated "sample" rows in between.
/// Columns: record, kind, time, duration, seam, process set, each joint,
/// TCP position and quaternion, speeds, blend, the margin of each joint to
/// its nearer limit, singularity margin and clearance; units in the column
/// names. A sample_period that is not 0 must be at least 1 ms (a finer grid
/// only makes the file huge); anything else throws tw::InputError.
class JointTablePostProcessor : public PostProcessor {
 public:
  std::string name() const override { return "joint-table"; }
  std::string description() const override {
    return "CSV table of joint values, TCP poses, limit margins, singularity margin, clearance";
  }
  std::string fileExtension() const override { return "csv"; }
  void write(const planner::Program& program, const WriteOptions& options,
             std::ostream& out) const override;
};

}  // namespace tw::postproc
