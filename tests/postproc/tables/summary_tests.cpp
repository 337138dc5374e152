#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>
#include <sstream>

#include "postproc/tables/summary_post_processor.hpp"
#include "tests/postproc/sample_program.hpp"

using namespace tw::postproc;
using nlohmann::json;

namespace {

std::string summaryText(const tw::planner::Program& program, const WriteOptions& options) {
  std::ostringstream out;
  SummaryPostProcessor().write(program, options, out);
  return out.str();
}

}  // namespace

TEST_CASE("The summary of the sample program matches the golden file", "[summary]") {
  // Golden file: tests/postproc/data/sample_program.json (figures checked in
  // the next test case).
  CHECK(summaryText(test::sampleProgram(), WriteOptions{}) ==
        test::readDataFile("sample_program.json"));
}

TEST_CASE("The summary holds the figures of the sample program", "[summary]") {
  const json summary = json::parse(summaryText(test::sampleProgram(), WriteOptions{}));
  CHECK(summary.at("format") == "tracewright-summary");
  CHECK(summary.at("units").at("length") == "mm");
  CHECK(summary.at("seed") == 42);
  CHECK(summary.at("caution").size() >= 4);

  // Hand arithmetic on the sample data: six motions; the home move ends at
  // 12.7 + 2.0 s; the arc is on from 2.1 to 12.2 s. The JSON holds values
  // rounded to the printed decimals, so 1e-9 only absorbs the decimal-to-
  // binary conversion of those short numbers.
  const json& total = summary.at("total");
  CHECK(total.at("waypoints") == 6);
  CHECK(total.at("cycle_time").get<double>() == Approx(14.7).margin(1e-9));
  CHECK(total.at("process_time").get<double>() == Approx(10.1).margin(1e-9));
  CHECK(total.at("air_time").get<double>() == Approx(4.6).margin(1e-9));
  CHECK(total.at("min_clearance").at("value").get<double>() == Approx(8.0).margin(1e-9));
  CHECK(total.at("min_clearance").at("record") == 4);
  CHECK(total.at("min_singularity_margin").at("value").get<double>() ==
        Approx(42.75).margin(1e-9));
  CHECK(total.at("min_singularity_margin").at("record") == 5);
  // Relative to its range, axis 5 at 60° of ±125° (65° left of 250°) is the
  // tightest of all joints in all records.
  const json& limit = total.at("tightest_joint_limit_margin");
  CHECK(limit.at("joint") == "axis_5");
  CHECK(limit.at("record") == 8);
  CHECK(limit.at("value").get<double>() == Approx(65.0).margin(1e-9));

  REQUIRE(summary.at("seams").size() == 1);
  const json& seam = summary.at("seams").at(0);
  CHECK(seam.at("seam") == "seam_1");
  CHECK(seam.at("waypoints") == 4);
  // Approach starts at 1.5 s, retract ends at 12.2 + 0.5 s.
  CHECK(seam.at("time").get<double>() == Approx(11.2).margin(1e-9));
  CHECK(seam.at("tightest_joint_limit_margin").at("record") == 2);

  // Only the planner's warning with the default thresholds.
  REQUIRE(summary.at("warnings").size() == 1);
}

TEST_CASE("The summary warns below the margins and above the reduced speed", "[summary]") {
  tw::planner::Program program = test::sampleProgram();
  auto& retract = std::get<tw::planner::MotionRecord>(program.records[6]);
  retract.speed.value = 0.300;  // above 250 mm/s (ISO 10218-1 reduced speed)
  WriteOptions options;
  options.clearance_warning = 0.009;
  options.singularity_warning = 43.0 * WriteOptions::kDegree;
  const json summary = json::parse(summaryText(program, options));
  const std::vector<std::string> warnings = summary.at("warnings").get<std::vector<std::string>>();
  REQUIRE(warnings.size() == 4);
  CHECK(warnings[0] == "seam_1 point 2: clearance to the clamp below 10 mm");
  CHECK(warnings[1] == "record 4 (seam_1): clearance 8.000 mm is below 9.000 mm");
  CHECK(warnings[2] == "record 5 (seam_1): singularity margin 42.7500 deg is below 43.0000 deg");
  CHECK_THAT(warnings[3], Catch::StartsWith("record 7 (seam_1): TCP speed 300.000 mm/s is above"));
  CHECK_THAT(summary.at("caution").back().get<std::string>(),
             Catch::Contains("1 linear motion(s) are programmed faster than 250 mm/s"));
}

TEST_CASE("Figures the planner did not measure are null in the summary", "[summary]") {
  tw::planner::Program program = test::sampleProgram();
  for (auto& record : program.records) {
    if (auto* motion = std::get_if<tw::planner::MotionRecord>(&record)) {
      motion->clearance.reset();
      motion->singularity_margin.reset();
    }
  }
  const json summary = json::parse(summaryText(program, WriteOptions{}));
  CHECK(summary.at("total").at("min_clearance").is_null());
  CHECK(summary.at("seams").at(0).at("min_singularity_margin").is_null());
  CHECK(summary.at("total").at("tightest_joint_limit_margin").at("joint") == "axis_5");
}

TEST_CASE("The summary counts circular moves, and only when the program has any", "[summary]") {
  const json arcs = json::parse(summaryText(test::arcProgram(), WriteOptions{}));
  // arcProgram(): two circular moves, both in seam "ring" (sample data).
  CHECK(arcs.at("total").at("circular_moves") == 2);
  REQUIRE(arcs.at("seams").size() == 1);
  CHECK(arcs.at("seams")[0].at("circular_moves") == 2);
  CHECK(arcs.at("total").at("waypoints") == 8);
  const json plain = json::parse(summaryText(test::sampleProgram(), WriteOptions{}));
  CHECK_FALSE(plain.at("total").contains("circular_moves"));
}
