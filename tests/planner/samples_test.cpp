#include <catch2/catch.hpp>

#include "planner/job_loader.hpp"
#include "planner/process_angles.hpp"
#include "planner/tool_path_builder.hpp"
#include "test_files.hpp"

namespace tw::planner {
namespace {

constexpr double kPi = 3.14159265358979323846;

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
  // The bracket frame is the table top shifted, not turned, so world and
  // part directions agree: the check vector of domain-facts §1 (10° push on
  // n1 = z, n2 = y, t = x) applies to the world poses; 5e-6 per component
  // is half a unit of its last digit.
  const Eigen::Isometry3d X_WT = worldPoses(path, job.cell.frames)[1];
  CHECK(
      (X_WT.linear().col(2) - Eigen::Vector3d(0.17365, -0.69636, -0.69636)).cwiseAbs().maxCoeff() <
      5e-6);
  // The corner seam starts at (10, 8, 8) mm in the bracket frame: the world
  // point is table (950, 0, 0) + top (0, 0, 400) + bracket (−225, −60, 0) + it,
  // and the TCP sits 15 mm back along the torch axis.
  const Eigen::Vector3d p_W(0.950 - 0.225 + 0.010, -0.060 + 0.008, 0.400 + 0.008);
  CHECK((X_WT.translation() + 0.015 * X_WT.linear().col(2) - p_W).norm() < 1e-9);
  CHECK(std::get<WeldParameters>(corner.process).work_angle.value() == Approx(45.0 * kPi / 180.0));

  SECTION("after a known move of the bracket the seam follows it") {
    // Shift the bracket 20 mm along the table's y and turn it 90° about z
    // at its origin: (10, 8, 8) mm in the bracket is then at (−8, 10, 8) mm
    // from its new origin (hand composition, common practice, no source).
    FrameTree moved = job.cell.frames;
    Eigen::Isometry3d X_TB = Eigen::Isometry3d::Identity();
    X_TB.translation() = Eigen::Vector3d(-0.150, -0.040, 0.0);
    X_TB.linear() = Eigen::AngleAxisd(kPi / 2, Eigen::Vector3d::UnitZ()).toRotationMatrix();
    moved.setPoseInParent("bracket", X_TB);
    const Eigen::Isometry3d X_WT_moved = worldPoses(path, moved)[1];
    const Eigen::Vector3d p_W_moved(0.950 - 0.150 - 0.008, -0.040 + 0.010, 0.400 + 0.008);
    CHECK((X_WT_moved.translation() + 0.015 * X_WT_moved.linear().col(2) - p_W_moved).norm() <
          1e-9);
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
  // the right edge (x = 600 mm + lead), and the TCP stands off 200 mm along
  // the panel's z.
  const double w = patch.raster.spray_width;
  const Eigen::Vector3d expected(1.4 - 0.2, 0.3 - (0.6 + patch.raster.lead), 0.95 + 0.2 + w);
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
  // 950 + 20) mm, with the TCP 3 mm off the face towards the arm (−x).
  const Eigen::Vector3d expected(1.4 - 0.003, 0.3 - 0.02, 0.95 + 0.02);
  CHECK((X_WT.translation() - expected).norm() < 1e-9);
  CHECK((X_WT.linear().col(2) - Eigen::Vector3d::UnitX()).norm() < 1e-12);
}

}  // namespace
}  // namespace tw::planner
