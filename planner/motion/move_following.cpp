#include "planner/motion/move_following.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/number_text.hpp"
#include "kinematics/forward_kinematics.hpp"
#include "planner/report_text.hpp"

namespace tw::planner {
namespace {

using kinematics::JointVector;

constexpr double kInfinity = std::numeric_limits<double>::infinity();
constexpr double kDegree = kPi / 180.0;
/// Samples taken to measure a path's length and turn before choosing steps:
/// lines and arcs with slerp change uniformly, so a few are exact; more
/// guard a caller's path that does not.
constexpr int kMeasureSamples = 32;

double rotationAngle(const Eigen::Matrix3d& R_a, const Eigen::Matrix3d& R_b) {
  const double c = 0.5 * ((R_a.transpose() * R_b).trace() - 1.0);
  return std::acos(std::clamp(c, -1.0, 1.0));
}

double wristAngle(const kinematics::OrthoParallelGeometry& g, const JointVector& q) {
  const double theta5 = g.sign[4] * q[4] + g.zero_offset[4];
  return std::abs(theta5 - kPi * std::round(theta5 / kPi));
}

const kinematics::ArmModel& armOf(const FollowSetting& setting) {
  if (setting.world == nullptr) throw std::invalid_argument("move follower: the setting has no collision world");
  if (!setting.world->arm().orthoParallel()) {
    throw std::invalid_argument("move follower: the arm has no ortho-parallel parameters");
  }
  return setting.world->arm();
}

}  // namespace

MoveFollower::MoveFollower(const FollowSetting& setting, const FollowLimits& limits)
    : setting_(setting), limits_(limits), ik_(armOf(setting)), X_TF_(setting.X_FT.inverse()) {}

std::vector<double> MoveFollower::checkFractions(
    const std::function<Eigen::Isometry3d(double)>& pose_at, const std::vector<double>& extra) const {
  double length = 0.0;
  double turn = 0.0;
  Eigen::Isometry3d previous = pose_at(0.0);
  for (int k = 1; k <= kMeasureSamples; ++k) {
    const Eigen::Isometry3d pose = pose_at(static_cast<double>(k) / kMeasureSamples);
    length += (pose.translation() - previous.translation()).norm();
    turn += rotationAngle(previous.linear(), pose.linear());
    previous = pose;
  }
  const double pieces_by_length = std::ceil(length / limits_.max_step - 1e-9);
  const double pieces_by_turn = std::ceil(turn / limits_.max_angle_step - 1e-9);
  const int pieces = static_cast<int>(std::max({1.0, pieces_by_length, pieces_by_turn}));
  std::vector<double> fractions;
  fractions.reserve(static_cast<std::size_t>(pieces) + 1 + extra.size());
  for (int k = 0; k <= pieces; ++k) fractions.push_back(static_cast<double>(k) / pieces);
  for (const double u : extra) {
    if (u > 0.0 && u < 1.0) fractions.push_back(u);
  }
  std::sort(fractions.begin(), fractions.end());
  fractions.erase(std::unique(fractions.begin(), fractions.end()), fractions.end());
  return fractions;
}

FollowOutcome MoveFollower::follow(const std::function<Eigen::Isometry3d(double)>& pose_at,
                                   const JointVector& q_start, const JointVector& q_end,
                                   collision::CollisionWorkspace& workspace,
                                   const std::vector<double>& extra_fractions) {
  const kinematics::ArmModel& arm = setting_.world->arm();
  const kinematics::OrthoParallelGeometry& geometry = *arm.orthoParallel();
  FollowedPath path;
  path.fractions = checkFractions(pose_at, extra_fractions);
  path.q.reserve(path.fractions.size());
  path.q.push_back(q_start);
  Eigen::Isometry3d X_BT_previous = setting_.X_BR * pose_at(0.0);
  const std::size_t last = path.fractions.size() - 1;
  for (std::size_t k = 1; k <= last; ++k) {
    const double u = path.fractions[k];
    const Eigen::Isometry3d X_BT = setting_.X_BR * pose_at(u);
    const JointVector& from = path.q.back();
    JointVector next = q_end;
    if (k < last) {
      ik_.solve(X_BT * X_TF_, kinematics::IkOptions{}, solutions_);
      const kinematics::BranchOutcome& outcome = solutions_.branches[setting_.branch_index];
      double nearest = kInfinity;
      for (int s = 0; s < outcome.solution_count; ++s) {
        const JointVector& q = solutions_.solutions[outcome.first_solution + s].q;
        const double d = (q - from).cwiseAbs().maxCoeff();
        if (d < nearest) {
          nearest = d;
          next = q;
        }
      }
      if (nearest == kInfinity) {
        return FollowFailure{u, "the branch has no in-limit solution here (" +
                                    std::string(kinematics::toString(outcome.status)) + ")"};
      }
      if (wristAngle(geometry, next) < limits_.wrist_hard_margin) {
        return FollowFailure{u, "axis 5 comes within " +
                                    formatFixed(limits_.wrist_hard_margin / kDegree, 1) +
                                    " deg of its singularity"};
      }
    }
    const double travel = (X_BT.translation() - X_BT_previous.translation()).norm() +
                          limits_.rotation_lever * rotationAngle(X_BT_previous.linear(), X_BT.linear());
    const double bound = limits_.joint_rate * travel + limits_.joint_step_floor;
    Eigen::Index joint = 0;
    const double jump = (next - from).cwiseAbs().maxCoeff(&joint);
    if (jump > bound) {
      return FollowFailure{u, "joint " + arm.joint(static_cast<int>(joint)).name + " moves " +
                                  formatFixed(jump / kDegree, 2) + " deg in one step of " +
                                  formatFixed(travel * 1000.0, 2) +
                                  " mm (a branch change or wrist flip)"};
    }
    const double u_mid = 0.5 * (path.fractions[k - 1] + u);
    const Eigen::Isometry3d X_BT_mid = setting_.X_BR * pose_at(u_mid);
    const Eigen::Isometry3d X_BT_fk = kinematics::flangePose(arm, 0.5 * (from + next)) * setting_.X_FT;
    if ((X_BT_fk.translation() - X_BT_mid.translation()).norm() > limits_.continuity_position ||
        rotationAngle(X_BT_fk.linear(), X_BT_mid.linear()) > limits_.continuity_angle) {
      return FollowFailure{u_mid, "the joint step leaves the path (midpoint off by more than " +
                                      formatFixed(limits_.continuity_position * 1000.0, 2) +
                                      " mm or " + formatFixed(limits_.continuity_angle / kDegree, 2) +
                                      " deg)"};
    }
    path.q.push_back(next);
    X_BT_previous = X_BT;
  }
  for (std::size_t k = 1; k <= last; ++k) {
    const collision::SegmentResult segment =
        setting_.world->checkSegment(path.q[k - 1], path.q[k], workspace);
    if (!segment.valid()) {
      const double u = path.fractions[k - 1] + segment.fraction * (path.fractions[k] - path.fractions[k - 1]);
      return FollowFailure{u, "collision: " + describeState(*setting_.world, segment.state)};
    }
  }
  return path;
}

}  // namespace tw::planner
