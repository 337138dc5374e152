#include "collision/collision_world.hpp"

#include <algorithm>
#include <cmath>
#include <fcl/narrowphase/collision.h>
#include <fcl/narrowphase/distance.h>
#include <limits>
#include <stdexcept>

#include "collision/proximity.hpp"
#include "collision/world_model.hpp"
#include "kinematics/common/input_error.hpp"

namespace tw::collision {
namespace {

using detail::Piece;
using detail::PieceKind;
using detail::WorldModel;

const Piece& pieceOf(const fcl::CollisionObjectd* object) {
  return *static_cast<const Piece*>(object->getUserData());
}

/// Is piece `inner` (no surface contact with `outer` is known) wholly inside
/// the closed mesh of `outer`? Only possible when its box lies in outer's.
bool isInside(const fcl::CollisionObjectd& inner, const Piece& inner_piece,
              const fcl::CollisionObjectd& outer, const Piece& outer_piece) {
  if (!outer_piece.closed) return false;
  const fcl::AABBd& a = inner.getAABB();
  const fcl::AABBd& b = outer.getAABB();
  if ((a.min_.array() < b.min_.array()).any() || (a.max_.array() > b.max_.array()).any()) {
    return false;
  }
  const Eigen::Vector3d p_W = inner.getTransform() * inner_piece.p_S_probe;
  return insideClosedMesh(outer, outer.getTransform().inverse() * p_W);
}

bool eitherInside(const fcl::CollisionObjectd& a, const fcl::CollisionObjectd& b) {
  return isInside(a, pieceOf(&a), b, pieceOf(&b)) || isInside(b, pieceOf(&b), a, pieceOf(&a));
}

/// Narrow phase of a state check: nearer than the margin or not, and, when
/// asked, whether the offending pair is in contact.
StateStatus pairStatus(const fcl::CollisionObjectd& a, const fcl::CollisionObjectd& b,
                       double margin, bool tell_contact) {
  const std::optional<double> near = nearerThan(a, b, margin);
  if (!near) return eitherInside(a, b) ? StateStatus::kInCollision : StateStatus::kFree;
  if (*near <= 0.0) return StateStatus::kInCollision;
  if (!tell_contact) return StateStatus::kWithinMargin;
  fcl::CollisionRequestd request;
  fcl::CollisionResultd result;
  if (fcl::collide(&a, &b, request, result) > 0 || eitherInside(a, b)) {
    return StateStatus::kInCollision;
  }
  return StateStatus::kWithinMargin;
}

struct StateSearch {
  const WorldModel* model;
  bool tell_contact;
  /// The margin of the pairs the current manager query hands on: one query
  /// is arm and tool against the cell, the other among themselves.
  double margin;
  StateResult result;
};

bool stateCallback(fcl::CollisionObjectd* a, fcl::CollisionObjectd* b, void* data) {
  StateSearch& search = *static_cast<StateSearch*>(data);
  const Piece& piece_a = pieceOf(a);
  const Piece& piece_b = pieceOf(b);
  if (!search.model->checks(piece_a, piece_b)) return false;
  const StateStatus status = pairStatus(*a, *b, search.margin, search.tell_contact);
  if (status == StateStatus::kFree) return false;
  search.result = {status, piece_a.body, piece_b.body};
  return true;
}

struct PairCount {
  const WorldModel* model;
  int pairs = 0;
};

bool countCallback(fcl::CollisionObjectd* a, fcl::CollisionObjectd* b, void* data) {
  PairCount& count = *static_cast<PairCount*>(data);
  if (count.model->checks(pieceOf(a), pieceOf(b))) ++count.pairs;
  return false;
}

/// Measures one checked pair and keeps it when it is the closest so far.
/// Three steps, each cheap where the next is dear: the proximity walk drops
/// pairs no nearer than the best so far and otherwise yields an upper bound;
/// a collision query settles contact (FCL's distance query is slowest on
/// overlapping meshes, hunting for the one exact zero); the distance query,
/// started at the upper bound, measures the rest.
void measurePair(const fcl::CollisionObjectd& a, const fcl::CollisionObjectd& b,
                 double tolerance, Clearance& best) {
  const std::optional<double> near = nearerThan(a, b, best.distance);
  if (!near && !eitherInside(a, b)) return;
  fcl::CollisionRequestd contact_request;
  contact_request.enable_contact = true;
  fcl::CollisionResultd contact;
  if (fcl::collide(&a, &b, contact_request, contact) > 0) {
    best = {0.0, pieceOf(&a).body, pieceOf(&b).body, contact.getContact(0).pos,
            contact.getContact(0).pos};
    return;
  }
  if (eitherInside(a, b)) {
    const Eigen::Vector3d p_W = a.getTransform() * pieceOf(&a).p_S_probe;
    best = {0.0, pieceOf(&a).body, pieceOf(&b).body, p_W, p_W};
    return;
  }
  fcl::DistanceRequestd request;
  request.enable_nearest_points = true;
  // FCL then skips parts that could be nearer by less than the tolerance:
  // between finely meshed, nearly parallel surfaces the exact minimum costs
  // milliseconds, one within 0.1 mm a small part of that.
  request.abs_err = tolerance;
  fcl::DistanceResultd result;
  // Above the walk's find by more than the tolerance, so that FCL cannot
  // prune the path to that triangle pair (it only keeps strictly smaller
  // distances) while it prunes everything farther.
  result.min_distance = *near + tolerance + 1e-9 * (1.0 + *near);
  fcl::distance(&a, &b, request, result);
  if (result.o1 == nullptr) {
    // Nothing below the start was kept (rounding): measure exactly.
    request.abs_err = 0.0;
    result = fcl::DistanceResultd();
    fcl::distance(&a, &b, request, result);
  }
  if (result.min_distance >= best.distance) return;
  best = {std::max(result.min_distance, 0.0), pieceOf(&a).body, pieceOf(&b).body,
          result.nearest_points[0], result.nearest_points[1]};
}

}  // namespace

CollisionWorld::CollisionWorld(const kinematics::ArmModel& arm,
                               const WorldDescription& description)
    : model_(detail::buildWorldModel(arm, description)) {
  for (const FixtureFrame& fixture : description.fixtures) fixture_poses_.push_back(fixture.X_WX);
  placeCellObjects();
}

CollisionWorld::CollisionWorld(std::shared_ptr<const WorldModel> model,
                               std::vector<Eigen::Isometry3d> fixture_poses)
    : model_(std::move(model)), fixture_poses_(std::move(fixture_poses)) {
  placeCellObjects();
}

CollisionWorld::CollisionWorld(CollisionWorld&&) noexcept = default;
CollisionWorld& CollisionWorld::operator=(CollisionWorld&&) noexcept = default;
CollisionWorld::~CollisionWorld() = default;

void CollisionWorld::placeCellObjects() {
  cell_objects_.clear();
  cell_manager_ = std::make_unique<fcl::DynamicAABBTreeCollisionManagerd>();
  std::vector<fcl::CollisionObjectd*> objects;
  for (const Piece& piece : model_->cell) {
    const Eigen::Isometry3d X_WP =
        piece.frame < 0 ? Eigen::Isometry3d::Identity() : fixture_poses_[piece.frame];
    auto object = std::make_unique<MarginObject>(piece.geometry, model_->cell_growth);
    object->setTransform(X_WP * piece.X_PS);
    object->updateBounds();
    // FCL hands user data back as void*; the piece is never written through it.
    object->setUserData(const_cast<Piece*>(&piece));
    objects.push_back(object.get());
    cell_objects_.push_back(std::move(object));
  }
  cell_manager_->registerObjects(objects);
  cell_manager_->setup();
}

CollisionWorld CollisionWorld::withFixturePose(const std::string& fixture,
                                               const Eigen::Isometry3d& X_WX) const {
  const std::vector<std::string>& names = model_->fixture_names;
  const auto found = std::find(names.begin(), names.end(), fixture);
  if (found == names.end()) {
    throw InputError("collision world: no fixture frame named \"" + fixture + "\"");
  }
  std::vector<Eigen::Isometry3d> poses = fixture_poses_;
  poses[found - names.begin()] = X_WX;
  return CollisionWorld(model_, std::move(poses));
}

const kinematics::ArmModel& CollisionWorld::arm() const { return model_->arm; }
double CollisionWorld::clearanceMargin() const { return model_->cell_margin; }
double CollisionWorld::selfMargin() const { return model_->self_margin; }
int CollisionWorld::bodyCount() const { return static_cast<int>(model_->body_names.size()); }

const std::string& CollisionWorld::bodyName(int index) const {
  static const std::string kNone;
  return index < 0 ? kNone : model_->body_names.at(index);
}

const std::vector<std::string>& CollisionWorld::notes() const { return model_->notes; }

std::vector<std::pair<int, int>> CollisionWorld::baseConflicts() const {
  std::vector<std::pair<int, int>> conflicts;
  for (const Piece& piece : model_->moving) {
    if (piece.kind != PieceKind::kLink || piece.frame != 0) continue;
    MarginObject base(piece.geometry, model_->moving_growth);
    base.setTransform(model_->X_WB * piece.X_PS);
    base.updateBounds();
    base.setUserData(const_cast<Piece*>(&piece));
    for (const auto& cell : cell_objects_) {
      const std::pair<int, int> pair(piece.body, pieceOf(cell.get()).body);
      if (model_->isAllowed(pair.first, pair.second) ||
          std::find(conflicts.begin(), conflicts.end(), pair) != conflicts.end()) {
        continue;
      }
      if (nearerThan(base, *cell, model_->cell_margin) || eitherInside(base, *cell)) {
        conflicts.push_back(pair);
      }
    }
  }
  std::sort(conflicts.begin(), conflicts.end());
  return conflicts;
}

void CollisionWorld::checkWorkspace(const CollisionWorkspace& workspace) const {
  if (workspace.model_ != model_) {
    throw std::invalid_argument("collision world: the workspace was made for another collision world");
  }
}

void CollisionWorld::poseArm(const kinematics::JointVector& q,
                             CollisionWorkspace& workspace) const {
  checkWorkspace(workspace);
  if (q.size() != model_->arm.jointCount()) {
    throw std::invalid_argument("collision world: joint vector has " + std::to_string(q.size()) +
                     " values, the arm has " + std::to_string(model_->arm.jointCount()) +
                     " joints");
  }
  if (!q.allFinite()) throw std::invalid_argument("collision world: joint vector has a non-finite value");
  kinematics::computeLinkPoses(model_->arm, q, workspace.poses_);
  const std::vector<Piece>& moving = model_->moving;
  for (std::size_t i = 0; i < moving.size(); ++i) {
    const Eigen::Isometry3d X_WS = model_->X_WB * workspace.poses_.X_BL[moving[i].frame] *
                                   moving[i].X_PS;
    workspace.objects_[i]->setTransform(X_WS);
    workspace.objects_[i]->updateBounds();
  }
  workspace.manager_->update();
}

StateResult CollisionWorld::checkState(const kinematics::JointVector& q,
                                       CollisionWorkspace& workspace,
                                       const StateQuery& query) const {
  poseArm(q, workspace);
  StateSearch search{model_.get(), query.tell_contact, model_->cell_margin, {}};
  // FCL's manager-against-manager query takes the other manager by non-const
  // pointer but only reads it (the tree walk is a const method).
  workspace.manager_->collide(cell_manager_.get(), &search, stateCallback);
  if (search.result.valid()) {
    search.margin = model_->self_margin;
    workspace.manager_->collide(&search, stateCallback);
  }
  return search.result;
}

int CollisionWorld::countCandidatePairs(const kinematics::JointVector& q,
                                        CollisionWorkspace& workspace) const {
  poseArm(q, workspace);
  PairCount count{model_.get()};
  workspace.manager_->collide(cell_manager_.get(), &count, countCallback);
  workspace.manager_->collide(&count, countCallback);
  return count.pairs;
}

Clearance CollisionWorld::clearance(const kinematics::JointVector& q,
                                    CollisionWorkspace& workspace,
                                    const ClearanceQuery& query) const {
  poseArm(q, workspace);
  // Every checked pair with the distance of their (grown) boxes, a lower
  // bound of theirs; measured nearest first, a pair is skipped once its
  // bound reaches the best distance found.
  std::vector<CollisionWorkspace::PairBound>& pairs = workspace.pairs_;
  pairs.clear();
  const auto consider = [&](const fcl::CollisionObjectd& a, const fcl::CollisionObjectd& b) {
    if (model_->checks(pieceOf(&a), pieceOf(&b))) {
      pairs.push_back({a.getAABB().distance(b.getAABB()), &a, &b});
    }
  };
  const bool cell_pairs = query.pairs != PairGroup::kSelf;
  const bool self_pairs = query.pairs != PairGroup::kCell;
  const std::size_t moving = workspace.objects_.size();
  for (std::size_t i = 0; i < moving; ++i) {
    if (cell_pairs) {
      for (const auto& cell : cell_objects_) consider(*workspace.objects_[i], *cell);
    }
    if (self_pairs) {
      for (std::size_t j = i + 1; j < moving; ++j) {
        consider(*workspace.objects_[i], *workspace.objects_[j]);
      }
    }
  }
  std::sort(pairs.begin(), pairs.end(),
            [](const auto& x, const auto& y) { return x.bound < y.bound; });
  Clearance best;
  best.distance = std::numeric_limits<double>::infinity();
  for (const CollisionWorkspace::PairBound& pair : pairs) {
    if (pair.bound >= best.distance || best.distance <= 0.0) break;
    measurePair(*pair.a, *pair.b, query.tolerance, best);
  }
  return best;
}

double CollisionWorld::motionBound(const kinematics::JointVector& q_start,
                                   const kinematics::JointVector& q_end) const {
  double bound = 0.0;
  for (const Piece& piece : model_->moving) {
    double reach = 0.0;
    for (std::size_t j = 0; j < piece.lever.size(); ++j) {
      reach += piece.lever[j] * std::abs(q_end[j] - q_start[j]);
    }
    bound = std::max(bound, reach);
  }
  return bound;
}

double CollisionWorld::selfMotionBound(const kinematics::JointVector& q_start,
                                       const kinematics::JointVector& q_end) const {
  double bound = 0.0;
  for (const Piece& piece : model_->moving) {
    double reach = 0.0;
    for (std::size_t j = piece.self_joint_from; j < piece.lever.size(); ++j) {
      reach += piece.lever[j] * std::abs(q_end[j] - q_start[j]);
    }
    bound = std::max(bound, reach);
  }
  return bound;
}

SegmentResult CollisionWorld::checkSegment(const kinematics::JointVector& q_start,
                                           const kinematics::JointVector& q_end,
                                           CollisionWorkspace& workspace) const {
  SegmentResult segment;
  const auto visit = [&](int index, int steps) {
    const double fraction = static_cast<double>(index) / steps;
    const kinematics::JointVector q = q_start + fraction * (q_end - q_start);
    ++segment.states_checked;
    segment.state = checkState(q, workspace);
    if (segment.state.valid()) return false;
    segment.fraction = fraction;
    return true;
  };
  if (q_start.size() != q_end.size() || q_start.size() != model_->arm.jointCount()) {
    throw std::invalid_argument("collision world: segment ends need one value per arm joint");
  }
  if (!q_start.allFinite() || !q_end.allFinite()) {
    throw std::invalid_argument("collision world: segment end has a non-finite value");
  }
  // Neighbouring states closer than each margin in the motion bound of its
  // pairs, so no body point passes more than a pair's margin, relative to
  // the other body, between two valid states.
  const double intervals = std::max(motionBound(q_start, q_end) / model_->cell_margin,
                                    selfMotionBound(q_start, q_end) / model_->self_margin);
  const int steps = static_cast<int>(std::floor(intervals)) + 1;
  if (visit(0, steps) || visit(steps, steps)) return segment;
  // Coarse to fine: every interior index once, halving the stride each pass,
  // so a blocked segment is usually found after few checks.
  int stride = 1;
  while (stride * 2 < steps) stride *= 2;
  for (; stride >= 1; stride /= 2) {
    for (int index = stride; index < steps; index += 2 * stride) {
      if (visit(index, steps)) return segment;
    }
  }
  return segment;
}

CollisionWorkspace::CollisionWorkspace(const CollisionWorld& world) : model_(world.model_) {
  manager_ = std::make_unique<fcl::DynamicAABBTreeCollisionManagerd>();
  std::vector<fcl::CollisionObjectd*> objects;
  for (const Piece& piece : model_->moving) {
    auto object = std::make_unique<MarginObject>(piece.geometry, model_->moving_growth);
    object->setUserData(const_cast<Piece*>(&piece));
    objects.push_back(object.get());
    objects_.push_back(std::move(object));
  }
  manager_->registerObjects(objects);
  manager_->setup();
}

}  // namespace tw::collision
