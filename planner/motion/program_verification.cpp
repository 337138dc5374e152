#include "planner/motion/program_verification.hpp"

#include <cmath>
#include <limits>
#include <memory>
#include <optional>
#include <stdexcept>
#include <variant>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"
#include "kinematics/common/number_text.hpp"
#include "kinematics/forward_kinematics.hpp"
#include "kinematics/ortho_parallel_ik.hpp"
#include "planner/motion/compact_move.hpp"
#include "planner/report_text.hpp"

namespace tw::planner {
namespace {

using kinematics::JointVector;

constexpr double kDegree = kPi / 180.0;
/// A stored joint vector is a solution of a branch when it matches one of
/// the closed form's solutions this closely [rad]: rounding of the file's
/// 4 decimals of a degree (1e-4° ≈ 1.7e-6 rad) with room to spare.
constexpr double kSameJoints = 1e-5;

double rotationAngle(const Eigen::Matrix3d& R_a, const Eigen::Matrix3d& R_b) {
  const double c = 0.5 * ((R_a.transpose() * R_b).trace() - 1.0);
  return std::acos(std::max(-1.0, std::min(1.0, c)));
}

class ProgramReplay {
 public:
  ProgramReplay(const Program& program, const Job& job, const VerifyOptions& options)
      : program_(program),
        job_(job),
        options_(options),
        arm_(job.cell.arm),
        ik_(arm_),
        X_WB_(job.cell.frames.X_W(job.cell.arm_frame)) {
    if (program.metadata.joints.size() != static_cast<std::size_t>(arm_.jointCount())) {
      throw InputError(job.source, 0,
                       "the program has " + std::to_string(program.metadata.joints.size()) +
                           " joints and the arm of the job's cell " + std::to_string(arm_.jointCount()) +
                           "; expected a program for this cell's arm");
    }
  }

  std::vector<RecordProblem> run() {
    std::optional<JointVector> previous;
    for (std::size_t i = 0; i < program_.records.size(); ++i) {
      const auto* motion = std::get_if<MotionRecord>(&program_.records[i]);
      if (motion == nullptr) continue;
      current_ = {static_cast<int>(i) + 1, toString(motion->kind), motion->seam, ""};
      const std::optional<JointVector> reached = checkTarget(*motion);
      if (previous && reached) {
        if (motion->kind == MotionKind::kJointMove) {
          checkJointMove(*previous, *motion);
        } else {
          checkCartesianMove(*previous, *reached, *motion);
        }
      }
      previous = reached;
    }
    return std::move(problems_);
  }

 private:
  struct ToolWorlds {
    const Tool* tool = nullptr;
    std::optional<double> contact_length;
    std::unique_ptr<collision::CollisionWorld> process;
    std::unique_ptr<collision::CollisionWorld> transit;
    std::unique_ptr<collision::CollisionWorkspace> process_workspace;
    std::unique_ptr<collision::CollisionWorkspace> transit_workspace;
  };

  void report(const std::string& reason) {
    RecordProblem problem = current_;
    problem.reason = reason;
    problems_.push_back(std::move(problem));
  }

  /// The contact part (wire stick-out, bead) of the job's seam `name`; none
  /// for moves outside seams and for paint.
  std::optional<double> contactLengthOf(const std::string& seam) const {
    for (const JobTask& task : job_.tasks) {
      const auto* spec = std::get_if<SeamSpec>(&task);
      if (spec != nullptr && spec->name == seam) return contactLength(spec->process);
    }
    return std::nullopt;
  }

  ToolWorlds& worldsFor(const MotionRecord& motion) {
    const std::string& tool_name = motion.tool;
    const std::optional<double> contact_length = contactLengthOf(motion.seam);
    for (ToolWorlds& worlds : tools_) {
      if (worlds.tool->name == tool_name && worlds.contact_length == contact_length) return worlds;
    }
    const Tool* tool = job_.cell.findTool(tool_name);
    if (tool == nullptr) {
      throw InputError(job_.cell.source, 0,
                       "the program uses tool '" + tool_name + "', which the cell does not define");
    }
    ToolWorlds worlds;
    worlds.tool = tool;
    worlds.contact_length = contact_length;
    CellCollisionOptions process = options_.collision;
    process.contact_length = contact_length;
    worlds.process = std::make_unique<collision::CollisionWorld>(
        buildCellCollisionWorld(job_.cell, *tool, process));
    CellCollisionOptions transit = options_.collision;
    transit.clearance_margin = job_.transit.clearance;
    transit.contact_length.reset();
    worlds.transit = std::make_unique<collision::CollisionWorld>(
        buildCellCollisionWorld(job_.cell, *tool, transit));
    worlds.process_workspace = std::make_unique<collision::CollisionWorkspace>(*worlds.process);
    worlds.transit_workspace = std::make_unique<collision::CollisionWorkspace>(*worlds.transit);
    tools_.push_back(std::move(worlds));
    return tools_.back();
  }

  /// X_RB: the arm base in the record's frame R.
  Eigen::Isometry3d X_RB(const std::string& frame) const {
    return job_.cell.frames.X_W(frame).inverse() * X_WB_;
  }

  Eigen::Isometry3d tcpPose(const JointVector& q, const MotionRecord& motion, const Tool& tool) const {
    return X_RB(motion.frame) * kinematics::flangePose(arm_, q) * tool.X_FT;
  }

  void checkJoints(const JointVector& q, const char* what) {
    for (int j = 0; j < arm_.jointCount(); ++j) {
      const kinematics::JointSpec& joint = arm_.joint(j);
      if (q[j] < joint.lower || q[j] > joint.upper) {
        const bool revolute = joint.type == kinematics::JointType::kRevolute;
        const double scale = revolute ? 1.0 / kDegree : 1000.0;
        report(std::string(what) + " joint " + joint.name + " at " + formatFixed(q[j] * scale, 2) +
               (revolute ? " deg" : " mm") + " is past its limit (" +
               formatFixed(joint.lower * scale, 1) + " to " + formatFixed(joint.upper * scale, 1) + ")");
      }
    }
  }

  void checkStoredPose(const JointVector& q, const Eigen::Isometry3d& X_RT, const MotionRecord& motion,
                       const Tool& tool, const char* what) {
    const Eigen::Isometry3d X_RT_fk = tcpPose(q, motion, tool);
    const double off = (X_RT_fk.translation() - X_RT.translation()).norm();
    const double turn = rotationAngle(X_RT_fk.linear(), X_RT.linear());
    if (off > options_.pose_position_tolerance || turn > options_.pose_angle_tolerance) {
      report(std::string("the stored ") + what + " pose is not where its joints put the TCP (off by " +
             formatFixed(off * 1000.0, 3) + " mm and " + formatFixed(turn / kDegree, 4) +
             " deg): the cell changed since planning, or the file was edited");
    }
  }

  /// Where the arm is after `motion`: a joint move goes to its stored
  /// joints; a linear or circular move to its stored pose, which the
  /// controller solves in the branch of the stored joints (nullopt when it
  /// cannot, reported).
  std::optional<JointVector> checkTarget(const MotionRecord& motion) {
    ToolWorlds& worlds = worldsFor(motion);
    checkJoints(motion.q, "target:");
    if (motion.kind == MotionKind::kJointMove) {
      checkStoredPose(motion.q, motion.X_RT, motion, *worlds.tool, "target");
      return motion.q;
    }
    if (motion.via) {
      checkJoints(motion.via->q_via, "via point:");
      if (!resolve(motion.via->X_RV, motion.via->q_via, motion, *worlds.tool, "via point")) return std::nullopt;
    }
    return resolve(motion.X_RT, motion.q, motion, *worlds.tool, "target");
  }

  /// The joints that reach the stored pose `X_RT` in the current cell in
  /// the branch of `stored`, nearest to it; reports a pose out of reach in
  /// that branch, and stored joints that do not reach the stored pose (the
  /// cell changed since planning, or the file was edited).
  std::optional<JointVector> resolve(const Eigen::Isometry3d& X_RT, const JointVector& stored,
                                     const MotionRecord& motion, const Tool& tool, const char* what) {
    const std::optional<int> branch = branchOf(stored);
    if (!branch) {
      report(std::string("the stored ") + what + " joints are not a solution of the arm's inverse kinematics");
      return std::nullopt;
    }
    ik_.solve(X_RB(motion.frame).inverse() * X_RT * tool.X_FT.inverse(), kinematics::IkOptions{},
              solutions_);
    const kinematics::BranchOutcome& outcome = solutions_.branches[*branch];
    std::optional<JointVector> nearest;
    double distance = std::numeric_limits<double>::infinity();
    for (int s = 0; s < outcome.solution_count; ++s) {
      const JointVector& q = solutions_.solutions[outcome.first_solution + s].q;
      const double d = (q - stored).cwiseAbs().maxCoeff();
      if (d < distance) {
        distance = d;
        nearest = q;
      }
    }
    if (!nearest) {
      report(std::string("the ") + what + " is out of reach in its branch (" +
             kinematics::ArmBranch::fromIndex(*branch).toString() + "): " +
             kinematics::toString(outcome.status));
      return std::nullopt;
    }
    checkStoredPose(stored, X_RT, motion, tool, what);
    return nearest;
  }

  void checkJointMove(const JointVector& from, const MotionRecord& motion) {
    ToolWorlds& worlds = worldsFor(motion);
    const collision::SegmentResult segment =
        worlds.transit->checkSegment(from, motion.q, *worlds.transit_workspace);
    if (!segment.valid()) {
      report("collision at " + formatFixed(segment.fraction, 3) + " of the joint move: " +
             describeState(*worlds.transit, segment.state));
    }
  }

  /// The branch whose closed-form solutions include q, if any.
  std::optional<int> branchOf(const JointVector& q) {
    ik_.solve(kinematics::flangePose(arm_, q), kinematics::IkOptions{}, solutions_);
    for (const kinematics::IkSolution& solution : solutions_.solutions) {
      if ((solution.q - q).cwiseAbs().maxCoeff() <= kSameJoints) return solution.branch_index;
    }
    return std::nullopt;
  }

  void checkCartesianMove(const JointVector& from, const JointVector& to, const MotionRecord& motion) {
    ToolWorlds& worlds = worldsFor(motion);
    const std::optional<int> branch = branchOf(to);
    if (!branch) {
      report("the target joints are not a solution of the arm's inverse kinematics");
      return;
    }
    const std::optional<int> start_branch = branchOf(from);
    if (start_branch != branch) {
      report("the move starts in another branch than it ends: "
             "a linear or circular move cannot change branch");
      return;
    }
    std::vector<Eigen::Isometry3d> poses = {tcpPose(from, motion, *worlds.tool)};
    CompactMove move{MoveShape::kLine, 0, 1, -1};
    if (motion.kind == MotionKind::kCircularMove && motion.via) {
      poses.push_back(motion.via->X_RV);
      move = CompactMove{MoveShape::kArc, 0, 2, 1};
    }
    poses.push_back(motion.X_RT);
    if ((poses.back().translation() - poses.front().translation()).norm() == 0.0 &&
        motion.kind == MotionKind::kCircularMove) {
      report("a circular move that ends where it starts");
      return;
    }
    FollowSetting setting;
    setting.world = worlds.process.get();
    setting.X_BR = X_RB(motion.frame).inverse();
    setting.X_FT = worlds.tool->X_FT;
    setting.branch_index = *branch;
    MoveFollower follower(setting, options_.limits);
    const auto pose_at = [&](double u) {
      if ((poses.back().translation() - poses.front().translation()).norm() == 0.0) {
        // A turn on the spot: orientation by slerp, position held.
        Eigen::Isometry3d pose = poses.front();
        pose.linear() = Eigen::Quaterniond(poses.front().linear())
                            .slerp(u, Eigen::Quaterniond(poses.back().linear()))
                            .toRotationMatrix();
        return pose;
      }
      return interpolateMove(poses, move, u);
    };
    FollowOutcome outcome = FollowFailure{};
    try {
      outcome = follower.follow(pose_at, from, to, *worlds.process_workspace);
    } catch (const std::invalid_argument& error) {
      report(std::string("the move's path is not defined: ") + error.what());
      return;
    }
    if (const FollowFailure* failure = std::get_if<FollowFailure>(&outcome)) {
      report("at " + formatFixed(failure->fraction, 3) + " of the move: " + failure->reason);
    }
  }

  const Program& program_;
  const Job& job_;
  const VerifyOptions& options_;
  const kinematics::ArmModel& arm_;
  kinematics::OrthoParallelSolver ik_;
  kinematics::IkSolutions solutions_;
  const Eigen::Isometry3d X_WB_;
  std::vector<ToolWorlds> tools_;
  RecordProblem current_;
  std::vector<RecordProblem> problems_;
};

}  // namespace

std::vector<RecordProblem> verifyProgram(const Program& program, const Job& job,
                                         const VerifyOptions& options) {
  if (!job.cell.arm.orthoParallel()) {
    throw InputError(job.cell.arm.source(), 0,
                     "verify needs an arm with ortho-parallel parameters (the closed-form solver)");
  }
  return ProgramReplay(program, job, options).run();
}

}  // namespace tw::planner
