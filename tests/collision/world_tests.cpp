#include <catch2/catch.hpp>

#include <cmath>
#include <fcl/narrowphase/distance.h>
#include <limits>
#include <memory>

#include "collision/collision_world.hpp"
#include "collision/tessellation.hpp"
#include "kinematics/arm_loader.hpp"
#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"
#include "tests/collision/mesh_files.hpp"
#include "tests/collision/test_arms.hpp"

namespace tw::collision {
namespace {

const std::string kOut = TW_TEST_OUTPUT_DIR;

kinematics::JointVector joints(std::initializer_list<double> values) {
  kinematics::JointVector q(static_cast<int>(values.size()));
  int i = 0;
  for (double value : values) q[i++] = value;
  return q;
}

TEST_CASE("The clearance margin separates free, within-margin and colliding states") {
  // Sphere r = 0.1 on the carriage; the obstacle's face is at x = 1.0, so the
  // gap is 0.9 − q (elementary geometry).
  WorldDescription description;
  description.bodies.push_back(
      {"wall", BodyRole::kObstacle, "",
       {test::boxShape(Eigen::Vector3d(0.4, 1.0, 1.0), Eigen::Vector3d(1.2, 0, 0))}});
  const CollisionWorld world(test::sliderArm({test::sphereShape(0.1, Eigen::Vector3d::Zero())}),
                             description);
  CollisionWorkspace workspace(world);
  CHECK(world.clearanceMargin() == 0.010);  // the documented default

  CHECK(world.checkState(joints({0.885}), workspace).status == StateStatus::kFree);
  const StateResult near = world.checkState(joints({0.895}), workspace);
  CHECK(near.status == StateStatus::kWithinMargin);
  CHECK(world.bodyName(near.body_a) == "carriage");
  CHECK(world.bodyName(near.body_b) == "wall");
  CHECK(world.checkState(joints({0.95}), workspace).status == StateStatus::kInCollision);

  SECTION("a smaller margin lets the near state pass") {
    description.clearance_margin = 0.002;
    const CollisionWorld tight(
        test::sliderArm({test::sphereShape(0.1, Eigen::Vector3d::Zero())}), description);
    CollisionWorkspace tight_workspace(tight);
    CHECK(tight.checkState(joints({0.895}), tight_workspace).status == StateStatus::kFree);
    CHECK(tight.checkState(joints({0.899}), tight_workspace).status ==
          StateStatus::kWithinMargin);
  }
}

TEST_CASE("A mesh obstacle gives closed-form clearance and catches a body inside it") {
  // A closed box mesh 400 mm on a side, centred at x = 1 m.
  kinematics::LinkShape box_spec = test::boxShape(Eigen::Vector3d(0.4, 0.4, 0.4), {0, 0, 0});
  test::writeBinaryStl(kOut + "/block.stl", tessellateShape(box_spec, 8));
  Eigen::Isometry3d X_WS = Eigen::Isometry3d::Identity();
  X_WS.translation() = Eigen::Vector3d(1.0, 0, 0);
  WorldDescription description;
  description.bodies.push_back(
      {"block", BodyRole::kObstacle, "", {test::meshShape(kOut + "/block.stl", X_WS)}});
  const CollisionWorld world(test::sliderArm({test::sphereShape(0.05, Eigen::Vector3d::Zero())}),
                             description);
  CollisionWorkspace workspace(world);

  // Sphere centre to the face at x = 0.8, minus the radius (elementary geometry);
  // 1e-9: the mesh corners are integer mm, exact in float32, faces are exact planes.
  CHECK(world.clearance(joints({0.3}), workspace).distance == Approx(0.45).margin(1e-9));
  // Wholly inside the surface: no triangle touches, yet it is a collision.
  CHECK(world.checkState(joints({1.0}), workspace).status == StateStatus::kInCollision);
  CHECK(world.clearance(joints({1.0}), workspace).distance == 0.0);

  SECTION("mesh against mesh: near miss and contact told apart on request") {
    // The same 400 mm block as the carriage: it spans x ∈ [q − 0.2, q + 0.2].
    const CollisionWorld blocks(
        test::sliderArm({test::meshShape(kOut + "/block.stl", Eigen::Isometry3d::Identity())}),
        description);
    CollisionWorkspace blocks_workspace(blocks);
    const StateQuery tell{/*tell_contact=*/true};
    // 5 mm gap: nearer than the 10 mm margin, no contact.
    CHECK(blocks.checkState(joints({0.595}), blocks_workspace, tell).status ==
          StateStatus::kWithinMargin);
    CHECK(blocks.checkState(joints({0.595}), blocks_workspace).status ==
          StateStatus::kWithinMargin);
    // 100 mm overlap: invalid either way, a contact when asked.
    CHECK_FALSE(blocks.checkState(joints({0.7}), blocks_workspace).valid());
    CHECK(blocks.checkState(joints({0.7}), blocks_workspace, tell).status ==
          StateStatus::kInCollision);
    CHECK(blocks.clearance(joints({0.595}), blocks_workspace).distance ==
          Approx(0.005).margin(1e-9));
  }
}

/// The slider carries a box (the carriage) and a torch: a cylinder r = 10 mm
/// from the flange down 200 mm, with the TCP at its tip (z towards the work)
/// and a tip contact of a 30 mm ball about it. The workpiece top
/// is 1 mm above the tip at q = 0.5, and a wall of the same workpiece rises
/// at x = 0.75.
struct TorchCell {
  TorchCell() {
    Eigen::Isometry3d X_FS = Eigen::Isometry3d::Identity();
    X_FS.translation() = Eigen::Vector3d(0, 0, -0.1);
    tool.shapes = {test::cylinderShape(0.01, 0.2, X_FS)};
    tool.name = "torch";
    tool.X_FT.translation() = Eigen::Vector3d(0, 0, -0.2);
    tool.X_FT.linear() = Eigen::AngleAxisd(kPi, Eigen::Vector3d::UnitX()).toRotationMatrix();
    tool.tip_contact = TipContact{0.0, 0.03};
    description.tool = tool;
    description.bodies.push_back(
        {"part", BodyRole::kWorkpiece, "",
         {test::boxShape(Eigen::Vector3d(0.4, 0.4, 0.202), Eigen::Vector3d(0.5, 0, -0.3)),
          test::boxShape(Eigen::Vector3d(0.05, 0.4, 0.2), Eigen::Vector3d(0.775, 0, -0.1))}});
  }

  CollisionWorld build() const {
    return CollisionWorld(test::sliderArm({test::boxShape(Eigen::Vector3d(0.1, 0.1, 0.05),
                                                          Eigen::Vector3d(0, 0, 0.05))}),
                          description);
  }

  ToolDescription tool;
  WorldDescription description;
};

TEST_CASE("The tool tip may touch the workpiece at the seam, nothing else may") {
  TorchCell cell;
  const CollisionWorld world = cell.build();
  CollisionWorkspace workspace(world);

  SECTION("tip 1 mm into the part, inside the tip allowance: allowed") {
    CHECK(world.checkState(joints({0.5}), workspace).status == StateStatus::kFree);
  }
  SECTION("the torch side against the part's wall: a collision of torch and part") {
    // Torch spans x ∈ [q − 0.01, q + 0.01]; the wall starts at x = 0.75.
    const StateResult result = world.checkState(joints({0.741}), workspace);
    CHECK(result.status == StateStatus::kInCollision);
    CHECK(world.bodyName(result.body_a) == "torch");
    CHECK(world.bodyName(result.body_b) == "part");
  }
  SECTION("the torch sunk 40 mm deep: beyond the 30 mm allowance, a collision") {
    cell.description.bodies[0].shapes[0].X_LS.translation().z() += 0.039;
    const CollisionWorld deep = cell.build();
    CollisionWorkspace deep_workspace(deep);
    CHECK(deep.checkState(joints({0.5}), deep_workspace).status == StateStatus::kInCollision);
  }
  SECTION("the same tip contact with an obstacle, not a workpiece, counts") {
    cell.description.bodies[0].role = BodyRole::kObstacle;
    const CollisionWorld obstacle = cell.build();
    CollisionWorkspace obstacle_workspace(obstacle);
    CHECK(obstacle.checkState(joints({0.5}), obstacle_workspace).status ==
          StateStatus::kInCollision);
  }
  SECTION("an arm link touching the workpiece counts") {
    // No torch, and the part raised so its top (z = −0.199 + 0.23) reaches
    // above the carriage's underside at z = 0.025.
    cell.description.tool.reset();
    cell.description.bodies[0].shapes[0].X_LS.translation().z() += 0.23;
    const CollisionWorld raised = cell.build();
    CollisionWorkspace raised_workspace(raised);
    const StateResult result = raised.checkState(joints({0.5}), raised_workspace);
    CHECK(result.status == StateStatus::kInCollision);
    CHECK(raised.bodyName(result.body_a) == "carriage");
  }
}

/// A welding torch on the slider, TCP (the wire end) 200 mm below the
/// flange with z towards the work: a modelled wire (r 0.6 mm) from the TCP
/// up 15 mm to the contact tip, and a nozzle (r 9 mm) from 20 mm to 120 mm
/// above the TCP. At q = 0.5 the wire end rests on a plate; a wall of the
/// same workpiece stands beside the nozzle, its face 11 mm from the torch
/// axis: 2 mm from the nozzle.
struct NozzleCell {
  static constexpr double kQ = 0.5;

  NozzleCell() {
    ToolDescription tool;
    tool.name = "torch";
    tool.X_FT.translation() = Eigen::Vector3d(0, 0, -0.2);
    tool.X_FT.linear() = Eigen::AngleAxisd(kPi, Eigen::Vector3d::UnitX()).toRotationMatrix();
    tool.shapes = {test::cylinderShape(0.0006, 0.015, translation(0, 0, -0.2 + 0.0075)),
                   test::cylinderShape(0.009, 0.1, translation(0, 0, -0.2 + 0.07))};
    tool.tip_contact = TipContact{0.015, 0.003};
    description.tool = tool;
    description.bodies.push_back(
        {"plate", BodyRole::kWorkpiece, "",
         {test::boxShape(Eigen::Vector3d(0.4, 0.4, 0.02), Eigen::Vector3d(kQ, 0, -0.21)),
          test::boxShape(Eigen::Vector3d(0.01, 0.1, 0.06), Eigen::Vector3d(kQ + 0.016, 0, -0.17))}});
  }

  static Eigen::Isometry3d translation(double x, double y, double z) {
    Eigen::Isometry3d X = Eigen::Isometry3d::Identity();
    X.translation() = Eigen::Vector3d(x, y, z);
    return X;
  }

  CollisionWorld build() const {
    return CollisionWorld(test::sliderArm({test::boxShape(Eigen::Vector3d(0.1, 0.1, 0.05),
                                                          Eigen::Vector3d(0, 0, 0.05))}),
                          description);
  }

  /// FCL's own distance between two primitives at world poses.
  static double fclDistance(const fcl::CollisionGeometryd& a_geometry, const Eigen::Isometry3d& X_WA,
                            const fcl::CollisionGeometryd& b_geometry,
                            const Eigen::Isometry3d& X_WB) {
    std::shared_ptr<fcl::CollisionGeometryd> a(const_cast<fcl::CollisionGeometryd*>(&a_geometry),
                                               [](fcl::CollisionGeometryd*) {});
    std::shared_ptr<fcl::CollisionGeometryd> b(const_cast<fcl::CollisionGeometryd*>(&b_geometry),
                                               [](fcl::CollisionGeometryd*) {});
    const fcl::CollisionObjectd object_a(a, X_WA);
    const fcl::CollisionObjectd object_b(b, X_WB);
    fcl::DistanceRequestd request;
    fcl::DistanceResultd result;
    fcl::distance(&object_a, &object_b, request, result);
    return result.min_distance;
  }

  WorldDescription description;
};

TEST_CASE("Record clearance is the distance of the tool without its contact part") {
  NozzleCell cell;
  const CollisionWorld world = cell.build();
  CollisionWorkspace workspace(world);
  ClearanceQuery to_cell;
  to_cell.pairs = PairGroup::kCell;

  // Reference: FCL's distance between the primitives themselves (a reference
  // library), at the world poses the slider gives them (flange at x = q).
  const fcl::Cylinderd nozzle(0.009, 0.1);
  const fcl::Cylinderd wire(0.0006, 0.015);
  const fcl::Boxd wall(0.01, 0.1, 0.06);
  const fcl::Boxd plate(0.4, 0.4, 0.02);
  const auto at = [](double x, double z) { return NozzleCell::translation(x, 0, z); };
  const double nozzle_to_wall = NozzleCell::fclDistance(nozzle, at(NozzleCell::kQ, -0.13), wall,
                                                        at(NozzleCell::kQ + 0.016, -0.17));
  const double wire_to_plate = NozzleCell::fclDistance(wire, at(NozzleCell::kQ, -0.1925), plate,
                                                       at(NozzleCell::kQ, -0.21));
  // The scene is what it claims: nozzle 2 mm from the wall (elementary
  // geometry: 11 mm face offset − 9 mm radius), wire end on the plate.
  REQUIRE(nozzle_to_wall == Approx(0.002).margin(1e-9));
  // FCL reports a negative distance for objects in contact.
  REQUIRE(wire_to_plate <= 0.0);

  const Clearance clearance = world.clearance(joints({NozzleCell::kQ}), workspace, to_cell);
  // 0.1 mm: the world measures the nozzle as a 32-sided polygon prism, up to
  // r·(1 − cos(π/32)) = 0.04 mm inside the cylinder (elementary geometry).
  CHECK(clearance.distance == Approx(nozzle_to_wall).margin(0.0001));
  CHECK(world.bodyName(clearance.body_a) == "torch");
  CHECK(world.bodyName(clearance.body_b) == "plate");
  // 2 mm is inside the 10 mm margin: the nozzle may not work there, though
  // the wire may touch.
  const StateResult state = world.checkState(joints({NozzleCell::kQ}), workspace);
  CHECK(state.status == StateStatus::kWithinMargin);

  SECTION("without a tip contact (a spray tool) the wire on the plate counts too") {
    cell.description.tool->tip_contact.reset();
    const CollisionWorld strict = cell.build();
    CollisionWorkspace strict_workspace(strict);
    CHECK(strict.clearance(joints({NozzleCell::kQ}), strict_workspace, to_cell).distance <
          0.0001);
    CHECK(strict.checkState(joints({NozzleCell::kQ}), strict_workspace).status ==
          StateStatus::kInCollision);
  }
  SECTION("without the wall, the nozzle's face 20 mm above the plate is nearest") {
    // The whole 15 mm stick-out (the modelled wire) is exempt, not only the
    // ball at the TCP: the wire's upper end is at 15 mm.
    cell.description.bodies[0].shapes.pop_back();
    const CollisionWorld open = cell.build();
    CollisionWorkspace open_workspace(open);
    CHECK(open.clearance(joints({NozzleCell::kQ}), open_workspace, to_cell).distance ==
          Approx(0.020).margin(0.0001));
  }
  SECTION("moved 1 mm further from the wall, the nozzle is 3 mm from it") {
    // The nozzle's face stays 20 mm above the plate: the wall is nearest.
    const Clearance moved = world.clearance(joints({NozzleCell::kQ - 0.001}), workspace, to_cell);
    CHECK(moved.distance == Approx(nozzle_to_wall + 0.001).margin(0.0001));
  }
}

TEST_CASE("Neighbouring links never report, other link pairs do") {
  // Three links 0.5 m apart, each a 0.6 m bar overlapping its neighbours at
  // the joints; the base block overlaps the first link at every angle.
  const kinematics::LinkShape bar =
      test::boxShape(Eigen::Vector3d(0.6, 0.1, 0.1), Eigen::Vector3d(0.25, 0, 0));
  const kinematics::LinkShape base = test::boxShape(Eigen::Vector3d(0.1, 0.1, 0.1), {0, 0, 0});
  const CollisionWorld world(test::planarArm({{base}, {bar}, {bar}, {bar}}, 0.5),
                             WorldDescription{});
  CollisionWorkspace workspace(world);
  for (double q2 : {-2.0, -0.5, 0.0, 0.7, 1.9}) {
    CAPTURE(q2);
    CHECK(world.checkState(joints({0.3, q2, 0.0}), workspace).valid());
  }
  // Folded by 0.8π twice, link 3 starts at (0.096, 0.294) heading −72° and
  // crosses link 1 near x = 0.19, clear of the base block (planar geometry).
  const kinematics::JointVector folded_q = joints({0.0, 0.8 * kPi, 0.8 * kPi});
  const StateResult folded = world.checkState(folded_q, workspace);
  CHECK(folded.status == StateStatus::kInCollision);
  const std::string pair = world.bodyName(folded.body_a) + "+" + world.bodyName(folded.body_b);
  CHECK((pair == "link1+link3" || pair == "link3+link1"));

  SECTION("an allowed pair named in the description is not reported") {
    WorldDescription description;
    description.allowed_pairs = {{"link1", "link3"}};
    const CollisionWorld relaxed(test::planarArm({{base}, {bar}, {bar}, {bar}}, 0.5),
                                 description);
    CollisionWorkspace relaxed_workspace(relaxed);
    CHECK(relaxed.checkState(folded_q, relaxed_workspace).valid());
  }
}

TEST_CASE("Link pairs nearer than the margin at the zero pose are pointed out") {
  // In this arm's zero pose the upper-arm capsule (axis x = 155 mm,
  // r = 95 mm, up to z = 1155 mm) and the forearm capsule (axis x = 270 mm,
  // r = 75 mm, from z = 1035 mm) overlap at the elbow: 115 mm < 95 + 75 mm.
  const kinematics::ArmModel arm =
      kinematics::loadArmDescription(std::string(TW_SOURCE_DIR) +
                                     "/tests/collision/data/overlapping_elbow_arm.xml");
  const CollisionWorld world(arm, WorldDescription{});
  REQUIRE_FALSE(world.notes().empty());
  CHECK_THAT(world.notes()[0], Catch::Contains("\"j2\" and \"j4\"") &&
                                   Catch::Contains("zero joint vector"));
  CollisionWorkspace workspace(world);
  CHECK_FALSE(world.checkState(kinematics::JointVector::Zero(6), workspace).valid());

  SECTION("the sample arm has no such pair") {
    const CollisionWorld sample(kinematics::loadArmDescription(std::string(TW_SOURCE_DIR) +
                                                               "/samples/arms/weld_arm_1400.xml"),
                                WorldDescription{});
    CHECK(sample.notes().empty());
  }
  SECTION("allowing the pair silences the note") {
    WorldDescription description;
    description.allowed_pairs = {{"j2", "j4"}};
    const CollisionWorld relaxed(arm, description);
    for (const std::string& note : relaxed.notes()) {
      CHECK_THAT(note, !Catch::Contains("\"j2\" and \"j4\""));
    }
  }
}

TEST_CASE("A cell body in the arm's foot is reported once, not per state") {
  const kinematics::LinkShape foot = test::boxShape(Eigen::Vector3d(0.4, 0.4, 0.2), {0, 0, 0.1});
  const kinematics::LinkShape bar =
      test::boxShape(Eigen::Vector3d(0.6, 0.1, 0.1), Eigen::Vector3d(0.25, 0, 0.5));
  WorldDescription description;
  // The cable duct overlaps the foot (x from 0.15 to 0.5 against 0.2); the
  // fence is 1 m away.
  description.bodies.push_back(
      {"duct", BodyRole::kObstacle, "", {test::boxShape({0.35, 0.1, 0.1}, {0.325, 0, 0.05})}});
  description.bodies.push_back(
      {"fence", BodyRole::kObstacle, "", {test::boxShape({0.1, 2.0, 2.0}, {1.2, 0, 0})}});
  const CollisionWorld world(test::planarArm({{foot}, {bar}}, 0.5), description);
  const std::vector<std::pair<int, int>> conflicts = world.baseConflicts();
  REQUIRE(conflicts.size() == 1);
  CHECK(world.bodyName(conflicts[0].first) == "base");
  CHECK(world.bodyName(conflicts[0].second) == "duct");
  // States do not report it: the link above is clear of both.
  CollisionWorkspace workspace(world);
  CHECK(world.checkState(joints({0.0}), workspace).valid());
}

TEST_CASE("Clearance to a fixture body follows the fixture frame") {
  WorldDescription description;
  description.fixtures.push_back({"table", Eigen::Isometry3d(Eigen::Translation3d(1.0, 0, 0))});
  description.bodies.push_back(
      {"clamp", BodyRole::kObstacle, "table", {test::sphereShape(0.1, {0, 0.5, 0})}});
  const CollisionWorld world(test::sliderArm({test::sphereShape(0.1, Eigen::Vector3d::Zero())}),
                             description);
  CollisionWorkspace workspace(world);
  // Ball centres (0,0,0) and (1, 0.5, 0): |Δc| − r1 − r2 (elementary geometry).
  CHECK(world.clearance(joints({0.0}), workspace).distance ==
        Approx(std::hypot(1.0, 0.5) - 0.2).margin(1e-9));

  // The table moved to x = 1.5 and turned 90° about z: the clamp lands at (1.0, 0, 0).
  const Eigen::Isometry3d X_WX =
      Eigen::Translation3d(1.5, 0, 0) * Eigen::AngleAxisd(kPi / 2, Eigen::Vector3d::UnitZ());
  const CollisionWorld moved = world.withFixturePose("table", X_WX);
  const Clearance clearance = moved.clearance(joints({0.0}), workspace);
  CHECK(clearance.distance == Approx(0.8).margin(1e-9));
  CHECK((clearance.p_WB - Eigen::Vector3d(0.9, 0, 0)).norm() < 1e-9);
  // The original world is untouched.
  CHECK(world.clearance(joints({0.0}), workspace).distance ==
        Approx(std::hypot(1.0, 0.5) - 0.2).margin(1e-9));
}

TEST_CASE("Bad world descriptions and misuse give clear errors") {
  const kinematics::ArmModel arm = test::sliderArm({test::sphereShape(0.1, {0, 0, 0})});
  WorldDescription description;
  SECTION("unknown fixture") {
    description.bodies.push_back({"clamp", BodyRole::kObstacle, "bench", {}});
    CHECK_THROWS_WITH(CollisionWorld(arm, description), Catch::Contains("unknown fixture \"bench\""));
  }
  SECTION("duplicate body name") {
    description.bodies.push_back({"carriage", BodyRole::kObstacle, "", {}});
    CHECK_THROWS_WITH(CollisionWorld(arm, description), Catch::Contains("used twice"));
  }
  SECTION("no margin") {
    description.clearance_margin = 0.0;
    CHECK_THROWS_WITH(CollisionWorld(arm, description), Catch::Contains("clearance margin"));
  }
  SECTION("unknown allowed pair") {
    description.allowed_pairs = {{"carriage", "ghost"}};
    CHECK_THROWS_WITH(CollisionWorld(arm, description), Catch::Contains("\"ghost\""));
  }
  SECTION("missing mesh file") {
    description.bodies.push_back(
        {"jig", BodyRole::kObstacle, "",
         {test::meshShape(kOut + "/missing_jig.stl", Eigen::Isometry3d::Identity())}});
    CHECK_THROWS_WITH(CollisionWorld(arm, description),
                      Catch::Contains("missing_jig.stl") && Catch::Contains("cannot open"));
  }
  SECTION("a workspace of another world") {
    const CollisionWorld first(arm, description);
    const CollisionWorld second(arm, description);
    CollisionWorkspace workspace(first);
    CHECK_THROWS_AS(second.checkState(joints({0.0}), workspace), std::invalid_argument);
  }
  SECTION("a joint vector of the wrong size") {
    const CollisionWorld world(arm, description);
    CollisionWorkspace workspace(world);
    CHECK_THROWS_WITH(world.checkState(joints({0.0, 1.0}), workspace),
                      Catch::Contains("2 values"));
    CHECK_THROWS_AS(world.checkSegment(joints({0.0}), joints({0.0, 1.0}), workspace), std::invalid_argument);
  }
  SECTION("a joint value that is not a number") {
    const CollisionWorld world(arm, description);
    CollisionWorkspace workspace(world);
    const double nan = std::numeric_limits<double>::quiet_NaN();
    CHECK_THROWS_WITH(world.checkState(joints({nan}), workspace), Catch::Contains("non-finite"));
    CHECK_THROWS_WITH(world.checkSegment(joints({0.0}), joints({nan}), workspace),
                      Catch::Contains("non-finite"));
  }
}

TEST_CASE("Degenerate triangles of a cell mesh are reported in the world's notes") {
  TriangleMesh mesh = tessellateShape(test::boxShape(Eigen::Vector3d(0.1, 0.1, 0.1), {0, 0, 0}), 8);
  mesh.triangles.push_back({{0, 0, 1}});
  test::writeObj(kOut + "/block_degenerate.obj", mesh);
  WorldDescription description;
  description.bodies.push_back(
      {"block", BodyRole::kObstacle, "",
       {test::meshShape(kOut + "/block_degenerate.obj", Eigen::Isometry3d::Identity())}});
  const CollisionWorld world(test::sliderArm({test::sphereShape(0.1, {0, 0, 0})}), description);
  REQUIRE(world.notes().size() == 1);
  CHECK_THAT(world.notes()[0],
             Catch::Contains("block_degenerate.obj") && Catch::Contains("1 degenerate"));
}

}  // namespace
}  // namespace tw::collision
