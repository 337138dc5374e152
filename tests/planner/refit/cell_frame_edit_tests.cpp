#include <catch2/catch.hpp>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"
#include "kinematics/common/rotations.hpp"
#include "kinematics/urdf_chain.hpp"
#include "planner/cell/cell_loader.hpp"
#include "planner/refit/cell_frame_edit.hpp"
#include "tests/planner/test_files.hpp"

namespace tw::planner {
namespace {

constexpr double kDeg = kPi / 180.0;

Eigen::Isometry3d pose(const Eigen::Vector3d& xyz_mm, const Eigen::Vector3d& rpy_deg) {
  Eigen::Isometry3d X = Eigen::Isometry3d::Identity();
  X.translation() = 0.001 * xyz_mm;
  X.linear() = rotationFromRollPitchYaw(kDeg * rpy_deg);
  return X;
}

/// The lines of `a` and `b` that differ, as "line: a | b"; both must have as
/// many lines.
std::vector<int> differingLines(const std::string& a, const std::string& b) {
  std::istringstream in_a(a);
  std::istringstream in_b(b);
  std::vector<int> lines;
  std::string line_a;
  std::string line_b;
  int line = 0;
  while (true) {
    const bool more_a = static_cast<bool>(std::getline(in_a, line_a));
    const bool more_b = static_cast<bool>(std::getline(in_b, line_b));
    if (!more_a && !more_b) return lines;
    ++line;
    if (more_a != more_b || line_a != line_b) lines.push_back(line);
  }
}

}  // namespace

TEST_CASE("Rewriting one frame's pose changes only that frame's line", "[cell-edit]") {
  const std::string original = test::sampleCellText();
  const Eigen::Isometry3d X_PF = pose({-125.0, -60.0, 0.0}, {0.0, 0.0, 3.0});
  const std::string edited = cellTextWithFramePose(original, "cell.xml", "bracket", X_PF);
  const int line = 28;  // <frame name="bracket" ...> in the sample cell
  REQUIRE(differingLines(original, edited) == std::vector<int>{line});
  CHECK_THAT(edited, Catch::Contains("<frame name=\"bracket\" parent=\"table-top\" "
                                     "xyz=\"-125.0000 -60.0000 0.0000\" "
                                     "rpy=\"0.000000 0.000000 3.000000\"/>"));

  const std::string path = test::writeTestFile("edit_bracket.xml", edited);
  const Cell cell = loadCell(path);
  // Written to 0.1 µm and 1e-6 deg: that is how close the reloaded pose is.
  CHECK(cell.frames.X_PF("bracket").isApprox(X_PF, 1e-7));
  const Cell before = loadCell(test::writeTestFile("edit_before.xml", original));
  for (const std::string& name : before.frames.names()) {
    if (name == "bracket") continue;
    CAPTURE(name);
    CHECK(cell.frames.X_PF(name).isApprox(before.frames.X_PF(name), 0.0));
  }
}

TEST_CASE("A frame written with a quaternion keeps a quaternion", "[cell-edit]") {
  const std::string original = test::sampleCellText();
  const Eigen::Isometry3d X_PF = pose({310.0, -690.5, 1.25}, {0.0, 0.0, 120.0});
  const std::string edited = cellTextWithFramePose(original, "cell.xml", "cleaning-station", X_PF);
  CHECK(differingLines(original, edited).size() == 1);
  // cos 60°, sin 60° to 9 decimals (w ≥ 0 written).
  CHECK_THAT(edited, Catch::Contains("xyz=\"310.0000 -690.5000 1.2500\" "
                                     "quaternion=\"0.500000000 0.000000000 0.000000000 "
                                     "0.866025404\""));
  const Cell cell = loadCell(test::writeTestFile("edit_quaternion.xml", edited));
  // 9 decimals of a unit quaternion: rotations agree to about 1e-9.
  CHECK(cell.frames.X_PF("cleaning-station").isApprox(X_PF, 1e-8));
}

TEST_CASE("A frame without pose attributes gets them appended to its tag", "[cell-edit]") {
  const std::string original = test::sampleCellText();
  const Eigen::Isometry3d X_PF = pose({1.0, 2.0, 3.0}, {10.0, -20.0, 30.0});
  const std::string edited = cellTextWithFramePose(original, "cell.xml", "arm-base", X_PF);
  CHECK_THAT(edited, Catch::Contains("<frame name=\"arm-base\" parent=\"world\" xyz=\"1.0000 "
                                     "2.0000 3.0000\" rpy=\"10.000000 -20.000000 30.000000\"/>"));
  const Cell cell = loadCell(test::writeTestFile("edit_append.xml", edited));
  CHECK(cell.frames.X_PF("arm-base").isApprox(X_PF, 1e-7));  // written to 0.1 µm, 1e-6 deg
}

TEST_CASE("A tag over several lines with single quotes is rewritten in place", "[cell-edit]") {
  const std::string text =
      "<cell>\n  <frames>\n    <!-- <frame name='fixture' xyz='9 9 9'/> -->\n"
      "    <frame\n       name='fixture' parent='world'\n       xyz='1 2 3' rpy='0 0 0' />\n"
      "  </frames>\n</cell>\n";
  const std::string edited =
      cellTextWithFramePose(text, "cell.xml", "fixture", pose({4.0, 5.0, 6.0}, {0.0, 0.0, 0.0}));
  CHECK(edited ==
        "<cell>\n  <frames>\n    <!-- <frame name='fixture' xyz='9 9 9'/> -->\n"
        "    <frame\n       name='fixture' parent='world'\n"
        "       xyz='4.0000 5.0000 6.0000' rpy='0.000000 0.000000 0.000000' />\n"
        "  </frames>\n</cell>\n");
}

TEST_CASE("An unknown frame or broken XML is an error naming the file", "[cell-edit]") {
  const Eigen::Isometry3d X = Eigen::Isometry3d::Identity();
  CHECK_THROWS_WITH(cellTextWithFramePose(test::sampleCellText(), "cell.xml", "bracket-2", X),
                    Catch::StartsWith("cell.xml: no <frame name=\"bracket-2\">"));
  try {
    cellTextWithFramePose("<cell>\n<frames>\n</cell>\n", "cell.xml", "a", X);
    FAIL("expected an InputError");
  } catch (const InputError& error) {
    CHECK(error.file() == "cell.xml");
    CHECK(error.line() > 0);
    CHECK_THAT(error.message(), Catch::Contains("not well-formed XML"));
  }
}

}  // namespace tw::planner
