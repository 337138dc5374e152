#pragma once

#include "postproc/post_processor.hpp"

namespace tw::postproc {

/// A JSON summary for review (postproc/FORMAT.md, "Summary"): the metadata,
/// the safety caution, figures for the whole program and per seam
/// (waypoints, time, process time, minimum clearance, minimum singularity
/// margin, tightest joint-limit margin, each with the record where it
/// occurs) and warnings: the planner's, then one per record that is faster
/// than the reduced-speed limit or below the margins in WriteOptions.
class SummaryPostProcessor : public PostProcessor {
 public:
  std::string name() const override { return "summary"; }
  std::string description() const override {
    return "JSON summary per seam and in total: waypoints, cycle time, margins, warnings";
  }
  std::string fileExtension() const override { return "json"; }
  void write(const planner::Program& program, const WriteOptions& options,
             std::ostream& out) const override;
};

}  // namespace tw::postproc
