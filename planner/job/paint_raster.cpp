#include "planner/job/paint_raster.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>

namespace tw::planner {
namespace {

/// Keeps the part of a closed polygon (2-D, u and v) with side·(v − limit) ≥ 0
/// (Sutherland–Hodgman against one line).
std::vector<Eigen::Vector2d> clipped(const std::vector<Eigen::Vector2d>& polygon, double limit,
                                     double side) {
  std::vector<Eigen::Vector2d> kept;
  for (std::size_t i = 0; i < polygon.size(); ++i) {
    const Eigen::Vector2d& a = polygon[i];
    const Eigen::Vector2d& b = polygon[(i + 1) % polygon.size()];
    const double da = side * (a.y() - limit);
    const double db = side * (b.y() - limit);
    if (da >= 0.0) kept.push_back(a);
    if ((da >= 0.0) != (db >= 0.0)) {
      const Eigen::Vector2d crossing = a + (da / (da - db)) * (b - a);
      kept.push_back(crossing);
    }
  }
  return kept;
}

}  // namespace

double fanWidth(double stand_off, double half_angle) {
  return 2.0 * stand_off * std::tan(half_angle);
}

double defaultLead(double spray_width, double speed, double acceleration) {
  return 0.5 * spray_width + speed * speed / (2.0 * acceleration);
}

std::vector<RasterPass> paintRaster(const PaintPatch& patch, const RasterParameters& raster) {
  if (paintPatchProblem(patch)) throw std::invalid_argument("paintRaster: invalid patch");
  if (!(raster.spray_width > 0.0) || !(raster.overlap >= 0.0 && raster.overlap < 1.0) ||
      !(raster.lead >= 0.0)) {
    throw std::invalid_argument("paintRaster: spray width, overlap or lead out of range");
  }
  const Eigen::Vector3d& n = patch.normal;
  const Eigen::Vector3d u = (patch.pass_direction - patch.pass_direction.dot(n) * n).normalized();
  const Eigen::Vector3d v = n.cross(u);
  const Eigen::Vector3d origin = patch.outline.front();

  std::vector<Eigen::Vector2d> outline;
  double v_min = std::numeric_limits<double>::infinity();
  double v_max = -v_min;
  for (const Eigen::Vector3d& corner : patch.outline) {
    outline.emplace_back((corner - origin).dot(u), (corner - origin).dot(v));
    v_min = std::min(v_min, outline.back().y());
    v_max = std::max(v_max, outline.back().y());
  }

  const double spacing = raster.spray_width * (1.0 - raster.overlap);
  // The 1e-9 keeps a patch an exact multiple of the spacing from getting an extra pass.
  const int count = static_cast<int>(std::ceil((v_max - v_min) / spacing - 1e-9)) + 1;
  const double middle = 0.5 * (v_min + v_max);
  const double half_width = 0.5 * raster.spray_width;

  std::vector<RasterPass> passes;
  for (int k = 0; k < count; ++k) {
    const double offset = middle + (k - 0.5 * (count - 1)) * spacing;
    const std::vector<Eigen::Vector2d> band =
        clipped(clipped(outline, offset - half_width, 1.0), offset + half_width, -1.0);
    // Outermost lines sit less than half a spacing (≤ half a fan width)
    // beyond the edge, so their band always meets the patch.
    double u_min = std::numeric_limits<double>::infinity();
    double u_max = -u_min;
    for (const Eigen::Vector2d& point : band) {
      u_min = std::min(u_min, point.x());
      u_max = std::max(u_max, point.x());
    }
    if (band.empty()) throw std::logic_error("paintRaster: a pass band missed the patch");
    const double sign = k % 2 == 0 ? 1.0 : -1.0;
    const double enter = sign > 0 ? u_min : u_max;
    const double leave = sign > 0 ? u_max : u_min;
    const auto on_plane = [&](double along) -> Eigen::Vector3d {
      return origin + along * u + offset * v;
    };
    RasterPass pass;
    pass.offset = offset;
    pass.direction = sign * u;
    pass.start = on_plane(enter - sign * raster.lead);
    pass.edge_in = on_plane(enter);
    pass.edge_out = on_plane(leave);
    pass.end = on_plane(leave + sign * raster.lead);
    passes.push_back(pass);
  }
  return passes;
}

}  // namespace tw::planner
