#include <catch2/catch.hpp>
#include <optional>
#include <random>
#include <sstream>
#include <vector>

#include "kinematics/common/input_error.hpp"
#include "postproc/safety_caution.hpp"
#include "postproc/template/program_template.hpp"
#include "postproc/template/template_post_processor.hpp"
#include "tests/postproc/sample_program.hpp"
#include "tests/test_support/text_damage.hpp"

using namespace tw::postproc;

namespace {

const std::string kData = std::string(TW_SOURCE_DIR) + "/tests/postproc/data/";

std::string rendered(const std::string& template_file, const tw::planner::Program& program) {
  WriteOptions options;
  options.template_file = template_file;
  std::ostringstream out;
  TemplatePostProcessor().write(program, options, out);
  return out.str();
}

/// The sample program with a singularity margin on every linear move, which
/// the tiny template prints (the retract has none in the sample).
tw::planner::Program tinyProgram() {
  tw::planner::Program program = test::sampleProgram();
  std::get<tw::planner::MotionRecord>(program.records[6]).singularity_margin = 0.5;
  return program;
}

tw::InputError parseError(const std::string& text) {
  try {
    ProgramTemplate::parse(text, "dialect.twt");
  } catch (const tw::InputError& error) {
    return error;
  }
  FAIL("the template was accepted");
  return tw::InputError("");
}

const std::string kHeader = "@@ header\n# [[caution]]\n";

}  // namespace

TEST_CASE("A template renders the sample program to exactly the expected text", "[template]") {
  // Golden file: tests/postproc/data/tiny_expected.txt, checked by hand
  // against the template and the sample data.
  CHECK(rendered(kData + "tiny.twt", tinyProgram()) == test::readDataFile("tiny_expected.txt"));
}

TEST_CASE("The sample stepcard template renders the sample program", "[template]") {
  // Golden file: tests/postproc/data/stepcard_expected.txt.
  CHECK(rendered(std::string(TW_SOURCE_DIR) + "/samples/templates/stepcard.twt",
                 test::sampleProgram()) == test::readDataFile("stepcard_expected.txt"));
}

TEST_CASE("The sample stepcard template renders circular moves with their via points",
          "[template]") {
  // Golden file: tests/postproc/data/stepcard_arc_expected.txt, read line by
  // line against the template and arcProgram() when it was committed.
  const std::string text =
      rendered(std::string(TW_SOURCE_DIR) + "/samples/templates/stepcard.twt", test::arcProgram());
  CHECK(text == test::readDataFile("stepcard_arc_expected.txt"));
  // Record 5, the half circle (sample data): via (975, 25, 410) mm, target
  // (950, 50, 410) mm, 10 mm/s, blend 2 mm.
  CHECK_THAT(text, Catch::Contains("CARD 5 CURVE VIA (975.00 25.00 410.00) TO (950.00 50.00 410.00 / "));
}

TEST_CASE("Via placeholders render the via point and only in the circular-move section",
          "[template]") {
  const std::string sections = "@@ joint-move\nJ\n@@ linear-move\nL\n@@ process-on\nON\n"
                               "@@ process-off\nOFF\n";
  const ProgramTemplate arcs = ProgramTemplate::parse(
      kHeader + sections +
          "@@ circular-move\nC [[n]] [[via_joints;1]] | [[via_j6;2]] | "
          "[[via_x;1]],[[via_y;1]],[[via_z;1]] | [[via_qw;3]],[[via_qx;3]],[[via_qy;3]],"
          "[[via_qz;3]] | [[x;1]]\n",
      "dialect.twt");
  std::ostringstream out;
  arcs.render(test::arcProgram(), out);
  // Record 5's via (sample data): joints 19, −11, 24.5, 1.5, 47.5, 36°, at
  // (975, 25, 410) mm, torch turned 75° about z and pointing down:
  // quaternion (0, cos 37.5°, sin 37.5°, 0) (hand derivation, as for the
  // sample program's 30°).
  CHECK_THAT(out.str(), Catch::Contains("C 5 19.0,-11.0,24.5,1.5,47.5,36.0 | 36.00 | "
                                        "975.0,25.0,410.0 | 0.000,0.793,0.609,0.000 | 950.0\n"));
  CHECK_THAT(parseError(kHeader + "@@ linear-move\nL [[via_x]]\n").message(),
             Catch::Contains("cannot be used in the 'linear-move' section"));
  CHECK_THAT(parseError(kHeader + "@@ circular-move\nC [[via_speed]]\n").message(),
             Catch::Contains("unknown placeholder [[via_speed]]"));
  const ProgramTemplate seventh = ProgramTemplate::parse(
      kHeader + sections + "@@ circular-move\nC [[via_j7]]\n", "dialect.twt");
  std::ostringstream refused;
  CHECK_THROWS_WITH(seventh.render(test::arcProgram(), refused),
                    Catch::Contains("[[via_j7]] names joint 7 but the arm has 6 joints"));
  CHECK(refused.str().empty());
}

TEST_CASE("Template errors name the template line", "[template]") {
  struct BadTemplate {
    std::string text;
    int line;
    std::string message;
  };
  const std::vector<BadTemplate> cases = {
      {kHeader + "@@ joint-move\nCARD [[n]]\nCARD [[speed]]\n", 5, "unknown placeholder [[speed]]"},
      {kHeader + "start [[x]]\n", 3, "cannot be used in the 'header' section"},
      {kHeader + "[[job;2]]\n", 3, "takes no decimals"},
      {kHeader + "[[cycle_time;13]]\n", 3, "with D from 0 to 12 decimals"},
      {kHeader + "@@ footer\nend [[job\n", 4, "no closing ']]'"},
      {"@@ header\nbegin\n", 1, "[[caution]]"},
      {kHeader + "@@ circle-move\n", 3, "unknown section '@@ circle-move'"},
      {kHeader + "@@ footer\n@@ footer\n", 4, "the section '@@ footer' is given twice"},
      {"begin\n" + kHeader, 1, "text before the first section"},
  };
  for (const BadTemplate& bad : cases) {
    CAPTURE(bad.text);
    const tw::InputError error = parseError(bad.text);
    CHECK(error.file() == "dialect.twt");
    CHECK(error.line() == bad.line);
    CHECK_THAT(error.message(), Catch::Contains(bad.message));
  }
}

TEST_CASE("Rendering errors name the template line and the record", "[template]") {
  const tw::planner::Program program = test::sampleProgram();
  std::ostringstream out;

  SECTION("a TCP speed asked of a joint move") {
    const ProgramTemplate bad = ProgramTemplate::parse(
        kHeader + "@@ joint-move\nJ [[tcp_speed]]\n", "dialect.twt");
    CHECK_THROWS_WITH(bad.render(program, out),
                      Catch::StartsWith("dialect.twt:4:") &&
                          Catch::Contains("record 1 (joint-move), which has a joint speed fraction"));
  }
  SECTION("a record kind without a section") {
    const ProgramTemplate bad =
        ProgramTemplate::parse(kHeader + "@@ joint-move\nJ [[n]]\n", "dialect.twt");
    CHECK_THROWS_WITH(bad.render(program, out),
                      Catch::Contains("no '@@ linear-move' section but record 2 needs one"));
  }
  SECTION("a circular move without a circular-move section") {
    const ProgramTemplate no_arcs = ProgramTemplate::parse(
        kHeader + "@@ joint-move\nJ\n@@ linear-move\nL\n@@ process-on\nON\n@@ process-off\nOFF\n",
        "dialect.twt");
    CHECK_THROWS_WITH(no_arcs.render(test::arcProgram(), out),
                      Catch::Contains("no '@@ circular-move' section but record 5 needs one"));
  }
  SECTION("a joint the arm does not have") {
    const ProgramTemplate bad =
        ProgramTemplate::parse(kHeader + "@@ joint-move\nJ [[j7]]\n", "dialect.twt");
    CHECK_THROWS_WITH(bad.render(program, out), Catch::Contains("the arm has 6 joints"));
  }
  // Nothing reaches the stream when rendering fails.
  CHECK(out.str().empty());
}

TEST_CASE("Randomly damaged templates either parse and render or give a located error",
          "[template][errors]") {
  const std::string original =
      test::readWholeFile(std::string(TW_SOURCE_DIR) + "/samples/templates/stepcard.twt");
  const tw::planner::Program program = test::sampleProgram();
  const tw::planner::Program arcs = test::arcProgram();
  const std::vector<std::string> caution = safetyCaution(program);
  REQUIRE_FALSE(caution.empty());
  std::mt19937 random(1201);  // fixed seed: the same damage on every run
  int parsed = 0;
  int rejected = 0;
  for (int trial = 0; trial < 2000; ++trial) {
    const std::string text = tw::test::damaged(original, tw::test::kTemplateDamage, random);
    CAPTURE(trial, text);
    std::optional<ProgramTemplate> parsed_template;
    try {
      parsed_template = ProgramTemplate::parse(text, "damaged.twt");
      ++parsed;
    } catch (const tw::InputError& error) {
      ++rejected;
      CHECK(error.file() == "damaged.twt");
      CHECK(error.line() > 0);
      continue;
    }
    // A template that parses renders the program or refuses with the
    // project's error (a section or value the program needs is missing);
    // any other exception fails the test case.
    for (const tw::planner::Program* each : {&program, &arcs}) {
      std::ostringstream out;
      try {
        parsed_template->render(*each, out);
        // The header holds [[caution]], so every rendered program carries
        // every line of the safety caution (program_template.hpp).
        for (const std::string& line : caution) CHECK_THAT(out.str(), Catch::Contains(line));
      } catch (const tw::InputError& error) {
        CHECK(error.file() == "damaged.twt");
        CHECK(out.str().empty());  // nothing reaches the stream when rendering fails
      }
    }
  }
  // Both outcomes occur, so the loop exercised the error paths and the parser.
  CHECK(parsed > 0);
  CHECK(rejected > 0);
}
