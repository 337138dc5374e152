#include "kinematics/common/angles.hpp"
#include "planner/cell/cell_loader.hpp"

#include <catch2/catch.hpp>

#include "kinematics/common/input_error.hpp"
#include "tests/planner/test_files.hpp"

namespace tw::planner {
namespace {

// mm and deg converted once: rounding near 1e-16.
constexpr double kExact = 1e-12;

std::string validCell() {
  // A one-triangle ASCII STL (format: domain-facts §5), only opened by the loader.
  test::writeTestFile("cell_test_part.stl",
                      "solid part\n facet normal 0 0 1\n  outer loop\n   vertex 0 0 0\n"
                      "   vertex 1 0 0\n   vertex 0 1 0\n  endloop\n endfacet\nendsolid part\n");
  return R"(<?xml version="1.0"?>
<cell format-version="1" name="test-cell" length-unit="mm" angle-unit="deg">
  <arm file=")" +
         test::sourcePath("samples/arms/weld_arm_1400.xml") + R"(" frame="arm-base"/>
  <home joints="0 -20 10 0 60 0"/>
  <frames>
    <frame name="part" parent="table" xyz="10 20 30" rpy="0 0 90"/>
    <frame name="table" parent="world" xyz="1000 0 0"/>
    <frame name="arm-base" parent="world" quaternion="0.7071067811865476 0 0 0.7071067811865476"/>
  </frames>
  <tool name="torch" symmetric="true">
    <tcp xyz="0 0 400" rpy="0 20 0"/>
    <cylinder radius="40" length="200" xyz="0 0 100"/>
  </tool>
  <tool name="gun" symmetric="false" spin-min="-10" spin-max="10" tip-allowance="5">
    <tcp xyz="0 0 250"/>
  </tool>
  <fixture name="table" frame="table">
    <box size="800 1000 400" xyz="0 0 200"/>
  </fixture>
  <workpiece name="bracket" frame="part">
    <mesh file="cell_test_part.stl" unit="mm"/>
  </workpiece>
  <obstacle name="post" frame="world">
    <capsule radius="50" length="1000" xyz="0 -800 500"/>
    <sphere radius="20"/>
  </obstacle>
</cell>
)";
}

TEST_CASE("A cell file loads with its frames, tools, bodies and home in SI", "[planner][cell]") {
  const std::string path = test::writeTestFile("valid_cell.xml", validCell());
  const Cell cell = loadCell(path);
  CHECK(cell.name == "test-cell");
  CHECK(cell.arm.jointCount() == 6);
  CHECK(cell.arm_frame == "arm-base");

  // part: 90° about z in a table 1 m along x: (10, 20, 30) mm → (1.01, 0.02, 0.03) m,
  // and the part's x axis along the world's y (hand composition, common practice, no source).
  const Eigen::Isometry3d& X_WP = cell.frames.X_W("part");
  CHECK((X_WP.translation() - Eigen::Vector3d(1.01, 0.02, 0.03)).norm() < kExact);
  CHECK((X_WP.linear().col(0) - Eigen::Vector3d::UnitY()).norm() < kExact);
  // The quaternion (cos 45°, 0, 0, sin 45°) is the same 90° about z.
  CHECK((cell.frames.X_W("arm-base").linear().col(0) - Eigen::Vector3d::UnitY()).norm() < kExact);

  REQUIRE(cell.tools.size() == 2);
  const Tool& torch = cell.tools[0];
  CHECK((torch.X_FT.translation() - Eigen::Vector3d(0, 0, 0.4)).norm() < kExact);
  CHECK(torch.X_FT.linear().col(2).x() == Approx(std::sin(20.0 * kPi / 180.0)).margin(kExact));
  CHECK(torch.symmetric);
  // A symmetric tool without a range spins a full turn (the loader's default).
  CHECK(torch.spin.min == Approx(-kPi).margin(kExact));
  CHECK(torch.spin.max == Approx(kPi).margin(kExact));
  REQUIRE(torch.shapes.size() == 1);
  CHECK(torch.shapes[0].kind == kinematics::LinkShape::Kind::kCylinder);
  CHECK(torch.shapes[0].radius == Approx(0.04).margin(kExact));
  const Tool& gun = *cell.findTool("gun");
  CHECK_FALSE(gun.symmetric);
  CHECK(gun.spin.max == Approx(10.0 * kPi / 180.0).margin(kExact));
  // The tip allowance: 3 mm unless the tool states one (the loader's default).
  CHECK(torch.tip_allowance == Approx(0.003).margin(kExact));
  CHECK(gun.tip_allowance == Approx(0.005).margin(kExact));
  CHECK(cell.findTool("none") == nullptr);

  REQUIRE(cell.bodies.size() == 3);
  CHECK(cell.bodies[0].role == CellBody::Role::kFixture);
  CHECK(cell.bodies[1].role == CellBody::Role::kWorkpiece);
  CHECK(cell.bodies[1].frame == "part");
  // Relative mesh paths resolve against the cell file's folder.
  CHECK(cell.bodies[1].shapes[0].mesh_path ==
        std::string(TW_TEST_OUTPUT_DIR) + "/cell_test_part.stl");
  CHECK(cell.bodies[1].shapes[0].mesh_scale == 0.001);
  CHECK(cell.bodies[2].shapes.size() == 2);
  CHECK(std::string(toString(cell.bodies[2].role)) == "obstacle");

  CHECK(cell.home[1] == Approx(-20.0 * kPi / 180.0).margin(kExact));
  CHECK(cell.home[4] == Approx(60.0 * kPi / 180.0).margin(kExact));
}

TEST_CASE("Every malformed cell element is a located error", "[planner][cell][errors]") {
  const std::vector<test::BadInput> cases = {
      {"unknown element", "  <frames>", "  <frame-list/>\n  <frames>", "<frame-list/>",
       "unknown element inside <cell>"},
      {"unknown attribute", R"(xyz="1000 0 0"/>)", R"(xyz="1000 0 0" color="red"/>)",
       "color=", "unknown attribute 'color'"},
      {"missing attribute", R"(<frame name="table" parent="world")", R"(<frame name="table")",
       R"(<frame name="table")", "missing attribute 'parent'"},
      {"non-finite number", R"(xyz="10 20 30")", R"(xyz="10 nan 30")", "nan",
       "three finite numbers"},
      {"both orientations", R"(rpy="0 0 90")", R"(rpy="0 0 90" quaternion="1 0 0 0")",
       "quaternion=\"1", "either rpy or quaternion"},
      {"non-unit quaternion", "0.7071067811865476 0 0 0.7071067811865476", "1 0 0 1", "\"1 0 0 1\"",
       "unit length"},
      {"unknown parent", R"(parent="table" xyz="10)", R"(parent="tabel" xyz="10)", "tabel",
       "unknown parent 'tabel'"},
      {"cycle", R"(<frame name="table" parent="world")", R"(<frame name="table" parent="part")",
       R"(name="part")", "cycle"},
      {"duplicate frame", R"(<frame name="arm-base")", R"(<frame name="table")",
       R"(quaternion="0.70)", "defined twice"},
      {"unknown arm frame", R"(frame="arm-base"/>)", R"(frame="robot"/>)", R"(frame="robot")",
       "unknown frame 'robot'"},
      {"unknown body frame", R"(<workpiece name="bracket" frame="part">)",
       R"(<workpiece name="bracket" frame="fixture">)", "<workpiece", "unknown frame 'fixture'"},
      {"repeated tool", R"(<tool name="gun")", R"(<tool name="torch")", R"(symmetric="false")",
       "tool name repeated"},
      {"spin range reversed", R"(spin-min="-10" spin-max="10")", R"(spin-min="10" spin-max="-10")",
       "spin-min=", "spin-min must not exceed spin-max"},
      {"spin range over a turn", R"(spin-min="-10" spin-max="10")",
       R"(spin-min="-200" spin-max="200")", "spin-min=", "at most 360"},
      {"zero tip allowance", R"(tip-allowance="5")", R"(tip-allowance="0")", "tip-allowance=",
       "tip-allowance must be > 0"},
      {"tool without tcp", R"(<tcp xyz="0 0 250"/>)", "", R"(<tool name="gun")",
       "missing element <tcp>"},
      {"bad symmetric", R"(symmetric="false")", R"(symmetric="no")", R"(symmetric="no")",
       "expected one of: false, true"},
      {"home too short", R"(joints="0 -20 10 0 60 0")", R"(joints="0 -20 10 0 60")", "<home",
       "must be 6 numbers"},
      {"home outside limits", R"(joints="0 -20 10 0 60 0")", R"(joints="0 -20 10 0 160 0")",
       "<home", "home value 5 (joint 'j5') is outside the joint limits -135 to 135 deg"},
      {"missing mesh file", "cell_test_part.stl", "no_such_part.stl", "<mesh",
       "cannot open the mesh file"},
      {"mesh without unit", R"( unit="mm")", "", "<mesh", "missing attribute 'unit'"},
      {"zero box size", R"(size="800 1000 400")", R"(size="800 0 400")", "size=", "must be > 0"},
      {"negative radius", R"(radius="50")", R"(radius="-50")", R"(radius="-50")", "must be > 0"},
      {"unsupported version", R"(format-version="1")", R"(format-version="2")", "<cell",
       "not supported"},
      {"wrong unit", R"(length-unit="mm")", R"(length-unit="m")", "<cell", "length-unit must be"},
      // tinyxml2 reports a mismatched end tag at the element it fails to close.
      {"not XML", "  </frames>", "  </frame>", "<frames>", "not well-formed"},
  };
  test::checkBadInputs(cases, validCell, "bad_cell.xml",
                       [](const std::string& path) { loadCell(path); });
}

TEST_CASE("Cell references that cannot be read name their file", "[planner][cell][errors]") {
  SECTION("a missing arm description") {
    const std::string text = test::replaced(validCell(), "weld_arm_1400.xml", "no_arm.xml");
    const std::string path = test::writeTestFile("bad_arm_cell.xml", text);
    CHECK_THROWS_WITH(loadCell(path), Catch::Contains("no_arm.xml: cannot open"));
  }
  SECTION("a body with no shape") {
    const std::string text =
        test::replaced(validCell(), "    <box size=\"800 1000 400\" xyz=\"0 0 200\"/>\n", "");
    const std::string path = test::writeTestFile("empty_body_cell.xml", text);
    try {
      loadCell(path);
      FAIL("expected an InputError");
    } catch (const InputError& error) {
      CHECK(error.line() == test::lineOf(text, "<fixture"));
      CHECK_THAT(error.message(), Catch::Contains("at least one shape"));
    }
  }
  SECTION("a missing cell file") {
    CHECK_THROWS_WITH(loadCell("/nonexistent/cell.xml"),
                      Catch::StartsWith("/nonexistent/cell.xml: cannot open"));
  }
}

}  // namespace
}  // namespace tw::planner
