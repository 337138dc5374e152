#include "kinematics/common/angles.hpp"
#include "planner/toolpath/tool_path_builder.hpp"

#include <catch2/catch.hpp>

#include "planner/toolpath/normal_tool_poses.hpp"
#include "tests/planner/seam_test_points.hpp"

namespace tw::planner {
namespace {

// The bar for generated geometry.
constexpr double kBar = 1e-9;

Tool torch() {
  Tool tool;
  tool.name = "torch";
  tool.symmetric = true;
  tool.spin = SpinRange{-kPi, kPi};
  return tool;
}

SeamSpec seamWith(ProcessParameters process) {
  SeamSpec seam;
  seam.name = "s";
  seam.frame = "part";
  seam.tool = "torch";
  seam.points = test::cornerFillet();
  seam.process = process;
  seam.speed = 0.010;
  seam.approach = 0.030;
  seam.retract = 0.045;
  return seam;
}

TEST_CASE("A seam tool path has approach and retract along the tool axis", "[planner][path]") {
  const ToolPath path = buildToolPath(seamWith(WeldParameters{}), torch());
  REQUIRE(path.waypoints.size() == sampleSeam(test::cornerFillet(), SamplingOptions{}).size());
  CHECK(path.process == ProcessKind::kWeld);
  CHECK(path.frame == "part");
  // The free spin of the symmetric torch is handed on, not fixed here.
  CHECK(path.spin.min == -kPi);
  CHECK(path.spin.max == kPi);

  const Eigen::Isometry3d& first = path.waypoints.front().X_XT;
  const Eigen::Isometry3d& last = path.waypoints.back().X_XT;
  const Eigen::Vector3d approach_move = first.translation() - path.approach.translation();
  // Onto the seam along +z (towards the work) by the approach distance.
  CHECK(std::abs(approach_move.dot(first.linear().col(2)) - 0.030) < kBar);
  CHECK(approach_move.cross(first.linear().col(2)).norm() < kBar);
  CHECK(path.approach.linear().isApprox(first.linear(), 1e-15));
  const Eigen::Vector3d retract_move = path.retract.translation() - last.translation();
  CHECK(std::abs(retract_move.dot(last.linear().col(2)) + 0.045) < kBar);
  CHECK(retract_move.cross(last.linear().col(2)).norm() < kBar);

  SECTION("the process runs from the first waypoint to the last at the seam speed") {
    for (std::size_t i = 0; i < path.waypoints.size(); ++i) {
      CAPTURE(i);
      CHECK(path.waypoints[i].process_on == (i + 1 < path.waypoints.size()));
      CHECK(path.waypoints[i].speed == 0.010);
    }
  }
  SECTION("world poses follow the frame tree") {
    const Eigen::Isometry3d X_WP(Eigen::Translation3d(1.0, 0.2, 0.4));
    const FrameTree frames({{"part", "world", X_WP, 1}}, "cell.xml");
    const std::vector<Eigen::Isometry3d> poses = worldPoses(path, frames);
    REQUIRE(poses.size() == path.waypoints.size() + 2);
    CHECK((poses[1].translation() - (X_WP * first).translation()).norm() < kBar);
    CHECK((poses.back().translation() - (X_WP * path.retract).translation()).norm() < kBar);
  }
}

TEST_CASE("Paint and dispense tools stand square to the surface, the TCP on the seam",
          "[planner][path]") {
  for (const ProcessParameters& process :
       {ProcessParameters(PaintParameters{0.200}), ProcessParameters(DispenseParameters{0.003})}) {
    SeamSpec seam = seamWith(process);
    seam.points = test::pointList({{0, 0, 0}, {0.05, 0.01, 0.0}},
                                  {Eigen::Vector3d(0, 0.2, 1), Eigen::Vector3d(0, 0.2, 1)});
    const ToolPath path = buildToolPath(seam, torch());
    CAPTURE(toString(path.process));
    const Eigen::Vector3d n = Eigen::Vector3d(0, 0.2, 1).normalized();
    for (const Waypoint& waypoint : path.waypoints) {
      const Eigen::Vector3d z = waypoint.X_XT.linear().col(2);
      CHECK((z + n).norm() < kBar);
      // The TCP is the seam point (the stand-off is the tool tip's distance
      // back from it), on the seam line from (0,0,0) to (50,10,0) mm.
      const Eigen::Vector3d foot = waypoint.X_XT.translation();
      CHECK(foot.z() == Approx(0.0).margin(kBar));
      CHECK(foot.y() == Approx(0.2 * foot.x()).margin(kBar));
      CHECK(waypoint.X_XT.linear().col(0).dot(Eigen::Vector3d(5, 1, 0)) > 0.0);
    }
  }
  SECTION("a dispensed fillet bead uses the bisector of the two normals") {
    SeamSample sample;
    sample.tangent = Eigen::Vector3d::UnitX();
    sample.second_normal = Eigen::Vector3d::UnitY();
    const Eigen::Isometry3d X = normalToolPose(sample, "test.csv");
    // domain-facts.md §1 torch frame check, no lean: z0 = (0, −0.7071, −0.7071).
    CHECK((X.linear().col(2) - Eigen::Vector3d(0, -0.7071068, -0.7071068)).cwiseAbs().maxCoeff() <
          5e-8);
  }
}

TEST_CASE("A patch tool path sprays only across the part", "[planner][path][paint]") {
  PatchSpec patch;
  patch.name = "coat";
  patch.frame = "panel";
  patch.tool = "gun";
  patch.patch.outline = {{0, 0, 0}, {0.6, 0, 0}, {0.6, 0.4, 0}, {0, 0.4, 0}};
  patch.raster.stand_off = 0.2;
  patch.raster.spray_width = 0.2;
  patch.raster.overlap = 0.5;
  patch.raster.lead = 0.125;
  patch.speed = 0.5;
  patch.step = 0.05;
  patch.line = 12;
  Tool gun;
  gun.name = "gun";
  const ToolPath path = buildToolPath(patch, gun, "job.xml");
  // 5 passes (400 mm at 100 mm), each: lead start, 12 pieces of 50 mm across
  // (12 waypoints from the near edge), far edge, lead end = 15 waypoints.
  REQUIRE(path.waypoints.size() == 5 * 15);
  CHECK(path.spin.fixed());
  for (const Waypoint& waypoint : path.waypoints) {
    const Eigen::Vector3d p = waypoint.X_XT.translation();
    CAPTURE(waypoint.pass, p.transpose());
    // The TCP aims at the surface; the gun stands the stand-off behind it.
    CHECK(p.z() == Approx(0.0).margin(kBar));
    CHECK((waypoint.X_XT.linear().col(2) + Eigen::Vector3d::UnitZ()).norm() < kBar);
    // The gun keeps its x axis along the first pass (+x) on the return
    // passes too: the fan (along the gun's y) stays across every pass, and
    // the gun never turns half round at a turnaround.
    CHECK((waypoint.X_XT.linear().col(0) - Eigen::Vector3d::UnitX()).norm() < kBar);
    CHECK(waypoint.line == 12);
    // Spraying moves start inside the outline (x in [0, 0.6)), never in the lead.
    if (waypoint.process_on) CHECK((p.x() >= -kBar && p.x() <= 0.6 + kBar));
    if (p.x() < -kBar || p.x() > 0.6 + kBar) CHECK_FALSE(waypoint.process_on);
  }
  CHECK(path.waypoints.front().X_XT.translation().x() == Approx(-0.125).margin(kBar));
  CHECK(path.waypoints[15].X_XT.translation().x() == Approx(0.725).margin(kBar));
  CHECK(path.waypoints[15].pass == 1);
}

}  // namespace
}  // namespace tw::planner
