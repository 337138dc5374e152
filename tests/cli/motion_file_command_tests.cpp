// Runs the built `tracewright compare`, `table` and `posts` on motion text
// files written by the motion-text post-processor.
#include <catch2/catch.hpp>
#include <filesystem>
#include <nlohmann/json.hpp>
#include <sstream>
#include <variant>
#include <vector>

#include "postproc/atomic_file.hpp"
#include "postproc/motion_text/motion_text_post_processor.hpp"
#include "postproc/motion_text/motion_text_reader.hpp"
#include "postproc/post_processor_registry.hpp"
#include "postproc/tables/joint_table_post_processor.hpp"
#include "tests/cli/cli_test_support.hpp"
#include "tests/postproc/sample_program.hpp"
#include "tests/postproc/two_programs.hpp"

namespace tw::cli {
namespace {

using test::runTool;

std::string writeMotionText(const std::string& name, const planner::Program& program) {
  const std::string path = std::string(TW_TEST_OUTPUT_DIR) + "/" + name;
  postproc::writeProgramFile(postproc::MotionTextPostProcessor(), program, postproc::WriteOptions{},
                             path);
  return path;
}

std::string quoted(const std::string& path) { return "'" + path + "'"; }

int countLines(const std::string& text) {
  int lines = 0;
  for (const char c : text) lines += c == '\n';
  return lines;
}

}  // namespace

TEST_CASE("Every command and the tool itself answer --help", "[cli][help]") {
  for (const std::string command : {"", "reach", "pose", "refit", "compare", "table", "posts"}) {
    const test::ToolRun run = runTool(command + " --help");
    CAPTURE(command, run.output);
    CHECK(run.exit_code == 0);
    CHECK_THAT(run.output, Catch::Contains("Usage"));
  }
  const test::ToolRun none = runTool("");
  CHECK(none.exit_code == 2);  // a subcommand is required
  CHECK(runTool("no-such-command").exit_code == 2);
}

TEST_CASE("compare reports the planted changes, as text and as JSON", "[cli][compare]") {
  const std::string a = writeMotionText("compare_a.twm", postproc::test::programA());
  const std::string b = writeMotionText("compare_b.twm", postproc::test::programB());
  SECTION("text") {
    const test::ToolRun run = runTool("compare " + quoted(a) + " " + quoted(b) + " --records");
    CAPTURE(run.output);
    CHECK(run.exit_code == 0);
    CHECK_THAT(run.output, Catch::Contains("records: 7 matched, 3 changed, 1 removed, 1 added"));
    CHECK_THAT(run.output, Catch::Contains("removed (A): 8") && Catch::Contains("added (B): 8"));
    CHECK_THAT(run.output, Catch::Contains("axis_1             0.5000 deg (A 4 / B 4)"));
    CHECK_THAT(run.output, Catch::Contains("largest TCP deviation: 2.000 mm (A 7 / B 7)"));
    CHECK_THAT(run.output, Catch::Contains("branch changes: 1") &&
                               Catch::Contains("-> B 5 \"shoulder front, elbow down"));
    CHECK_THAT(run.output, Catch::Contains("cycle time: 14.7000 s -> 13.7000 s (-1.0000 s)"));
    CHECK_THAT(run.output, Catch::Contains("A 4 / B 4: 0.5000 0.0000"));
    CHECK_THAT(run.output, Catch::Contains("the programs differ"));
  }
  SECTION("json") {
    const test::ToolRun run = runTool("compare " + quoted(a) + " " + quoted(b) + " --json");
    CAPTURE(run.output);
    REQUIRE(run.exit_code == 0);
    const nlohmann::json json = nlohmann::json::parse(run.output);
    CHECK(json["format"] == "tracewright-comparison");
    CHECK(json["equal"] == false);
    CHECK(json["removed"] == nlohmann::json::array({8}));
    CHECK(json["added"] == nlohmann::json::array({8}));
    CHECK(json["largest_joint_delta"][0]["value"] == 0.5);
    CHECK(json["largest_joint_delta"][0]["joint"] == "axis_1");
    CHECK(json["largest_tcp_position_deviation"]["value"] == 2.0);
    CHECK(json["branch_changes"] == 1);
    CHECK(json["cycle_time_change"] == -1.0);
    CHECK(json["changes"].size() == 3);
    CHECK(json["changes"][1]["branch_changed"] == true);
  }
  SECTION("--fail-on-change gives 3 for different programs and 0 for equal ones") {
    CHECK(runTool("compare " + quoted(a) + " " + quoted(b) + " --fail-on-change").exit_code == 3);
    const test::ToolRun same =
        runTool("compare " + quoted(a) + " " + quoted(a) + " --fail-on-change");
    CHECK(same.exit_code == 0);
    CHECK_THAT(same.output, Catch::Contains("equal within the tolerances"));
  }
}

TEST_CASE("compare and table refuse a damaged file with its file and line",
          "[cli][compare][table]") {
  const std::string a = writeMotionText("damaged_a.twm", postproc::test::programA());
  std::string text = test::readText(a);
  text.replace(text.find("joints=10.0000"), 14, "joints=11.0000");  // an edit the hash catches
  const std::string damaged = test::writeTestFile("damaged_b.twm", text);
  const test::ToolRun compare = runTool("compare " + quoted(a) + " " + quoted(damaged));
  CAPTURE(compare.output);
  CHECK(compare.exit_code == 2);
  CHECK_THAT(compare.output, Catch::Contains(damaged + ":"));
  CHECK_THAT(compare.output, Catch::Contains("integrity"));

  const std::string csv = std::string(TW_TEST_OUTPUT_DIR) + "/damaged_table.csv";
  std::filesystem::remove(csv);
  const test::ToolRun table = runTool("table " + quoted(damaged) + " --csv " + quoted(csv));
  CHECK(table.exit_code == 2);
  CHECK_FALSE(std::filesystem::exists(csv));  // nothing written
  CHECK(runTool("compare " + quoted(a) + " no-such.twm").exit_code == 2);
  CHECK(runTool("compare " + quoted(a) + " " + quoted(a) + " --tcp-tolerance -1").exit_code == 2);
}

TEST_CASE("table prints one row per record, marks margins, colours only when asked",
          "[cli][table]") {
  const std::string a = writeMotionText("table_a.twm", postproc::test::programA());
  const test::ToolRun plain = runTool("table " + quoted(a));
  CAPTURE(plain.output);
  REQUIRE(plain.exit_code == 0);
  // Header, 8 records, the legend line.
  CHECK(countLines(plain.output) == 10);
  CHECK_THAT(plain.output, Catch::Contains("axis_1_deg") && Catch::Contains("linear-move"));
  CHECK_THAT(plain.output, Catch::Contains("14.7000"));  // the last record ends at 14.7 s
  CHECK_THAT(plain.output, !Catch::Contains("\033["));   // a pipe gets no colour
  CHECK_THAT(plain.output, !Catch::Contains(" !") && !Catch::Contains("0!"));

  // axis_5 (±125°) at 45° is 80° from its limit: marked under a 100° warning.
  const test::ToolRun marked = runTool("table " + quoted(a) + " --margin-warning 100");
  CHECK_THAT(marked.output, Catch::Contains("45.0000!"));
  CHECK_THAT(marked.output, !Catch::Contains("\033["));
  const test::ToolRun coloured =
      runTool("table " + quoted(a) + " --margin-warning 100 --colour always");
  CHECK_THAT(coloured.output, Catch::Contains("\033[33m"));

  const test::ToolRun metres =
      runTool("table " + quoted(a) + " --columns record,tcp --length-unit m");
  CAPTURE(metres.output);
  CHECK(metres.exit_code == 0);
  CHECK_THAT(metres.output, Catch::Contains("x_m") && Catch::Contains("0.800000"));
  CHECK_THAT(metres.output, !Catch::Contains("axis_1"));
  CHECK(runTool("table " + quoted(a) + " --columns record,bogus").exit_code == 2);
}

TEST_CASE("table shows circular moves by kind, each after a row for its via point",
          "[cli][table]") {
  const std::string arcs = writeMotionText("table_arcs.twm", postproc::test::arcProgram());
  const test::ToolRun run = runTool("table " + quoted(arcs) + " --columns record,kind,time,tcp");
  CAPTURE(run.output);
  REQUIRE(run.exit_code == 0);
  // Header, 10 records, 2 via rows, the legend line.
  CHECK(countLines(run.output) == 14);
  std::istringstream lines(run.output);
  std::vector<std::string> rows;
  for (std::string line; std::getline(lines, line);) rows.push_back(line);
  // Rows 5 and 6 after the header: record 5's via (passed at 7.4 + 7.854 / 2 s
  // at x = 975 mm, sample data), then record 5 itself.
  CHECK_THAT(rows[5], Catch::Matches(R"(\s+5\s+via\s+11\.3270\s+975\.000\s+25\.000\s+410\.000.*)"));
  CHECK_THAT(rows[6], Catch::Matches(R"(\s+5\s+circular-move\s+15\.2540\s+950\.000\s+50\.000.*)"));
}

TEST_CASE("compare reports a moved via point", "[cli][compare]") {
  const planner::Program original = postproc::test::arcProgram();
  planner::Program moved = original;
  std::get<planner::MotionRecord>(moved.records[4]).via->X_RV.translation().x() += 0.0004;
  const std::string a = writeMotionText("compare_arcs_a.twm", original);
  const std::string b = writeMotionText("compare_arcs_b.twm", moved);
  const test::ToolRun text = runTool("compare " + quoted(a) + " " + quoted(b) + " --records");
  CAPTURE(text.output);
  CHECK(text.exit_code == 0);
  // The planted 0.4 mm at record 5's via.
  CHECK_THAT(text.output, Catch::Contains("largest TCP deviation: 0.400 mm (A 5 / B 5)"));
  CHECK_THAT(text.output, Catch::Contains("via: 0.0000 0.0000 0.0000 0.0000 0.0000 0.0000  TCP 0.400 mm"));
  const test::ToolRun json = runTool("compare " + quoted(a) + " " + quoted(b) + " --json");
  REQUIRE(json.exit_code == 0);
  const nlohmann::json parsed = nlohmann::json::parse(json.output);
  REQUIRE(parsed["changes"].size() == 1);
  CHECK(parsed["changes"][0]["via_tcp_position_deviation"] == 0.4);
  CHECK(parsed["changes"][0]["tcp_position_deviation"] == 0.0);
}

TEST_CASE("table --csv writes the joint-table post-processor's file", "[cli][table]") {
  const std::string a = writeMotionText("table_csv.twm", postproc::test::programA());
  const std::string csv = std::string(TW_TEST_OUTPUT_DIR) + "/table_csv.csv";
  const test::ToolRun run = runTool("table " + quoted(a) + " --csv " + quoted(csv));
  CAPTURE(run.output);
  REQUIRE(run.exit_code == 0);
  // The same bytes as the post-processor writes for the program read back.
  std::ostringstream expected;
  postproc::JointTablePostProcessor().write(postproc::readMotionTextFile(a),
                                            postproc::WriteOptions{}, expected);
  CHECK(test::readText(csv) == expected.str());

  SECTION("with samples") {
    const std::string sampled = std::string(TW_TEST_OUTPUT_DIR) + "/table_sampled.csv";
    CHECK(runTool("table " + quoted(a) + " --csv " + quoted(sampled) + " --sample-period 0.5")
              .exit_code == 0);
    CHECK_THAT(test::readText(sampled), Catch::Contains(",sample,"));
  }
  SECTION("a sample period without --csv, or below 1 ms, is refused with nothing written") {
    CHECK(runTool("table " + quoted(a) + " --sample-period 0.5").exit_code == 2);
    const std::string fine = std::string(TW_TEST_OUTPUT_DIR) + "/table_too_fine.csv";
    std::filesystem::remove(fine);
    const test::ToolRun run =
        runTool("table " + quoted(a) + " --csv " + quoted(fine) + " --sample-period 0.0001");
    CAPTURE(run.output);
    CHECK(run.exit_code == 2);
    CHECK_FALSE(std::filesystem::exists(fine));
  }
}

TEST_CASE("posts lists every registered post-processor", "[cli][posts]") {
  postproc::PostProcessorRegistry registry;
  postproc::registerBuiltInPostProcessors(registry);
  REQUIRE_FALSE(registry.empty());
  const test::ToolRun run = runTool("posts");
  CAPTURE(run.output);
  CHECK(run.exit_code == 0);
  for (const std::string& name : registry.names()) {
    const postproc::PostProcessor& post = registry.get(name);
    CHECK_THAT(run.output, Catch::Contains(name) && Catch::Contains("." + post.fileExtension()) &&
                               Catch::Contains(post.description()));
  }
  CHECK(countLines(run.output) == static_cast<int>(registry.names().size()) + 1);
}

}  // namespace tw::cli
