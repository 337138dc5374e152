#pragma once

#include "postproc/post_processor.hpp"

namespace tw::postproc {

/// Writes the project's own motion text (postproc/FORMAT.md): a versioned
/// first line, the safety caution as comments, units, metadata, joints, one
/// line per record with joint values and TCP pose, and a final SHA-256
/// integrity line. readMotionText() reads it back.
class MotionTextPostProcessor : public PostProcessor {
 public:
  std::string name() const override { return "motion-text"; }
  std::string description() const override {
    return "neutral motion text with joint values, TCP poses and an integrity line";
  }
  std::string fileExtension() const override { return "twm"; }
  void write(const planner::Program& program, const WriteOptions& options,
             std::ostream& out) const override;
};

}  // namespace tw::postproc
