#pragma once

#include <string>
#include <vector>

namespace tw::postproc {

/// Axis ticks at "nice" values: integer multiples of a step of 1, 2, 2.5 or
/// 5 times a power of ten, from the largest multiple at or below the low end
/// of the data to the smallest at or above the high end, so that the first
/// and last labels bracket the data.
struct AxisTicks {
  std::vector<double> values;  ///< ascending, at least two
  double step = 1.0;
  int decimals = 0;  ///< enough to tell neighbouring ticks apart, no more

  double first() const { return values.front(); }
  double last() const { return values.back(); }
  /// `value` with the decimals of the ticks (C locale, no "-0").
  std::string label(double value) const;
};

/// About `target_count` (≥ 2) nice ticks covering [low, high]. An empty or
/// near-empty range (high - low tiny against the values) is widened to one
/// unit, or 5 % of the magnitude when that is larger, around its centre.
/// Precondition: low and high finite, low <= high.
AxisTicks niceTicks(double low, double high, int target_count = 6);

/// A point in data coordinates of a plot.
struct PlotPoint {
  double x = 0.0;
  double y = 0.0;
};

/// Where a plot sits on its SVG canvas [px]: the canvas size and the inner
/// data area left for the axes and labels.
struct PlotLayout {
  double width = 600.0;
  double height = 220.0;
  double left = 62.0;
  double right = 14.0;
  double top = 28.0;
  double bottom = 34.0;
};

/// One SVG chart with numeric axes, in the project's own look (CSS classes
/// styled by the page). Marks are drawn in the order they are added, clipped
/// to the data area. Output is plain XML (XHTML-compatible): text is
/// escaped, coordinates carry one decimal, numbers are locale-independent.
///
/// The data area spans the ticks of each axis exactly (except for
/// equalAspect()), so the first and last tick labels are the ends of the axis.
class SvgPlot {
 public:
  /// `id` must be unique in the page (it also names the clip path);
  /// `attributes` is inserted verbatim into the <svg> start tag (e.g.
  /// `class="plot" data-joint="axis_1"`) and must be well-formed XML.
  SvgPlot(PlotLayout layout, AxisTicks x_ticks, AxisTicks y_ticks, std::string id,
          std::string attributes);

  /// With equal scales on both axes (for orthographic views): the shorter
  /// data extent is widened about its centre until one data unit is the
  /// same number of pixels horizontally and vertically.
  static SvgPlot equalAspect(PlotLayout layout, double x_low, double x_high, double y_low,
                             double y_high, std::string id, std::string attributes);

  void title(const std::string& text);
  void axisLabels(const std::string& x_label, const std::string& y_label);
  /// A horizontal band between two y values across the whole data area.
  void band(double y_low, double y_high, const std::string& css_class);
  /// A strip 4 px high along the bottom of the data area between two x
  /// values (marks an interval without covering the data).
  void bottomStrip(double x_low, double x_high, const std::string& css_class);
  /// Connected line through `points`; nothing for fewer than two.
  void polyline(const std::vector<PlotPoint>& points, const std::string& css_class);
  /// A filled polygon (closed path) through `points`; nothing for fewer than three.
  void polygon(const std::vector<PlotPoint>& points, const std::string& css_class);
  /// A vertical line at `x` with a short label at its top (a warning mark).
  void verticalMark(double x, const std::string& label, const std::string& css_class);
  /// A small circle at `point` with `radius` [px].
  void dot(PlotPoint point, double radius, const std::string& css_class);
  /// Text beside `point`, offset by (dx, dy) [px].
  void text(PlotPoint point, double dx, double dy, const std::string& text,
            const std::string& css_class);

  /// Pixels per data unit along x (for sizing labels against marks).
  double pixelsPerUnitX() const;

  /// The complete <svg> element.
  std::string svg() const;

 private:
  double pixelX(double x) const;
  double pixelY(double y) const;

  PlotLayout layout_;
  double x_low_, x_high_, y_low_, y_high_;  ///< data range of the data area
  AxisTicks x_ticks_;
  AxisTicks y_ticks_;
  std::string id_;
  std::string attributes_;
  std::string title_;
  std::string x_label_;
  std::string y_label_;
  std::string marks_;  ///< clipped to the data area
  std::string labels_;  ///< drawn over the marks, not clipped
  int mark_count_ = 0;
};

/// `text` with &, <, > and " escaped for XML text and attribute values.
std::string escapeXml(const std::string& text);

}  // namespace tw::postproc
