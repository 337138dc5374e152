#include <catch2/catch.hpp>

#include <cstdio>
#include <stdexcept>
#include <string>

#include "kinematics/common/input_error.hpp"
#include "planner/cli/command_line.hpp"
#include "planner/cli/exit_codes.hpp"
#include "planner/cli/progress_bar.hpp"
#include "tests/cli/cli_test_support.hpp"
#include "tests/planner/test_files.hpp"

namespace tw::cli {
namespace {

/// What runCommandLine returned and wrote on its error stream.
struct Outcome {
  int exit_code = -1;
  std::string errors;
};

/// Runs runCommandLine on an app with commands that end in each way a real
/// command can: no input of the real tool may cause an internal error, so
/// the mapping is tested with commands made to fail.
Outcome runWith(const char* command) {
  CLI::App app{"test"};
  int exit_code = kExitOk;
  app.require_subcommand(1);
  app.add_subcommand("broken")->callback([] { throw std::logic_error("a broken invariant"); });
  app.add_subcommand("bad-input")->callback([] { throw InputError("job.xml", 7, "expected a speed"); });
  app.add_subcommand("infeasible")->callback([&exit_code] { exit_code = kExitInfeasible; });
  const char* argv[] = {"tracewright", command};
  std::FILE* errors = std::tmpfile();
  REQUIRE(errors != nullptr);
  Outcome outcome;
  outcome.exit_code = runCommandLine(app, 2, argv, exit_code, errors);
  std::rewind(errors);
  char buffer[512];
  while (std::fgets(buffer, sizeof buffer, errors) != nullptr) outcome.errors += buffer;
  std::fclose(errors);
  return outcome;
}

TEST_CASE("The command line maps what escapes a command to the exit codes", "[cli][exit-codes]") {
  const Outcome broken = runWith("broken");
  CHECK(broken.exit_code == kExitInternalError);
  CHECK(broken.exit_code == 1);
  CHECK_THAT(broken.errors, Catch::StartsWith("internal error: a broken invariant"));

  const Outcome bad = runWith("bad-input");
  CHECK(bad.exit_code == kExitBadInput);
  CHECK_THAT(bad.errors, Catch::StartsWith("error: ") && Catch::Contains("job.xml") &&
                             Catch::Contains("7") && Catch::Contains("expected a speed"));

  const Outcome infeasible = runWith("infeasible");
  CHECK(infeasible.exit_code == kExitInfeasible);
  CHECK(infeasible.errors.empty());

  // A usage error is bad input, reported by CLI11 itself.
  CHECK(runWith("no-such-command").exit_code == kExitBadInput);
}

TEST_CASE("The progress bar fills in proportion and never overflows", "[cli][progress]") {
  // 24 cells: 3 of 12 steps fill 6 of them.
  CHECK(ProgressBar::render(3, 12, "seam corner-left") ==
        "[######..................]  3/12  seam corner-left");
  CHECK(ProgressBar::render(0, 12, "solving seams") ==
        "[........................]  0/12  solving seams");
  CHECK(ProgressBar::render(12, 12, "wrote a.twm") ==
        "[########################] 12/12  wrote a.twm");
  // More steps than expected stay at full; long descriptions are cut.
  CHECK(ProgressBar::render(13, 12, "x") == ProgressBar::render(12, 12, "x"));
  const std::string long_name(80, 'n');
  const std::string cut = ProgressBar::render(1, 2, long_name);
  CHECK(cut.size() < 80);
  CHECK_THAT(cut, Catch::EndsWith("..."));
}

TEST_CASE("The progress bar writes nothing when disabled, and clears its line when done",
          "[cli][progress]") {
  for (const bool enabled : {false, true}) {
    std::FILE* out = std::tmpfile();
    REQUIRE(out != nullptr);
    ProgressBar bar(out, enabled, 2);
    bar.stage("solving seams");
    bar.step("seam a");
    bar.finish();
    const long size = std::ftell(out);
    std::rewind(out);
    std::string text(static_cast<std::size_t>(size), '\0');
    CHECK(std::fread(text.data(), 1, text.size(), out) == text.size());
    std::fclose(out);
    CAPTURE(enabled, text);
    if (!enabled) {
      CHECK(text.empty());
    } else {
      CHECK_THAT(text, Catch::Contains(ProgressBar::render(1, 2, "seam a")));
      CHECK_THAT(text, Catch::EndsWith("\r\033[K"));
    }
  }
}

TEST_CASE("plan and check refuse a job whose tasks use two tools, at the second tool's task",
          "[cli][exit-codes]") {
  const std::string samples = std::string(TW_SOURCE_DIR) + "/samples";
  const std::string text =
      "<?xml version=\"1.0\"?>\n"
      "<job format-version=\"1\" name=\"two-tools\" length-unit=\"mm\" angle-unit=\"deg\" "
      "time-unit=\"s\">\n"
      "  <cell file=\"" + samples + "/cells/panel_paint_cell.xml\"/>\n"
      "  <seam name=\"seal\" points=\"" + samples + "/seams/panel_edge_seal.csv\" frame=\"panel\" "
      "tool=\"bead-nozzle\" speed=\"40\" approach=\"20\" retract=\"20\">\n"
      "    <dispense stand-off=\"3\"/>\n"
      "  </seam>\n"
      "  <seam name=\"seal-again\" points=\"" + samples + "/seams/panel_edge_seal.csv\" "
      "frame=\"panel\" tool=\"spray-gun\" speed=\"40\" approach=\"20\" retract=\"20\">\n"
      "    <dispense stand-off=\"3\"/>\n"
      "  </seam>\n"
      "  <transit joint-speed=\"40\" clearance=\"20\"/>\n"
      "  <outputs directory=\"" + std::string(TW_TEST_OUTPUT_DIR) + "/two-tools\">\n"
      "    <output writer=\"motion-text\" file=\"two_tools.twm\"/>\n"
      "  </outputs>\n"
      "</job>\n";
  const std::string path = test::writeTestFile("two_tools_job.xml", text);
  const int line = planner::test::lineOf(text, "name=\"seal-again\"");
  for (const char* command : {"plan", "check"}) {
    const test::ToolRun run = test::runTool(std::string(command) + " '" + path + "'");
    CAPTURE(command, run.output);
    CHECK(run.exit_code == kExitBadInput);
    CHECK_THAT(run.output, Catch::Contains(path + ":" + std::to_string(line)) &&
                               Catch::Contains("'seal-again' uses tool 'spray-gun'"));
  }
}

}  // namespace
}  // namespace tw::cli
