#include "kinematics/ortho_parallel_ik.hpp"

#include <algorithm>
#include <cmath>

#include "kinematics/arc_tangent.hpp"
#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"

namespace tw::kinematics {
namespace {

constexpr double kTwoPi = 2.0 * kPi;
// A cosine computed a few ulps beyond ±1 at the stretched or folded arm is
// rounding, not a miss: clamp within this, report out of reach beyond it.
constexpr double kCosineRounding = 1e-12;
// Joint values within this of a limit count as at the limit (and are clamped
// onto it): far below any drive's resolution, above rounding of the formulas.
constexpr double kLimitTolerance = 1e-9;

/// Wraps to (−π, π]. The formulas give angles within about a turn of it, so
/// one branch-free step each way does it for ordinary zero offsets; the loops
/// catch offsets beyond a turn.
double wrapToPi(double angle) {
  angle -= angle > kPi ? kTwoPi : 0.0;
  angle += angle <= -kPi ? kTwoPi : 0.0;
  while (angle > kPi) angle -= kTwoPi;
  while (angle <= -kPi) angle += kTwoPi;
  return angle;
}

/// A triangle angle from its cosine, as (cosine, sine, angle in [0, π]);
/// false for a cosine beyond ±1 by more than rounding (no such triangle).
/// The sine comes from (1 − c)(1 + c), which keeps the digits 1 − c² loses
/// near ±1, and the angle from atan2, which is accurate there, unlike acos.
struct TriangleAngle {
  double cosine = 1.0;
  double sine = 0.0;
  double angle = 0.0;
};
bool triangleAngle(double cosine, TriangleAngle& out) {
  if (std::abs(cosine) > 1.0 + kCosineRounding) return false;
  out.cosine = std::clamp(cosine, -1.0, 1.0);
  out.sine = std::sqrt((1.0 - out.cosine) * (1.0 + out.cosine));
  out.angle = arcTangent2(out.sine, out.cosine);
  return true;
}

}  // namespace

inline void OrthoParallelSolver::findTurns(const JointRange& range, double q, TurnValues& turns) {
  // Which candidates lie in range depends on the pose, so the tests are
  // folded into counts instead of branches (those were often mispredicted);
  // whether a joint has one candidate or several is fixed per arm.
  double value = q + range.first_offset;
  if (range.candidates == 1) {
    turns.value[0] = std::clamp(value, range.lower, range.upper);
    turns.count = (value >= range.lower_tolerant) & (value <= range.upper_tolerant);
    return;
  }
  turns.count = 0;
  for (int candidate = 0; candidate < 3; ++candidate, value += kTwoPi) {
    const bool inside = (candidate < range.candidates) & (value >= range.lower_tolerant) &
                        (value <= range.upper_tolerant);
    turns.value[static_cast<std::size_t>(std::min(turns.count, 2))] =
        std::clamp(value, range.lower, range.upper);
    turns.count += inside ? 1 : 0;
  }
}

const char* toString(BranchStatus status) {
  switch (status) {
    case BranchStatus::kSolved: return "solved";
    case BranchStatus::kOutOfReach: return "out of reach";
    case BranchStatus::kJointLimit: return "joint limit";
  }
  return "unknown";
}

OrthoParallelSolver::OrthoParallelSolver(const ArmModel& arm) : arm_(arm) {
  if (!arm.orthoParallel()) {
    throw InputError(arm.source(), 0,
                     "arm '" + arm.name() +
                         "' has no ortho-parallel parameters; the closed-form solver needs them "
                         "(use the numeric solver for general chains)");
  }
  g_ = *arm.orthoParallel();
  X_FL_ = arm.flangeInLastLink().inverse();
  forearm_length_ = std::sqrt(g_.a2 * g_.a2 + g_.c3 * g_.c3);
  forearm_angle_ = std::atan2(g_.a2, g_.c3);
  sin_forearm_ = g_.a2 / forearm_length_;
  for (int j = 0; j < 6; ++j) {
    JointRange& range = ranges_[j];
    range.lower = arm.joint(j).lower;
    range.upper = arm.joint(j).upper;
    // Wrapped values lie in (−π, π]; these turns can bring one into range.
    const int first_turn = static_cast<int>(std::ceil((range.lower - kLimitTolerance - kPi) / kTwoPi));
    const int last_turn = static_cast<int>(std::floor((range.upper + kLimitTolerance + kPi) / kTwoPi));
    range.lower_tolerant = range.lower - kLimitTolerance;
    range.upper_tolerant = range.upper + kLimitTolerance;
    range.first_offset = first_turn * kTwoPi;
    range.candidates = std::max(0, last_turn - first_turn + 1);
  }
  cos_forearm_ = g_.c3 / forearm_length_;
}

IkSolutions OrthoParallelSolver::solve(const Eigen::Isometry3d& X_BF,
                                       const IkOptions& options) const {
  IkSolutions out;
  solve(X_BF, options, out);
  return out;
}

void OrthoParallelSolver::solve(const Eigen::Isometry3d& X_BF, const IkOptions& options,
                                IkSolutions& out) const {
  out.solutions.clear();
  // Field by field: assigning a fresh BranchOutcome copies its joint vector
  // through a library memcpy, eight times per pose.
  for (int index = 0; index < 8; ++index) {
    BranchOutcome& outcome = out.branches[index];
    outcome.branch = ArmBranch::fromIndex(index);
    outcome.status = BranchStatus::kOutOfReach;
    outcome.wrist_singular = false;
    outcome.q.resize(0);
    outcome.limit_joint = -1;
    outcome.limit_value = 0.0;
    outcome.first_solution = 0;
    outcome.solution_count = 0;
  }

  // The last link's origin is the wrist centre C (axes 4, 5, 6 meet there).
  const Eigen::Isometry3d X_B6 = X_BF * X_FL_;
  const Eigen::Vector3d p_BC = X_B6.translation();
  const Eigen::Matrix3d& R_B6 = X_B6.linear();

  const double radial_squared = p_BC.x() * p_BC.x() + p_BC.y() * p_BC.y() - g_.b * g_.b;
  if (radial_squared < 0.0) return;  // inside the cylinder of the lateral offset b
  const double radial = std::sqrt(radial_squared);
  const double planar_squared = p_BC.x() * p_BC.x() + p_BC.y() * p_BC.y();
  const double height = p_BC.z() - g_.c1;
  const double k = forearm_length_;
  const double theta4_reference = g_.sign[3] * options.axis4_reference + g_.zero_offset[3];

  // Every in-limit value of each joint per branch; the solutions are their
  // combinations, written in one pass once all branches are known.
  std::array<std::array<TurnValues, 6>, 8> branch_turns;
  for (int shoulder = 0; shoulder < 2; ++shoulder) {
    const bool front = shoulder == 0;
    // θ1 = atan2(y, x) ∓ atan2(b, r) (− π behind): its sine and cosine follow
    // from the wrist centre by the angle-sum formulas, with no trig calls.
    // On axis 1 (x = y = 0, b = 0) any θ1 serves; take 0 in front, π behind.
    double c1 = front ? 1.0 : -1.0;
    double s1 = 0.0;
    if (planar_squared > 0.0) {
      const double x = p_BC.x();
      const double y = p_BC.y();
      c1 = front ? (x * radial + y * g_.b) / planar_squared : -(x * radial - y * g_.b) / planar_squared;
      s1 = front ? (y * radial - x * g_.b) / planar_squared : -(y * radial + x * g_.b) / planar_squared;
    }
    const double theta1 = arcTangent2(s1, c1);
    // Wrist centre in the arm plane, from axis 2: forward distance and height.
    const double forward = front ? radial - g_.a1 : -(radial + g_.a1);
    const double distance_squared = forward * forward + height * height;
    const double distance = std::sqrt(distance_squared);
    const double cos_bend = (distance_squared - g_.c2 * g_.c2 - k * k) / (2.0 * g_.c2 * k);
    const double cos_lag = (distance_squared + g_.c2 * g_.c2 - k * k) / (2.0 * distance * g_.c2);
    TriangleAngle bend;  // |θ3 + forearm angle|
    TriangleAngle lag;
    if (distance < kLimitTolerance || !triangleAngle(cos_bend, bend) || !triangleAngle(cos_lag, lag)) {
      continue;
    }
    const double elbow_bend = bend.angle;
    const double shoulder_lag = lag.angle;
    const double direction = arcTangent2(forward, height);
    // θ2 + θ3 = (direction − forearm angle) ± (bend − lag): sines and cosines
    // of both parts from the triangle's sides.
    const double sin_direction = forward / distance;
    const double cos_direction = height / distance;
    const double sin_d = sin_direction * cos_forearm_ - cos_direction * sin_forearm_;
    const double cos_d = cos_direction * cos_forearm_ + sin_direction * sin_forearm_;
    const double sin_e = bend.sine * lag.cosine - bend.cosine * lag.sine;
    const double cos_e = bend.cosine * lag.cosine + bend.sine * lag.sine;

    for (const bool elbow_up : {true, false}) {
      // A positive bend puts the elbow above the shoulder–wrist line when the
      // arm is in front, below it when the arm reaches back.
      const double sign = elbow_up == front ? 1.0 : -1.0;
      const double theta2 = direction - sign * shoulder_lag;
      const double theta3 = sign * elbow_bend - forearm_angle_;
      const double s23 = sin_d * cos_e + sign * cos_d * sin_e;
      const double c23 = cos_d * cos_e - sign * sin_d * sin_e;

      // Wrist rotation W = R_03ᵀ R_B6 with R_03 = Rz(θ1) Ry(θ2 + θ3).
      Eigen::Matrix3d R_03;
      R_03 << c1 * c23, -s1, c1 * s23,  //
          s1 * c23, c1, s1 * s23,       //
          -s23, 0.0, c23;
      const Eigen::Matrix3d W = R_03.transpose() * R_B6;

      // W = Rz(θ4) Ry(θ5) Rz(θ6): the third column is (c4 s5, s4 s5, c5).
      // Its entries give the sines and cosines directly (W is orthonormal to
      // rounding), which saves four sincos calls per arm branch.
      const double s5 = std::sqrt(W(0, 2) * W(0, 2) + W(1, 2) * W(1, 2));
      const double c5 = W(2, 2);
      const double theta5 = arcTangent2(s5, c5);
      const bool singular = s5 < options.wrist_singular_sine;
      const double theta4 = singular ? theta4_reference : arcTangent2(W(1, 2), W(0, 2));
      // The singular wrist is rare: its sine and cosine only then.
      const double s4 = singular ? std::sin(theta4_reference) : W(1, 2) / s5;
      const double c4 = singular ? std::cos(theta4_reference) : W(0, 2) / s5;
      // Axis 6 given axes 4 and 5, so that the pose is exact whatever the
      // accuracy of axis 4 near the singularity: Rz(θ6) = Ry(θ5)ᵀ Rz(θ4)ᵀ W.
      const double m00 = c5 * (c4 * W(0, 0) + s4 * W(1, 0)) - s5 * W(2, 0);
      const double m10 = -s4 * W(0, 0) + c4 * W(1, 0);
      const double theta6 = arcTangent2(m10, m00);

      // Axes 1–3 are shared by both wrist branches: map and expand them once.
      std::array<double, 6> q;
      std::array<TurnValues, 3> arm_turns;
      const double arm_theta[3] = {theta1, theta2, theta3};
      int arm_limit_joint = -1;
      for (int j = 0; j < 3; ++j) {
        q[j] = wrapToPi(g_.sign[j] * (arm_theta[j] - g_.zero_offset[j]));
        findTurns(ranges_[j], q[j], arm_turns[j]);
        if (arm_turns[j].count == 0 && arm_limit_joint < 0) arm_limit_joint = j;
      }

      for (int flip = 0; flip < 2; ++flip) {
        // The flipped wrist reaches the same rotation with θ5 negated and
        // axes 4 and 6 half a turn round.
        const double wrist_theta[3] = {flip == 0 ? theta4 : theta4 + kPi,
                                       flip == 0 ? theta5 : -theta5,
                                       flip == 0 ? theta6 : theta6 - kPi};
        ArmBranch branch;
        branch.shoulder = front ? ShoulderSide::kFront : ShoulderSide::kBack;
        branch.elbow = elbow_up ? ElbowSide::kUp : ElbowSide::kDown;
        branch.wrist = flip == 0 ? WristSide::kNotFlipped : WristSide::kFlipped;
        BranchOutcome& outcome = out.branches[branch.index()];
        outcome.wrist_singular = singular;
        std::array<TurnValues, 6>& turns = branch_turns[branch.index()];
        for (int j = 0; j < 3; ++j) turns[j] = arm_turns[j];
        int limit_joint = arm_limit_joint;
        for (int j = 3; j < 6; ++j) {
          q[j] = wrapToPi(g_.sign[j] * (wrist_theta[j - 3] - g_.zero_offset[j]));
          if (limit_joint >= 0) continue;
          findTurns(ranges_[j], q[j], turns[j]);
          if (turns[j].count == 0) limit_joint = j;
        }
        outcome.q = Eigen::Map<const Eigen::Matrix<double, 6, 1>>(q.data());
        if (limit_joint >= 0) {
          outcome.status = BranchStatus::kJointLimit;
          outcome.limit_joint = limit_joint;
          outcome.limit_value = nearestToRange(limit_joint, q[limit_joint]);
          continue;
        }
        outcome.status = BranchStatus::kSolved;
      }
    }
  }
  appendSolutions(branch_turns, out);
}

double OrthoParallelSolver::nearestToRange(int joint, double q) const {
  const JointRange& range = ranges_[joint];
  const double below = q + std::floor((range.lower - q) / kTwoPi) * kTwoPi;
  const double above = below + kTwoPi;
  return (range.lower - below) < (above - range.upper) ? below : above;
}

void OrthoParallelSolver::appendSolutions(
    const std::array<std::array<TurnValues, 6>, 8>& branch_turns, IkSolutions& out) const {
  for (BranchOutcome& outcome : out.branches) {
    if (outcome.status != BranchStatus::kSolved) continue;
    const int branch_index = outcome.branch.index();
    const std::array<TurnValues, 6>& turns = branch_turns[branch_index];
    // Each solution starts from the first value of every joint; only the
    // joints with several values (axis 6, sometimes axis 4) then vary.
    // Copying a prepared solution measured faster than constructing each in
    // place.
    IkSolution solution;
    solution.branch_index = branch_index;
    solution.q.resize(6);
    std::array<int, 6> varying;
    int varying_count = 0;
    int count = 1;
    for (int j = 0; j < 6; ++j) {
      solution.q[j] = turns[j].value[0];
      count *= turns[j].count;
      if (turns[j].count > 1) varying[varying_count++] = j;
    }
    outcome.first_solution = static_cast<int>(out.solutions.size());
    outcome.solution_count = count;
    std::array<int, 6> pick{};
    for (int s = 0; s < count; ++s) {
      for (int v = 0; v < varying_count; ++v) {
        solution.q[varying[v]] = turns[varying[v]].value[static_cast<std::size_t>(pick[v])];
      }
      out.solutions.push_back(solution);
      // Odometer over the varying joints, the last fastest.
      for (int v = varying_count - 1; v >= 0 && ++pick[v] == turns[varying[v]].count; --v) pick[v] = 0;
    }
  }
}

}  // namespace tw::kinematics
