#include "kinematics/ortho_parallel_ik.hpp"

#include <algorithm>
#include <cmath>

#include "kinematics/input_error.hpp"

namespace tw::kinematics {
namespace {

constexpr double kPi = 3.14159265358979323846;
constexpr double kTwoPi = 2.0 * kPi;
// A cosine computed a few ulps beyond ±1 at the stretched or folded arm is
// rounding, not a miss: clamp within this, report out of reach beyond it.
constexpr double kCosineRounding = 1e-12;
// Joint values within this of a limit count as at the limit (and are clamped
// onto it): far below any drive's resolution, above rounding of the formulas.
constexpr double kLimitTolerance = 1e-9;

/// Wraps to (−π, π]. The formulas give angles within a few turns, so
/// stepping is cheaper than std::remainder here.
double wrapToPi(double angle) {
  while (angle > kPi) angle -= kTwoPi;
  while (angle <= -kPi) angle += kTwoPi;
  return angle;
}

/// acos that reports out-of-range arguments instead of returning NaN.
bool safeAcos(double cosine, double& angle) {
  if (std::abs(cosine) > 1.0 + kCosineRounding) return false;
  angle = std::acos(std::clamp(cosine, -1.0, 1.0));
  return true;
}

/// The geometric angles θ1..θ6 of one branch before mapping to joint values.
using Angles = Eigen::Matrix<double, 6, 1>;

}  // namespace

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
    lower_[j] = arm.joint(j).lower;
    upper_[j] = arm.joint(j).upper;
    // Wrapped values lie in (−π, π]; these turns can bring one into range.
    first_turn_[j] = static_cast<int>(std::ceil((arm.joint(j).lower - kLimitTolerance - kPi) / kTwoPi));
    last_turn_[j] = static_cast<int>(std::floor((arm.joint(j).upper + kLimitTolerance + kPi) / kTwoPi));
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
  for (int index = 0; index < 8; ++index) {
    BranchOutcome& outcome = out.branches[index];
    outcome = BranchOutcome{};
    outcome.branch = ArmBranch::fromIndex(index);
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
  const double sin_theta4_reference = std::sin(theta4_reference);
  const double cos_theta4_reference = std::cos(theta4_reference);

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
    const double theta1 = std::atan2(s1, c1);
    // Wrist centre in the arm plane, from axis 2: forward distance and height.
    const double forward = front ? radial - g_.a1 : -(radial + g_.a1);
    const double distance_squared = forward * forward + height * height;
    const double distance = std::sqrt(distance_squared);
    const double cos_bend = (distance_squared - g_.c2 * g_.c2 - k * k) / (2.0 * g_.c2 * k);
    const double cos_lag = (distance_squared + g_.c2 * g_.c2 - k * k) / (2.0 * distance * g_.c2);
    double elbow_bend = 0.0;  // |θ3 + forearm angle|
    double shoulder_lag = 0.0;
    if (distance < kLimitTolerance || !safeAcos(cos_bend, elbow_bend) ||
        !safeAcos(cos_lag, shoulder_lag)) {
      continue;
    }
    const double direction = std::atan2(forward, height);
    // θ2 + θ3 = (direction − forearm angle) ± (bend − lag): sines and cosines
    // of both parts from the triangle's sides.
    const double sin_direction = forward / distance;
    const double cos_direction = height / distance;
    const double sin_d = sin_direction * cos_forearm_ - cos_direction * sin_forearm_;
    const double cos_d = cos_direction * cos_forearm_ + sin_direction * sin_forearm_;
    const double sin_bend = std::sin(elbow_bend);
    const double sin_lag = std::sin(shoulder_lag);
    const double cb = std::cos(elbow_bend);
    const double cl = std::cos(shoulder_lag);
    const double sin_e = sin_bend * cl - cb * sin_lag;
    const double cos_e = cb * cl + sin_bend * sin_lag;

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
      const double theta5 = std::atan2(s5, c5);
      const bool singular = s5 < options.wrist_singular_sine;
      const double theta4 = singular ? theta4_reference : std::atan2(W(1, 2), W(0, 2));
      const double s4 = singular ? sin_theta4_reference : W(1, 2) / s5;
      const double c4 = singular ? cos_theta4_reference : W(0, 2) / s5;
      // Axis 6 given axes 4 and 5, so that the pose is exact whatever the
      // accuracy of axis 4 near the singularity: Rz(θ6) = Ry(θ5)ᵀ Rz(θ4)ᵀ W.
      const double m00 = c5 * (c4 * W(0, 0) + s4 * W(1, 0)) - s5 * W(2, 0);
      const double m10 = -s4 * W(0, 0) + c4 * W(1, 0);
      const double theta6 = std::atan2(m10, m00);

      for (int flip = 0; flip < 2; ++flip) {
        Angles theta;
        if (flip == 0) {
          theta << theta1, theta2, theta3, theta4, theta5, theta6;
        } else {
          theta << theta1, theta2, theta3, theta4 + kPi, -theta5, theta6 - kPi;
        }
        ArmBranch branch;
        branch.shoulder = front ? ShoulderSide::kFront : ShoulderSide::kBack;
        branch.elbow = elbow_up ? ElbowSide::kUp : ElbowSide::kDown;
        branch.wrist = flip == 0 ? WristSide::kNotFlipped : WristSide::kFlipped;
        BranchOutcome& outcome = out.branches[branch.index()];
        outcome.wrist_singular = singular;
        outcome.q.resize(6);
        for (int j = 0; j < 6; ++j) {
          outcome.q[j] = wrapToPi(g_.sign[j] * (theta[j] - g_.zero_offset[j]));
        }
        expandTurns(outcome, out);
      }
    }
  }
}

void OrthoParallelSolver::expandTurns(BranchOutcome& outcome, IkSolutions& out) const {
  // Per joint, the equivalent values q + 2πk inside the limits (at most 3,
  // since ranges are at most 720°); the candidate turns k are precomputed.
  std::array<std::array<double, 3>, 6> values;
  std::array<int, 6> counts{};
  for (int j = 0; j < 6; ++j) {
    const double q = outcome.q[j];
    double value = q + first_turn_[j] * kTwoPi;
    for (int turn = first_turn_[j]; turn <= last_turn_[j]; ++turn, value += kTwoPi) {
      if (value < lower_[j] - kLimitTolerance) continue;
      if (value > upper_[j] + kLimitTolerance) break;
      values[j][counts[j]++] = std::clamp(value, lower_[j], upper_[j]);
    }
    if (counts[j] == 0) {
      // Report the equivalent value closest to the range.
      const double below = q + std::floor((lower_[j] - q) / kTwoPi) * kTwoPi;
      const double above = below + kTwoPi;
      outcome.status = BranchStatus::kJointLimit;
      outcome.limit_joint = j;
      outcome.limit_value = (lower_[j] - below) < (above - upper_[j]) ? below : above;
      return;
    }
  }
  outcome.status = BranchStatus::kSolved;
  outcome.first_solution = static_cast<int>(out.solutions.size());
  const int branch_index = outcome.branch.index();
  std::array<int, 6> pick{};
  while (true) {
    IkSolution& solution = out.solutions.emplace_back();
    solution.branch_index = branch_index;
    solution.q.resize(6);
    for (int j = 0; j < 6; ++j) solution.q[j] = values[j][pick[j]];
    // Odometer over the per-joint choices, last joint fastest.
    int j = 5;
    while (j >= 0 && ++pick[j] == counts[j]) pick[j--] = 0;
    if (j < 0) break;
  }
  outcome.solution_count = static_cast<int>(out.solutions.size()) - outcome.first_solution;
}

}  // namespace tw::kinematics
