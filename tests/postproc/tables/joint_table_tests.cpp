#include <catch2/catch.hpp>
#include <cmath>
#include <map>
#include <sstream>
#include <vector>

#include "kinematics/common/input_error.hpp"
#include "postproc/tables/joint_table_post_processor.hpp"
#include "tests/postproc/sample_program.hpp"

using namespace tw::postproc;

namespace {

std::string jointTable(const tw::planner::Program& program, double sample_period = 0.0) {
  WriteOptions options;
  options.sample_period = sample_period;
  std::ostringstream out;
  JointTablePostProcessor().write(program, options, out);
  return out.str();
}

/// The cells of one CSV row: RFC 4180 §2, fields optionally in double
/// quotes, a doubled quote inside standing for one.
std::vector<std::string> splitCsvRow(const std::string& row) {
  std::vector<std::string> cells(1);
  bool quoted = false;
  for (std::size_t i = 0; i < row.size(); ++i) {
    const char c = row[i];
    if (quoted && c == '"' && i + 1 < row.size() && row[i + 1] == '"') {
      cells.back() += '"';
      ++i;
    } else if (c == '"') {
      quoted = !quoted;
    } else if (c == ',' && !quoted) {
      cells.emplace_back();
    } else {
      cells.back() += c;
    }
  }
  return cells;
}

/// Rows of the table as column-name → text maps.
std::vector<std::map<std::string, std::string>> parseTable(const std::string& text) {
  std::istringstream in(text);
  std::string line;
  const auto split = splitCsvRow;
  std::getline(in, line);
  const std::vector<std::string> header = split(line);
  std::vector<std::map<std::string, std::string>> rows;
  while (std::getline(in, line)) {
    const std::vector<std::string> cells = split(line);
    REQUIRE(cells.size() == header.size());
    std::map<std::string, std::string> row;
    for (std::size_t i = 0; i < header.size(); ++i) row[header[i]] = cells[i];
    rows.push_back(row);
  }
  return rows;
}

}  // namespace

TEST_CASE("The joint table of the sample program matches the golden file", "[joint-table]") {
  // Golden file: tests/postproc/data/sample_program.csv (values checked in
  // the next test case by hand arithmetic).
  CHECK(jointTable(test::sampleProgram()) == test::readDataFile("sample_program.csv"));
}

TEST_CASE("The joint table reads back with the expected columns and values", "[joint-table]") {
  const std::string text = jointTable(test::sampleProgram());
  const std::string header = text.substr(0, text.find('\n'));
  CHECK(header ==
        "record,kind,time_s,duration_s,seam,process_set,branch,axis_1_deg,axis_2_deg,axis_3_deg,"
        "axis_4_deg,axis_5_deg,axis_6_deg,x_mm,y_mm,z_mm,qw,qx,qy,qz,tcp_speed_mm_s,"
        "joint_speed_fraction,blend_mm,axis_1_margin_deg,axis_2_margin_deg,axis_3_margin_deg,"
        "axis_4_margin_deg,axis_5_margin_deg,axis_6_margin_deg,singularity_margin_deg,"
        "clearance_mm");
  const auto rows = parseTable(text);
  REQUIRE(rows.size() == 8);

  // Record 4, the first weld move (sample data): arrives at 2.1 + 5.0 s.
  const auto& weld = rows[3];
  CHECK(weld.at("kind") == "linear-move");
  CHECK(weld.at("time_s") == "7.1000");
  CHECK(weld.at("axis_1_deg") == "14.0000");
  CHECK(weld.at("y_mm") == "150.000");
  CHECK(weld.at("tcp_speed_mm_s") == "10.000");
  CHECK(weld.at("joint_speed_fraction").empty());
  CHECK(weld.at("blend_mm") == "2.000");
  // Margins by hand: axis 4 at 1° of ±190° → 189°; axis 6 at −19° of ±360° → 341°.
  CHECK(weld.at("axis_4_margin_deg") == "189.0000");
  CHECK(weld.at("axis_6_margin_deg") == "341.0000");
  CHECK(weld.at("singularity_margin_deg") == "43.5000");
  CHECK(weld.at("clearance_mm") == "8.000");
  // Rz(30°)·Rx(180°) as a quaternion: (0, cos 15°, sin 15°, 0) (hand derivation).
  CHECK(weld.at("qx") == "0.965925826");
  CHECK(weld.at("qy") == "0.258819045");

  CHECK(weld.at("branch") == "shoulder front, elbow up, wrist not flipped");

  const auto& arc_on = rows[2];
  CHECK(arc_on.at("kind") == "process-on");
  CHECK(arc_on.at("process_set") == "steel_3mm_fillet");
  CHECK(arc_on.at("axis_1_deg").empty());
}

TEST_CASE("Sampled joint-table rows interpolate between records", "[joint-table]") {
  const auto rows = parseTable(jointTable(test::sampleProgram(), 1.0));
  std::vector<std::map<std::string, std::string>> samples;
  for (const auto& row : rows) {
    if (row.at("kind") == "sample") samples.push_back(row);
  }
  // Grid points strictly inside motions after the first: 2 s (record 2,
  // 1.5–2.1 s), 3…7 s (record 4), 8…12 s (record 5), 13 and 14 s (record 8).
  REQUIRE(samples.size() == 13);
  // 2 s is 5/6 of record 2: axis 1 from 10° to 10.5° → 10.41667°, z from 450
  // to 420 mm → 425 mm (hand arithmetic).
  CHECK(samples[0].at("record") == "2");
  CHECK(samples[0].at("time_s") == "2.0000");
  CHECK(samples[0].at("axis_1_deg") == "10.4167");
  CHECK(samples[0].at("z_mm") == "425.000");
  CHECK(samples[0].at("clearance_mm").empty());
  // Times never run backwards across all rows.
  double previous = 0.0;
  for (const auto& row : rows) {
    const double time = std::stod(row.at("time_s"));
    CHECK(time >= previous);
    previous = time;
  }
}

TEST_CASE("The joint table of the arc program matches the golden file", "[joint-table]") {
  // Golden file: tests/postproc/data/arc_program.csv, read line by line
  // against arcProgram() when it was committed; the via rows are checked in
  // the next test case.
  CHECK(jointTable(test::arcProgram()) == test::readDataFile("arc_program.csv"));
}

TEST_CASE("A circular move has a via row before its own, at its passing time", "[joint-table]") {
  const auto rows = parseTable(jointTable(test::arcProgram()));
  // Ten records and two via rows.
  REQUIRE(rows.size() == 12);
  const auto& via = rows[4];
  CHECK(via.at("record") == "5");
  CHECK(via.at("kind") == "via");
  // Half circle from 7.4 s for 7.854 s with the via at half its sweep:
  // 7.4 + 3.927 s (sample data, hand arithmetic).
  CHECK(via.at("time_s") == "11.3270");
  CHECK(via.at("duration_s").empty());
  CHECK(via.at("x_mm") == "975.000");
  CHECK(via.at("y_mm") == "25.000");
  CHECK(via.at("axis_6_deg") == "36.0000");
  CHECK(via.at("axis_6_margin_deg") == "324.0000");  // 360° − 36°
  CHECK(via.at("tcp_speed_mm_s") == "10.000");
  CHECK(via.at("blend_mm").empty());
  CHECK(via.at("clearance_mm").empty());
  CHECK(rows[5].at("kind") == "circular-move");
  CHECK(rows[5].at("record") == "5");
  CHECK(rows[5].at("blend_mm") == "2.000");
  // The three-quarter circle passes its via at 180° of its 270° sweep:
  // 20.754 + 2.3562 · 2/3 s (hand arithmetic).
  CHECK(rows[9].at("kind") == "via");
  CHECK(rows[9].at("time_s") == "22.3248");
  CHECK(rows[9].at("z_mm") == "560.000");
}

TEST_CASE("Sampled rows of a circular move lie on its circle, in time order with the via",
          "[joint-table]") {
  const auto rows = parseTable(jointTable(test::arcProgram(), 1.0));
  std::vector<std::map<std::string, std::string>> inside;
  for (const auto& row : rows) {
    if (row.at("record") == "5" && row.at("kind") != "circular-move") inside.push_back(row);
  }
  // 8 … 15 s lie strictly inside 7.4–15.254 s, and the via at 11.327 s.
  REQUIRE(inside.size() == 9);
  CHECK(inside[4].at("kind") == "via");
  for (std::size_t i = 0; i < inside.size(); ++i) {
    CAPTURE(i, inside[i].at("time_s"));
    // Circle of radius 25 mm about (950, 25, 410) mm (sample data); printed
    // positions round by 0.0005 mm per coordinate, so 0.001 mm covers them.
    const double dx = std::stod(inside[i].at("x_mm")) - 950.0;
    const double dy = std::stod(inside[i].at("y_mm")) - 25.0;
    CHECK(std::hypot(dx, dy) == Approx(25.0).margin(0.001));
    CHECK(inside[i].at("z_mm") == "410.000");
    if (i > 0) CHECK(std::stod(inside[i].at("time_s")) > std::stod(inside[i - 1].at("time_s")));
  }
  // 9 s is (9 − 7.4) / 7.854 of the arc: 36.67° from the start about the
  // centre, x = 950 + 25 sin(36.67°) = 964.930 mm (hand arithmetic).
  CHECK(inside[1].at("time_s") == "9.0000");
  CHECK(std::stod(inside[1].at("x_mm")) == Approx(964.930).margin(0.001));
}

TEST_CASE("The joint table refuses a sample period below 1 ms", "[joint-table]") {
  CHECK_THROWS_AS(jointTable(test::sampleProgram(), 1e-5), tw::InputError);
}

TEST_CASE("Joint-table text with commas or quotes is quoted as RFC 4180 says", "[joint-table]") {
  tw::planner::Program program = test::sampleProgram();
  program.metadata.joints[0].name = "axis \"1\", base";
  std::get<tw::planner::MotionRecord>(program.records[1]).seam = "seam 1, left";
  const std::string text = jointTable(program);
  // RFC 4180 §2 rules 6 and 7: enclose in quotes, double the inner quotes.
  CHECK_THAT(text, Catch::StartsWith("record,kind,time_s,duration_s,seam,process_set,branch,"
                                     "\"axis \"\"1\"\", base_deg\","));
  CHECK_THAT(text, Catch::Contains("\n2,linear-move,2.1000,0.6000,\"seam 1, left\",,\"shoulder front, elbow up, wrist not flipped\","));
}
