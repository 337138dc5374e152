#pragma once

#include "postproc/post_processor.hpp"

namespace tw::postproc {

/// A review page (postproc/FORMAT.md, "Review report"): one self-contained
/// HTML file, written as XHTML-compatible markup with inline SVG and CSS and
/// nothing fetched from anywhere, so that it opens offline. It shows the
/// metadata, the safety caution, the summary figures and warnings, top,
/// front and side views of the TCP path (and of the cell when
/// WriteOptions::report_cell holds it), for the whole program and per seam
/// the joint values with their limits, TCP speed, clearance and singularity
/// margin over time with the warnings marked, a collapsible table of every
/// record and the input file hashes.
class HtmlReportPostProcessor : public PostProcessor {
 public:
  std::string name() const override { return "html-report"; }
  std::string description() const override {
    return "self-contained HTML review page: plots of joints, speed, margins, views of the path";
  }
  std::string fileExtension() const override { return "html"; }
  /// Also throws tw::InputError, before writing anything, when
  /// options.report_cell holds a non-finite pose or corner.
  void write(const planner::Program& program, const WriteOptions& options,
             std::ostream& out) const override;
};

}  // namespace tw::postproc
