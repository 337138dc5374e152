#include "planner/seam/seam_solver.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>
#include <set>
#include <stdexcept>
#include <tuple>
#include <unordered_map>
#include <utility>

#include "kinematics/common/angles.hpp"
#include "kinematics/forward_kinematics.hpp"
#include "kinematics/ortho_parallel_ik.hpp"

namespace tw::planner {
namespace {

using kinematics::JointVector;
constexpr double kInfinity = std::numeric_limits<double>::infinity();
/// Clearance queries may report up to this much above the true distance
/// [m]; 0.1 mm is far below any comfort distance worth setting.
constexpr double kClearanceTolerance = 1e-4;

enum class CheckState : std::uint8_t { kUnchecked, kFree, kColliding };

struct Candidate {
  JointVector q;
  int branch = 0;
  int spin = 0;  ///< index into the spin samples
  bool wrist_warning = false;
  CheckState check = CheckState::kUnchecked;
  collision::StateResult collision;  ///< set when kColliding
  double penalty = 0.0;  ///< singularity and joint-limit penalties of this pose
  /// Clearance to the cell capped at the comfort distance [m], and its
  /// penalty; until measured (clearance_known) the penalty is 0, a lower
  /// bound, so that the search stays optimal while measuring lazily.
  bool clearance_known = false;
  double clearance = 0.0;
  double clearance_penalty = 0.0;
  double cost = kInfinity;           ///< best cost from the first pose
  int pred = -1;                     ///< index in the previous layer
};

/// One pose of the path (approach start, waypoint, retract end) and its candidates.
struct Layer {
  int index = 0;  ///< waypoint index as reported: -1 approach, n retract
  int line = 0;
  Eigen::Isometry3d X_XT = Eigen::Isometry3d::Identity();  ///< without spin
  std::vector<Eigen::Isometry3d> X_BT;  ///< per spin sample, TCP in the base frame
  /// Sorted by (branch, spin, q6); group g = branch · spins + spin starts at group_start[g].
  std::vector<Candidate> candidates;
  std::vector<int> group_start;
  /// Joint step bound [rad] from spin sa of the previous layer to spin sb
  /// of this one, at [sb · (2K + 1) + (sa − sb + K)], K = max spin change.
  std::vector<double> step_bound;
  BlockedWaypoint tally;
  std::optional<NearMiss> nearest;  ///< among limit, wrist and twist rejections
};

double wristAngle(const kinematics::OrthoParallelGeometry& g, const JointVector& q) {
  const double theta5 = g.sign[4] * q[4] + g.zero_offset[4];
  return std::abs(theta5 - kPi * std::round(theta5 / kPi));
}

/// How far x falls short of the threshold t, from 0 (at or above t) to 1 (at 0).
double shortfall(double x, double t) { return t > 0.0 ? std::max(0.0, 1.0 - x / t) : 0.0; }

double rotationAngle(const Eigen::Matrix3d& R_a, const Eigen::Matrix3d& R_b) {
  const double c = 0.5 * ((R_a.transpose() * R_b).trace() - 1.0);
  return std::acos(std::clamp(c, -1.0, 1.0));
}

Eigen::Isometry3d interpolate(const Eigen::Isometry3d& a, const Eigen::Isometry3d& b, double f) {
  const Eigen::Quaterniond qa(a.linear());
  const Eigen::Quaterniond qb(b.linear());
  Eigen::Isometry3d out = Eigen::Isometry3d::Identity();
  out.linear() = qa.slerp(f, qb).toRotationMatrix();
  out.translation() = (1.0 - f) * a.translation() + f * b.translation();
  return out;
}

double maxAbs(const JointVector& a, const JointVector& b) { return (a - b).cwiseAbs().maxCoeff(); }

void keepNearer(std::optional<NearMiss>& nearest, const NearMiss& miss) {
  if (!nearest || miss.shortfall < nearest->shortfall) nearest = miss;
}

class SeamSearch {
 public:
  SeamSearch(const ToolPath& path, const SeamSetting& setting, const SeamSolverOptions& options,
             collision::CollisionWorkspace& workspace)
      : path_(path),
        setting_(setting),
        options_(options),
        world_(*setting.world),
        arm_(world_.arm()),
        ik_(arm_),
        geometry_(*arm_.orthoParallel()),
        workspace_(workspace) {
    checkOptions();
    if (options.weights.size() == 0) {
      weights_ = Eigen::VectorXd(arm_.jointCount());
      for (int j = 0; j < arm_.jointCount(); ++j) weights_[j] = 1.0 / arm_.joint(j).max_velocity;
    } else {
      weights_ = options.weights;
    }
    X_TF_ = setting.X_FT.inverse();
    makeSpins();
    max_spin_change_ = std::max(
        0, static_cast<int>(std::floor(options.max_spin_change / options.spin_step + 1e-9)));
    makeLayers();
  }

  SeamOutcome run() {
    const std::optional<std::vector<int>> chosen = findPath(0);
    if (!chosen) return report();
    SolvedSeam seam = solved(*chosen);
    if (options_.find_alternative) {
      // Layer 1 is the first waypoint; the approach start shares its spin.
      const Candidate& first = layers_[1].candidates[(*chosen)[1]];
      alternative_to_ = std::make_pair(first.branch, first.spin);
      if (const std::optional<std::vector<int>> other = findPath(1)) {
        seam.alternative = margins(*other);
      }
      alternative_to_.reset();
      seam.counts = counts_;
    }
    return seam;
  }

 private:
  /// The cheapest path that passes every check, searching again from layer
  /// `from` (the layers before it keep their costs), or nullopt when none.
  std::optional<std::vector<int>> findPath(int from) {
    const int last = static_cast<int>(layers_.size()) - 1;
    for (;;) {
      search(from);
      ++counts_.searches;
      const int end = bestIn(layers_[last]);
      if (end < 0) return std::nullopt;
      std::vector<int> chosen(layers_.size());
      chosen[last] = end;
      for (int l = last; l > 0; --l) chosen[l - 1] = layers_[l].candidates[chosen[l]].pred;
      from = validate(chosen);
      if (from < 0) from = measureClearance(chosen);
      if (from < 0) return chosen;
    }
  }

  /// Settings that would make the search meaningless are refused, not mended.
  void checkOptions() const {
    const auto refuse = [](const std::string& what) {
      throw std::invalid_argument("seam solver options: " + what);
    };
    if (!(options_.spin_step > 0.0)) refuse("spin_step must be a positive angle");
    if (!(options_.max_spin_change >= 0.0)) refuse("max_spin_change must not be negative");
    if (!(options_.joint_rate > 0.0) || !(options_.joint_step_floor >= 0.0)) {
      refuse("joint_rate must be positive and joint_step_floor not negative");
    }
    if (!(options_.interpolation_step > 0.0) || !(options_.interpolation_angle > 0.0)) {
      refuse("interpolation_step and interpolation_angle must be positive");
    }
    if (!(options_.singularity_weight >= 0.0) || !(options_.clearance_weight >= 0.0) ||
        !(options_.limit_weight >= 0.0)) {
      refuse("the margin penalty weights must not be negative");
    }
    if (!(options_.clearance_comfort > 0.0) || !(options_.revolute_limit_warning > 0.0) ||
        !(options_.prismatic_limit_warning > 0.0) || !(options_.alternative_spin_gap >= 0.0)) {
      refuse("clearance_comfort and the limit warnings must be positive, alternative_spin_gap "
             "not negative");
    }
    if (options_.weights.size() != 0 && options_.weights.size() != arm_.jointCount()) {
      refuse("weights needs one value per joint (" + std::to_string(arm_.jointCount()) +
             "), got " + std::to_string(options_.weights.size()));
    }
  }

  void makeSpins() {
    const SpinRange& range = path_.spin;
    const double span = range.max - range.min;
    if (span <= 0.0) {
      spins_.push_back(range.min);
      return;
    }
    full_circle_ = span >= 2.0 * kPi - 1e-9;
    // A full circle is sampled once (max coincides with min); otherwise both ends are kept.
    const int pieces = std::max(1, static_cast<int>(std::ceil(span / options_.spin_step - 1e-9)));
    const int count = full_circle_ ? pieces : pieces + 1;
    for (int k = 0; k < count; ++k) {
      spins_.push_back(full_circle_ ? range.min + k * (2.0 * kPi / pieces)
                                    : range.min + k * (span / pieces));
    }
  }

  void makeLayers() {
    const int n = static_cast<int>(path_.waypoints.size());
    layers_.resize(n + 2);
    layers_[0].index = -1;
    layers_[0].X_XT = path_.approach;
    layers_[0].line = n > 0 ? path_.waypoints.front().line : 0;
    for (int i = 0; i < n; ++i) {
      layers_[i + 1].index = i;
      layers_[i + 1].X_XT = path_.waypoints[i].X_XT;
      layers_[i + 1].line = path_.waypoints[i].line;
    }
    layers_[n + 1].index = n;
    layers_[n + 1].X_XT = path_.retract;
    layers_[n + 1].line = n > 0 ? path_.waypoints.back().line : 0;
    const Eigen::Isometry3d X_BX = setting_.X_WB.inverse() * setting_.X_WX;
    for (Layer& layer : layers_) makeCandidates(layer, X_BX);
    const int spins = static_cast<int>(spins_.size());
    const int offsets = 2 * max_spin_change_ + 1;
    for (std::size_t l = 1; l < layers_.size(); ++l) {
      Layer& layer = layers_[l];
      layer.step_bound.assign(static_cast<std::size_t>(spins) * offsets, -1.0);
      for (int sb = 0; sb < spins; ++sb) {
        for (int d = -max_spin_change_; d <= max_spin_change_; ++d) {
          const std::optional<int> sa = spinFrom(sb, d);
          if (!sa) continue;
          layer.step_bound[sb * offsets + d + max_spin_change_] =
              stepBound(travel(layers_[l - 1], *sa, layer, sb));
        }
      }
    }
  }

  /// The spin sample d samples away from sb, or nullopt when there is none
  /// (outside a partial range, or already visited round a full circle).
  std::optional<int> spinFrom(int sb, int d) const {
    const int spins = static_cast<int>(spins_.size());
    if (!full_circle_) {
      const int sa = sb + d;
      if (sa < 0 || sa >= spins) return std::nullopt;
      return sa;
    }
    // Round a full circle each sample once: offsets −⌊(n−1)/2⌋ … ⌈(n−1)/2⌉.
    if (d < -(spins - 1) / 2 || d > spins / 2) return std::nullopt;
    return ((sb + d) % spins + spins) % spins;
  }

  /// The approach (into layer 1) and the retract (into the last layer) are
  /// moves along the tool axis: they keep the spin, so the tool keeps the
  /// orientation of the first and last waypoint.
  bool keepsSpin(int l) const { return l == 1 || l == static_cast<int>(layers_.size()) - 1; }

  /// The bound for a step from spin sa to spin sb into layer l, or nullopt
  /// when the spin changes by more than max_spin_change samples.
  std::optional<double> boundInto(int l, int sa, int sb) const {
    const int spin_change = keepsSpin(l) ? 0 : max_spin_change_;
    for (int d = -spin_change; d <= spin_change; ++d) {
      const std::optional<int> from = spinFrom(sb, d);
      if (from && *from == sa) {
        return layers_[l].step_bound[sb * (2 * max_spin_change_ + 1) + d + max_spin_change_];
      }
    }
    return std::nullopt;
  }

  void makeCandidates(Layer& layer, const Eigen::Isometry3d& X_BX) {
    const int spins = static_cast<int>(spins_.size());
    layer.X_BT.resize(spins);
    for (int s = 0; s < spins; ++s) {
      layer.X_BT[s] = X_BX * layer.X_XT * Eigen::AngleAxisd(spins_[s], Eigen::Vector3d::UnitZ());
      ik_.solve(layer.X_BT[s] * X_TF_, kinematics::IkOptions{}, solutions_);
      ++counts_.ik_calls;
      for (const kinematics::BranchOutcome& outcome : solutions_.branches) {
        ++layer.tally.tried;
        const std::string words = outcome.branch.toString();
        if (outcome.status == kinematics::BranchStatus::kOutOfReach) {
          ++layer.tally.rejected[static_cast<int>(RejectReason::kOutOfReach)];
          continue;
        }
        if (outcome.status == kinematics::BranchStatus::kJointLimit) {
          ++layer.tally.rejected[static_cast<int>(RejectReason::kJointLimit)];
          ++layer.tally.limit_joint[outcome.limit_joint];
          const kinematics::JointSpec& joint = arm_.joint(outcome.limit_joint);
          const double past = std::max(joint.lower - outcome.limit_value,
                                       outcome.limit_value - joint.upper);
          keepNearer(layer.nearest, {RejectReason::kJointLimit, words, spins_[s], past,
                                     outcome.limit_joint, "", false});
          continue;
        }
        for (int k = 0; k < outcome.solution_count; ++k) {
          const JointVector& q = solutions_.solutions[outcome.first_solution + k].q;
          const double wrist = wristAngle(geometry_, q);
          if (wrist < options_.wrist_hard_margin) {
            ++layer.tally.rejected[static_cast<int>(RejectReason::kWristSingularity)];
            keepNearer(layer.nearest, {RejectReason::kWristSingularity, words, spins_[s],
                                       options_.wrist_hard_margin - wrist, 4, "", false});
            continue;
          }
          const double twist = std::abs(q[3]) + std::abs(q[5]);
          if (options_.wrist_twist_limit && twist > *options_.wrist_twist_limit) {
            ++layer.tally.rejected[static_cast<int>(RejectReason::kWristTwist)];
            keepNearer(layer.nearest, {RejectReason::kWristTwist, words, spins_[s],
                                       twist - *options_.wrist_twist_limit, -1, "", false});
            continue;
          }
          Candidate candidate;
          candidate.q = q;
          candidate.branch = outcome.branch.index();
          candidate.spin = s;
          candidate.wrist_warning = wrist < options_.wrist_warning_margin;
          candidate.penalty =
              options_.singularity_weight * shortfall(wrist, options_.wrist_warning_margin) +
              options_.limit_weight * limitShortfall(q);
          layer.candidates.push_back(candidate);
        }
      }
    }
    counts_.candidates += static_cast<long>(layer.candidates.size());
    std::sort(layer.candidates.begin(), layer.candidates.end(),
              [](const Candidate& a, const Candidate& b) {
                if (a.branch != b.branch) return a.branch < b.branch;
                if (a.spin != b.spin) return a.spin < b.spin;
                for (int j = static_cast<int>(a.q.size()) - 1; j >= 0; --j) {
                  if (a.q[j] != b.q[j]) return a.q[j] < b.q[j];
                }
                return false;
              });
    layer.group_start.assign(8 * spins + 1, 0);
    for (const Candidate& c : layer.candidates) ++layer.group_start[c.branch * spins + c.spin + 1];
    for (std::size_t g = 1; g < layer.group_start.size(); ++g) {
      layer.group_start[g] += layer.group_start[g - 1];
    }
  }

  /// The smallest margin of any joint of q to its nearer limit, as
  /// (margin [rad] or [m], joint).
  std::pair<double, int> limitMargin(const JointVector& q) const {
    std::pair<double, int> smallest{kInfinity, -1};
    for (int j = 0; j < arm_.jointCount(); ++j) {
      const kinematics::JointSpec& joint = arm_.joint(j);
      const double margin = std::min(q[j] - joint.lower, joint.upper - q[j]);
      if (margin < smallest.first) smallest = {margin, j};
    }
    return smallest;
  }

  /// The largest shortfall of any joint's limit margin below its warning margin.
  double limitShortfall(const JointVector& q) const {
    double worst = 0.0;
    for (int j = 0; j < arm_.jointCount(); ++j) {
      const kinematics::JointSpec& joint = arm_.joint(j);
      const double warning = joint.type == kinematics::JointType::kRevolute
                                 ? options_.revolute_limit_warning
                                 : options_.prismatic_limit_warning;
      worst = std::max(worst, shortfall(std::min(q[j] - joint.lower, joint.upper - q[j]), warning));
    }
    return worst;
  }

  /// TCP travel [m] between spin sample sa of layer a and sb of layer b.
  double travel(const Layer& a, int sa, const Layer& b, int sb) const {
    const Eigen::Isometry3d& A = a.X_BT[sa];
    const Eigen::Isometry3d& B = b.X_BT[sb];
    return (B.translation() - A.translation()).norm() +
           options_.rotation_lever * rotationAngle(A.linear(), B.linear());
  }

  double stepBound(double travel_m) const {
    return options_.joint_rate * travel_m + options_.joint_step_floor;
  }

  double stepCost(const JointVector& a, const JointVector& b) const {
    double cost = 0.0;
    for (int j = 0; j < a.size(); ++j) cost += weights_[j] * std::abs(b[j] - a[j]);
    return cost;
  }

  static std::uint64_t edgeKey(int layer, int c, int p) {
    return (static_cast<std::uint64_t>(layer) << 42) | (static_cast<std::uint64_t>(c) << 21) |
           static_cast<std::uint64_t>(p);
  }

  /// Calls visit(p) for every candidate p of layer l − 1 that can step to
  /// candidate c of layer l by branch, spin change and joint bound.
  template <typename Visit>
  void forEachPredecessor(int l, const Candidate& c, Visit visit) const {
    const Layer& prev = layers_[l - 1];
    const Layer& layer = layers_[l];
    const int spins = static_cast<int>(spins_.size());
    const int offsets = 2 * max_spin_change_ + 1;
    const int spin_change = keepsSpin(l) ? 0 : max_spin_change_;
    for (int d = -spin_change; d <= spin_change; ++d) {
      const std::optional<int> sa = spinFrom(c.spin, d);
      if (!sa) continue;
      const double bound = layer.step_bound[c.spin * offsets + d + max_spin_change_];
      const int group = c.branch * spins + *sa;
      const auto first = prev.candidates.begin() + prev.group_start[group];
      const auto last = prev.candidates.begin() + prev.group_start[group + 1];
      const double q6 = c.q[5];
      auto it = std::lower_bound(first, last, q6 - bound,
                                 [](const Candidate& p, double v) { return p.q[5] < v; });
      for (; it != last && it->q[5] <= q6 + bound; ++it) {
        if (maxAbs(it->q, c.q) <= bound) visit(static_cast<int>(it - prev.candidates.begin()));
      }
    }
  }

  void search(int from) {
    for (int l = from; l < static_cast<int>(layers_.size()); ++l) {
      Layer& layer = layers_[l];
      for (int i = 0; i < static_cast<int>(layer.candidates.size()); ++i) {
        Candidate& c = layer.candidates[i];
        c.cost = kInfinity;
        c.pred = -1;
        if (c.check == CheckState::kColliding) continue;
        if (l == 1 && alternative_to_ && !isAlternative(c)) continue;
        const double penalty = c.penalty + c.clearance_penalty;
        if (l == 0) {
          c.cost = (setting_.reference ? stepCost(*setting_.reference, c.q) : 0.0) + penalty;
          continue;
        }
        const Layer& prev = layers_[l - 1];
        forEachPredecessor(l, c, [&](int p) {
          const Candidate& from_c = prev.candidates[p];
          if (from_c.cost == kInfinity) return;
          const auto known = edges_.find(edgeKey(l, i, p));
          if (known != edges_.end() && !known->second) return;
          const double cost = from_c.cost + stepCost(from_c.q, c.q) + penalty;
          if (cost < c.cost) {
            c.cost = cost;
            c.pred = p;
          }
        });
      }
    }
  }

  /// Whether candidate c of the first waypoint may start the alternative:
  /// another branch, or a spin at least alternative_spin_gap away.
  bool isAlternative(const Candidate& c) const {
    if (c.branch != alternative_to_->first) return true;
    double gap = std::abs(spins_[c.spin] - spins_[alternative_to_->second]);
    if (full_circle_) gap = std::min(gap, 2.0 * kPi - gap);
    return gap >= options_.alternative_spin_gap - 1e-9;
  }

  /// Measures the clearance of the chosen path's poses not yet known and
  /// returns the first layer whose penalty became positive (its cost was
  /// underestimated), or −1 when the path's cost was exact. The distance to
  /// the cell changes between two states by no more than any body moves
  /// (CollisionWorld::motionBound), so a pose whose bound from the last
  /// measured state stays above the comfort distance is not measured.
  int measureClearance(const std::vector<int>& chosen) {
    if (options_.clearance_weight <= 0.0) return -1;
    const double comfort = options_.clearance_comfort;
    const collision::ClearanceQuery query{kClearanceTolerance, collision::PairGroup::kCell};
    int first_change = -1;
    for (int l = 0; l < static_cast<int>(layers_.size()); ++l) {
      Layer& layer = layers_[l];
      const Candidate& c = layer.candidates[chosen[l]];
      if (c.clearance_known) continue;
      double capped = comfort;
      const bool surely_comfortable =
          measured_ && measured_->second - kClearanceTolerance -
                               world_.motionBound(measured_->first, c.q) >=
                           comfort;
      if (!surely_comfortable) {
        const double distance = world_.clearance(c.q, workspace_, query).distance;
        ++counts_.clearance_queries;
        measured_ = std::make_pair(c.q, distance);
        capped = std::min(distance, comfort);
      }
      const double penalty = options_.clearance_weight * shortfall(capped, comfort);
      const int group = c.branch * static_cast<int>(spins_.size()) + c.spin;
      for (int k = layer.group_start[group]; k < layer.group_start[group + 1]; ++k) {
        layer.candidates[k].clearance_known = true;
        layer.candidates[k].clearance = capped;
        layer.candidates[k].clearance_penalty = penalty;
      }
      if (penalty > 0.0 && first_change < 0) first_change = l;
    }
    return first_change;
  }

  static int bestIn(const Layer& layer) {
    int best = -1;
    for (int i = 0; i < static_cast<int>(layer.candidates.size()); ++i) {
      if (layer.candidates[i].cost == kInfinity) continue;
      if (best < 0 || layer.candidates[i].cost < layer.candidates[best].cost) best = i;
    }
    return best;
  }

  /// Checks candidate i of `layer` and gives the result to its whole group:
  /// one branch at one spin is one arm pose, the group's members differ only
  /// by whole turns of joints, so they collide or not together.
  void checkCandidate(Layer& layer, int i) {
    if (layer.candidates[i].check != CheckState::kUnchecked) return;
    const collision::StateResult result = world_.checkState(layer.candidates[i].q, workspace_);
    ++counts_.state_checks;
    const int spins = static_cast<int>(spins_.size());
    const int group = layer.candidates[i].branch * spins + layer.candidates[i].spin;
    for (int k = layer.group_start[group]; k < layer.group_start[group + 1]; ++k) {
      layer.candidates[k].collision = result;
      layer.candidates[k].check = result.valid() ? CheckState::kFree : CheckState::kColliding;
    }
  }

  /// Checks the chosen path; returns the first layer whose choice failed
  /// (every failure on the path is recorded), or −1 when all passed.
  int validate(const std::vector<int>& chosen) {
    int first_failure = -1;
    for (int l = 0; l < static_cast<int>(layers_.size()); ++l) {
      checkCandidate(layers_[l], chosen[l]);
      const Candidate& c = layers_[l].candidates[chosen[l]];
      if (c.check == CheckState::kColliding && first_failure < 0) first_failure = l;
    }
    if (first_failure >= 0) return first_failure;
    for (int l = 1; l < static_cast<int>(layers_.size()); ++l) {
      const std::uint64_t key = edgeKey(l, chosen[l], chosen[l - 1]);
      auto known = edges_.find(key);
      if (known == edges_.end()) {
        const bool ok = !checkStep(l, chosen[l - 1], chosen[l]).has_value();
        known = edges_.emplace(key, ok).first;
      }
      if (!known->second && first_failure < 0) first_failure = l;
    }
    return first_failure;
  }

  /// Why the step from candidate p of layer l − 1 to candidate c of layer l
  /// fails its full check, or nullopt when it passes.
  std::optional<StepReason> checkStep(int l, int p, int c) {
    ++counts_.edges_validated;
    const Layer& prev = layers_[l - 1];
    const Layer& layer = layers_[l];
    const Candidate& a = prev.candidates[p];
    const Candidate& b = layer.candidates[c];
    const Eigen::Isometry3d& A = prev.X_BT[a.spin];
    const Eigen::Isometry3d& B = layer.X_BT[b.spin];
    const double distance = (B.translation() - A.translation()).norm();
    const double angle = rotationAngle(A.linear(), B.linear());
    const int pieces = std::max(
        {1, static_cast<int>(std::ceil(distance / options_.interpolation_step - 1e-9)),
         static_cast<int>(std::ceil(angle / options_.interpolation_angle - 1e-9))});
    const double bound = stepBound(travel(prev, a.spin, layer, b.spin) / pieces);
    states_.clear();
    states_.push_back(a.q);
    for (int k = 1; k <= pieces; ++k) {
      const JointVector& from = states_.back();
      JointVector next = b.q;
      if (k < pieces) {
        const Eigen::Isometry3d X_BT = interpolate(A, B, static_cast<double>(k) / pieces);
        ik_.solve(X_BT * X_TF_, kinematics::IkOptions{}, solutions_);
        ++counts_.ik_calls;
        const kinematics::BranchOutcome& outcome = solutions_.branches[a.branch];
        double nearest = kInfinity;
        for (int s = 0; s < outcome.solution_count; ++s) {
          const JointVector& q = solutions_.solutions[outcome.first_solution + s].q;
          const double d = maxAbs(q, from);
          if (d < nearest) {
            nearest = d;
            next = q;
          }
        }
        if (nearest == kInfinity) return StepReason::kInterpolation;
        if (wristAngle(geometry_, next) < options_.wrist_hard_margin) {
          return StepReason::kInterpolation;
        }
      }
      if (maxAbs(next, from) > bound) return StepReason::kJointJump;
      const Eigen::Isometry3d X_BT_mid =
          interpolate(A, B, (static_cast<double>(k) - 0.5) / pieces);
      const JointVector mid = 0.5 * (from + next);
      const Eigen::Isometry3d X_BT_fk = kinematics::flangePose(arm_, mid) * setting_.X_FT;
      if ((X_BT_fk.translation() - X_BT_mid.translation()).norm() > options_.continuity_position ||
          rotationAngle(X_BT_fk.linear(), X_BT_mid.linear()) > options_.continuity_angle) {
        return StepReason::kDiscontinuous;
      }
      states_.push_back(next);
    }
    for (std::size_t k = 1; k < states_.size(); ++k) {
      const collision::SegmentResult segment =
          world_.checkSegment(states_[k - 1], states_[k], workspace_);
      counts_.state_checks += segment.states_checked;
      if (!segment.valid()) return StepReason::kMotionCollision;
    }
    return std::nullopt;
  }

  SolvedPose pose(const Layer& layer, const Candidate& c, const Waypoint* waypoint) const {
    SolvedPose out;
    out.q = c.q;
    out.spin = spins_[c.spin];
    out.X_XT = layer.X_XT * Eigen::AngleAxisd(out.spin, Eigen::Vector3d::UnitZ());
    out.X_WT = setting_.X_WX * out.X_XT;
    out.wrist_warning = c.wrist_warning;
    out.line = layer.line;
    if (waypoint) {
      out.speed = waypoint->speed;
      out.process_on = waypoint->process_on;
      out.corner = waypoint->corner;
    }
    return out;
  }

  PathMargins margins(const std::vector<int>& chosen) const {
    PathMargins out;
    const int last = static_cast<int>(layers_.size()) - 1;
    const Candidate& first = layers_[1].candidates[chosen[1]];
    out.branch = kinematics::ArmBranch::fromIndex(first.branch);
    out.spin = spins_[first.spin];
    out.cost = layers_[last].candidates[chosen[last]].cost;
    out.wrist_angle = kInfinity;
    out.limit_margin = kInfinity;
    out.clearance = options_.clearance_weight > 0.0 ? kInfinity : -1.0;
    double penalties = 0.0;
    for (int l = 0; l <= last; ++l) {
      const Candidate& c = layers_[l].candidates[chosen[l]];
      penalties += c.penalty + c.clearance_penalty;
      out.wrist_angle = std::min(out.wrist_angle, wristAngle(geometry_, c.q));
      const std::pair<double, int> limit = limitMargin(c.q);
      if (limit.first < out.limit_margin) std::tie(out.limit_margin, out.limit_joint) = limit;
      if (options_.clearance_weight > 0.0) out.clearance = std::min(out.clearance, c.clearance);
      if (c.wrist_warning) ++out.singular_poses;
    }
    out.clearance_capped = out.clearance >= options_.clearance_comfort;
    out.motion_cost = out.cost - penalties;
    return out;
  }

  SolvedSeam solved(const std::vector<int>& chosen) const {
    SolvedSeam seam;
    seam.name = path_.name;
    seam.frame = path_.frame;
    seam.tool = path_.tool;
    seam.process = path_.process;
    seam.source = path_.source;
    const int last = static_cast<int>(layers_.size()) - 1;
    seam.branch = kinematics::ArmBranch::fromIndex(layers_[0].candidates[chosen[0]].branch);
    seam.approach = pose(layers_[0], layers_[0].candidates[chosen[0]], nullptr);
    for (int l = 1; l < last; ++l) {
      seam.waypoints.push_back(
          pose(layers_[l], layers_[l].candidates[chosen[l]], &path_.waypoints[l - 1]));
    }
    seam.retract = pose(layers_[last], layers_[last].candidates[chosen[last]], nullptr);
    seam.cost = layers_[last].candidates[chosen[last]].cost;
    seam.min_wrist_angle = kInfinity;
    seam.axis4_min = seam.axis6_min = kInfinity;
    seam.axis4_max = seam.axis6_max = -kInfinity;
    for (int l = 0; l <= last; ++l) {
      const JointVector& q = layers_[l].candidates[chosen[l]].q;
      if (l > 0 && l < last) seam.min_wrist_angle = std::min(seam.min_wrist_angle, wristAngle(geometry_, q));
      seam.axis4_min = std::min(seam.axis4_min, q[3]);
      seam.axis4_max = std::max(seam.axis4_max, q[3]);
      seam.axis6_min = std::min(seam.axis6_min, q[5]);
      seam.axis6_max = std::max(seam.axis6_max, q[5]);
    }
    seam.margins = margins(chosen);
    seam.counts = counts_;
    return seam;
  }

  std::string pairName(const collision::StateResult& result) const {
    const std::string& a = world_.bodyName(result.body_a);
    const std::string& b = world_.bodyName(result.body_b);
    return a < b ? a + " / " + b : b + " / " + a;
  }

  /// Everything checked, then either the blocked poses or the first step no
  /// path crosses.
  SeamOutcome report() {
    SeamReport out;
    out.name = path_.name;
    out.source = path_.source;
    out.waypoint_count = static_cast<int>(path_.waypoints.size());
    for (Layer& layer : layers_) {
      bool any_free = false;
      for (int i = 0; i < static_cast<int>(layer.candidates.size()); ++i) {
        checkCandidate(layer, i);
        any_free = any_free || layer.candidates[i].check == CheckState::kFree;
      }
      if (any_free) continue;
      BlockedWaypoint blocked = layer.tally;
      blocked.index = layer.index;
      blocked.line = layer.line;
      std::set<std::string> pairs;
      std::optional<NearMiss> near_collision;
      for (const Candidate& c : layer.candidates) {
        ++blocked.rejected[static_cast<int>(RejectReason::kCollision)];
        pairs.insert(pairName(c.collision));
        if (near_collision && !near_collision->touching) continue;
        // Only within the margin (no contact) is nearer than touching.
        const collision::StateResult told =
            world_.checkState(c.q, workspace_, collision::StateQuery{true});
        ++counts_.state_checks;
        const bool touching = told.status == collision::StateStatus::kInCollision;
        if (!near_collision || (near_collision->touching && !touching)) {
          near_collision = NearMiss{RejectReason::kCollision,
                                    kinematics::ArmBranch::fromIndex(c.branch).toString(),
                                    spins_[c.spin], 0.0, -1, pairName(told), touching};
        }
      }
      blocked.colliding_pairs.assign(pairs.begin(), pairs.end());
      blocked.nearest = near_collision && !near_collision->touching ? near_collision
                        : layer.nearest                          ? layer.nearest
                                                                 : near_collision;
      out.blocked.push_back(std::move(blocked));
    }
    for (const BlockedWaypoint& blocked : out.blocked) {
      if (!out.stretches.empty() && out.stretches.back().second + 1 == blocked.index) {
        out.stretches.back().second = blocked.index;
      } else {
        out.stretches.emplace_back(blocked.index, blocked.index);
      }
    }
    if (out.blocked.empty()) out.step = blockedStep();
    out.counts = counts_;
    return out;
  }

  /// With every candidate checked, the first layer no path reaches, and why
  /// each pair of a reached and a free candidate cannot be joined.
  BlockedStep blockedStep() {
    search(0);
    int dead = 1;
    const int last = static_cast<int>(layers_.size()) - 1;
    while (dead < last && bestIn(layers_[dead]) >= 0) ++dead;
    const Layer& prev = layers_[dead - 1];
    const Layer& layer = layers_[dead];
    BlockedStep step;
    step.from = prev.index;
    step.to = layer.index;
    for (int c = 0; c < static_cast<int>(layer.candidates.size()); ++c) {
      const Candidate& b = layer.candidates[c];
      if (b.check != CheckState::kFree) continue;
      for (int p = 0; p < static_cast<int>(prev.candidates.size()); ++p) {
        const Candidate& a = prev.candidates[p];
        if (a.cost == kInfinity) continue;
        StepReason reason = StepReason::kBranchChange;
        if (a.branch == b.branch) {
          const std::optional<double> bound = boundInto(dead, a.spin, b.spin);
          if (!bound || maxAbs(a.q, b.q) > *bound) {
            reason = StepReason::kJointJump;
          } else if (const std::optional<StepReason> refused = checkStep(dead, p, c)) {
            reason = *refused;
          } else {
            continue;  // cannot happen: a passing step would have reached the layer
          }
        }
        ++step.rejected[static_cast<int>(reason)];
      }
    }
    return step;
  }

  const ToolPath& path_;
  const SeamSetting& setting_;
  const SeamSolverOptions& options_;
  const collision::CollisionWorld& world_;
  const kinematics::ArmModel& arm_;
  kinematics::OrthoParallelSolver ik_;
  kinematics::OrthoParallelGeometry geometry_;
  collision::CollisionWorkspace& workspace_;
  Eigen::VectorXd weights_;
  Eigen::Isometry3d X_TF_;
  std::vector<double> spins_;
  bool full_circle_ = false;
  int max_spin_change_ = 0;  ///< in samples
  std::vector<Layer> layers_;
  std::unordered_map<std::uint64_t, bool> edges_;  ///< fully checked steps: passed?
  kinematics::IkSolutions solutions_;
  std::vector<JointVector> states_;
  SolverCounts counts_;
  /// While the alternative is sought: the (branch, spin) of the chosen first waypoint.
  std::optional<std::pair<int, int>> alternative_to_;
  /// The last state whose clearance was measured, and that clearance [m].
  std::optional<std::pair<JointVector, double>> measured_;
};

}  // namespace

SeamOutcome solveSeam(const ToolPath& path, const SeamSetting& setting,
                      const SeamSolverOptions& options, collision::CollisionWorkspace& workspace) {
  if (setting.world == nullptr) throw std::invalid_argument("seam solver: the setting has no collision world");
  return SeamSearch(path, setting, options, workspace).run();
}

}  // namespace tw::planner
