#pragma once

#include <Eigen/Core>

namespace tw::collision {

/// Outcome of a state check, worst first.
enum class StateStatus {
  /// Every checked pair at least its margin apart (the cell margin for a
  /// pair with a cell body, the self margin for arm and tool among
  /// themselves).
  kFree,
  /// Some pair nearer than its margin, and no contact found between them:
  /// none at all with StateQuery::tell_contact, else none among the parts
  /// looked at before the check stopped.
  kWithinMargin,
  /// Some pair touches, overlaps, or one body is inside another.
  kInCollision,
};

const char* toString(StateStatus status);

/// Options of CollisionWorld::checkState, set by field name.
struct StateQuery {
  /// Settle whether the offending pair is in contact or only nearer than the
  /// margin: one more collision query on that pair (several µs for meshes in
  /// deep overlap, most of a check's cost). Validity does not depend on it.
  bool tell_contact = false;
};

/// Result of CollisionWorld::checkState. The pair is the first offending
/// pair found (body indices into CollisionWorld::bodyName), -1 when free.
struct StateResult {
  StateStatus status = StateStatus::kFree;
  int body_a = -1;
  int body_b = -1;

  bool valid() const { return status == StateStatus::kFree; }
};

/// Which checked pairs a clearance query measures.
enum class PairGroup {
  kAll,   ///< every checked pair
  kCell,  ///< an arm link or the tool against a cell body (fixture, workpiece, obstacle)
  kSelf,  ///< arm links and the tool among themselves
};

/// Options of CollisionWorld::clearance, set by field name.
struct ClearanceQuery {
  /// How far [m] the reported distance may lie above the true minimum
  /// between meshes (primitives are exact). 0 asks for the exact minimum,
  /// which between finely meshed near-parallel surfaces costs milliseconds.
  double tolerance = 1e-4;
  /// The pairs measured: the clearance to the cell is what a programmer
  /// reviews, the self distance is a property of the arm and its tool.
  PairGroup pairs = PairGroup::kAll;
};

/// Result of CollisionWorld::clearance: the closest checked pair of the
/// queried group (ClearanceQuery::pairs). Distance
/// [m] is 0 when bodies touch, overlap or contain one another (FCL gives no
/// depth for meshes). Witness points in the world frame, one on each body
/// (equal when in contact); in a pair with a cell body, body_a is the arm
/// link or tool and body_b the cell body. body_a is -1 when the group holds no checked
/// pair at all (distance is then +infinity).
struct Clearance {
  double distance = 0.0;
  int body_a = -1;
  int body_b = -1;
  Eigen::Vector3d p_WA = Eigen::Vector3d::Zero();
  Eigen::Vector3d p_WB = Eigen::Vector3d::Zero();
};

/// Result of CollisionWorld::checkSegment.
struct SegmentResult {
  /// The first invalid state found (not necessarily the one nearest the
  /// start: states are visited by bisection), or kFree.
  StateResult state;
  /// Where along the segment that state is, 0 at the start, 1 at the end;
  /// -1 when the segment is valid.
  double fraction = -1.0;
  /// How many states were checked.
  int states_checked = 0;

  bool valid() const { return state.valid(); }
};

}  // namespace tw::collision
