#include "planner/job_planner.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <memory>
#include <optional>
#include <set>

#include "collision/collision_workspace.hpp"
#include "kinematics/common/input_error.hpp"
#include "kinematics/forward_kinematics.hpp"
#include "kinematics/singularity.hpp"
#include "planner/cell/cell_collision_world.hpp"
#include "planner/motion/move_following.hpp"
#include "planner/motion/seam_moves.hpp"
#include "planner/program/sha256.hpp"
#include "planner/timing/joint_trajectory.hpp"
#include "planner/timing/process_move_timing.hpp"
#include "planner/timing/seam_move_timing.hpp"

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

/// The seam solver's limits for following a path, so that the compacted
/// moves keep what the solved steps kept.
FollowLimits followLimits(const SeamSolverOptions& solver) {
  FollowLimits limits;
  limits.wrist_hard_margin = solver.wrist_hard_margin;
  limits.joint_rate = solver.joint_rate;
  limits.joint_step_floor = solver.joint_step_floor;
  limits.rotation_lever = solver.rotation_lever;
  limits.continuity_position = solver.continuity_position;
  limits.continuity_angle = solver.continuity_angle;
  limits.max_step = solver.interpolation_step;
  limits.max_angle_step = solver.interpolation_angle;
  return limits;
}

/// The phases after the seams are solved, in the order a program runs them:
/// start at home, then for each seam a transit to its approach and the seam
/// itself, then the transit home; finish() adds the warnings and checks the
/// program. A failed transit is recorded in the result and ends the work.
class ProgramAssembler {
 public:
  ProgramAssembler(const Job& job, const PlanOptions& options, const Tool& tool, PlanResult& result)
      : job_(job),
        options_(options),
        tool_(tool),
        result_(result),
        world_(buildCellCollisionWorld(job.cell, tool, transitCollisionOptions(job, options))),
        workspace_(world_),
        X_BW_(job.cell.frames.X_W(job.cell.arm_frame).inverse()),
        transit_planner_(world_),
        seed_(options.seed.value_or(job.transit.seed)),
        builder_(job, options, program_) {
    const kinematics::ArmModel& arm = job.cell.arm;
    program_.metadata.job = job.name;
    program_.metadata.arm = arm.name();
    program_.metadata.generator = options.generator;
    program_.metadata.seed = seed_;
    program_.metadata.inputs = inputHashes(job);
    program_.metadata.joints = programJoints(arm);
    transit_limits_.velocity_fraction = job.transit.joint_speed_fraction;
  }

  /// Where the arm is assumed to start; no time passes.
  void startAtHome() {
    addJointMove(job_.cell.home, 0.0);
    position_ = job_.cell.home;
    position_name_ = "home";
  }

  /// Plans and times the transit from the current position to `goal`; false
  /// (and the failure recorded) when no transit was found. `index` numbers
  /// the transits of the job.
  bool transitTo(const JointVector& goal, const std::string& goal_name, int index) {
    TransitRequest request;
    request.start = position_;
    request.goals = {goal};
    request.planner = options_.transit_planner;
    request.time_limit = job_.transit.time_limit;
    // One seed per transit, derived from the job's, so that a change to one
    // transit does not reshuffle the others.
    request.seed = seed_ + static_cast<unsigned>(index);
    const TransitResult transit = transit_planner_.plan(request);
    if (!transit.solved()) {
      result_.transit_failures.push_back({position_name_, goal_name, transit});
      return false;
    }
    if (options_.on_step) options_.on_step("transit " + position_name_ + " to " + goal_name);
    const JointTrajectory trajectory(job_.cell.arm, transit.path, transit_limits_);
    for (const JointTrajectory::Segment& segment : trajectory.segments()) {
      addJointMove(segment.q_end, segment.profile.duration());
    }
    position_ = goal;
    position_name_ = goal_name;
    return true;
  }

  /// The approach, the seam's waypoints as the fewest linear and circular
  /// moves (compactSolvedSeam, each re-checked as the controller
  /// interpolates it, timed by timeSeamMoves) with the process events at
  /// their points, and the retract. False (and the seam reported) when a
  /// step between neighbouring waypoints fails as the controller drives it.
  bool runSeam(const SolvedSeam& seam, const JobTask& task) {
    const std::string named_set =
        std::visit([](const auto& spec) { return spec.parameter_set; }, task);
    const auto* seam_spec = std::get_if<SeamSpec>(&task);
    SeamWorld& seam_world =
        seamWorld(seam_spec != nullptr ? contactLength(seam_spec->process) : std::nullopt);
    const std::string parameter_set = named_set.empty() ? toString(seam.process) : named_set;
    const std::string branch = seam.branch.toString();

    // The moves are checked in the world the seam was solved in: the cell
    // margin of options.collision, with the seam's contact part.
    CellCollisionOptions solver_collision = options_.collision;
    solver_collision.contact_length =
        seam_spec != nullptr ? contactLength(seam_spec->process) : std::nullopt;
    const collision::CollisionWorld solver_world =
        buildCellCollisionWorld(job_.cell, tool_, solver_collision);
    collision::CollisionWorkspace solver_workspace(solver_world);
    FollowSetting follow;
    follow.world = &solver_world;
    follow.X_BR = X_BW_ * job_.cell.frames.X_W(seam.frame);
    follow.X_FT = tool_.X_FT;
    follow.branch_index = seam.branch.index();
    MoveFollower follower(follow, followLimits(options_.solver));
    auto compacted = compactSolvedSeam(seam, options_.moves, follower, solver_workspace);
    if (const SeamMoveFailure* failure = std::get_if<SeamMoveFailure>(&compacted)) {
      result_.move_failures.push_back({seam.name, failure->waypoint, failure->failure});
      return false;
    }
    const std::vector<SeamMove>& moves = std::get<std::vector<SeamMove>>(compacted);
    std::vector<double> speeds;
    for (const SeamMove& move : moves) speeds.push_back(speedOf(seam, move));
    ProcessSpeed programmed;
    programmed.orientation_speed = options_.orientation_speed;
    const SeamMoveTiming timing = timeSeamMoves(job_.cell.arm, moves, speeds, programmed);
    for (const LoweredSpeed& lowered : timing.lowered) {
      result_.speed_limits.push_back({seam.name, moves[lowered.segment].move.end, lowered});
    }

    addLinearMove(seam, seam_world, branch, seam.approach, seam.waypoints.front(),
                  options_.approach_speed, 0);
    bool process_on = false;
    const auto switch_process = [&](const SolvedPose& pose) {
      if (pose.process_on == process_on) return;
      builder_.addEvent(pose.process_on ? ProcessEventKind::kStart : ProcessEventKind::kStop,
                        parameter_set, seam.name);
      process_on = pose.process_on;
    };
    switch_process(seam.waypoints.front());
    for (std::size_t k = 0; k < moves.size(); ++k) {
      const SeamMove& move = moves[k];
      const SolvedPose& target = seam.waypoints[move.move.end];
      MotionRecord record;
      record.kind = move.move.shape == MoveShape::kArc ? MotionKind::kCircularMove : MotionKind::kLinearMove;
      record.q = target.q;
      record.X_RT = target.X_XT;
      if (move.move.shape == MoveShape::kArc) {
        record.via = ViaPoint{seam.waypoints[move.move.via].q, seam.waypoints[move.move.via].X_XT};
      }
      record.tool = tool_.name;
      record.frame = seam.frame;
      record.speed = {SpeedKind::kTcpSpeed, speeds[k]};
      record.blend_radius = move.blend;
      record.duration = timing.durations[k];
      record.seam = seam.name;
      record.branch = branch;
      builder_.addMotion(record, seam_world.world, seam_world.workspace);
      keepSmallestMargin(move.joints);
      switch_process(target);
    }
    if (process_on) builder_.addEvent(ProcessEventKind::kStop, parameter_set, seam.name);
    addLinearMove(seam, seam_world, branch, seam.waypoints.back(), seam.retract, options_.approach_speed,
                  static_cast<int>(seam.waypoints.size()));
    // No planner warning per near-singular waypoint: each of its records
    // carries the singularity margin, which the review warns about once.
    position_ = seam.retract.q;
    position_name_ = seam.name;
    return true;
  }

  /// A compacted move's singularity margin is the smallest along the path
  /// the arm takes, not only at its target, so that no near-singular
  /// waypoint it passes goes unreported.
  void keepSmallestMargin(const FollowedPath& path) {
    auto& record = std::get<MotionRecord>(program_.records.back());
    for (const JointVector& q : path.q) {
      const std::optional<double> wrist = kinematics::singularityMeasures(job_.cell.arm, q).wrist;
      if (wrist && (!record.singularity_margin || *wrist < *record.singularity_margin)) {
        record.singularity_margin = *wrist;
      }
    }
  }

  /// The warnings of the whole job, then the consistency check.
  Program finish() {
    for (const SpeedLimit& limit : result_.speed_limits) {
      program_.warnings.push_back("seam " + limit.seam + ", move to waypoint " +
                                  std::to_string(limit.waypoint) + ": " + limit.lowered.reason);
    }
    for (const std::string& note : world_.notes()) program_.warnings.push_back(note);
    checkProgram(program_, job_.source);
    return std::move(program_);
  }

 private:
  /// The job's clearance is about the cell; self pairs keep the base margin
  /// of options.collision. On free moves no part of the tool may touch a
  /// workpiece.
  static CellCollisionOptions transitCollisionOptions(const Job& job, const PlanOptions& options) {
    CellCollisionOptions transit_collision = options.collision;
    transit_collision.clearance_margin = job.transit.clearance;
    transit_collision.contact_length.reset();
    return transit_collision;
  }

  /// Where a seam's moves measure their clearance: the transit world's
  /// margins with the seam's contact part (the wire stick-out, the bead), so
  /// that the clearance is that of the tool without it.
  struct SeamWorld {
    SeamWorld(const Cell& cell, const Tool& tool, const CellCollisionOptions& options)
        : world(buildCellCollisionWorld(cell, tool, options)), workspace(world) {}
    const collision::CollisionWorld world;
    collision::CollisionWorkspace workspace;
  };

  /// The seam world of one contact length, built on first use.
  SeamWorld& seamWorld(const std::optional<double>& contact_length) {
    std::unique_ptr<SeamWorld>& slot = seam_worlds_[contact_length];
    if (!slot) {
      CellCollisionOptions with_contact = transitCollisionOptions(job_, options_);
      with_contact.contact_length = contact_length;
      slot = std::make_unique<SeamWorld>(job_.cell, tool_, with_contact);
    }
    return *slot;
  }

  void addJointMove(const JointVector& q, double duration) {
    MotionRecord record;
    record.kind = MotionKind::kJointMove;
    record.q = q;
    record.X_RT = builder_.worldTcp(q, tool_);
    record.tool = tool_.name;
    record.frame = kWorldFrame;
    record.speed = {SpeedKind::kJointSpeedFraction, job_.transit.joint_speed_fraction};
    record.duration = duration;
    builder_.addMotion(record, world_, workspace_);
  }

  void addLinearMove(const SolvedSeam& seam, SeamWorld& seam_world, const std::string& branch,
                     const SolvedPose& from, const SolvedPose& to, double speed, int waypoint) {
    ProcessSpeed programmed;
    programmed.tcp_speed = speed;
    programmed.orientation_speed = options_.orientation_speed;
    const ProcessMoveTiming timing =
        timeProcessMove(job_.cell.arm, {{from.q, from.X_XT}, {to.q, to.X_XT}}, programmed);
    MotionRecord record;
    record.kind = MotionKind::kLinearMove;
    record.q = to.q;
    record.X_RT = to.X_XT;
    record.tool = tool_.name;
    record.frame = seam.frame;
    record.speed = {SpeedKind::kTcpSpeed, speed};
    record.duration = timing.duration;
    record.seam = seam.name;
    record.branch = branch;
    for (const LoweredSpeed& lowered : timing.lowered) {
      result_.speed_limits.push_back({seam.name, waypoint, lowered});
    }
    builder_.addMotion(record, seam_world.world, seam_world.workspace);
  }

  const Job& job_;
  const PlanOptions& options_;
  const Tool& tool_;
  PlanResult& result_;
  const collision::CollisionWorld world_;
  collision::CollisionWorkspace workspace_;
  const Eigen::Isometry3d X_BW_;
  const TransitPlanner transit_planner_;
  std::map<std::optional<double>, std::unique_ptr<SeamWorld>> seam_worlds_;
  const unsigned seed_;
  Program program_;
  ProgramBuilder builder_;
  JointTimingLimits transit_limits_;
  JointVector position_;
  std::string position_name_;
};

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
  ProgramAssembler assembler(job, options, toolOf(job, seams.front()->tool), result);
  assembler.startAtHome();
  for (std::size_t s = 0; s < seams.size(); ++s) {
    if (!assembler.transitTo(seams[s]->approach.q, seams[s]->name, static_cast<int>(s))) return result;
    if (!assembler.runSeam(*seams[s], job.tasks[s])) return result;
  }
  if (!assembler.transitTo(job.cell.home, "home", static_cast<int>(seams.size()))) return result;
  result.program = assembler.finish();
  return result;
}

}  // namespace tw::planner
