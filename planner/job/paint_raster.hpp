#pragma once

#include <Eigen/Geometry>
#include <vector>

#include "planner/job/paint_patch.hpp"

namespace tw::planner {

/// Spray geometry of a raster. Lengths [m].
struct RasterParameters {
  /// Gun-to-surface distance. 200 mm: NAVAIR 01-1A-509-2 §A-8.2 (150–250 mm).
  double stand_off = 0.200;
  /// Width of the spray fan on the surface, > 0 (see fanWidth()).
  double spray_width = 0.0;
  /// Fraction of a pass covered again by the next one, 0 ≤ overlap < 1.
  /// 0.5: the general rule, NAVAIR 01-1A-509-2 §A-8.3 (domain-facts §2).
  double overlap = 0.5;
  /// How far each pass runs on beyond the outline at both ends (see defaultLead()).
  double lead = 0.0;
};

/// Fan width on the surface for a cone half-angle [rad] at a stand-off [m]:
/// w = 2·h·tan(φ) [domain-facts §2, computed].
double fanWidth(double stand_off, double half_angle);

/// Lead beyond the edge so that the gun crosses it at constant speed and the
/// turnaround happens off the part: half the fan width plus the distance to
/// reach `speed` [m/s] at `acceleration` [m/s²], v²/(2a) [domain-facts §2,
/// computed + from memory].
double defaultLead(double spray_width, double speed, double acceleration);

/// One straight pass of the gun's aim point across the patch, on its plane.
struct RasterPass {
  double offset = 0.0;  ///< position across the passes (along v) from the first corner [m]
  Eigen::Vector3d start = Eigen::Vector3d::Zero();       ///< lead-in start, off the part
  Eigen::Vector3d edge_in = Eigen::Vector3d::Zero();     ///< where the fan reaches the part
  Eigen::Vector3d edge_out = Eigen::Vector3d::Zero();    ///< where it leaves it
  Eigen::Vector3d end = Eigen::Vector3d::Zero();         ///< lead-out end, off the part
  Eigen::Vector3d direction = Eigen::Vector3d::UnitX();  ///< unit, alternates (zig-zag)
};

/// A zig-zag raster over a planar patch (points on the patch plane, frame X).
///
/// Passes run along the pass direction u, stepping across by exactly
/// spacing = spray_width·(1 − overlap) along v = normal × u. Their count is
/// the smallest that puts the outermost pass lines at or beyond both edges,
/// ceil(H / spacing) + 1 for a patch H wide across, centred on the patch, so
/// every point of the patch lies between two pass lines. Each pass covers
/// the outline's extent inside its fan band (|v − offset| ≤ spray_width/2),
/// plus `lead` at both ends; the first runs along +u, the next along −u, ...
///
/// Preconditions (checked, std::invalid_argument): paintPatchProblem() is
/// nullopt, spray_width > 0, 0 ≤ overlap < 1, lead ≥ 0.
/// A pure function, safe to call from several threads.
std::vector<RasterPass> paintRaster(const PaintPatch& patch, const RasterParameters& raster);

}  // namespace tw::planner
