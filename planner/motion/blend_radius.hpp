#pragma once

#include <Eigen/Core>

#include <vector>

#include "planner/motion/compact_move.hpp"

namespace tw::planner {

/// Largest blend radius r [m] for the corner between two consecutive moves:
/// r ≤ max_radius, r ≤ half of each adjacent move's length (so neighbouring
/// blends on one move never overlap), and the rounded path stays within
/// `position_tolerance` [m] of the corner.
///
/// Model: the controller replaces the corner by a circular fillet tangent to
/// both legs, starting at distance r from the corner along each leg. With the
/// turning angle α between the leg directions (0 = straight on), that fillet
/// passes the corner at a distance
///
///     δ = r · tan(α/4)                                    (derived here)
///
/// Derivation: the fillet's centre lies on the bisector of the interior
/// angle β = π − α; tangency at distance r from the corner gives its radius
/// ρ = r·tan(β/2) = r·cot(α/2) and its centre's distance from the corner
/// r / cos(β/2) = r / sin(α/2). The fillet's point nearest the corner is on
/// the bisector, so δ = r/sin(α/2) − r·cos(α/2)/sin(α/2)
///   = r·(1 − cos(α/2))/sin(α/2) = r·tan(α/4).
/// δ is the distance to the corner point; the distance to the legs is
/// smaller (δ·cos(α/2)), so the bound is conservative for the path.
/// Hence r = position_tolerance / tan(α/4); a straight continuation (α = 0)
/// allows max_radius, a reversal (α = π) allows r = position_tolerance.
///
/// The blend deviation adds to the compaction's own deviation; pass the part
/// of the path tolerance you allot to blends. For a circular move pass its
/// tangent at the shared end (moveEndTangents). Process on/off points and
/// other must-keep points need r = 0: that is the caller's decision, this
/// function does not know them.
///
/// Directions need not be unit length. Throws std::invalid_argument for a
/// zero or non-finite direction, a non-positive or non-finite length, or a
/// negative or non-finite tolerance or max_radius.
double blendRadius(const Eigen::Vector3d& incoming_dir, const Eigen::Vector3d& outgoing_dir,
                   double incoming_length, double outgoing_length, double position_tolerance,
                   double max_radius = 2e-3);

/// blendRadius at each interior boundary of a chain of moves (moves[k].end ==
/// moves[k+1].start), using the moves' lengths and end tangents; element k
/// belongs to the boundary between moves k and k+1. Must-keep points are not
/// zeroed here (see above). Throws std::invalid_argument for a broken chain.
std::vector<double> boundaryBlendRadii(const std::vector<Eigen::Isometry3d>& poses,
                                       const std::vector<CompactMove>& moves,
                                       double position_tolerance, double max_radius = 2e-3);

}  // namespace tw::planner
