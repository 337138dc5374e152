#include "postproc/report/svg_plot.hpp"

#include <algorithm>
#include <cmath>

#include "kinematics/common/number_text.hpp"

namespace tw::postproc {
namespace {

/// Pixel coordinates carry one decimal: finer than any screen, and short.
std::string px(double value) { return formatFixed(value, 1); }

/// The tick spacing for `raw` (> 0): the smallest of 1, 2, 2.5, 5 times a
/// power of ten that is at least `raw`, and the decimals it needs.
std::pair<double, int> niceStep(double raw) {
  const int exponent = static_cast<int>(std::floor(std::log10(raw)));
  const double power = std::pow(10.0, exponent);
  const double fraction = raw / power;
  double mantissa = 10.0;
  for (const double candidate : {1.0, 2.0, 2.5, 5.0}) {
    if (fraction <= candidate * (1.0 + 1e-9)) {  // 1e-9: absorbs the rounding of log10/pow
      mantissa = candidate;
      break;
    }
  }
  // 2.5 × 10^e needs one decimal more than 10^e.
  const int mantissa_decimals = mantissa == 2.5 ? 1 : 0;
  const int decimals = std::max(0, mantissa_decimals - (mantissa == 10.0 ? exponent + 1 : exponent));
  return {mantissa * power, decimals};
}

}  // namespace

std::string AxisTicks::label(double value) const { return formatFixed(value, decimals); }

AxisTicks niceTicks(double low, double high, int target_count) {
  const double magnitude = std::max(std::abs(low), std::abs(high));
  if (high - low <= 1e-9 * std::max(1.0, magnitude)) {  // 1e-9: below any printed decimal
    const double half = std::max(0.5, 0.025 * magnitude);
    const double centre = 0.5 * (low + high);
    low = centre - half;
    high = centre + half;
  }
  const auto [step, decimals] = niceStep((high - low) / std::max(1, target_count - 1));
  // Multiples of the step, counted as integers so that ticks do not drift;
  // the tolerance keeps a value that is a multiple up to rounding on it.
  const double first = std::floor(low / step + 1e-9);
  const double last = std::ceil(high / step - 1e-9);
  AxisTicks ticks;
  ticks.step = step;
  ticks.decimals = decimals;
  for (double k = first; k <= last; k += 1.0) {
    const double value = k * step;
    ticks.values.push_back(value == 0.0 ? 0.0 : value);
  }
  if (ticks.values.size() < 2) ticks.values.push_back((last + 1.0) * step);
  return ticks;
}

SvgPlot::SvgPlot(PlotLayout layout, AxisTicks x_ticks, AxisTicks y_ticks, std::string id,
                 std::string attributes)
    : layout_(layout),
      x_low_(x_ticks.first()),
      x_high_(x_ticks.last()),
      y_low_(y_ticks.first()),
      y_high_(y_ticks.last()),
      x_ticks_(std::move(x_ticks)),
      y_ticks_(std::move(y_ticks)),
      id_(std::move(id)),
      attributes_(std::move(attributes)) {}

SvgPlot SvgPlot::equalAspect(PlotLayout layout, double x_low, double x_high, double y_low,
                             double y_high, std::string id, std::string attributes) {
  const double area_width = layout.width - layout.left - layout.right;
  const double area_height = layout.height - layout.top - layout.bottom;
  // Never a zero extent: a path along one axis still gets a square of room.
  const double floor_extent = std::max({x_high - x_low, y_high - y_low, 1e-3}) * 0.1;
  double x_extent = std::max(x_high - x_low, floor_extent);
  double y_extent = std::max(y_high - y_low, floor_extent);
  const double units_per_px = std::max(x_extent / area_width, y_extent / area_height);
  x_extent = units_per_px * area_width;
  y_extent = units_per_px * area_height;
  const double x_centre = 0.5 * (x_low + x_high);
  const double y_centre = 0.5 * (y_low + y_high);
  SvgPlot plot(layout, niceTicks(x_centre - x_extent / 2, x_centre + x_extent / 2),
               niceTicks(y_centre - y_extent / 2, y_centre + y_extent / 2), std::move(id),
               std::move(attributes));
  plot.x_low_ = x_centre - x_extent / 2;
  plot.x_high_ = x_centre + x_extent / 2;
  plot.y_low_ = y_centre - y_extent / 2;
  plot.y_high_ = y_centre + y_extent / 2;
  return plot;
}

double SvgPlot::pixelX(double x) const {
  const double area = layout_.width - layout_.left - layout_.right;
  return layout_.left + (x - x_low_) / (x_high_ - x_low_) * area;
}

double SvgPlot::pixelY(double y) const {
  const double area = layout_.height - layout_.top - layout_.bottom;
  return layout_.top + (y_high_ - y) / (y_high_ - y_low_) * area;
}

double SvgPlot::pixelsPerUnitX() const {
  return (layout_.width - layout_.left - layout_.right) / (x_high_ - x_low_);
}

void SvgPlot::title(const std::string& text) { title_ = text; }

void SvgPlot::axisLabels(const std::string& x_label, const std::string& y_label) {
  x_label_ = x_label;
  y_label_ = y_label;
}

void SvgPlot::band(double y_low, double y_high, const std::string& css_class) {
  const double low = std::max(y_low, y_low_);
  const double high = std::min(y_high, y_high_);
  if (high <= low) return;
  marks_ += "<rect class=\"" + css_class + "\" x=\"" + px(layout_.left) + "\" y=\"" +
            px(pixelY(high)) + "\" width=\"" + px(layout_.width - layout_.left - layout_.right) +
            "\" height=\"" + px(pixelY(low) - pixelY(high)) + "\"/>";
}

void SvgPlot::bottomStrip(double x_low, double x_high, const std::string& css_class) {
  const double low = std::max(x_low, x_low_);
  const double high = std::min(x_high, x_high_);
  if (high <= low) return;
  constexpr double kHeight = 4.0;
  marks_ += "<rect class=\"" + css_class + "\" x=\"" + px(pixelX(low)) + "\" y=\"" +
            px(layout_.height - layout_.bottom - kHeight) + "\" width=\"" +
            px(pixelX(high) - pixelX(low)) + "\" height=\"" + px(kHeight) + "\"/>";
}

void SvgPlot::polyline(const std::vector<PlotPoint>& points, const std::string& css_class) {
  if (points.size() < 2) return;
  std::string coordinates;
  for (const PlotPoint& point : points) {
    if (!coordinates.empty()) coordinates += ' ';
    coordinates += px(pixelX(point.x)) + ',' + px(pixelY(point.y));
  }
  marks_ += "<polyline class=\"" + css_class + "\" points=\"" + coordinates + "\"/>";
}

void SvgPlot::polygon(const std::vector<PlotPoint>& points, const std::string& css_class) {
  if (points.size() < 3) return;
  std::string coordinates;
  for (const PlotPoint& point : points) {
    if (!coordinates.empty()) coordinates += ' ';
    coordinates += px(pixelX(point.x)) + ',' + px(pixelY(point.y));
  }
  marks_ += "<polygon class=\"" + css_class + "\" points=\"" + coordinates + "\"/>";
}

void SvgPlot::verticalMark(double x, const std::string& label, const std::string& css_class) {
  if (x < x_low_ || x > x_high_) return;
  const std::string pixel = px(pixelX(x));
  marks_ += "<line class=\"" + css_class + "\" x1=\"" + pixel + "\" y1=\"" + px(layout_.top) +
            "\" x2=\"" + pixel + "\" y2=\"" + px(layout_.height - layout_.bottom) + "\"/>";
  // Every second label just inside the frame, so that close marks stay legible.
  const double label_y = mark_count_++ % 2 == 0 ? layout_.top - 3.0 : layout_.top + 11.0;
  labels_ += "<text class=\"" + css_class + "-label\" x=\"" + pixel + "\" y=\"" + px(label_y) +
             "\" text-anchor=\"middle\">" + escapeXml(label) + "</text>";
}

void SvgPlot::dot(PlotPoint point, double radius, const std::string& css_class) {
  marks_ += "<circle class=\"" + css_class + "\" cx=\"" + px(pixelX(point.x)) + "\" cy=\"" +
            px(pixelY(point.y)) + "\" r=\"" + px(radius) + "\"/>";
}

void SvgPlot::text(PlotPoint point, double dx, double dy, const std::string& text,
                   const std::string& css_class) {
  labels_ += "<text class=\"" + css_class + "\" x=\"" + px(pixelX(point.x) + dx) + "\" y=\"" +
             px(pixelY(point.y) + dy) + "\">" + escapeXml(text) + "</text>";
}

std::string SvgPlot::svg() const {
  const double right = layout_.width - layout_.right;
  const double bottom = layout_.height - layout_.bottom;
  std::string out = "<svg xmlns=\"http://www.w3.org/2000/svg\" id=\"" + id_ + "\" " +
                    attributes_ + " width=\"" + px(layout_.width) + "\" height=\"" +
                    px(layout_.height) + "\" viewBox=\"0 0 " + px(layout_.width) + ' ' +
                    px(layout_.height) + "\">";
  out += "<defs><clipPath id=\"" + id_ + "-area\"><rect x=\"" + px(layout_.left) + "\" y=\"" +
         px(layout_.top) + "\" width=\"" + px(right - layout_.left) + "\" height=\"" +
         px(bottom - layout_.top) + "\"/></clipPath></defs>";
  out += "<rect class=\"plot-area\" x=\"" + px(layout_.left) + "\" y=\"" + px(layout_.top) +
         "\" width=\"" + px(right - layout_.left) + "\" height=\"" + px(bottom - layout_.top) +
         "\"/>";
  // A tick within a millionth of the range of an end still counts as inside.
  const double x_slack = 1e-6 * (x_high_ - x_low_);
  const double y_slack = 1e-6 * (y_high_ - y_low_);
  std::string grid;
  std::string ticks;
  for (const double x : x_ticks_.values) {
    if (x < x_low_ - x_slack || x > x_high_ + x_slack) continue;
    const std::string pixel = px(pixelX(x));
    grid += "<line class=\"grid\" x1=\"" + pixel + "\" y1=\"" + px(layout_.top) + "\" x2=\"" +
            pixel + "\" y2=\"" + px(bottom) + "\"/>";
    ticks += "<text class=\"tick tick-x\" x=\"" + pixel + "\" y=\"" + px(bottom + 14.0) +
             "\" text-anchor=\"middle\">" + x_ticks_.label(x) + "</text>";
  }
  for (const double y : y_ticks_.values) {
    if (y < y_low_ - y_slack || y > y_high_ + y_slack) continue;
    const std::string pixel = px(pixelY(y));
    grid += "<line class=\"grid\" x1=\"" + px(layout_.left) + "\" y1=\"" + pixel + "\" x2=\"" +
            px(right) + "\" y2=\"" + pixel + "\"/>";
    ticks += "<text class=\"tick tick-y\" x=\"" + px(layout_.left - 6.0) + "\" y=\"" +
             px(pixelY(y) + 4.0) + "\" text-anchor=\"end\">" + y_ticks_.label(y) + "</text>";
  }
  out += grid;
  out += "<g clip-path=\"url(#" + id_ + "-area)\">" + marks_ + "</g>";
  out += "<rect class=\"plot-frame\" x=\"" + px(layout_.left) + "\" y=\"" + px(layout_.top) +
         "\" width=\"" + px(right - layout_.left) + "\" height=\"" + px(bottom - layout_.top) +
         "\"/>";
  out += ticks + labels_;
  if (!title_.empty()) {
    out += "<text class=\"plot-title\" x=\"" + px(layout_.left) + "\" y=\"" + px(14.0) + "\">" +
           escapeXml(title_) + "</text>";
  }
  if (!x_label_.empty()) {
    out += "<text class=\"axis-label\" x=\"" + px(right) + "\" y=\"" + px(layout_.height - 4.0) +
           "\" text-anchor=\"end\">" + escapeXml(x_label_) + "</text>";
  }
  if (!y_label_.empty()) {
    out += "<text class=\"axis-label\" x=\"" + px(right) + "\" y=\"" + px(14.0) +
           "\" text-anchor=\"end\">" + escapeXml(y_label_) + "</text>";
  }
  return out + "</svg>";
}

std::string escapeXml(const std::string& text) {
  std::string out;
  out.reserve(text.size());
  for (const char c : text) {
    switch (c) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '"': out += "&quot;"; break;
      default: out += c;
    }
  }
  return out;
}

}  // namespace tw::postproc
