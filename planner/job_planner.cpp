#include "planner/job_planner.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <memory>
#include <set>

#include "collision/collision_workspace.hpp"
#include "kinematics/forward_kinematics.hpp"
#include "kinematics/input_error.hpp"
#include "kinematics/singularity.hpp"
#include "planner/cell_collision_world.hpp"
#include "planner/joint_trajectory.hpp"
#include "planner/process_move_timing.hpp"
#include "planner/program/sha256.hpp"

namespace tw::planner {
namespace {

using kinematics::JointVector;

constexpr const char* kWorldFrame = "world";

/// Every file the program depends on, sorted and without repeats.
std::vector<InputFileHash> inputHashes(const Job& job) {
  std::set<std::string> paths{job.source, job.cell.source, job.cell.arm.source()};
  for (const JobTask& task : job.tasks) {
    if (const SeamSpec* seam = std::get_if<SeamSpec>(&task)) paths.insert(seam->points.source);
  }
  const auto add_meshes = [&](const std::vector<kinematics::LinkShape>& shapes) {
    for (const kinematics::LinkShape& shape : shapes) {
      if (shape.kind == kinematics::LinkShape::Kind::kMesh) paths.insert(shape.mesh_path);
    }
  };
  for (const kinematics::LinkGeometry& link : job.cell.arm.links()) add_meshes(link.shapes);
  for (const Tool& tool : job.cell.tools) add_meshes(tool.shapes);
  for (const CellBody& body : job.cell.bodies) add_meshes(body.shapes);
  std::vector<InputFileHash> hashes;
  for (const std::string& path : paths) {
    if (!path.empty()) hashes.push_back({path, sha256OfFile(path)});
  }
  return hashes;
}

/// Builds the records of one program in order, keeping the clock.
class ProgramBuilder {
 public:
  ProgramBuilder(const Job& job, const PlanOptions& options, Program& program)
      : job_(job), options_(options), program_(program), X_WB_(job.cell.frames.X_W(job.cell.arm_frame)) {}

  double now() const { return clock_; }

  /// Fills branch words, clearance and singularity margin, then appends.
  void addMotion(MotionRecord record, const collision::CollisionWorld& world,
                 collision::CollisionWorkspace& workspace) {
    record.start_time = clock_;
    clock_ += record.duration;
    const kinematics::SingularityMeasures measures =
        kinematics::singularityMeasures(job_.cell.arm, record.q);
    if (measures.wrist) record.singularity_margin = *measures.wrist;
    if (options_.measure_clearance) {
      // To the cell only: the arm's distance to its own tool is fixed by
      // design and would hide the fixtures and parts a programmer looks for.
      // Infinite when the world checks no pair with a cell body: nothing to
      // report.
      collision::ClearanceQuery query;
      query.pairs = collision::PairGroup::kCell;
      const double distance = world.clearance(record.q, workspace, query).distance;
      if (std::isfinite(distance)) record.clearance = distance;
    }
    program_.records.push_back(std::move(record));
  }

  void addEvent(ProcessEventKind kind, const std::string& set, const std::string& seam) {
    ProcessEvent event;
    event.kind = kind;
    event.parameter_set = set;
    event.seam = seam;
    event.time = clock_;
    program_.records.push_back(event);
  }

  /// The TCP pose of `q` in the world, for moves outside seams.
  Eigen::Isometry3d worldTcp(const JointVector& q, const Tool& tool) const {
    return X_WB_ * kinematics::flangePose(job_.cell.arm, q) * tool.X_FT;
  }

 private:
  const Job& job_;
  const PlanOptions& options_;
  Program& program_;
  Eigen::Isometry3d X_WB_;
  double clock_ = 0.0;
};

const Tool& toolOf(const Job& job, const std::string& name) {
  const Tool* tool = job.cell.findTool(name);
  if (tool == nullptr) throw InputError(job.source, 0, "unknown tool '" + name + "'");
  return *tool;
}

}  // namespace

void requireOneTool(const Job& job) {
  const auto tool_of = [](const JobTask& task) {
    return std::visit([](const auto& spec) { return spec.tool; }, task);
  };
  const auto line_of = [](const JobTask& task) {
    return std::visit([](const auto& spec) { return spec.line; }, task);
  };
  const auto name_of = [](const JobTask& task) {
    return std::visit([](const auto& spec) { return spec.name; }, task);
  };
  for (const JobTask& task : job.tasks) {
    if (tool_of(task) != tool_of(job.tasks.front())) {
      throw InputError(job.source, line_of(task),
                       "'" + name_of(task) + "' uses tool '" + tool_of(task) + "' after '" +
                           tool_of(job.tasks.front()) +
                           "': a program runs with one tool (tool changes within one program are "
                           "not supported; put the tasks of each tool in a job of their own)");
    }
  }
}

PlanResult planJob(const Job& job, const PlanOptions& options) {
  if (job.tasks.empty()) throw InputError(job.source, 0, "the job has no seams or patches");
  requireOneTool(job);
  PlanResult result;
  result.seams = solveJob(job, options.solver, options.collision, options.on_step);
  if (!result.seams.feasible()) return result;

  std::vector<const SolvedSeam*> seams;
  for (const SeamOutcome& outcome : result.seams.tasks) seams.push_back(&std::get<SolvedSeam>(outcome));
  const std::string& tool_name = seams.front()->tool;
  const Tool& tool = toolOf(job, tool_name);
  const kinematics::ArmModel& arm = job.cell.arm;

  // The job's clearance is about the cell; self pairs keep the base margin
  // of options.collision.
  CellCollisionOptions transit_collision = options.collision;
  transit_collision.clearance_margin = job.transit.clearance;
  const collision::CollisionWorld world = buildCellCollisionWorld(job.cell, tool, transit_collision);
  collision::CollisionWorkspace workspace(world);
  const TransitPlanner transit_planner(world);
  const unsigned seed = options.seed.value_or(job.transit.seed);

  Program program;
  program.metadata.job = job.name;
  program.metadata.arm = arm.name();
  program.metadata.generator = options.generator;
  program.metadata.seed = seed;
  program.metadata.inputs = inputHashes(job);
  program.metadata.joints = programJoints(arm);
  ProgramBuilder builder(job, options, program);

  JointTimingLimits transit_limits;
  transit_limits.velocity_fraction = job.transit.joint_speed_fraction;
  const auto joint_move = [&](const JointVector& q, double duration) {
    MotionRecord record;
    record.kind = MotionKind::kJointMove;
    record.q = q;
    record.X_RT = builder.worldTcp(q, tool);
    record.tool = tool.name;
    record.frame = kWorldFrame;
    record.speed = {SpeedKind::kJointSpeedFraction, job.transit.joint_speed_fraction};
    record.duration = duration;
    builder.addMotion(record, world, workspace);
  };
  // Where the arm is assumed to start; no time passes.
  joint_move(job.cell.home, 0.0);

  JointVector position = job.cell.home;
  std::string position_name = "home";
  const auto transit_to = [&](const JointVector& goal, const std::string& goal_name,
                              int index) -> bool {
    TransitRequest request;
    request.start = position;
    request.goals = {goal};
    request.planner = options.transit_planner;
    request.time_limit = job.transit.time_limit;
    // One seed per transit, derived from the job's, so that a change to one
    // transit does not reshuffle the others.
    request.seed = seed + static_cast<unsigned>(index);
    const TransitResult transit = transit_planner.plan(request);
    if (!transit.solved()) {
      result.transit_failures.push_back({position_name, goal_name, transit});
      return false;
    }
    if (options.on_step) options.on_step("transit " + position_name + " to " + goal_name);
    const JointTrajectory trajectory(arm, transit.path, transit_limits);
    for (const JointTrajectory::Segment& segment : trajectory.segments()) {
      joint_move(segment.q_end, segment.profile.duration());
    }
    position = goal;
    position_name = goal_name;
    return true;
  };

  bool complete = true;
  for (std::size_t s = 0; s < seams.size() && complete; ++s) {
    const SolvedSeam& seam = *seams[s];
    complete = transit_to(seam.approach.q, seam.name, static_cast<int>(s));
    if (!complete) break;
    const std::string words = seam.branch.toString();
    const std::string named_set =
        std::visit([](const auto& spec) { return spec.parameter_set; }, job.tasks[s]);
    const std::string parameter_set = named_set.empty() ? toString(seam.process) : named_set;
    const SolvedPose* previous = &seam.approach;
    bool process_on = false;
    const auto linear_move = [&](const SolvedPose& target, double speed, int waypoint) {
      ProcessSpeed programmed;
      programmed.tcp_speed = speed;
      programmed.orientation_speed = options.orientation_speed;
      const ProcessMoveTiming timing =
          timeProcessMove(arm, {{previous->q, previous->X_XT}, {target.q, target.X_XT}}, programmed);
      MotionRecord record;
      record.kind = MotionKind::kLinearMove;
      record.q = target.q;
      record.X_RT = target.X_XT;
      record.tool = tool.name;
      record.frame = seam.frame;
      record.speed = {SpeedKind::kTcpSpeed, speed};
      record.duration = timing.duration;
      record.seam = seam.name;
      record.branch = words;
      for (const LoweredSpeed& lowered : timing.lowered) {
        result.speed_limits.push_back({seam.name, waypoint, lowered});
      }
      builder.addMotion(record, world, workspace);
      previous = &target;
    };
    for (std::size_t i = 0; i < seam.waypoints.size(); ++i) {
      const SolvedPose& pose = seam.waypoints[i];
      const bool first = i == 0;
      linear_move(pose, first ? options.approach_speed : pose.speed, static_cast<int>(i));
      if (pose.process_on != process_on) {
        builder.addEvent(pose.process_on ? ProcessEventKind::kStart : ProcessEventKind::kStop,
                         parameter_set, seam.name);
        process_on = pose.process_on;
      }
    }
    if (process_on) builder.addEvent(ProcessEventKind::kStop, parameter_set, seam.name);
    linear_move(seam.retract, options.approach_speed, static_cast<int>(seam.waypoints.size()));
    position = seam.retract.q;
    position_name = seam.name;
    for (std::size_t i = 0; i < seam.waypoints.size(); ++i) {
      if (seam.waypoints[i].wrist_warning) {
        program.warnings.push_back("seam " + seam.name + " waypoint " + std::to_string(i) +
                                   ": axis 5 within the wrist warning margin");
      }
    }
  }
  if (complete) complete = transit_to(job.cell.home, "home", static_cast<int>(seams.size()));
  if (!complete) return result;

  for (const SpeedLimit& limit : result.speed_limits) {
    program.warnings.push_back("seam " + limit.seam + ", move to waypoint " +
                               std::to_string(limit.waypoint) + ": " + limit.lowered.reason);
  }
  for (const std::string& note : world.notes()) program.warnings.push_back(note);
  checkProgram(program, job.source);
  result.program = std::move(program);
  return result;
}

}  // namespace tw::planner
