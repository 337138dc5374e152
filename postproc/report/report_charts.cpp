#include "postproc/report/report_charts.hpp"

#include <algorithm>
#include <limits>

#include "kinematics/common/number_text.hpp"
#include "postproc/safety_caution.hpp"

namespace tw::postproc {
namespace {

/// Charts of the review page share one size so that they line up in a grid.
PlotLayout chartLayout() {
  PlotLayout layout;
  layout.width = 380.0;
  layout.height = 190.0;
  return layout;
}

/// Smallest and largest of the values seen.
struct Extremes {
  double low = std::numeric_limits<double>::infinity();
  double high = -std::numeric_limits<double>::infinity();

  void offer(double value) {
    low = std::min(low, value);
    high = std::max(high, value);
  }
  bool empty() const { return low > high; }
};

std::string emptyFigure(const std::string& title, const std::string& why) {
  return "<figure class=\"chart chart-empty\"><div class=\"empty-title\">" + escapeXml(title) +
         "</div><p>" + escapeXml(why) + "</p></figure>";
}

}  // namespace

ReportCharts::ReportCharts(const planner::Program& program, const WriteOptions& options,
                           const std::vector<TimelineMotion>& timeline,
                           const std::vector<ReviewWarning>& warnings)
    : program_(program),
      options_(options),
      timeline_(timeline),
      warnings_(warnings),
      quantities_(fileQuantities(program.metadata.units)) {}

AxisTicks ReportCharts::timeTicks(const ReportScope& scope) const {
  const planner::MotionRecord& first = *timeline_[scope.motions.front()].motion;
  const double start = scope.lead_in ? timeline_[*scope.lead_in].end_time
                       : scope.seam.empty() ? 0.0
                                            : first.start_time;
  // Eight ticks: a seam's time axis then ends near its last motion rather
  // than a coarse step later.
  return niceTicks(start, timeline_[scope.motions.back()].end_time, 8);
}

std::string ReportCharts::attributes(const ReportScope& scope, const std::string& kind) const {
  return "class=\"plot " + kind + "\" data-scope=\"" +
         escapeXml(scope.seam.empty() ? "program" : scope.seam) + '"';
}

void ReportCharts::shadeProcess(const ReportScope& scope, SvgPlot& plot) const {
  for (const std::size_t index : scope.motions) {
    const TimelineMotion& entry = timeline_[index];
    if (entry.process_on) plot.bottomStrip(entry.motion->start_time, entry.end_time, "strip-process");
  }
}

void ReportCharts::markWarnings(const ReportScope& scope, WarningKind kind, int joint,
                                SvgPlot& plot) const {
  for (std::size_t w = 0; w < warnings_.size(); ++w) {
    const ReviewWarning& warning = warnings_[w];
    if (warning.kind != kind || warning.joint != joint || !warning.record) continue;
    for (const std::size_t index : scope.motions) {
      if (timeline_[index].record == *warning.record) {
        plot.verticalMark(timeline_[index].end_time, 'W' + std::to_string(w + 1), "warning-mark");
      }
    }
  }
}

std::string ReportCharts::figure(const SvgPlot& plot, const std::string& caption,
                                 const std::string& extra) const {
  return "<figure class=\"chart\"><div class=\"chart-row\">" + plot.svg() + extra +
         "</div><figcaption>" + escapeXml(caption) + "</figcaption></figure>";
}

std::string ReportCharts::jointChart(const ReportScope& scope, int joint,
                                     const std::string& id) const {
  const planner::ProgramJoint& limits = program_.metadata.joints[joint];
  const QuantityFormat& format = quantities_.joint(limits.type);
  std::vector<PlotPoint> points;
  Extremes extremes;
  auto add = [&](const TimelineMotion& entry) {
    const double value = entry.motion->q[joint] * format.scale;
    points.push_back({entry.end_time, value});
    extremes.offer(value);
  };
  if (scope.lead_in) add(timeline_[*scope.lead_in]);
  for (const std::size_t index : scope.motions) add(timeline_[index]);

  const double lower = limits.lower * format.scale;
  const double upper = limits.upper * format.scale;
  const double margin = jointLimitWarning(options_, limits.type) * format.scale;
  SvgPlot plot(chartLayout(), timeTicks(scope), niceTicks(extremes.low, extremes.high), id,
               attributes(scope, "joint-plot") + " data-joint=\"" + escapeXml(limits.name) + '"');
  plot.title(limits.name);
  plot.axisLabels("time [s]", format.unit);
  shadeProcess(scope, plot);
  const double far = 10.0 * (upper - lower);  // beyond any axis this chart can have
  plot.band(lower - far, lower, "band-limit");
  plot.band(upper, upper + far, "band-limit");
  plot.band(lower, lower + margin, "band-near");
  plot.band(upper - margin, upper, "band-near");
  plot.polyline(points, "line-joint");
  for (const PlotPoint& point : points) plot.dot(point, 1.8, "dot-joint");
  markWarnings(scope, WarningKind::kJointLimit, joint, plot);
  const std::string caption = "min " + formatFixed(extremes.low, format.decimals) + " · max " +
                              formatFixed(extremes.high, format.decimals) + ' ' + format.unit;
  return figure(plot, caption, limitGauge(joint, extremes.low, extremes.high));
}

std::string ReportCharts::limitGauge(int joint, double used_low, double used_high) const {
  const planner::ProgramJoint& limits = program_.metadata.joints[joint];
  const QuantityFormat& format = quantities_.joint(limits.type);
  const double lower = limits.lower * format.scale;
  const double upper = limits.upper * format.scale;
  const double margin = jointLimitWarning(options_, limits.type) * format.scale;
  // The whole range from lower (bottom) to upper (top) on the chart's height.
  const PlotLayout layout = chartLayout();
  const double top = layout.top;
  const double height = layout.height - layout.top - layout.bottom;
  auto y = [&](double value) {
    const double clamped = std::clamp(value, lower, upper);
    return top + (upper - clamped) / (upper - lower) * height;
  };
  auto rect = [&](const std::string& css_class, double x, double width, double from, double to) {
    return "<rect class=\"" + css_class + "\" x=\"" + formatFixed(x, 1) + "\" y=\"" +
           formatFixed(y(to), 1) + "\" width=\"" + formatFixed(width, 1) + "\" height=\"" +
           formatFixed(std::max(y(from) - y(to), 1.0), 1) + "\"/>";
  };
  std::string svg = "<svg xmlns=\"http://www.w3.org/2000/svg\" class=\"gauge\" width=\"34\" height=\"" +
                    formatFixed(layout.height, 1) + "\" viewBox=\"0 0 34 " +
                    formatFixed(layout.height, 1) + "\">";
  svg += rect("gauge-range", 12.0, 10.0, lower, upper);
  svg += rect("band-near", 12.0, 10.0, lower, lower + margin);
  svg += rect("band-near", 12.0, 10.0, upper - margin, upper);
  svg += rect("gauge-used", 9.0, 16.0, used_low, used_high);
  svg += "<text class=\"tick\" x=\"17\" y=\"" + formatFixed(top - 6.0, 1) +
         "\" text-anchor=\"middle\">" + formatFixed(upper, 0) + "</text>";
  svg += "<text class=\"tick\" x=\"17\" y=\"" + formatFixed(top + height + 14.0, 1) +
         "\" text-anchor=\"middle\">" + formatFixed(lower, 0) + "</text>";
  return svg + "<title>whole range of " + escapeXml(limits.name) + "</title></svg>";
}

std::string ReportCharts::speedChart(const ReportScope& scope, const std::string& id) const {
  const double scale = quantities_.speed.scale;
  std::vector<std::vector<PlotPoint>> commanded;
  std::vector<std::vector<PlotPoint>> chord;
  Extremes extremes;
  bool arcs = false;
  for (const std::size_t index : scope.motions) {
    const TimelineMotion& entry = timeline_[index];
    const planner::MotionRecord& motion = *entry.motion;
    if (motion.speed.kind == planner::SpeedKind::kTcpSpeed) {
      const double value = motion.speed.value * scale;
      commanded.push_back({{motion.start_time, value}, {entry.end_time, value}});
      extremes.offer(value);
    }
    // A joint move's chord says little about its real TCP path, so only
    // linear and circular moves (whose chord_speed is the arc's) are
    // compared with their commanded speed.
    if (entry.chord_speed && motion.kind != planner::MotionKind::kJointMove) {
      arcs |= motion.kind == planner::MotionKind::kCircularMove;
      const double value = *entry.chord_speed * scale;
      chord.push_back({{motion.start_time, value}, {entry.end_time, value}});
      extremes.offer(value);
    }
  }
  const std::string title = "TCP speed";
  if (extremes.empty()) return emptyFigure(title, "no TCP speed in this scope");
  const double limit = kReducedSpeedLimit * scale;
  SvgPlot plot(chartLayout(), timeTicks(scope), niceTicks(std::min(0.0, extremes.low), extremes.high),
               id, attributes(scope, "speed-plot"));
  plot.title(title);
  plot.axisLabels("time [s]", quantities_.speed.unit);
  shadeProcess(scope, plot);
  plot.band(limit, limit + 1e3 * std::max(limit, extremes.high), "band-limit");
  for (const auto& step : chord) plot.polyline(step, "line-chord");
  for (const auto& step : commanded) plot.polyline(step, "line-commanded");
  markWarnings(scope, WarningKind::kReducedSpeed, -1, plot);
  const QuantityFormat& format = quantities_.speed;
  return figure(plot, "min " + format.format(extremes.low / scale) + " · max " +
                          format.format(extremes.high / scale) + ' ' + format.unit +
                          (arcs ? " · thick: commanded, thin: path length (chord or arc) ÷ duration"
                                : " · thick: commanded, thin: chord ÷ duration"));
}

std::string ReportCharts::clearanceChart(const ReportScope& scope, const std::string& id) const {
  const QuantityFormat& format = quantities_.length;
  std::vector<std::vector<PlotPoint>> steps;
  Extremes extremes;
  for (const std::size_t index : scope.motions) {
    const TimelineMotion& entry = timeline_[index];
    if (!entry.motion->clearance) continue;
    const double value = *entry.motion->clearance * format.scale;
    steps.push_back({{entry.motion->start_time, value}, {entry.end_time, value}});
    extremes.offer(value);
  }
  const std::string title = "clearance";
  if (extremes.empty()) return emptyFigure(title, "clearance not measured in this scope");
  const double threshold = options_.clearance_warning * format.scale;
  SvgPlot plot(chartLayout(), timeTicks(scope),
               niceTicks(std::min(0.0, extremes.low), std::max(extremes.high, threshold)), id,
               attributes(scope, "clearance-plot"));
  plot.title(title);
  plot.axisLabels("time [s]", format.unit);
  shadeProcess(scope, plot);
  plot.band(-1e3 * threshold - extremes.high, 0.0, "band-limit");
  plot.band(0.0, threshold, "band-near");
  for (const auto& step : steps) plot.polyline(step, "line-clearance");
  markWarnings(scope, WarningKind::kClearance, -1, plot);
  return figure(plot, "min " + formatFixed(extremes.low, format.decimals) + " · max " +
                          formatFixed(extremes.high, format.decimals) + ' ' + format.unit +
                          " · warning below " + formatFixed(threshold, format.decimals) + ' ' + format.unit);
}

std::string ReportCharts::singularityChart(const ReportScope& scope, const std::string& id) const {
  const QuantityFormat& format = quantities_.angle;
  std::vector<PlotPoint> points;
  Extremes extremes;
  for (const std::size_t index : scope.motions) {
    const TimelineMotion& entry = timeline_[index];
    if (!entry.motion->singularity_margin) continue;
    const double value = *entry.motion->singularity_margin * format.scale;
    points.push_back({entry.end_time, value});
    extremes.offer(value);
  }
  const std::string title = "singularity margin";
  if (extremes.empty()) return emptyFigure(title, "singularity margin not measured in this scope");
  const double threshold = options_.singularity_warning * format.scale;
  SvgPlot plot(chartLayout(), timeTicks(scope),
               niceTicks(0.0, std::max(extremes.high, threshold)), id,
               attributes(scope, "singularity-plot"));
  plot.title(title);
  plot.axisLabels("time [s]", format.unit);
  shadeProcess(scope, plot);
  plot.band(0.0, threshold, "band-near");
  plot.polyline(points, "line-singularity");
  for (const PlotPoint& point : points) plot.dot(point, 2.2, "dot-singularity");
  markWarnings(scope, WarningKind::kSingularity, -1, plot);
  return figure(plot, "min " + formatFixed(extremes.low, format.decimals) + " · max " +
                          formatFixed(extremes.high, format.decimals) + ' ' + format.unit +
                          " · warning below " + formatFixed(threshold, format.decimals) + ' ' + format.unit);
}

}  // namespace tw::postproc
