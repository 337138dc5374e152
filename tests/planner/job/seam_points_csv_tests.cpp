#include "planner/job/seam_points_csv.hpp"

#include <catch2/catch.hpp>
#include <sstream>

#include "kinematics/common/input_error.hpp"
#include "tests/planner/test_files.hpp"

namespace tw::planner {
namespace {

SeamPointList parse(const std::string& text) {
  std::istringstream input(text);
  return parseSeamPointsCsv(input, "seam.csv");
}

/// The line and message of the error parsing `text` raises.
std::pair<int, std::string> failure(const std::string& text) {
  try {
    parse(text);
  } catch (const InputError& error) {
    CHECK(error.file() == "seam.csv");
    return {error.line(), error.message()};
  }
  FAIL("expected an InputError for:\n" << text);
  return {0, ""};
}

TEST_CASE("A seam point list reads positions, normals, second normals and speeds",
          "[planner][csv]") {
  // Columns in a shuffled order, a comment, a blank line and CRLF endings.
  const SeamPointList list = parse(
      "# bracket seam\r\n"
      "nz,x_mm,y_mm,z_mm,nx,ny,n2x,n2y,n2z,speed_mm_s\r\n"
      "\r\n"
      "2, 10, 8, 8, 0, 0, 0, 3, 0, 12.5\r\n"
      "1,+140.5,8,8,0,0,0,1,0,1e1\r\n");
  REQUIRE(list.points.size() == 2);
  const SeamPoint& first = list.points[0];
  // mm → m at the boundary; normals normalised (exact for axis vectors).
  CHECK(first.p_XP == Eigen::Vector3d(0.010, 0.008, 0.008));
  CHECK(first.normal == Eigen::Vector3d::UnitZ());
  REQUIRE(first.second_normal);
  CHECK(*first.second_normal == Eigen::Vector3d::UnitY());
  REQUIRE(first.speed);
  CHECK(*first.speed == Approx(0.0125).epsilon(1e-15));
  CHECK(first.line == 4);
  CHECK(list.points[1].p_XP.x() == Approx(0.1405).epsilon(1e-15));
  CHECK(*list.points[1].speed == Approx(0.010).epsilon(1e-15));
  CHECK(list.points[1].line == 5);
}

TEST_CASE("Optional columns stay absent when the header lacks them", "[planner][csv]") {
  const SeamPointList list = parse("x_mm,y_mm,z_mm,nx,ny,nz\n0,0,0,0,0,1\n1,0,0,0,0,1\n");
  REQUIRE(list.points.size() == 2);
  CHECK_FALSE(list.points[0].second_normal);
  CHECK_FALSE(list.points[0].speed);
}

TEST_CASE("Malformed seam point lists are located errors", "[planner][csv][errors]") {
  const std::string header = "x_mm,y_mm,z_mm,nx,ny,nz\n";
  const std::string good_row = "0,0,0,0,0,1\n";
  struct Case {
    const char* what;
    std::string text;
    int line;
    const char* message;
  };
  const std::vector<Case> cases = {
      {"unknown column", "x_mm,y_mm,z_mm,nx,ny,nz,w\n", 1, "unknown column 'w'"},
      {"column without unit", "x,y,z,nx,ny,nz\n", 1, "unknown column 'x'"},
      {"repeated column", "x_mm,y_mm,z_mm,nx,ny,nz,nx\n", 1, "appears twice"},
      {"missing column", "x_mm,y_mm,z_mm,nx,ny\n", 1, "lacks the required column 'nz'"},
      {"partial second normal", "x_mm,y_mm,z_mm,nx,ny,nz,n2x\n", 1, "all of n2x, n2y, n2z"},
      {"no header", "# only a comment\n", 1, "no header"},
      {"too few fields", header + good_row + "1,0,0,0,0\n", 3, "expected 6"},
      {"not a number", header + good_row + "1,0,abc,0,0,1\n", 3, "'z_mm': \"abc\""},
      {"not finite", header + good_row + "1,0,nan,0,0,1\n", 3, "not a finite number"},
      {"infinite", header + "inf,0,0,0,0,1\n" + good_row, 2, "not a finite number"},
      {"zero normal", header + good_row + "1,0,0,0,0,0\n", 3, "zero length"},
      {"zero second normal",
       "x_mm,y_mm,z_mm,nx,ny,nz,n2x,n2y,n2z\n0,0,0,0,0,1,0,1,0\n1,0,0,0,0,1,0,0,0\n", 3,
       "second normal"},
      {"zero speed", "x_mm,y_mm,z_mm,nx,ny,nz,speed_mm_s\n0,0,0,0,0,1,0\n", 2, "speed_mm_s"},
      {"one point", header + good_row, 2, "at least 2 points, found 1"},
      {"duplicate consecutive", header + "# a\n" + good_row + good_row, 4,
       "repeats the one on line 3"},
  };
  for (const Case& c : cases) {
    CAPTURE(c.what, c.text);
    const auto [line, message] = failure(c.text);
    CHECK(line == c.line);
    CHECK_THAT(message, Catch::Contains(c.message));
  }
}

TEST_CASE("A point list file that cannot be opened names the file", "[planner][csv][errors]") {
  const std::string path = test::sourcePath("tests/planner/data/no_such_file.csv");
  CHECK_THROWS_WITH(loadSeamPointsCsv(path), Catch::Contains(path + ": cannot open"));
}

}  // namespace
}  // namespace tw::planner
