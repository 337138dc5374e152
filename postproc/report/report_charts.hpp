#pragma once

#include <string>
#include <vector>

#include "planner/program/program.hpp"
#include "postproc/file_quantities.hpp"
#include "postproc/report/report_timeline.hpp"
#include "postproc/report/svg_plot.hpp"
#include "postproc/review_warnings.hpp"
#include "postproc/write_options.hpp"

namespace tw::postproc {

/// The time charts of the review report, one <figure> each, in the file
/// units of the program. Every chart's <svg> carries `class="plot <kind>"`,
/// `data-scope` (the seam, or "program") and, for joints, `data-joint`;
/// its caption states the smallest and largest plotted value. Warnings of
/// the chart's kind on a motion of the scope are marked at the motion's end
/// as "W<number>", numbered from 1 in the order of `warnings`; a strip along
/// the time axis marks the motions with the process on.
///
/// Holds references: every argument must outlive the object.
class ReportCharts {
 public:
  ReportCharts(const planner::Program& program, const WriteOptions& options,
               const std::vector<TimelineMotion>& timeline,
               const std::vector<ReviewWarning>& warnings);

  /// Joint `joint` over time at the motion targets (and the lead-in), with
  /// bands beyond the limits and within the warning margin of them, and a
  /// gauge of the whole joint range beside it.
  std::string jointChart(const ReportScope& scope, int joint, const std::string& id) const;
  /// Commanded TCP speed and chord speed (straight distance, or arc length
  /// for a circular move, ÷ duration) of the linear and circular moves, one
  /// step per motion, with a band above the reduced-speed limit.
  std::string speedChart(const ReportScope& scope, const std::string& id) const;
  /// Clearance per motion (one step each), band below the warning threshold.
  std::string clearanceChart(const ReportScope& scope, const std::string& id) const;
  /// Singularity margin at the targets, band below the warning threshold.
  std::string singularityChart(const ReportScope& scope, const std::string& id) const;

 private:
  /// The time axis of a scope: from the lead-in's end (or the first motion's
  /// start) to the last motion's end.
  AxisTicks timeTicks(const ReportScope& scope) const;
  std::string attributes(const ReportScope& scope, const std::string& kind) const;
  /// Marks the time of the scope's motions with the process on by a strip.
  void shadeProcess(const ReportScope& scope, SvgPlot& plot) const;
  void markWarnings(const ReportScope& scope, WarningKind kind, int joint, SvgPlot& plot) const;
  std::string figure(const SvgPlot& plot, const std::string& caption,
                     const std::string& extra = "") const;
  std::string limitGauge(int joint, double used_low, double used_high) const;

  const planner::Program& program_;
  const WriteOptions& options_;
  const std::vector<TimelineMotion>& timeline_;
  const std::vector<ReviewWarning>& warnings_;
  FileQuantities quantities_;
};

}  // namespace tw::postproc
