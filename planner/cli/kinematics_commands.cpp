#include "planner/cli/kinematics_commands.hpp"

#include <cstdio>
#include <memory>
#include <string>
#include <vector>

#include "kinematics/arm_loader.hpp"
#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"
#include "kinematics/common/rotations.hpp"
#include "kinematics/forward_kinematics.hpp"
#include "kinematics/ortho_parallel_ik.hpp"
#include "kinematics/reach_shell.hpp"
#include "kinematics/singularity.hpp"
#include "kinematics/urdf_chain.hpp"
#include "planner/cli/exit_codes.hpp"

namespace tw::cli {
namespace {

using namespace tw::kinematics;

constexpr double kDeg = kPi / 180.0;

struct ReachArguments {
  std::string arm_path;
  std::vector<double> position_mm;
  std::vector<double> rpy_deg{0.0, 180.0, 0.0};
  double axis4_reference_deg = 0.0;
};

struct PoseArguments {
  std::string arm_path;
  std::vector<double> joints;
};

void printJoints(const ArmModel& arm, const JointVector& q) {
  for (int j = 0; j < q.size(); ++j) {
    const double scale = arm.joint(j).type == JointType::kRevolute ? 1.0 / kDeg : 1000.0;
    std::printf(" %9.3f", q[j] * scale);
  }
}

int runReach(const ReachArguments& arguments) {
  const ArmModel arm = loadArmDescription(arguments.arm_path);
  const OrthoParallelSolver solver(arm);
  Eigen::Isometry3d X_BF = Eigen::Isometry3d::Identity();
  X_BF.translation() = 0.001 * Eigen::Vector3d(arguments.position_mm[0], arguments.position_mm[1],
                                               arguments.position_mm[2]);
  X_BF.linear() = rotationFromRollPitchYaw(
      kDeg * Eigen::Vector3d(arguments.rpy_deg[0], arguments.rpy_deg[1], arguments.rpy_deg[2]));
  IkOptions options;
  options.axis4_reference = arguments.axis4_reference_deg * kDeg;
  const IkSolutions result = solver.solve(X_BF, options);

  std::printf("arm %s, flange target (%.3f, %.3f, %.3f) mm, roll/pitch/yaw (%.3f, %.3f, %.3f) deg\n",
              arm.name().c_str(), arguments.position_mm[0], arguments.position_mm[1],
              arguments.position_mm[2], arguments.rpy_deg[0], arguments.rpy_deg[1],
              arguments.rpy_deg[2]);
  const ReachShell shell(arm);
  std::printf("wrist centre reach shell about the shoulder: %.1f to %.1f mm\n",
              shell.innerRadius() * 1000, shell.outerRadius() * 1000);
  std::printf("%-46s %-13s", "branch", "outcome");
  for (int j = 0; j < arm.jointCount(); ++j) std::printf(" %9s", arm.joint(j).name.c_str());
  std::printf("   [deg]\n");
  int solved = 0;
  for (const BranchOutcome& outcome : result.branches) {
    std::printf("%-46s %-13s", outcome.branch.toString().c_str(), toString(outcome.status));
    if (outcome.status == BranchStatus::kOutOfReach) {
      std::printf(" the wrist centre is beyond this branch's reach\n");
      continue;
    }
    if (outcome.status == BranchStatus::kJointLimit) {
      const JointSpec& joint = arm.joint(outcome.limit_joint);
      std::printf(" %s would be %.3f deg, outside [%.3f, %.3f]\n", joint.name.c_str(),
                  outcome.limit_value / kDeg, joint.lower / kDeg, joint.upper / kDeg);
      continue;
    }
    for (int i = 0; i < outcome.solution_count; ++i) {
      if (i > 0) std::printf("%-46s %-13s", "", "  same pose");
      const JointVector& q = result.solutions[outcome.first_solution + i].q;
      printJoints(arm, q);
      if (outcome.wrist_singular) std::printf("   wrist singular: axis 4 held at the reference");
      std::printf("\n");
      ++solved;
    }
  }
  std::printf("%d joint solution(s) within limits\n", solved);
  return solved > 0 ? kExitOk : kExitInfeasible;
}

int runPose(const PoseArguments& arguments) {
  const ArmModel arm = loadArmDescription(arguments.arm_path);
  if (static_cast<int>(arguments.joints.size()) != arm.jointCount()) {
    throw InputError("--joints: expected " + std::to_string(arm.jointCount()) + " values, got " +
                     std::to_string(arguments.joints.size()));
  }
  JointVector q(arm.jointCount());
  for (int j = 0; j < arm.jointCount(); ++j) {
    q[j] = arguments.joints[j] * (arm.joint(j).type == JointType::kRevolute ? kDeg : 0.001);
  }
  const Eigen::Isometry3d X_BF = flangePose(arm, q);
  const Eigen::Quaterniond orientation(X_BF.linear());
  std::printf("flange position (%.4f, %.4f, %.4f) mm\n", X_BF.translation().x() * 1000,
              X_BF.translation().y() * 1000, X_BF.translation().z() * 1000);
  std::printf("flange orientation quaternion w x y z (%.8f, %.8f, %.8f, %.8f)\n", orientation.w(),
              orientation.x(), orientation.y(), orientation.z());
  const SingularityMeasures measures = singularityMeasures(arm, q);
  std::printf("manipulability %.6g\n", measures.manipulability);
  if (measures.wrist) {
    std::printf("wrist %.3f deg from aligned, elbow %.3f deg from stretched/folded, wrist centre "
                "%.1f mm from the shoulder singularity\n",
                *measures.wrist / kDeg, *measures.elbow / kDeg, *measures.shoulder * 1000);
  }
  const JointVector margins = jointLimitMargins(arm, q);
  std::printf("joint-limit margins [deg or mm]:");
  printJoints(arm, margins);
  std::printf("\n");
  return arm.withinLimits(q) ? kExitOk : kExitInfeasible;
}

}  // namespace

void addKinematicsCommands(CLI::App& app, int& exit_code) {
  auto reach = std::make_shared<ReachArguments>();
  CLI::App* reach_command =
      app.add_subcommand("reach", "List every IK branch of an arm for one flange pose");
  reach_command->add_option("arm", reach->arm_path, "Arm description file")->required();
  reach_command->add_option("--position", reach->position_mm, "Flange position x,y,z [mm] in the arm base frame")
      ->required()
      ->expected(3)
      ->delimiter(',');
  reach_command
      ->add_option("--rpy", reach->rpy_deg,
                   "Flange roll,pitch,yaw [deg] about the fixed x, y, z axes (default 0,180,0: tool pointing down)")
      ->expected(3)
      ->delimiter(',');
  reach_command->add_option("--axis4-reference", reach->axis4_reference_deg,
                            "Axis 4 value [deg] kept at the wrist singularity");
  reach_command->callback([reach, &exit_code] { exit_code = runReach(*reach); });

  auto pose = std::make_shared<PoseArguments>();
  CLI::App* pose_command =
      app.add_subcommand("pose", "Flange pose, singularity measures and limit margins for joint values");
  pose_command->add_option("arm", pose->arm_path, "Arm description file")->required();
  pose_command->add_option("--joints", pose->joints, "Joint values [deg, or mm for linear joints]")
      ->required()
      ->delimiter(',');
  pose_command->callback([pose, &exit_code] { exit_code = runPose(*pose); });
}

}  // namespace tw::cli
