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

double wrapToPi(double angle) {
  angle = std::remainder(angle, kTwoPi);
  return angle <= -kPi ? angle + kTwoPi : angle;
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
  forearm_length_ = std::hypot(g_.a2, g_.c3);
  forearm_angle_ = std::atan2(g_.a2, g_.c3);
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
  const double azimuth = std::atan2(p_BC.y(), p_BC.x());
  const double offset_angle = std::atan2(g_.b, radial);
  const double height = p_BC.z() - g_.c1;
  const double k = forearm_length_;
  const double theta4_reference = g_.sign[3] * options.axis4_reference + g_.zero_offset[3];

  for (int shoulder = 0; shoulder < 2; ++shoulder) {
    const bool front = shoulder == 0;
    const double theta1 = front ? azimuth - offset_angle : azimuth + offset_angle - kPi;
    // Wrist centre in the arm plane, from axis 2: forward distance and height.
    const double forward = front ? radial - g_.a1 : -(radial + g_.a1);
    const double distance_squared = forward * forward + height * height;
    const double distance = std::sqrt(distance_squared);
    double elbow_bend = 0.0;  // θ3 + forearm angle, magnitude
    double shoulder_lag = 0.0;
    if (distance < kLimitTolerance ||
        !safeAcos((distance_squared - g_.c2 * g_.c2 - k * k) / (2.0 * g_.c2 * k), elbow_bend) ||
        !safeAcos((distance_squared + g_.c2 * g_.c2 - k * k) / (2.0 * distance * g_.c2),
                  shoulder_lag)) {
      continue;
    }
    const double direction = std::atan2(forward, height);
    const double s1 = std::sin(theta1);
    const double c1 = std::cos(theta1);

    for (const bool elbow_up : {true, false}) {
      // A positive bend puts the elbow above the shoulder–wrist line when the
      // arm is in front, below it when the arm reaches back.
      const double sign = elbow_up == front ? 1.0 : -1.0;
      const double theta2 = direction - sign * shoulder_lag;
      const double theta3 = sign * elbow_bend - forearm_angle_;

      // Wrist rotation W = R_03ᵀ R_B6 with R_03 = Rz(θ1) Ry(θ2 + θ3).
      const double s23 = std::sin(theta2 + theta3);
      const double c23 = std::cos(theta2 + theta3);
      Eigen::Matrix3d R_03;
      R_03 << c1 * c23, -s1, c1 * s23,  //
          s1 * c23, c1, s1 * s23,       //
          -s23, 0.0, c23;
      const Eigen::Matrix3d W = R_03.transpose() * R_B6;

      // W = Rz(θ4) Ry(θ5) Rz(θ6): the third column is (c4 s5, s4 s5, c5).
      const double sin5 = std::hypot(W(0, 2), W(1, 2));
      const double theta5 = std::atan2(sin5, W(2, 2));
      const bool singular = sin5 < options.wrist_singular_sine;
      const double theta4 = singular ? theta4_reference : std::atan2(W(1, 2), W(0, 2));
      // Axis 6 given axes 4 and 5, so that the pose is exact whatever the
      // accuracy of axis 4 near the singularity: Rz(θ6) = Ry(θ5)ᵀ Rz(θ4)ᵀ W.
      const double s4 = std::sin(theta4);
      const double c4 = std::cos(theta4);
      const double s5 = std::sin(theta5);
      const double c5 = std::cos(theta5);
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
  // since ranges are at most 720°).
  std::array<std::array<double, 3>, 6> values;
  std::array<int, 6> counts{};
  for (int j = 0; j < 6; ++j) {
    const double lower = arm_.joint(j).lower;
    const double upper = arm_.joint(j).upper;
    const double q = outcome.q[j];
    for (double turn = std::ceil((lower - kLimitTolerance - q) / kTwoPi);
         q + turn * kTwoPi <= upper + kLimitTolerance; turn += 1.0) {
      if (counts[j] < 3) values[j][counts[j]++] = std::clamp(q + turn * kTwoPi, lower, upper);
    }
    if (counts[j] == 0) {
      // Report the equivalent value closest to the range.
      const double below = q + std::floor((lower - q) / kTwoPi) * kTwoPi;
      const double above = below + kTwoPi;
      outcome.status = BranchStatus::kJointLimit;
      outcome.limit_joint = j;
      outcome.limit_value = (lower - below) < (above - upper) ? below : above;
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
