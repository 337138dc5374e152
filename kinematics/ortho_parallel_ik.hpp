#pragma once

#include <Eigen/Geometry>
#include <array>
#include <vector>

#include "kinematics/arm_branch.hpp"
#include "kinematics/arm_model.hpp"

namespace tw::kinematics {

/// Why a branch has no in-limit solution, or that it has one.
enum class BranchStatus {
  kSolved,      ///< at least one joint vector of this branch is within limits
  kOutOfReach,  ///< the wrist centre cannot be placed by this branch
  kJointLimit,  ///< reachable, but a joint is outside its limits in every equivalent turn
};
const char* toString(BranchStatus status);

/// The outcome of one branch for one target pose.
struct BranchOutcome {
  ArmBranch branch;
  BranchStatus status = BranchStatus::kOutOfReach;
  /// Axis 5 so close to 0 or ±180° that axes 4 and 6 are not separable;
  /// axis 4 was then held at the reference given in IkOptions.
  bool wrist_singular = false;
  /// The branch's joint values with revolute joints wrapped to (−π, π]; set
  /// unless kOutOfReach, so a caller can see how far off a limit it is.
  JointVector q;
  /// kJointLimit: the first joint (0-based) with no in-limit value, and
  /// that joint's value nearest to its range.
  int limit_joint = -1;
  double limit_value = 0.0;
  /// The in-limit joint vectors of this branch are
  /// IkSolutions::solutions[first_solution, first_solution + solution_count).
  int first_solution = 0;
  int solution_count = 0;
};

/// One in-limit joint vector and the branch it belongs to.
struct IkSolution {
  JointVector q;
  int branch_index = 0;  ///< ArmBranch::index()
};

/// The result of one closed-form solve; owned by the caller and reused so
/// that repeated solves do not allocate once the vector has grown.
struct IkSolutions {
  std::array<BranchOutcome, 8> branches;  ///< indexed by ArmBranch::index()
  /// Every in-limit solution, each multi-turn equivalent separately, in
  /// branch order; within a branch in increasing order of axis values.
  std::vector<IkSolution> solutions;
};

struct IkOptions {
  /// Joint value of axis 4 [rad] kept at the wrist singularity.
  double axis4_reference = 0.0;
  /// sin(θ5) below which the wrist counts as singular. Above it the regular
  /// formula is accurate to ~1e-16/threshold rad in axis 4, and axis 6 is
  /// solved given axis 4, so the pose stays exact.
  double wrist_singular_sine = 1e-10;
};

/// Closed-form inverse kinematics of an ortho-parallel arm with a spherical
/// wrist (Brandstötter, Angerer & Hofbaur 2014; the position/orientation
/// decoupling of Pieper 1968): all 8 branches, limits applied, every
/// equivalent turn of each joint within its limits (axes whose range exceeds
/// ±180°).
///
/// Built once per arm (precomputes constants); immutable and thread-safe.
/// Never returns NaN: unreachable targets are kOutOfReach outcomes.
class OrthoParallelSolver {
 public:
  /// Throws tw::InputError unless `arm` was described by ortho-parallel
  /// parameters. Keeps a reference: `arm` must outlive the solver.
  explicit OrthoParallelSolver(const ArmModel& arm);

  /// Solves for the flange pose X_BF in the arm base frame. No allocation
  /// once `out.solutions` has the capacity it needs.
  void solve(const Eigen::Isometry3d& X_BF, const IkOptions& options, IkSolutions& out) const;

  IkSolutions solve(const Eigen::Isometry3d& X_BF, const IkOptions& options = {}) const;

  const ArmModel& arm() const { return arm_; }

 private:
  /// One joint's limits, as the multi-turn expansion uses them.
  struct JointRange {
    double lower = 0.0;
    double upper = 0.0;
    /// Values up to this far outside count as at the limit.
    double lower_tolerant = 0.0;
    double upper_tolerant = 0.0;
    /// The first candidate q + 2πk, q in (−π, π], that may be in range is
    /// q + first_offset; `candidates` (at most 3) values one turn apart follow.
    double first_offset = 0.0;
    int candidates = 0;
  };
  /// Every value q + 2πk of one joint within its limits: at most 3, since
  /// ranges are at most 720°; values within tolerance of a limit are clamped
  /// onto it.
  struct TurnValues {
    std::array<double, 3> value;
    int count = 0;
  };
  static void findTurns(const JointRange& range, double q, TurnValues& turns);
  /// The equivalent value of a joint nearest to its range, for the report
  /// of a branch that has none inside.
  double nearestToRange(int joint, double q) const;
  /// For every solved branch, in branch order, appends each combination of
  /// its per-joint values (last joint varying fastest) and records where
  /// they are.
  void appendSolutions(const std::array<std::array<TurnValues, 6>, 8>& branch_turns,
                       IkSolutions& out) const;

  const ArmModel& arm_;
  OrthoParallelGeometry g_;
  Eigen::Isometry3d X_FL_;  ///< last link in the flange frame
  double forearm_length_;   ///< √(a2² + c3²)
  double forearm_angle_;    ///< atan2(a2, c3)
  double sin_forearm_;
  double cos_forearm_;
  std::array<JointRange, 6> ranges_;  ///< copied from the arm for locality
};

}  // namespace tw::kinematics
