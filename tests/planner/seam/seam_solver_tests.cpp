#include <catch2/catch.hpp>
#include <cmath>
#include <functional>
#include <limits>
#include <set>
#include <stdexcept>

#include "kinematics/common/angles.hpp"
#include "kinematics/forward_kinematics.hpp"
#include "kinematics/ortho_parallel_ik.hpp"
#include "kinematics/reach_shell.hpp"
#include "planner/cell/cell_loader.hpp"
#include "planner/job/job_loader.hpp"
#include "planner/seam/job_solver.hpp"
#include "planner/toolpath/tool_path_builder.hpp"
#include "tests/planner/test_files.hpp"

namespace tw::planner {
namespace {

using kinematics::JointVector;
constexpr double kDeg = kPi / 180.0;

double rotationAngle(const Eigen::Matrix3d& a, const Eigen::Matrix3d& b) {
  return Eigen::AngleAxisd(a.transpose() * b).angle();
}

/// A straight tool path in `frame`, tool z pointing down (world −z when the
/// frame is level), from p_start to p_end [m] with `count` waypoints.
ToolPath straightPath(const std::string& frame, const Eigen::Vector3d& p_start,
                      const Eigen::Vector3d& p_end, int count, SpinRange spin) {
  ToolPath path;
  path.name = "test-seam";
  path.frame = frame;
  path.tool = "torch";
  path.spin = spin;
  path.source = "test";
  for (int i = 0; i < count; ++i) {
    Waypoint waypoint;
    waypoint.X_XT = Eigen::Translation3d(p_start + (p_end - p_start) * i / (count - 1.0)) *
                    Eigen::AngleAxisd(kPi, Eigen::Vector3d::UnitX());
    waypoint.speed = 0.010;
    waypoint.process_on = i + 1 < count;
    waypoint.line = i + 1;
    path.waypoints.push_back(waypoint);
  }
  path.approach = backedOff(path.waypoints.front().X_XT, 0.030);
  path.retract = backedOff(path.waypoints.back().X_XT, 0.030);
  return path;
}

const SpinRange kFullSpin{-kPi, kPi};

/// A cell, its collision world and the setting of one path frame.
struct Bench {
  Cell cell;
  std::unique_ptr<collision::CollisionWorld> world;
  std::unique_ptr<collision::CollisionWorkspace> workspace;

  explicit Bench(Cell loaded) : cell(std::move(loaded)) {
    world = std::make_unique<collision::CollisionWorld>(
        buildCellCollisionWorld(cell, *cell.findTool("torch")));
    workspace = std::make_unique<collision::CollisionWorkspace>(*world);
  }
  SeamSetting setting(const std::string& frame) const {
    SeamSetting s;
    s.world = world.get();
    s.X_WB = cell.frames.X_W(cell.arm_frame);
    s.X_WX = cell.frames.X_W(frame);
    s.X_FT = cell.findTool("torch")->X_FT;
    return s;
  }
  SeamOutcome solve(const ToolPath& path, const SeamSolverOptions& options = {}) {
    return solveSeam(path, setting(path.frame), options, *workspace);
  }
};

Cell sampleCell() { return loadCell(test::sourcePath("samples/cells/bracket_weld_cell.xml")); }

/// Re-verifies a solved seam against its path by other routes than the
/// solver's own: FK of every joint vector against the requested pose, limits,
/// the clearance distance, the branch found again by IK, the joint step bound.
void verifySolved(const SolvedSeam& seam, const ToolPath& path, const SeamSetting& setting,
                  const SeamSolverOptions& options, collision::CollisionWorkspace& workspace) {
  const collision::CollisionWorld& world = *setting.world;
  const kinematics::ArmModel& arm = world.arm();
  const kinematics::OrthoParallelSolver ik(arm);
  REQUIRE(seam.waypoints.size() == path.waypoints.size());
  std::vector<const SolvedPose*> poses{&seam.approach};
  std::vector<Eigen::Isometry3d> wanted{path.approach};
  for (std::size_t i = 0; i < path.waypoints.size(); ++i) {
    poses.push_back(&seam.waypoints[i]);
    wanted.push_back(path.waypoints[i].X_XT);
  }
  poses.push_back(&seam.retract);
  wanted.push_back(path.retract);
  // Approach and retract run along the tool axis: the tool keeps exactly the
  // orientation of the first and last waypoint. 1e-9 rad: the bar,
  // the same rotation matrices up to FK rounding (~1e-15).
  CHECK(rotationAngle(seam.approach.X_XT.linear(), seam.waypoints.front().X_XT.linear()) <= 1e-9);
  CHECK(rotationAngle(seam.retract.X_XT.linear(), seam.waypoints.back().X_XT.linear()) <= 1e-9);
  const auto fkRotation = [&](const SolvedPose& pose) -> Eigen::Matrix3d {
    return (setting.X_WB * kinematics::flangePose(arm, pose.q) * setting.X_FT).linear();
  };
  CHECK(rotationAngle(fkRotation(seam.approach), fkRotation(seam.waypoints.front())) <= 1e-9);
  CHECK(rotationAngle(fkRotation(seam.retract), fkRotation(seam.waypoints.back())) <= 1e-9);
  for (std::size_t i = 0; i < poses.size(); ++i) {
    const SolvedPose& pose = *poses[i];
    CAPTURE(i, pose.q.transpose(), pose.spin);
    // The pose is the path's pose turned about its own z by the spin.
    const Eigen::Isometry3d X_XT = wanted[i] * Eigen::AngleAxisd(pose.spin, Eigen::Vector3d::UnitZ());
    CHECK(pose.spin >= path.spin.min - 1e-12);
    CHECK(pose.spin <= path.spin.max + 1e-12);
    // 1e-6 m / 1e-6 rad: the bar; closed-form IK is exact to ~1e-12.
    const Eigen::Isometry3d X_WT_fk =
        setting.X_WB * kinematics::flangePose(arm, pose.q) * setting.X_FT;
    const Eigen::Isometry3d X_WT = setting.X_WX * X_XT;
    CHECK((X_WT_fk.translation() - X_WT.translation()).norm() <= 1e-6);
    CHECK(rotationAngle(X_WT_fk.linear(), X_WT.linear()) <= 1e-6);
    CHECK((pose.X_WT.translation() - X_WT.translation()).norm() <= 1e-9);
    CHECK(arm.withinLimits(pose.q));
    // Clearance never reports below the true distance (collision_world.hpp),
    // so at least the margin means the state keeps the margin.
    CHECK(world.clearance(pose.q, workspace).distance >= world.clearanceMargin());
    // The branch, found again: an IK solution of the chosen branch equals q.
    const kinematics::IkSolutions solutions =
        ik.solve(setting.X_WB.inverse() * X_WT * setting.X_FT.inverse());
    bool found = false;
    for (const kinematics::IkSolution& solution : solutions.solutions) {
      // 1e-9 rad: the same closed form on the same pose.
      found = found || (solution.branch_index == seam.branch.index() &&
                        (solution.q - pose.q).cwiseAbs().maxCoeff() < 1e-9);
    }
    CHECK(found);
    if (i == 0) continue;
    const SolvedPose& before = *poses[i - 1];
    const double travel = (pose.X_WT.translation() - before.X_WT.translation()).norm() +
                          options.rotation_lever *
                              rotationAngle(before.X_WT.linear(), pose.X_WT.linear());
    CHECK((pose.q - before.q).cwiseAbs().maxCoeff() <=
          options.joint_rate * travel + options.joint_step_floor + 1e-12);
  }
}

TEST_CASE("The sample bracket job solves every seam, verified, the same on 1 and 2 threads",
          "[planner][seam-solver]") {
  const Job job = loadJob(test::sourcePath("samples/jobs/bracket_welds.xml"));
  SeamSolverOptions one_thread;
  one_thread.threads = 1;
  SeamSolverOptions two_threads;
  two_threads.threads = 2;
  const JobSolution first = solveJob(job, one_thread);
  const JobSolution second = solveJob(job, two_threads);
  std::string reports;
  for (const SeamReport* report : first.reports()) reports += report->text();
  CAPTURE(reports);
  REQUIRE(first.tasks.size() == 4);
  REQUIRE(first.feasible());
  REQUIRE(second.feasible());
  Bench bench(job.cell);
  for (std::size_t t = 0; t < job.tasks.size(); ++t) {
    const SolvedSeam& a = std::get<SolvedSeam>(first.tasks[t]);
    const SolvedSeam& b = std::get<SolvedSeam>(second.tasks[t]);
    CAPTURE(a.name, a.branch.toString());
    const SeamSpec& spec = std::get<SeamSpec>(job.tasks[t]);
    const ToolPath path = buildToolPath(spec, *job.cell.findTool(spec.tool));
    verifySolved(a, path, bench.setting(path.frame), one_thread, *bench.workspace);
    // Determinism: bit for bit, whatever the thread count.
    CHECK(a.branch == b.branch);
    CHECK(a.cost == b.cost);
    CHECK(a.counts.state_checks == b.counts.state_checks);
    CHECK(describeMargins(a) == describeMargins(b));
    REQUIRE(a.waypoints.size() == b.waypoints.size());
    for (std::size_t i = 0; i < a.waypoints.size(); ++i) {
      CHECK(a.waypoints[i].q == b.waypoints[i].q);
    }
    CHECK(a.approach.q == b.approach.q);
    CHECK(a.retract.q == b.retract.q);
  }
}

TEST_CASE("A seam blocked by a clamp at one spin is solved with another spin",
          "[planner][seam-solver]") {
  // A 20 mm seam in the world frame, torch straight down, 500 mm above the
  // floor and 200 mm short of the table: clear of every body of the cell.
  const Eigen::Vector3d p_start(0.700, 0.300, 0.500);
  const Eigen::Vector3d p_end(0.720, 0.300, 0.500);
  Cell cell = sampleCell();
  const ToolPath fixed = straightPath("world", p_start, p_end, 11, SpinRange{0.0, 0.0});
  const ToolPath free = straightPath("world", p_start, p_end, 11, kFullSpin);
  {
    Bench open(cell);
    REQUIRE(std::holds_alternative<SolvedSeam>(open.solve(fixed)));
  }
  // The clamp: spheres of 60 mm where the wrist centre is at spins −120°,
  // −60° and 0° at the seam's middle. The bent torch carries the wrist
  // centre round a circle about the tool axis, so these spins (and their
  // neighbours) put the wrist sphere into the clamp; spins about 100° to
  // 140° keep it more than 140 mm away (hand geometry, no source).
  const kinematics::ReachShell shell(cell.arm);
  const Eigen::Isometry3d X_WX = cell.frames.X_W("world");
  const Eigen::Isometry3d X_FT = cell.findTool("torch")->X_FT;
  CellBody clamp;
  clamp.name = "spin-clamp";
  clamp.role = CellBody::Role::kFixture;
  clamp.frame = FrameTree::kWorld;
  for (double spin_deg : {-120.0, -60.0, 0.0}) {
    const Eigen::Isometry3d X_WT = X_WX * Eigen::Translation3d(0.5 * (p_start + p_end)) *
                                   Eigen::AngleAxisd(kPi, Eigen::Vector3d::UnitX()) *
                                   Eigen::AngleAxisd(spin_deg * kDeg, Eigen::Vector3d::UnitZ());
    kinematics::LinkShape sphere;
    sphere.kind = kinematics::LinkShape::Kind::kSphere;
    sphere.radius = 0.060;
    sphere.X_LS = Eigen::Isometry3d(Eigen::Translation3d(
        cell.frames.X_W(cell.arm_frame) * shell.wristCentre(cell.frames.X_W(cell.arm_frame).inverse() *
                                                            X_WT * X_FT.inverse())));
    clamp.shapes.push_back(sphere);
  }
  cell.bodies.push_back(clamp);
  Bench clamped(cell);

  SECTION("with the spin held at 0 the clamp is reported at every waypoint") {
    const SeamOutcome outcome = clamped.solve(fixed);
    REQUIRE(std::holds_alternative<SeamReport>(outcome));
    const SeamReport& report = std::get<SeamReport>(outcome);
    CAPTURE(report.text());
    REQUIRE(report.blocked.size() == 13);  // approach, 11 waypoints, retract
    for (const BlockedWaypoint& blocked : report.blocked) {
      CHECK(blocked.rejected[static_cast<int>(RejectReason::kCollision)] > 0);
      bool names_clamp = false;
      for (const std::string& pair : blocked.colliding_pairs) {
        names_clamp = names_clamp || pair.find("spin-clamp") != std::string::npos;
      }
      CHECK(names_clamp);
    }
    CHECK(report.stretches == std::vector<std::pair<int, int>>{{-1, 11}});
  }
  SECTION("with the spin free a spin away from the clamp is found and verified") {
    const SeamSolverOptions options;
    const SeamOutcome outcome = clamped.solve(free, options);
    REQUIRE(std::holds_alternative<SolvedSeam>(outcome));
    const SolvedSeam& seam = std::get<SolvedSeam>(outcome);
    CAPTURE(seam.waypoints.front().spin / kDeg);
    verifySolved(seam, free, clamped.setting("world"), options, *clamped.workspace);
    for (const SolvedPose& pose : seam.waypoints) CHECK(std::abs(pose.spin) > 30.0 * kDeg);
  }
}

TEST_CASE("A seam that leaves the reach is reported at exactly the waypoints out of reach",
          "[planner][seam-solver]") {
  // Out along x from 0.9 m to 2.1 m and back, 20 mm apart, 0.9 m above the
  // floor, torch down (the world frame).
  Bench bench(sampleCell());
  ToolPath path = straightPath("world", {0.9, 0.3, 0.9}, {2.1, 0.3, 0.9}, 61, kFullSpin);
  const ToolPath back = straightPath("world", {2.1, 0.3, 0.9}, {0.9, 0.3, 0.9}, 61, kFullSpin);
  path.waypoints.insert(path.waypoints.end(), back.waypoints.begin() + 1, back.waypoints.end());
  path.retract = back.retract;
  // The expected stretch by another route: the reach shell about the
  // shoulder (kinematics/reach_shell.hpp), for every spin sample.
  const kinematics::ReachShell shell(bench.cell.arm);
  const Eigen::Isometry3d X_BW = bench.cell.frames.X_W(bench.cell.arm_frame).inverse();
  const Eigen::Isometry3d X_TF = bench.cell.findTool("torch")->X_FT.inverse();
  std::vector<int> expected;
  for (int i = 0; i < static_cast<int>(path.waypoints.size()); ++i) {
    bool reachable = false;
    for (int k = 0; k < 36; ++k) {
      const Eigen::Isometry3d X_BF = X_BW * path.waypoints[i].X_XT *
                                     Eigen::AngleAxisd(-kPi + k * 10.0 * kDeg,
                                                       Eigen::Vector3d::UnitZ()) *
                                     X_TF;
      reachable = reachable || shell.mayReach(shell.wristCentre(X_BF));
    }
    if (!reachable) expected.push_back(i);
  }
  REQUIRE_FALSE(expected.empty());
  REQUIRE(expected.front() > 0);
  REQUIRE(expected.back() < static_cast<int>(path.waypoints.size()) - 1);

  const SeamOutcome outcome = bench.solve(path);
  REQUIRE(std::holds_alternative<SeamReport>(outcome));
  const SeamReport& report = std::get<SeamReport>(outcome);
  CAPTURE(report.text());
  std::vector<int> blocked;
  for (const BlockedWaypoint& b : report.blocked) {
    blocked.push_back(b.index);
    CHECK(b.rejected[static_cast<int>(RejectReason::kOutOfReach)] == b.tried);
  }
  CHECK(blocked == expected);
  CHECK(report.stretches ==
        std::vector<std::pair<int, int>>{{expected.front(), expected.back()}});
}

TEST_CASE("The chosen path costs what brute-force enumeration of every sequence finds",
          "[planner][seam-solver]") {
  Bench bench(sampleCell());
  const ToolPath path = straightPath("world", {0.9, 0.3, 0.9}, {0.9, 0.306, 0.9}, 3, kFullSpin);
  SeamSolverOptions options;
  options.spin_step = 90.0 * kDeg;
  options.max_spin_change = 90.0 * kDeg;
  // Thresholds raised so that every margin penalty is active on this short
  // seam in free space (the defaults would leave them all at 0 here).
  options.wrist_warning_margin = 60.0 * kDeg;
  options.revolute_limit_warning = 120.0 * kDeg;
  options.clearance_comfort = 1.5;
  options.singularity_weight = 0.3;
  options.limit_weight = 0.2;
  options.clearance_weight = 0.1;
  const SeamOutcome outcome = bench.solve(path, options);
  REQUIRE(std::holds_alternative<SolvedSeam>(outcome));
  const SolvedSeam& seam = std::get<SolvedSeam>(outcome);

  // Brute force: every candidate (branch × spin × turn, in limits, outside
  // the wrist margin, collision-free) of every pose, every sequence in one
  // branch, spin changing by at most one sample (not at all into the first
  // waypoint and the retract end), each step within the joint bound and
  // collision-free as a joint-space segment. Cost: weighted joint motion
  // plus, per pose, the three margin penalties as seam_solver_options.hpp
  // defines them, the clearance measured directly at every pose.
  const collision::CollisionWorld& world = *bench.world;
  const kinematics::ArmModel& arm = world.arm();
  const kinematics::OrthoParallelSolver ik(arm);
  const SeamSetting setting = bench.setting("world");
  std::vector<Eigen::Isometry3d> poses{path.approach};
  for (const Waypoint& w : path.waypoints) poses.push_back(w.X_XT);
  poses.push_back(path.retract);
  struct Option {
    JointVector q;
    int branch;
    int spin;
    Eigen::Isometry3d X_WT;
    double penalty;
  };
  const auto shortfall = [](double x, double t) { return std::max(0.0, 1.0 - x / t); };
  const auto posePenalty = [&](const JointVector& q) {
    const double wrist = std::abs(std::remainder(q[4], kPi));
    double limit = 0.0;
    for (int j = 0; j < arm.jointCount(); ++j) {
      const double margin = std::min(q[j] - arm.joint(j).lower, arm.joint(j).upper - q[j]);
      limit = std::max(limit, shortfall(margin, options.revolute_limit_warning));
    }
    const collision::ClearanceQuery query{1e-4, collision::PairGroup::kCell};
    const double clearance =
        std::min(world.clearance(q, *bench.workspace, query).distance, options.clearance_comfort);
    return options.singularity_weight * shortfall(wrist, options.wrist_warning_margin) +
           options.limit_weight * limit +
           options.clearance_weight * shortfall(clearance, options.clearance_comfort);
  };
  std::vector<std::vector<Option>> layers;
  for (const Eigen::Isometry3d& X_WT0 : poses) {
    std::vector<Option> layer;
    for (int s = 0; s < 4; ++s) {
      const Eigen::Isometry3d X_WT =
          X_WT0 * Eigen::AngleAxisd(-kPi + s * 90.0 * kDeg, Eigen::Vector3d::UnitZ());
      for (const kinematics::IkSolution& solution :
           ik.solve(setting.X_WB.inverse() * X_WT * setting.X_FT.inverse()).solutions) {
        const double wrist = std::abs(std::remainder(solution.q[4], kPi));
        if (wrist < options.wrist_hard_margin) continue;
        if (!world.checkState(solution.q, *bench.workspace).valid()) continue;
        layer.push_back({solution.q, solution.branch_index, s, X_WT, posePenalty(solution.q)});
      }
    }
    REQUIRE_FALSE(layer.empty());
    layers.push_back(layer);
  }
  const Eigen::VectorXd weights = [&] {
    Eigen::VectorXd w(arm.jointCount());
    for (int j = 0; j < arm.jointCount(); ++j) w[j] = 1.0 / arm.joint(j).max_velocity;
    return w;
  }();
  double best = std::numeric_limits<double>::infinity();
  long sequences = 0;
  std::function<void(std::size_t, const Option*, double)> extend = [&](std::size_t l,
                                                                       const Option* prev,
                                                                       double cost) {
    if (l == layers.size()) {
      ++sequences;
      best = std::min(best, cost);
      return;
    }
    for (const Option& option : layers[l]) {
      double step = 0.0;
      if (prev) {
        if (option.branch != prev->branch) continue;
        const int ds = (option.spin - prev->spin + 4) % 4;
        if (ds == 2) continue;
        if ((l == 1 || l + 1 == layers.size()) && ds != 0) continue;
        const double travel =
            (option.X_WT.translation() - prev->X_WT.translation()).norm() +
            options.rotation_lever * rotationAngle(prev->X_WT.linear(), option.X_WT.linear());
        if ((option.q - prev->q).cwiseAbs().maxCoeff() >
            options.joint_rate * travel + options.joint_step_floor) {
          continue;
        }
        if (!world.checkSegment(prev->q, option.q, *bench.workspace).valid()) continue;
        step = weights.dot((option.q - prev->q).cwiseAbs());
      }
      extend(l + 1, &option, cost + step + option.penalty);
    }
  };
  extend(0, nullptr, 0.0);
  CAPTURE(sequences);
  REQUIRE(sequences > 1);
  // 1e-12: the same sums of the same terms, possibly in another order.
  CHECK(seam.cost == Approx(best).margin(1e-12));
  // The penalties took part: the cost is more than the motion.
  CHECK(seam.margins.cost > seam.margins.motion_cost + 0.01);
  verifySolved(seam, path, setting, options, *bench.workspace);
}

TEST_CASE("A seam through the wrist singularity in its naive branch is avoided by the spin",
          "[planner][seam-solver]") {
  Bench bench(sampleCell());
  const kinematics::ArmModel& arm = bench.cell.arm;
  const SeamSetting setting = bench.setting("world");
  // The naive joint path: axis 5 from +12° to −12° (through 0) while the
  // other axes move a little; its TCP poses are the seam.
  JointVector q0(6), q1(6);
  q0 << 0.3, 0.2, -0.1, 0.4, 12.0 * kDeg, 0.2;
  q1 << 0.35, 0.22, -0.08, 0.4, -12.0 * kDeg, 0.25;
  ToolPath path = straightPath("world", Eigen::Vector3d::Zero(), Eigen::Vector3d::UnitX(), 2,
                               kFullSpin);
  path.waypoints.clear();
  std::vector<int> naive_singular;
  const int count = 25;
  for (int i = 0; i < count; ++i) {
    const JointVector q = q0 + (q1 - q0) * (i / (count - 1.0));
    Waypoint waypoint;
    waypoint.X_XT = setting.X_WB * kinematics::flangePose(arm, q) * setting.X_FT;
    waypoint.speed = 0.01;
    waypoint.line = i + 1;
    path.waypoints.push_back(waypoint);
    if (std::abs(q[4]) < SeamSolverOptions{}.wrist_hard_margin) naive_singular.push_back(i);
  }
  // No approach or retract distance: this test is about the seam. The
  // naive path starts 12° from the singularity, and every spin that crosses
  // the seam is so near it at the first waypoint that a move along the tool
  // axis there exceeds the joint bound; the solver once dodged that by
  // turning the tool during the approach, which it no longer does.
  path.approach = path.waypoints.front().X_XT;
  path.retract = path.waypoints.back().X_XT;
  REQUIRE_FALSE(naive_singular.empty());

  const SeamSolverOptions options;
  const SeamOutcome outcome = bench.solve(path, options);
  CAPTURE(std::holds_alternative<SeamReport>(outcome) ? std::get<SeamReport>(outcome).text() : "");
  REQUIRE(std::holds_alternative<SolvedSeam>(outcome));
  const SolvedSeam& seam = std::get<SolvedSeam>(outcome);
  CAPTURE(seam.branch.toString(), seam.waypoints.front().spin / kDeg);
  verifySolved(seam, path, setting, options, *bench.workspace);
  for (const SolvedPose& pose : seam.waypoints) {
    CHECK(std::abs(std::remainder(pose.q[4], kPi)) >= options.wrist_hard_margin);
  }
  CHECK(seam.min_wrist_angle >= options.wrist_hard_margin);

  SECTION("with the spin held at the naive one, it is avoided or reported with its indices") {
    ToolPath fixed = path;
    fixed.spin = SpinRange{0.0, 0.0};
    const SeamOutcome held = bench.solve(fixed, options);
    if (const auto* other = std::get_if<SolvedSeam>(&held)) {
      CHECK(other->min_wrist_angle >= options.wrist_hard_margin);
      verifySolved(*other, fixed, setting, options, *bench.workspace);
    } else {
      const SeamReport& report = std::get<SeamReport>(held);
      CAPTURE(report.text());
      std::set<int> blocked;
      for (const BlockedWaypoint& b : report.blocked) blocked.insert(b.index);
      if (report.step) {
        // The refused step enters or leaves the stretch where the naive
        // branch is within the margin.
        CHECK(report.step->to <= naive_singular.back() + 1);
        CHECK(report.step->to >= naive_singular.front() - 1);
      } else {
        for (int i : naive_singular) CHECK(blocked.count(i) == 1);
      }
    }
  }
}

}  // namespace
}  // namespace tw::planner

namespace tw::planner {
namespace {

TEST_CASE("A wrist twist limit below the free solution's twist is kept or reported",
          "[planner][seam-solver]") {
  const Job job = loadJob(test::sourcePath("samples/jobs/bracket_welds.xml"));
  const SeamSpec& spec = std::get<SeamSpec>(job.tasks[2]);
  const ToolPath path = buildToolPath(spec, *job.cell.findTool(spec.tool));
  Bench bench(job.cell);
  const SeamOutcome free = bench.solve(path);
  REQUIRE(std::holds_alternative<SolvedSeam>(free));
  double twist = 0.0;
  const auto twistOf = [](const SolvedPose& pose) {
    return std::abs(pose.q[3]) + std::abs(pose.q[5]);
  };
  for (const SolvedPose& pose : std::get<SolvedSeam>(free).waypoints) {
    twist = std::max(twist, twistOf(pose));
  }
  CAPTURE(twist);
  REQUIRE(twist > 0.1);
  SeamSolverOptions options;
  options.wrist_twist_limit = twist - 0.05;  // 0.05 rad below: the free solution breaks it
  const SeamOutcome limited = bench.solve(path, options);
  if (const auto* seam = std::get_if<SolvedSeam>(&limited)) {
    std::vector<const SolvedPose*> poses{&seam->approach, &seam->retract};
    for (const SolvedPose& pose : seam->waypoints) poses.push_back(&pose);
    for (const SolvedPose* pose : poses) CHECK(twistOf(*pose) <= *options.wrist_twist_limit);
    verifySolved(*seam, path, bench.setting(path.frame), options, *bench.workspace);
  } else {
    const SeamReport& report = std::get<SeamReport>(limited);
    CAPTURE(report.text());
    int twisted = 0;
    for (const BlockedWaypoint& b : report.blocked) {
      twisted += b.rejected[static_cast<int>(RejectReason::kWristTwist)];
    }
    CHECK((twisted > 0 || report.step.has_value()));
  }
}

}  // namespace
}  // namespace tw::planner

namespace tw::planner {
namespace {

TEST_CASE("Seam solver options out of range are refused as a programming error", "[planner][seam-solver]") {
  Bench bench(sampleCell());
  const ToolPath path = straightPath("world", {0.9, 0.3, 0.9}, {0.9, 0.31, 0.9}, 3, kFullSpin);
  SeamSolverOptions zero_step;
  zero_step.spin_step = 0.0;
  CHECK_THROWS_AS(bench.solve(path, zero_step), std::invalid_argument);
  SeamSolverOptions short_weights;
  short_weights.weights = Eigen::VectorXd::Ones(5);
  CHECK_THROWS_WITH(bench.solve(path, short_weights), Catch::Contains("one value per joint"));
}

}  // namespace
}  // namespace tw::planner
