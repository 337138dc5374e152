#pragma once

#include <fcl/broadphase/broadphase_dynamic_AABB_tree.h>

#include <memory>
#include <string>
#include <utility>
#include <vector>

#include "collision/collision_workspace.hpp"
#include "collision/margin_object.hpp"
#include "collision/query_results.hpp"
#include "collision/world_description.hpp"
#include "kinematics/arm_model.hpp"

namespace tw::collision {

namespace detail {
struct WorldModel;
}

/// The collision world of one cell: the arm's link bodies (from the arm
/// description's link geometry), the tool on the flange, and the cell's
/// obstacles and workpieces in the world or on fixture frames.
///
/// Built once (meshes loaded, bounding-volume trees built) and then
/// immutable: every query is const and thread-safe, with its scratch in a
/// caller-owned CollisionWorkspace (one per thread). Lengths [m], angles
/// [rad], poses in the world frame W.
///
/// Which pairs are checked:
/// - arm links against each other, except neighbours along the chain (the
///   base and the first link are neighbours; a link without geometry is
///   skipped, so the links on either side of it become neighbours);
/// - the tool against every link but the last one with geometry, which
///   carries it;
/// - arm links and the tool against every cell body, except the arm base
///   (it does not move, so a conflict of the base with the cell is a matter
///   of the cell layout, not of any state); against a workpiece a tool with
///   a ToolDescription::tip_contact counts only outside the capsule of that
///   contact (the wire stick-out or bead with its allowance), so the wire
///   may work at the seam while the rest of the tool, and every link, keep
///   the margin (the capsule is cut from the tool mesh conservatively: up to
///   an eighth of its radius less is exempt); a tool without one counts
///   whole;
/// - never cell bodies against each other (they do not move relative to
///   each other during a program), nor any pair in
///   WorldDescription::allowed_pairs.
///
/// A state is valid when every checked pair is at least its margin apart:
/// a pair with a cell body the cell margin (WorldDescription::
/// clearance_margin), a pair of links or of the tool and a link the self
/// margin (WorldDescription::self_margin). The cell margin stands for what
/// is uncertain about the cell; the arm's own geometry is known, so raising
/// the cell margin for a cautious job does not make the wrist collide with
/// its own tool. Touching counts as collision. Meshes are surfaces: a body wholly
/// inside a closed mesh is caught by a containment test; inside an open one
/// it is not.
class CollisionWorld {
 public:
  /// Loads meshes and builds the world. Throws tw::InputError for a mesh
  /// problem (see loadMesh), a duplicate or empty body name, an unknown
  /// fixture, an unknown name in allowed_pairs, a non-positive or
  /// non-finite margin (cell or self) or tip allowance, a negative or
  /// non-finite tip contact length, or a primitive with
  /// non-positive size.
  CollisionWorld(const kinematics::ArmModel& arm, const WorldDescription& description);
  CollisionWorld(CollisionWorld&&) noexcept;
  CollisionWorld& operator=(CollisionWorld&&) noexcept;
  ~CollisionWorld();

  /// The same world with one fixture frame moved (geometry is shared, not
  /// rebuilt; workspaces of this world work with the copy). Throws
  /// tw::InputError for an unknown fixture name.
  CollisionWorld withFixturePose(const std::string& fixture, const Eigen::Isometry3d& X_WX) const;

  const kinematics::ArmModel& arm() const;
  /// The cell margin [m]: for pairs with a cell body.
  double clearanceMargin() const;
  /// The self margin [m]: for arm links and the tool among themselves.
  double selfMargin() const;
  int bodyCount() const;
  /// Name of body `index` (as in StateResult and Clearance); "" for -1.
  const std::string& bodyName(int index) const;
  /// Things worth telling the user that are not errors, e.g. degenerate
  /// triangles dropped from a mesh file. In a stable order.
  const std::vector<std::string>& notes() const;

  /// Pairs (arm base body, cell body) nearer than the cell margin: the
  /// base is never checked per state (it does not move), so a cell layout
  /// that puts something into the arm's foot shows here. In body order.
  std::vector<std::pair<int, int>> baseConflicts() const;

  /// Is the joint vector q (one value per arm joint, not checked against
  /// limits) free of collision, every checked pair at least its margin
  /// apart? Stops at the first offending pair. No allocation.
  StateResult checkState(const kinematics::JointVector& q, CollisionWorkspace& workspace,
                         const StateQuery& query = {}) const;

  /// The closest checked pair at q of the group ClearanceQuery::pairs (all,
  /// those with a cell body, or arm and tool among themselves) with its
  /// distance and witness points, within ClearanceQuery::tolerance of the
  /// true minimum (never below it). Margins play no part. Costs many state
  /// checks: meant for reporting, not for validity.
  Clearance clearance(const kinematics::JointVector& q, CollisionWorkspace& workspace,
                      const ClearanceQuery& query = {}) const;

  /// Is the straight joint-space segment from q_start to q_end valid? States
  /// along it (both ends included) are checked so densely that between two
  /// neighbours no body moves, relative to any body it is checked against,
  /// as far as that pair's margin. The motion bound is that of Schwarzer,
  /// Saha and Latombe, "Adaptive dynamic collision checking for single and
  /// multiple articulated robots in complex environments", IEEE T-RO 21(3),
  /// 2005 (from memory): the sum over joints of |Δq_j| times the farthest
  /// reach of the body from joint j's axis. A pair's distance changes by no
  /// more than one body moves relative to the other: against the cell that
  /// is motionBound, between two links or a link and the tool the motion
  /// through the joints between them, selfMotionBound. The step count is
  /// set by whichever of bound ÷ margin is larger, so every state of a valid
  /// segment keeps at least half of each pair's margin and no body, however
  /// thin, is stepped over.
  SegmentResult checkSegment(const kinematics::JointVector& q_start,
                             const kinematics::JointVector& q_end,
                             CollisionWorkspace& workspace) const;

  /// Diagnostics for profiling: poses the arm and runs only the broad phase
  /// of checkState, returning how many checked pairs reach the narrow phase
  /// (boxes grown by their pair's margin overlap).
  int countCandidatePairs(const kinematics::JointVector& q, CollisionWorkspace& workspace) const;

  /// An upper bound [m] on how far any point of the arm and tool moves along
  /// the straight segment from q_start to q_end.
  double motionBound(const kinematics::JointVector& q_start,
                     const kinematics::JointVector& q_end) const;

  /// An upper bound [m] on how far any arm or tool body moves, along the
  /// same segment, relative to a body it is checked against on an earlier
  /// link (only the joints between the two count); 0 without such pairs.
  double selfMotionBound(const kinematics::JointVector& q_start,
                         const kinematics::JointVector& q_end) const;

 private:
  friend class CollisionWorkspace;

  explicit CollisionWorld(std::shared_ptr<const detail::WorldModel> model,
                          std::vector<Eigen::Isometry3d> fixture_poses);
  void placeCellObjects();
  void poseArm(const kinematics::JointVector& q, CollisionWorkspace& workspace) const;
  void checkWorkspace(const CollisionWorkspace& workspace) const;

  std::shared_ptr<const detail::WorldModel> model_;
  std::vector<Eigen::Isometry3d> fixture_poses_;
  std::vector<std::unique_ptr<MarginObject>> cell_objects_;
  std::unique_ptr<fcl::DynamicAABBTreeCollisionManagerd> cell_manager_;
};

}  // namespace tw::collision
