#pragma once

#include <Eigen/Geometry>
#include <optional>
#include <string>

#include "planner/program/program.hpp"

namespace tw::planner {

/// Smallest distance [m] between any two of a circular move's start, via
/// and target, and smallest distance of any one of them from the line
/// through the other two. 20 times the rounding of a position written at
/// 0.001 mm (±0.0005 mm), so that the points read back from a file define
/// the same circle; a flatter "arc" is a straight line to any controller.
constexpr double kArcPointSeparation = 1e-5;

/// Allowance [m] in the rule "blend of one target + blend of the next ≤
/// distance between them": two blends and two positions each rounded to
/// ±0.0005 mm when written add up to at most about 0.0027 mm.
constexpr double kBlendOverlapSlack = 5e-6;

/// The arc a circular move follows: from its start through its via point to
/// its target, on the one circle through the three. Positions in the
/// record's reference frame R [m]. Immutable value.
class CircularArc {
 public:
  /// The arc through the three points, or nullopt when arcPointProblem()
  /// finds a problem with them.
  static std::optional<CircularArc> through(const Eigen::Vector3d& p_start,
                                            const Eigen::Vector3d& p_via,
                                            const Eigen::Vector3d& p_end);

  const Eigen::Vector3d& centre() const { return centre_; }
  double radius() const { return radius_; }
  /// Unit normal of the circle's plane; the arc turns positively (right-hand
  /// rule) about it from start to via to target.
  const Eigen::Vector3d& normal() const { return normal_; }
  /// Angle swept from start to target [rad], in (0, 2π).
  double sweep() const { return sweep_; }
  /// Angle swept from start to via [rad], in (0, sweep()).
  double viaSweep() const { return via_sweep_; }
  /// Arc length from start to target [m].
  double length() const { return radius_ * sweep_; }
  /// Point at `fraction` of the arc length from the start, `fraction` in
  /// [0, 1]; throws std::invalid_argument outside.
  Eigen::Vector3d position(double fraction) const;

 private:
  Eigen::Vector3d centre_ = Eigen::Vector3d::Zero();
  Eigen::Vector3d start_radial_ = Eigen::Vector3d::UnitX();  ///< start − centre
  Eigen::Vector3d normal_ = Eigen::Vector3d::UnitZ();
  double radius_ = 0.0;
  double sweep_ = 0.0;
  double via_sweep_ = 0.0;
};

/// Why three points define no arc (two closer than kArcPointSeparation, or
/// all three within it of one line), or nullopt when they define one.
std::optional<std::string> arcPointProblem(const Eigen::Vector3d& p_start,
                                           const Eigen::Vector3d& p_via,
                                           const Eigen::Vector3d& p_end);

/// TCP path length [m] of a linear or circular move starting at `p_RS` (the
/// previous motion's target position, in the same frame R). Throws
/// std::invalid_argument for a joint move (its TCP path depends on the arm)
/// and for a circular move without a via point or whose points define no arc.
double pathLength(const Eigen::Vector3d& p_RS, const MotionRecord& motion);

/// The TCP pose a controller commands at `fraction` in [0, 1] of the path
/// length of a linear or circular move starting at `X_RS` (the previous
/// motion's target, same frame R): the position on the straight line or on
/// the arc, the orientation slerped (shorter way) from X_RS to the target
/// by the same fraction. Blends are not applied. Preconditions as
/// pathLength(), and `fraction` in [0, 1]; std::invalid_argument otherwise.
Eigen::Isometry3d interpolatedPose(const Eigen::Isometry3d& X_RS, const MotionRecord& motion,
                                   double fraction);

/// When circular move `motion`, starting at `p_RS` (the previous target),
/// passes its via point [s from the program start], at a uniform speed along
/// its arc: start_time + duration · viaSweep / sweep. An estimate for tables
/// and plots (the real speed ramps). Preconditions as pathLength() for a
/// circular move; std::invalid_argument for any other kind.
double viaPassingTime(const Eigen::Vector3d& p_RS, const MotionRecord& motion);

/// Largest distance [m] between a programmed corner and the circular fillet
/// that rounds it with blend radius `blend_radius` [m] ≥ 0 between two
/// straight legs whose directions of travel turn by `deflection` [rad] in
/// [0, π): blend_radius · tan(deflection / 4) (derived in
/// postproc/FORMAT.md, "Blends"). std::invalid_argument outside the ranges.
double blendCornerDeviation(double blend_radius, double deflection);

}  // namespace tw::planner
