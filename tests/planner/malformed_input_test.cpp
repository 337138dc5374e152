#include <catch2/catch.hpp>
#include <random>
#include <sstream>

#include "kinematics/input_error.hpp"
#include "planner/cell_loader.hpp"
#include "planner/seam_points_csv.hpp"
#include "test_files.hpp"
#include "tests/test_support/text_damage.hpp"

namespace tw::planner {
namespace {

TEST_CASE("Randomly damaged point lists either read cleanly or give a located error",
          "[planner][csv][errors]") {
  const std::string original =
      tw::test::readTextFile(test::sourcePath("samples/seams/lug_wrap.csv"));
  REQUIRE_FALSE(original.empty());
  std::mt19937 random(977);
  int accepted = 0;
  int rejected = 0;
  for (int trial = 0; trial < 2000; ++trial) {
    const std::string text = tw::test::damaged(original, tw::test::kCsvDamage, random);
    CAPTURE(trial, text);
    std::istringstream input(text);
    try {
      const SeamPointList list = parseSeamPointsCsv(input, "damaged.csv");
      ++accepted;
      // Whatever is accepted keeps the documented guarantees.
      REQUIRE(list.points.size() >= 2);
      for (std::size_t i = 0; i < list.points.size(); ++i) {
        const SeamPoint& point = list.points[i];
        CHECK(point.p_XP.allFinite());
        // Normalised on reading: unit to rounding.
        CHECK(point.normal.norm() == Approx(1.0).margin(1e-12));
        if (i > 0) CHECK(point.p_XP != list.points[i - 1].p_XP);
      }
    } catch (const InputError& error) {
      ++rejected;
      CHECK(error.file() == "damaged.csv");
      CHECK(error.line() > 0);
    }
  }
  // Both outcomes occur, so the loop exercised the error paths and the readers.
  CHECK(accepted > 0);
  CHECK(rejected > 0);
}

TEST_CASE("Randomly damaged cell files either load or give a located error",
          "[planner][cell][errors]") {
  // The sample cell with its references (arm, mesh) made absolute, so that
  // a copy in the scratch folder loads.
  const std::string original = test::replaced(
      test::replaced(
          tw::test::readTextFile(test::sourcePath("samples/cells/bracket_weld_cell.xml")),
          "../arms/weld_arm_1400.xml", test::sourcePath("samples/arms/weld_arm_1400.xml")),
      "meshes/gusset.obj", test::sourcePath("samples/cells/meshes/gusset.obj"));
  REQUIRE_NOTHROW(loadCell(test::writeTestFile("damaged_cell.xml", original)));
  std::mt19937 random(31337);
  int accepted = 0;
  int rejected = 0;
  for (int trial = 0; trial < 300; ++trial) {
    const std::string text = tw::test::damaged(original, tw::test::kXmlDamage, random);
    CAPTURE(trial);
    const std::string path = test::writeTestFile("damaged_cell.xml", text);
    try {
      loadCell(path);
      ++accepted;
    } catch (const InputError& error) {
      ++rejected;
      // Errors name the damaged file (or, for a damaged reference, the file
      // it names); a located error carries a line.
      CHECK_FALSE(error.file().empty());
      if (error.file() == path) CHECK(error.line() > 0);
    }
  }
  // Both outcomes occur, so the loop exercised the error paths and the loader.
  CHECK(accepted > 0);
  CHECK(rejected > 0);
}

}  // namespace
}  // namespace tw::planner
