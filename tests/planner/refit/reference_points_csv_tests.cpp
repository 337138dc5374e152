#include <catch2/catch.hpp>
#include <sstream>

#include "kinematics/common/input_error.hpp"
#include "planner/refit/reference_points_csv.hpp"

namespace tw::planner {
namespace {

const std::string kHeader =
    "point,nominal_x_mm,nominal_y_mm,nominal_z_mm,measured_x_mm,measured_y_mm,measured_z_mm\n";
const std::string kRows =
    "A,0,0,0,10,0,0\n"
    "B,100,0,0,110,0,0\n"
    "C,0,50,0,10,50,0\n";

ReferencePointList parse(const std::string& text) {
  std::istringstream input(text);
  return parseReferencePointsCsv(input, "points.csv");
}

}  // namespace

TEST_CASE("A reference point list is read in mm with columns in any order", "[reference-points]") {
  const ReferencePointList list = parse(
      "# comment\n\n"
      "measured_z_mm, measured_y_mm,measured_x_mm,nominal_z_mm,nominal_y_mm,nominal_x_mm,point\r\n"
      "1,2,3,4,5,6,first\r\n"
      "0,0,0,0,0,1e3,second\n"
      "# between rows\n"
      "7.5,0,0,0,1,0,third\n");
  REQUIRE(list.points.size() == 3);
  CHECK(list.source == "points.csv");
  CHECK(list.points[0].name == "first");
  CHECK(list.points[0].line == 4);
  // 1 mm = 0.001 m; exact in binary to within one rounding.
  CHECK(list.points[0].p_N.isApprox(Eigen::Vector3d(0.006, 0.005, 0.004), 1e-15));
  CHECK(list.points[0].p_M.isApprox(Eigen::Vector3d(0.003, 0.002, 0.001), 1e-15));
  CHECK(list.points[1].p_N.x() == Approx(1.0).epsilon(1e-15));
  CHECK(list.points[2].p_M.z() == Approx(0.0075).epsilon(1e-15));
  CHECK(list.points[2].line == 7);
}

TEST_CASE("Every malformed reference point list names its file and line", "[reference-points]") {
  struct Case {
    std::string text;
    int line;
    std::string message;
  };
  const std::vector<Case> cases = {
      {"point,nominal_x_mm\n" + kRows, 1, "lacks the column 'nominal_y_mm'"},
      {"point,x_mm," + kHeader.substr(6) + kRows, 1, "unknown column 'x_mm'"},
      {"point,point," + kHeader.substr(6) + kRows, 1, "appears twice"},
      {kHeader + "A,0,0,0,10,0\n" + kRows, 2, "expected 7 comma-separated fields"},
      {kHeader + ",0,0,0,10,0,0\n" + kRows, 2, "point name is empty"},
      {kHeader + kRows + "B,1,2,3,4,5,6\n", 5, "point 'B' is listed twice"},
      {kHeader + "A,0,0,zero,10,0,0\n" + kRows, 2,
       "'nominal_z_mm': \"zero\" is not a finite number"},
      {kHeader + "A,0,0,0,10,0,inf\n" + kRows, 2, "'measured_z_mm': \"inf\""},
      {kHeader + "A,0,0,0,1,0,0\nB,1,0,0,2,0,0\n", 3, "at least 3 reference points"},
      {"# only a comment\n", 1, "no header row"},
  };
  for (const Case& c : cases) {
    CAPTURE(c.text);
    try {
      parse(c.text);
      FAIL("expected an InputError");
    } catch (const InputError& error) {
      CHECK(error.file() == "points.csv");
      CHECK(error.line() == c.line);
      CHECK_THAT(error.message(), Catch::Contains(c.message));
    }
  }
}

TEST_CASE("A missing reference point list is an error naming it", "[reference-points]") {
  CHECK_THROWS_WITH(loadReferencePointsCsv("no/such/points.csv"),
                    Catch::Contains("no/such/points.csv") && Catch::Contains("cannot open"));
}

}  // namespace tw::planner
