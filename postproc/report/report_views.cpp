#include "postproc/report/report_views.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "postproc/file_quantities.hpp"
#include "postproc/report/svg_plot.hpp"

namespace tw::postproc {
namespace {

struct ViewAxes {
  const char* name;
  const char* title;
  int horizontal;  ///< coordinate index to the right
  int vertical;    ///< coordinate index upwards
  int depth;       ///< coordinate index towards the viewer
  double toward;   ///< +1 when the viewer sits on the + side of `depth`
};

constexpr ViewAxes kViews[] = {
    {"top", "top, from +z", 0, 1, 2, 1.0},
    {"front", "front, from −y", 0, 2, 1, -1.0},
    {"side", "side, from +x", 1, 2, 0, 1.0},
};

constexpr const char* kAxisNames[] = {"x", "y", "z"};

/// A projected triangle, with its distance towards the viewer for ordering.
struct FlatTriangle {
  std::vector<PlotPoint> corners;
  double nearness = 0.0;
  std::size_t body = 0;
};

/// Bounding box in the view plane, in output units.
struct Box {
  double x_low = std::numeric_limits<double>::infinity();
  double x_high = -std::numeric_limits<double>::infinity();
  double y_low = std::numeric_limits<double>::infinity();
  double y_high = -std::numeric_limits<double>::infinity();

  void offer(PlotPoint point) {
    x_low = std::min(x_low, point.x);
    x_high = std::max(x_high, point.x);
    y_low = std::min(y_low, point.y);
    y_high = std::max(y_high, point.y);
  }
};

std::string pathClass(const TimelineMotion& entry) {
  if (entry.process_on) return "path-process";
  return entry.motion->seam.empty() ? "path-air" : "path-seam";
}

std::string oneView(const ViewAxes& axes, const std::vector<TimelineMotion>& timeline,
                    const ReportCell& cell, const QuantityFormat& length) {
  auto flat = [&](const Eigen::Vector3d& p_C) {
    return PlotPoint{p_C[axes.horizontal] * length.scale, p_C[axes.vertical] * length.scale};
  };
  Box box;
  std::vector<FlatTriangle> triangles;
  for (std::size_t b = 0; b < cell.bodies.size(); ++b) {
    for (const auto& triangle : cell.bodies[b].triangles_C) {
      FlatTriangle projected;
      projected.body = b;
      for (const Eigen::Vector3d& corner : triangle) {
        projected.corners.push_back(flat(corner));
        projected.nearness += axes.toward * corner[axes.depth] / 3.0;
      }
      const PlotPoint& a = projected.corners[0];
      const PlotPoint& p = projected.corners[1];
      const PlotPoint& c = projected.corners[2];
      // Triangles seen edge-on cover nothing; 1e-9 of a squared unit is far
      // below anything visible.
      if (std::abs((p.x - a.x) * (c.y - a.y) - (p.y - a.y) * (c.x - a.x)) < 1e-9) continue;
      for (const PlotPoint& corner : projected.corners) box.offer(corner);
      triangles.push_back(projected);
    }
  }
  std::stable_sort(triangles.begin(), triangles.end(),
                   [](const FlatTriangle& a, const FlatTriangle& b) { return a.nearness < b.nearness; });
  std::vector<PlotPoint> path;
  for (const TimelineMotion& entry : timeline) {
    path.push_back(flat(entry.p_CT));
    box.offer(path.back());
    for (const Eigen::Vector3d& p_C : entry.arc_C) box.offer(flat(p_C));
  }
  std::optional<PlotPoint> base;
  if (cell.X_CB) {
    base = flat(cell.X_CB->translation());
    box.offer(*base);
  }
  if (box.x_low > box.x_high) box.offer({0.0, 0.0});  // nothing to draw: an empty view at the origin
  // A margin of 8 % on every side keeps labels and markers off the frame.
  const double pad = 0.08 * std::max({box.x_high - box.x_low, box.y_high - box.y_low, 1.0});
  PlotLayout layout;
  layout.width = 420.0;
  layout.height = 360.0;
  layout.left = 58.0;
  SvgPlot plot = SvgPlot::equalAspect(layout, box.x_low - pad, box.x_high + pad, box.y_low - pad,
                                      box.y_high + pad, std::string("view-") + axes.name,
                                      std::string("class=\"view\" data-view=\"") + axes.name + '"');
  plot.title(axes.title);
  plot.axisLabels(std::string(kAxisNames[axes.horizontal]) + " [" + length.unit + "]",
                  std::string(kAxisNames[axes.vertical]) + " [" + length.unit + "] ↑");
  for (const FlatTriangle& triangle : triangles) {
    plot.polygon(triangle.corners, "body body-" + std::to_string(triangle.body % 4));
  }
  for (std::size_t b = 0; b < cell.bodies.size(); ++b) {
    if (cell.bodies[b].name.empty()) continue;
    Box body_box;
    for (const FlatTriangle& triangle : triangles) {
      if (triangle.body != b) continue;
      for (const PlotPoint& corner : triangle.corners) body_box.offer(corner);
    }
    // Inside the top-left corner, when the body is large enough on screen
    // for its name (about 6 px per character at 10 px); the legend names
    // every body anyway.
    const double width_px = (body_box.x_high - body_box.x_low) * plot.pixelsPerUnitX();
    const double height_px = (body_box.y_high - body_box.y_low) * plot.pixelsPerUnitX();
    if (width_px < 6.0 * cell.bodies[b].name.size() + 8.0 || height_px < 14.0) continue;
    plot.text({body_box.x_low, body_box.y_high}, 4.0, 11.0, cell.bodies[b].name, "body-label");
  }
  if (base) {
    plot.dot(*base, 7.0, "base-mark");
    plot.dot(*base, 2.5, "base-centre");
    plot.text(*base, 10.0, 16.0, "arm base", "base-label");
  }
  for (std::size_t i = 1; i < timeline.size(); ++i) {
    if (timeline[i].arc_C.empty()) {
      plot.polyline({path[i - 1], path[i]}, pathClass(timeline[i]));
      continue;
    }
    std::vector<PlotPoint> arc;
    for (const Eigen::Vector3d& p_C : timeline[i].arc_C) arc.push_back(flat(p_C));
    plot.polyline(arc, pathClass(timeline[i]));
  }
  if (!path.empty()) {
    plot.dot(path.front(), 3.5, "path-start");
    plot.text(path.front(), 6.0, -6.0, "first target", "path-label");
  }
  std::vector<std::string> labelled;
  for (std::size_t i = 0; i < timeline.size(); ++i) {
    const std::string& seam = timeline[i].motion->seam;
    if (seam.empty() || std::find(labelled.begin(), labelled.end(), seam) != labelled.end()) continue;
    labelled.push_back(seam);
    plot.dot(path[i], 3.0, "seam-dot");
    // Alternate sides so that seams starting close together stay readable.
    const bool left = labelled.size() % 2 == 0;
    plot.text(path[i], left ? -6.0 : 6.0, left ? -6.0 : 14.0, seam,
              left ? "seam-label seam-label-left" : "seam-label");
  }
  return "<figure class=\"view-figure\">" + plot.svg() + "</figure>";
}

}  // namespace

std::string orthographicViews(const planner::Program& program,
                              const std::vector<TimelineMotion>& timeline,
                              const ReportCell& cell) {
  const QuantityFormat length = fileQuantities(program.metadata.units).length;
  std::string out;
  for (const ViewAxes& axes : kViews) out += oneView(axes, timeline, cell, length);
  return out;
}

}  // namespace tw::postproc
