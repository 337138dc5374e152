#pragma once

#include <optional>
#include <variant>

#include "kinematics/common/angles.hpp"

namespace tw::planner {

/// What a seam does. Each kind has its own parameters below.
enum class ProcessKind { kWeld, kPaint, kDispense };

const char* toString(ProcessKind kind);

/// Which way a welding torch leans along the seam: push (forehand) leans
/// the wire towards the travel direction, drag (backhand) away from it
/// [domain-facts §1, from memory, AWS A3.0 terminology].
enum class TravelTilt { kPush, kDrag };

const char* toString(TravelTilt tilt);

/// Arc welding geometry. Angles [rad], lengths [m].
struct WeldParameters {
  /// Angle between the torch axis and the first face (the surface of the
  /// first normal), measured in the plane perpendicular to the seam.
  /// nullopt: the bisector of the two faces of a fillet (45° for a T-joint,
  /// domain-facts §1, Goodheart-Willcox §8.11.2), or 90° (square to the
  /// surface) when the seam has a single normal.
  std::optional<double> work_angle;
  /// Lean along the seam, ≥ 0. 10°: the middle of the 5–15° "ideal" range
  /// of power-source manuals (domain-facts §1, secondary source).
  double travel_angle = 10.0 * kPi / 180.0;
  /// Push by default: common practice, no source (either is used).
  TravelTilt tilt = TravelTilt::kPush;
  /// Contact-tip-to-work distance: the contact tip stays this far back from
  /// the TCP (the wire end, on the seam) along the torch axis; the wire
  /// stick-out between them may touch the part. 15 mm: short-circuit
  /// transfer, domain-facts §1 (common practice, no source).
  double contact_tip_distance = 0.015;
};

/// A paint stroke along a seam: gun along the negative surface normal.
struct PaintParameters {
  /// Gun-to-surface distance [m]: the gun tip is this far back from the TCP
  /// (its aim point on the surface). 200 mm: NAVAIR 01-1A-509-2 §
  /// (150–250 mm, domain-facts §2).
  double stand_off = 0.200;
};

/// Dispensing or sealing a bead: nozzle normal to the surface (the bisector
/// of the two faces of a fillet) at a stand-off.
struct DispenseParameters {
  /// Nozzle-to-surface distance [m], > 0: the nozzle tip is this far back
  /// from the TCP (the bead's foot on the surface). No default: it depends on
  /// the bead and nozzle, so the job must say it.
  double stand_off = 0.0;
};

using ProcessParameters = std::variant<WeldParameters, PaintParameters, DispenseParameters>;

ProcessKind kindOf(const ProcessParameters& parameters);

/// Length [m] of the tool part that may touch the workpiece, from the TCP
/// back along the tool axis: a weld's contact-tip distance (the wire
/// stick-out), a bead's stand-off; nullopt for paint (nothing may touch).
std::optional<double> contactLength(const ProcessParameters& parameters);

}  // namespace tw::planner
