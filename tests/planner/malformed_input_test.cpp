#include <catch2/catch.hpp>
#include <fstream>
#include <random>
#include <sstream>

#include "kinematics/input_error.hpp"
#include "planner/cell_loader.hpp"
#include "planner/seam_points_csv.hpp"
#include "test_files.hpp"

namespace tw::planner {
namespace {

std::string readFile(const std::string& path) {
  std::ifstream file(path, std::ios::binary);
  std::ostringstream text;
  text << file.rdbuf();
  return text.str();
}

/// `text` with a few random bytes replaced, inserted or deleted.
std::string mutated(std::string text, std::mt19937& random) {
  const std::string alphabet = "0123456789.,-+e \n#<>=\"/xnan_";
  std::uniform_int_distribution<int> edits(1, 4);
  for (int n = edits(random); n > 0 && !text.empty(); --n) {
    const std::size_t at = std::uniform_int_distribution<std::size_t>(0, text.size() - 1)(random);
    const char c =
        alphabet[std::uniform_int_distribution<std::size_t>(0, alphabet.size() - 1)(random)];
    switch (std::uniform_int_distribution<int>(0, 2)(random)) {
      case 0:
        text[at] = c;
        break;
      case 1:
        text.insert(text.begin() + static_cast<std::ptrdiff_t>(at), c);
        break;
      default:
        text.erase(at, 1);
    }
  }
  return text;
}

TEST_CASE("Randomly damaged point lists either read cleanly or give a located error",
          "[planner][csv][errors]") {
  const std::string original = readFile(test::sourcePath("samples/seams/lug_wrap.csv"));
  REQUIRE_FALSE(original.empty());
  std::mt19937 random(977);
  int accepted = 0;
  int rejected = 0;
  for (int trial = 0; trial < 2000; ++trial) {
    const std::string text = mutated(original, random);
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
  const std::string original = test::replaced(
      readFile(test::sourcePath("samples/cells/bracket_weld_cell.xml")),
      "../arms/weld_arm_1400.xml", test::sourcePath("samples/arms/weld_arm_1400.xml"));
  std::mt19937 random(31337);
  int rejected = 0;
  for (int trial = 0; trial < 300; ++trial) {
    const std::string text = mutated(original, random);
    CAPTURE(trial);
    const std::string path = test::writeTestFile("damaged_cell.xml", text);
    try {
      loadCell(path);
    } catch (const InputError& error) {
      ++rejected;
      // Errors name the damaged file (or, for a damaged reference, the file
      // it names); a located error carries a line.
      CHECK_FALSE(error.file().empty());
      if (error.file() == path) CHECK(error.line() > 0);
    }
  }
  CHECK(rejected > 0);
}

}  // namespace
}  // namespace tw::planner
