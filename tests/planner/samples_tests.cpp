#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <string>

#include "collision/collision_workspace.hpp"
#include "kinematics/common/angles.hpp"
#include "kinematics/forward_kinematics.hpp"
#include "planner/cell/cell_collision_world.hpp"
#include "planner/job/job_loader.hpp"
#include "planner/seam/seam_solver.hpp"
#include "planner/toolpath/process_angles.hpp"
#include "planner/toolpath/tool_path_builder.hpp"
#include "tests/planner/test_files.hpp"

namespace tw::planner {
namespace {


ToolPath pathOf(const JobTask& task, const Job& job) {
  if (const auto* seam = std::get_if<SeamSpec>(&task)) {
    return buildToolPath(*seam, *job.cell.findTool(seam->tool));
  }
  const PatchSpec& patch = std::get<PatchSpec>(task);
  return buildToolPath(patch, *job.cell.findTool(patch.tool), job.source);
}

TEST_CASE("The sample jobs and cells load and give tool paths", "[planner][samples]") {
  for (const char* name : {"samples/jobs/bracket_welds.xml", "samples/jobs/panel_seal.xml",
                           "samples/jobs/panel_coat.xml"}) {
    CAPTURE(name);
    const Job job = loadJob(test::sourcePath(name));
    REQUIRE_FALSE(job.tasks.empty());
    REQUIRE_FALSE(job.outputs.empty());
    for (const JobTask& task : job.tasks) {
      const ToolPath path = pathOf(task, job);
      CAPTURE(path.name);
      CHECK(path.waypoints.size() >= 2);
      CHECK(worldPoses(path, job.cell.frames).size() == path.waypoints.size() + 2);
    }
  }
}

TEST_CASE("The sample bracket seams hold the torch at the job's angles", "[planner][samples]") {
  const Job job = loadJob(test::sourcePath("samples/jobs/bracket_welds.xml"));
  REQUIRE(job.tasks.size() == 4);
  const SeamSpec& corner = std::get<SeamSpec>(job.tasks[0]);
  const ToolPath path = pathOf(job.tasks[0], job);
  // 110 mm at most 2 mm apart: 55 pieces, 56 waypoints.
  CHECK(path.waypoints.size() == 56);
  // In the part frame the torch axis is the check vector of domain-facts §1
  // (10° push on n1 = z, n2 = y, t = x); 5e-6 per component is half a unit
  // of its last digit.
  const Eigen::Vector3d z_X(0.17365, -0.69636, -0.69636);
  CHECK((path.waypoints.front().X_XT.linear().col(2) - z_X).cwiseAbs().maxCoeff() < 5e-6);
  // The bracket frame is the table top shifted and turned 90° about z, so in
  // the world the axis is that vector turned 90° about z: (x, y, z) becomes
  // (−y, x, z) (hand composition, common practice, no source).
  const Eigen::Isometry3d X_WT = worldPoses(path, job.cell.frames)[1];
  CHECK((X_WT.linear().col(2) - Eigen::Vector3d(-z_X.y(), z_X.x(), z_X.z())).cwiseAbs().maxCoeff() <
        5e-6);
  // The corner seam starts at (10, 8, 8) mm in the bracket frame, which the
  // turn makes (−8, 10, 8) mm from the bracket origin: the world point is
  // table (1300, 0, 0) + top (0, 0, 800) + bracket (100, −50, 0) + that, and
  // the TCP (the wire end) is that point.
  const Eigen::Vector3d p_W(1.300 + 0.100 - 0.008, -0.050 + 0.010, 0.800 + 0.008);
  CHECK((X_WT.translation() - p_W).norm() < 1e-9);
  CHECK(std::get<WeldParameters>(corner.process).work_angle.value() == Approx(45.0 * kPi / 180.0));

  SECTION("after a known move of the bracket the seam follows it") {
    // Put the bracket origin at (50, 20, 0) mm in the table top and turn it
    // 180° about z, 90° more than in the cell: (10, 8, 8) mm in the bracket
    // is then at (−10, −8, 8) mm from its new origin (hand composition,
    // common practice, no source).
    FrameTree moved = job.cell.frames;
    Eigen::Isometry3d X_TB = Eigen::Isometry3d::Identity();
    X_TB.translation() = Eigen::Vector3d(0.050, 0.020, 0.0);
    X_TB.linear() = Eigen::AngleAxisd(kPi, Eigen::Vector3d::UnitZ()).toRotationMatrix();
    moved.setPoseInParent("bracket", X_TB);
    const Eigen::Isometry3d X_WT_moved = worldPoses(path, moved)[1];
    const Eigen::Vector3d p_W_moved(1.300 + 0.050 - 0.010, 0.020 - 0.008, 0.800 + 0.008);
    CHECK((X_WT_moved.translation() - p_W_moved).norm() < 1e-9);
    // The torch turned with the part: its axis is the old one turned 90° about z.
    const Eigen::Vector3d z_old = X_WT.linear().col(2);
    CHECK((X_WT_moved.linear().col(2) - Eigen::Vector3d(-z_old.y(), z_old.x(), z_old.z())).norm() <
          1e-12);
  }
  SECTION("the lug seam is one straight run along the lug's front") {
    const ToolPath lug = pathOf(job.tasks[3], job);
    int corners = 0;
    for (const Waypoint& waypoint : lug.waypoints) corners += waypoint.corner;
    CHECK(corners == 0);
    // 56 mm at most 2 mm apart: 28 pieces, 29 waypoints.
    CHECK(lug.waypoints.size() == 29);
  }
}

/// Does the joint vector q collide (within the margin) with body `name`?
/// The state check stops at the first offending pair, so every pair is
/// asked through a world that holds only that body besides the arm and tool.
bool touchesBody(const Cell& cell, const Tool& tool, const std::string& name,
                 const kinematics::JointVector& q) {
  Cell only = cell;
  only.bodies.erase(std::remove_if(only.bodies.begin(), only.bodies.end(),
                                   [&](const CellBody& body) { return body.name != name; }),
                    only.bodies.end());
  REQUIRE(only.bodies.size() == 1);
  const collision::CollisionWorld world = buildCellCollisionWorld(only, tool);
  collision::CollisionWorkspace workspace(world);
  return !world.checkState(q, workspace).valid();
}

TEST_CASE("The sample corner-left seam needs the torch spin to clear the right clamp's handle",
          "[planner][samples][seam-solver]") {
  const Job job = loadJob(test::sourcePath("samples/jobs/bracket_welds.xml"));
  const SeamSpec& corner = std::get<SeamSpec>(job.tasks[0]);
  REQUIRE(corner.name == "corner-left");
  const Tool& torch = *job.cell.findTool(corner.tool);
  // The cell leaves the spin of the symmetric torch free.
  REQUIRE(torch.symmetric);
  REQUIRE(torch.spin.max - torch.spin.min > kPi);
  // The same torch with the spin held at its nominal value (x along travel).
  Tool held = torch;
  held.spin = SpinRange{0.0, 0.0};
  const ToolPath held_path = buildToolPath(corner, held);
  const ToolPath free_path = buildToolPath(corner, torch);
  REQUIRE(held_path.spin.fixed());
  const int n = static_cast<int>(held_path.waypoints.size());

  Cell open_cell = job.cell;
  open_cell.bodies.erase(std::remove_if(open_cell.bodies.begin(), open_cell.bodies.end(),
                                        [](const CellBody& body) { return body.name == "clamp-right"; }),
                         open_cell.bodies.end());
  REQUIRE(open_cell.bodies.size() + 1 == job.cell.bodies.size());
  const collision::CollisionWorld world = buildCellCollisionWorld(job.cell, torch);
  const collision::CollisionWorld open_world = buildCellCollisionWorld(open_cell, torch);
  collision::CollisionWorkspace workspace(world);
  collision::CollisionWorkspace open_workspace(open_world);
  // As solveJob sets it up: the arm base, the seam frame, the TCP, home.
  SeamSetting setting;
  setting.X_WB = job.cell.frames.X_W(job.cell.arm_frame);
  setting.X_WX = job.cell.frames.X_W(corner.frame);
  setting.X_FT = torch.X_FT;
  setting.reference = job.cell.home;
  SeamSetting open_setting = setting;
  setting.world = &world;
  open_setting.world = &open_world;
  const SeamSolverOptions options;

  // Without the clamp the seam runs at the nominal spin: the clamp is what blocks it.
  const SeamOutcome open_held = solveSeam(held_path, open_setting, options, open_workspace);
  REQUIRE(std::holds_alternative<SolvedSeam>(open_held));
  const SolvedSeam& unblocked = std::get<SolvedSeam>(open_held);

  const SeamOutcome blocked_outcome = solveSeam(held_path, setting, options, workspace);
  REQUIRE(std::holds_alternative<SeamReport>(blocked_outcome));
  const SeamReport& report = std::get<SeamReport>(blocked_outcome);
  CAPTURE(report.text());
  REQUIRE_FALSE(report.blocked.empty());
  // One stretch, from the second half of the seam (the handle stands in
  // front of the bracket's middle, beyond the seam's end) to the retract end.
  REQUIRE(report.stretches.size() == 1);
  CHECK(report.stretches.front().first > n / 2);
  CHECK(report.stretches.front().second == n);
  std::vector<int> blocked;
  for (const BlockedWaypoint& b : report.blocked) {
    CAPTURE(b.index);
    blocked.push_back(b.index);
    CHECK(b.rejected[static_cast<int>(RejectReason::kCollision)] > 0);
    CHECK(std::any_of(b.colliding_pairs.begin(), b.colliding_pairs.end(), [](const std::string& pair) {
      return pair.find("clamp-right") != std::string::npos;
    }));
    // By another route: the pose the open cell runs there collides with the clamp.
    const SolvedPose& pose = b.index == n ? unblocked.retract : unblocked.waypoints[b.index];
    CHECK(touchesBody(job.cell, torch, "clamp-right", pose.q));
  }

  // With the cell's free spin the seam solves, turned away from the nominal
  // spin where it was blocked, and collision-free throughout.
  const SeamOutcome free_outcome = solveSeam(free_path, setting, options, workspace);
  REQUIRE(std::holds_alternative<SolvedSeam>(free_outcome));
  const SolvedSeam& seam = std::get<SolvedSeam>(free_outcome);
  CAPTURE(seam.branch.toString());
  for (const int i : blocked) {
    const SolvedPose& pose = i == n ? seam.retract : seam.waypoints[i];
    CAPTURE(i, pose.spin);
    // At least half a spin sample away from 0: a different sample.
    CHECK(std::abs(pose.spin) > 0.5 * options.spin_step);
    CHECK_FALSE(touchesBody(job.cell, torch, "clamp-right", pose.q));
  }
  REQUIRE(seam.waypoints.size() == free_path.waypoints.size());
  std::vector<std::pair<const SolvedPose*, Eigen::Isometry3d>> poses{
      {&seam.approach, free_path.approach}, {&seam.retract, free_path.retract}};
  for (int i = 0; i < n; ++i) poses.emplace_back(&seam.waypoints[i], free_path.waypoints[i].X_XT);
  for (const auto& [pose, X_XT] : poses) {
    CAPTURE(pose->q.transpose(), pose->spin);
    CHECK(world.checkState(pose->q, workspace).valid());
    // Clearance never reports below the true distance (collision_world.hpp).
    CHECK(world.clearance(pose->q, workspace).distance >= world.clearanceMargin());
    // The joints place the TCP at the path's pose turned by the spin: 1e-6 m
    // and 1e-6 rad, the seam solver tests' bar (closed-form IK is exact to ~1e-12).
    const Eigen::Isometry3d X_WT_fk =
        setting.X_WB * kinematics::flangePose(job.cell.arm, pose->q) * setting.X_FT;
    const Eigen::Isometry3d X_WT =
        setting.X_WX * X_XT * Eigen::AngleAxisd(pose->spin, Eigen::Vector3d::UnitZ());
    CHECK((X_WT_fk.translation() - X_WT.translation()).norm() < 1e-6);
    CHECK(Eigen::AngleAxisd(X_WT_fk.linear().transpose() * X_WT.linear()).angle() < 1e-6);
  }
}

TEST_CASE("The sample panel coat follows the reference spray vector", "[planner][samples]") {
  const Job job = loadJob(test::sourcePath("samples/jobs/panel_coat.xml"));
  REQUIRE(job.tasks.size() == 1);
  const PatchSpec& patch = std::get<PatchSpec>(job.tasks[0]);
  // domain-facts.md §2 [C]: 200 mm, 30° → 230.9 mm fan; lead = half of it
  // plus 0.5²/(2·5) m = 25 mm [C + M]; values to 0.1 mm, checked to 0.05 mm.
  CHECK(patch.raster.spray_width == Approx(0.2309).margin(5e-5));
  CHECK(patch.raster.lead == Approx(0.11547 + 0.025).margin(5e-5));
  const ToolPath path = pathOf(job.tasks[0], job);
  // 400 mm across at 115.5 mm: 5 passes (the rule in paint_raster.hpp).
  CHECK(path.waypoints.back().pass == 4);
  // The gun is fixed about its axis: a flat fan is not symmetric.
  CHECK(path.spin.fixed());
  const Eigen::Isometry3d X_WT = worldPoses(path, job.cell.frames)[1];
  // Hand composition of the cell's frames (common practice, no source): the
  // panel corner is at rack (1400, 0, 0) + (0, 300, 950) mm, and rpy
  // (90, 0, −90) turns the panel's x to the world's −y, its y to +z and its
  // z (out of the face) to −x. The first pass runs along −x of the panel
  // and steps across along z × (−x) = −y, so it lies above the panel: the
  // five pass lines are centred on its 400 mm height, two spacings (one fan
  // width) above the middle, at y = 200 mm + w. It starts the lead beyond
  // the right edge (x = 600 mm + lead), and the TCP is the aim point on the
  // face (the gun stands 200 mm back from it).
  const double w = patch.raster.spray_width;
  const Eigen::Vector3d expected(1.4, 0.3 - (0.6 + patch.raster.lead), 0.95 + 0.2 + w);
  CHECK((X_WT.translation() - expected).norm() < 1e-9);
  // Gun horizontal, pointing at the face (world +x); the first pass runs
  // from right to left as seen from the arm (world +y).
  CHECK((X_WT.linear().col(2) - Eigen::Vector3d::UnitX()).norm() < 1e-12);
  CHECK((X_WT.linear().col(0) - Eigen::Vector3d::UnitY()).norm() < 1e-12);
}

TEST_CASE("The sample panel seal runs along the lower edge with the nozzle at the face",
          "[planner][samples]") {
  const Job job = loadJob(test::sourcePath("samples/jobs/panel_seal.xml"));
  REQUIRE(job.tasks.size() == 1);
  const ToolPath path = pathOf(job.tasks[0], job);
  // 560 mm at most 5 mm apart: 112 pieces, 113 waypoints.
  CHECK(path.waypoints.size() == 113);
  const Eigen::Isometry3d X_WT = worldPoses(path, job.cell.frames)[1];
  // The first point (20, 20, 0) mm in the panel frame, composed by hand as in
  // the coat test (common practice, no source): world (1400, 300 − 20,
  // 950 + 20) mm; the TCP is that point on the face (the nozzle tip stands
  // 3 mm back from it towards the arm).
  const Eigen::Vector3d expected(1.4, 0.3 - 0.02, 0.95 + 0.02);
  CHECK((X_WT.translation() - expected).norm() < 1e-9);
  CHECK((X_WT.linear().col(2) - Eigen::Vector3d::UnitX()).norm() < 1e-12);
}

}  // namespace
}  // namespace tw::planner
