#include "planner/motion/seam_moves.hpp"

#include <Eigen/Geometry>
#include <algorithm>
#include <optional>

#include "planner/motion/blend_radius.hpp"

namespace tw::planner {
namespace {

/// Positions closer than this are one point: the tool turns on the spot
/// there (a corner of the seam appears twice) [m].
constexpr double kSamePosition = 1e-9;

bool samePosition(const SolvedPose& a, const SolvedPose& b) {
  return (a.X_XT.translation() - b.X_XT.translation()).norm() <= kSamePosition;
}

/// Works through one seam; the stretches between turns on the spot are
/// compacted and checked one by one.
class SeamCompaction {
 public:
  SeamCompaction(const SolvedSeam& seam, const SeamMoveOptions& options, MoveFollower& follower,
                 collision::CollisionWorkspace& workspace)
      : seam_(seam), options_(options), follower_(follower), workspace_(workspace) {
    for (const SolvedPose& pose : seam.waypoints) poses_.push_back(pose.X_XT);
    compaction_tolerance_ = options.path_tolerance;
    compaction_tolerance_.position *= 0.5;
    findKeptPoints();
  }

  std::variant<std::vector<SeamMove>, SeamMoveFailure> run() {
    const int n = static_cast<int>(poses_.size());
    int start = 0;
    for (int i = 0; i + 1 < n; ++i) {
      if (!samePosition(seam_.waypoints[i], seam_.waypoints[i + 1])) continue;
      if (i > start && !addStretch(start, i)) return *failure_;
      if (!addTurn(i)) return *failure_;
      start = i + 1;
    }
    if (n - 1 > start && !addStretch(start, n - 1)) return *failure_;
    setBlends();
    return std::move(moves_);
  }

 private:
  /// A move must end at waypoint i (seam index) when something changes there.
  bool mustKeep(int i) const { return keep_[static_cast<std::size_t>(i)]; }
  /// The arm stops exactly at waypoint i: the ends, corners and process
  /// switches (a speed step is blended through).
  bool exactStop(int i) const { return stop_[static_cast<std::size_t>(i)]; }

  /// The ends, corners and process switches, and the points where the
  /// programmed speed has changed by more than the speed step since the last
  /// kept point: a move has one speed, so a speed that varies along the seam
  /// becomes steps of at most options.speed_step.
  void findKeptPoints() {
    const int n = static_cast<int>(poses_.size());
    keep_.assign(static_cast<std::size_t>(n), false);
    keep_.front() = keep_.back() = true;
    stop_ = keep_;
    double low = seam_.waypoints.front().speed;
    double high = low;
    for (int i = 1; i < n; ++i) {
      const SolvedPose& here = seam_.waypoints[i];
      if (here.corner || here.process_on != seam_.waypoints[i - 1].process_on) keep_[i] = stop_[i] = true;
      low = std::min(low, here.speed);
      high = std::max(high, here.speed);
      if (high > low * (1.0 + options_.speed_step)) {
        keep_[i - 1] = true;
        low = high = here.speed;
      }
      if (keep_[i]) low = high = here.speed;
    }
  }

  bool addStretch(int first, int last) {
    CompactionInput input;
    input.poses.assign(poses_.begin() + first, poses_.begin() + last + 1);
    for (int i = first; i <= last; ++i) input.must_keep.push_back(mustKeep(i));
    const MoveFitter fitter(input, compaction_tolerance_);
    for (const CompactMove& local : compactMoves(input, compaction_tolerance_)) {
      if (!addChecked(fitter, input.poses, first, local)) return false;
    }
    return true;
  }

  /// Checks `local` (indices into `stretch`, which starts at seam index
  /// `first`); splits it at its middle waypoint while it fails.
  bool addChecked(const MoveFitter& fitter, const std::vector<Eigen::Isometry3d>& stretch, int first,
                  const CompactMove& local) {
    const auto pose_at = [&](double u) { return interpolateMove(stretch, local, u); };
    FollowOutcome outcome = follower_.follow(pose_at, seam_.waypoints[first + local.start].q,
                                             seam_.waypoints[first + local.end].q, workspace_);
    if (FollowedPath* path = std::get_if<FollowedPath>(&outcome)) {
      SeamMove move;
      move.move = {local.shape, first + local.start, first + local.end,
                   local.via < 0 ? -1 : first + local.via};
      move.length = moveLength(stretch, local);
      move.turn = moveRotationAngle(stretch, local);
      move.joints = std::move(*path);
      moves_.push_back(std::move(move));
      return true;
    }
    if (local.end - local.start == 1) {
      failure_ = SeamMoveFailure{first + local.end, std::get<FollowFailure>(outcome)};
      return false;
    }
    const int middle = (local.start + local.end) / 2;
    return addRange(fitter, stretch, first, local.start, middle) &&
           addRange(fitter, stretch, first, middle, local.end);
  }

  /// The stretch from `from` to `to` (indices into `stretch`) as one fitted
  /// move when one fits, else halved; a single step always fits as a line.
  bool addRange(const MoveFitter& fitter, const std::vector<Eigen::Isometry3d>& stretch, int first,
                int from, int to) {
    if (const std::optional<CompactMove> move = fitter.fit(from, to)) {
      return addChecked(fitter, stretch, first, *move);
    }
    const int middle = (from + to) / 2;
    return addRange(fitter, stretch, first, from, middle) &&
           addRange(fitter, stretch, first, middle, to);
  }

  /// The turn on the spot from waypoint i to i + 1.
  bool addTurn(int i) {
    const Eigen::Isometry3d& a = poses_[i];
    const Eigen::Isometry3d& b = poses_[i + 1];
    const Eigen::Quaterniond qa(a.linear());
    const Eigen::Quaterniond qb(b.linear());
    const auto pose_at = [&](double u) {
      Eigen::Isometry3d pose = a;
      pose.linear() = qa.slerp(u, qb).toRotationMatrix();
      return pose;
    };
    FollowOutcome outcome =
        follower_.follow(pose_at, seam_.waypoints[i].q, seam_.waypoints[i + 1].q, workspace_);
    if (FollowFailure* failure = std::get_if<FollowFailure>(&outcome)) {
      failure_ = SeamMoveFailure{i + 1, *failure};
      return false;
    }
    SeamMove move;
    move.move = {MoveShape::kLine, i, i + 1, -1};
    move.turn = qa.angularDistance(qb);
    move.joints = std::move(std::get<FollowedPath>(outcome));
    moves_.push_back(std::move(move));
    return true;
  }

  /// Blends at the interior points of each stretch, 0 at the others.
  void setBlends() {
    for (std::size_t k = 0; k + 1 < moves_.size(); ++k) {
      const SeamMove& in = moves_[k];
      const SeamMove& out = moves_[k + 1];
      if (in.length == 0.0 || out.length == 0.0 || exactStop(in.move.end)) continue;
      const MoveEndTangents in_tangents = moveEndTangents(poses_, in.move);
      const MoveEndTangents out_tangents = moveEndTangents(poses_, out.move);
      moves_[k].blend = blendRadius(in_tangents.at_end, out_tangents.at_start, in.length, out.length,
                                    0.5 * options_.path_tolerance.position, options_.max_blend);
    }
  }

  const SolvedSeam& seam_;
  const SeamMoveOptions& options_;
  MoveFollower& follower_;
  collision::CollisionWorkspace& workspace_;
  std::vector<Eigen::Isometry3d> poses_;
  CompactionTolerance compaction_tolerance_;
  std::vector<bool> keep_;
  std::vector<bool> stop_;
  std::vector<SeamMove> moves_;
  std::optional<SeamMoveFailure> failure_;
};

}  // namespace

double speedOf(const SolvedSeam& seam, const SeamMove& move) {
  double sum = 0.0;
  for (int i = move.move.start + 1; i <= move.move.end; ++i) sum += seam.waypoints[i].speed;
  return sum / (move.move.end - move.move.start);
}

std::variant<std::vector<SeamMove>, SeamMoveFailure> compactSolvedSeam(
    const SolvedSeam& seam, const SeamMoveOptions& options, MoveFollower& follower,
    collision::CollisionWorkspace& workspace) {
  return SeamCompaction(seam, options, follower, workspace).run();
}

}  // namespace tw::planner
