#include <catch2/catch.hpp>
#include <random>
#include <sstream>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"
#include "planner/program/sha256.hpp"
#include "postproc/motion_text/motion_text_post_processor.hpp"
#include "postproc/motion_text/motion_text_reader.hpp"
#include "tests/postproc/sample_program.hpp"
#include "tests/test_support/text_damage.hpp"

using namespace tw::postproc;
using tw::planner::MotionRecord;
using tw::planner::ProcessEvent;
using tw::planner::Program;

namespace {

std::string motionText(const Program& program) {
  std::ostringstream out;
  MotionTextPostProcessor().write(program, WriteOptions{}, out);
  return out.str();
}

/// `text` with its integrity line replaced by a correct one, so that a test
/// reaches the checks behind the integrity check.
std::string resealed(const std::string& text) {
  const std::size_t last = text.rfind("integrity sha256=");
  const std::string body = text.substr(0, last);
  return body + "integrity sha256=" + tw::planner::sha256Hex(body) + "\n";
}

std::string replaced(std::string text, const std::string& from, const std::string& to) {
  const std::size_t at = text.find(from);
  REQUIRE(at != std::string::npos);
  return text.replace(at, from.size(), to);
}

/// The 1-based line of `text` on which `needle` starts.
long lineOf(const std::string& text, const std::string& needle) {
  const std::size_t at = text.find(needle);
  REQUIRE(at != std::string::npos);
  return 1 + std::count(text.begin(), text.begin() + static_cast<long>(at), '\n');
}

tw::InputError readError(const std::string& text) {
  try {
    readMotionText(text, "cell_a.twm");
  } catch (const tw::InputError& error) {
    return error;
  }
  FAIL("the reader accepted the file");
  return tw::InputError("");
}

}  // namespace

TEST_CASE("Motion text of the sample program matches the golden file", "[motion-text]") {
  // Golden file: tests/postproc/data/sample_program.twm, checked by hand
  // against FORMAT.md when it was committed.
  CHECK(motionText(test::sampleProgram()) == test::readDataFile("sample_program.twm"));
}

TEST_CASE("Motion text of the arc program matches the golden file", "[motion-text]") {
  // Golden file: tests/postproc/data/arc_program.twm, read line by line
  // against arcProgram() and FORMAT.md when it was committed.
  CHECK(motionText(test::arcProgram()) == test::readDataFile("arc_program.twm"));
}

TEST_CASE("Motion text round-trips within the printed precision", "[motion-text]") {
  const bool arcs = GENERATE(false, true);
  CAPTURE(arcs);
  const Program original = arcs ? test::arcProgram() : test::sampleProgram();
  const Program read = readMotionText(motionText(original), "sample.twm");

  CHECK(read.metadata.job == original.metadata.job);
  CHECK(read.metadata.arm == original.metadata.arm);
  CHECK(read.metadata.generator == original.metadata.generator);
  CHECK(read.metadata.seed == original.metadata.seed);
  REQUIRE(read.metadata.inputs.size() == 1);
  CHECK(read.metadata.inputs[0].sha256 == original.metadata.inputs[0].sha256);
  CHECK(read.warnings == original.warnings);
  REQUIRE(read.metadata.joints.size() == original.metadata.joints.size());
  REQUIRE(read.records.size() == original.records.size());

  // Half a unit in the last printed digit: 1e-4 deg, 1e-3 mm, 1e-4 s, 1e-9
  // per quaternion component (which moves a rotation entry by up to ~4e-9).
  const double angle_tolerance = 0.5e-4 * tw::kPi / 180.0 + 1e-15;
  const double length_tolerance = 0.5e-6 + 1e-15;
  const double time_tolerance = 0.5e-4 + 1e-15;
  const double rotation_tolerance = 1e-8;
  for (std::size_t i = 0; i < original.records.size(); ++i) {
    CAPTURE(i);
    REQUIRE(read.records[i].index() == original.records[i].index());
    if (const auto* expected = std::get_if<MotionRecord>(&original.records[i])) {
      const auto& actual = std::get<MotionRecord>(read.records[i]);
      CHECK(actual.kind == expected->kind);
      CHECK((actual.q - expected->q).cwiseAbs().maxCoeff() <= angle_tolerance);
      CHECK((actual.X_RT.translation() - expected->X_RT.translation()).cwiseAbs().maxCoeff() <=
            length_tolerance);
      CHECK((actual.X_RT.linear() - expected->X_RT.linear()).cwiseAbs().maxCoeff() <=
            rotation_tolerance);
      CHECK(actual.tool == expected->tool);
      CHECK(actual.frame == expected->frame);
      CHECK(actual.seam == expected->seam);
      CHECK(actual.branch == expected->branch);
      CHECK(actual.speed.kind == expected->speed.kind);
      // Half a unit of the last digit: TCP speed 3 decimals in mm/s (0.5e-6 m/s),
      // joint speed fraction 4 decimals.
      const double speed_tolerance =
          expected->speed.kind == tw::planner::SpeedKind::kTcpSpeed ? 0.5e-6 + 1e-15 : 0.5e-4 + 1e-15;
      CHECK(actual.speed.value == Approx(expected->speed.value).margin(speed_tolerance));
      CHECK(actual.blend_radius == Approx(expected->blend_radius).margin(length_tolerance));
      CHECK(actual.start_time == Approx(expected->start_time).margin(time_tolerance));
      CHECK(actual.duration == Approx(expected->duration).margin(time_tolerance));
      REQUIRE(actual.clearance.has_value() == expected->clearance.has_value());
      if (expected->clearance) {
        CHECK(*actual.clearance == Approx(*expected->clearance).margin(length_tolerance));
      }
      REQUIRE(actual.singularity_margin.has_value() == expected->singularity_margin.has_value());
      if (expected->singularity_margin) {
        CHECK(*actual.singularity_margin ==
              Approx(*expected->singularity_margin).margin(angle_tolerance));
      }
      REQUIRE(actual.via.has_value() == expected->via.has_value());
      if (expected->via) {
        CHECK((actual.via->q_via - expected->via->q_via).cwiseAbs().maxCoeff() <= angle_tolerance);
        CHECK((actual.via->X_RV.translation() - expected->via->X_RV.translation())
                  .cwiseAbs()
                  .maxCoeff() <= length_tolerance);
        CHECK((actual.via->X_RV.linear() - expected->via->X_RV.linear()).cwiseAbs().maxCoeff() <=
              rotation_tolerance);
      }
    } else {
      const auto& expected_event = std::get<ProcessEvent>(original.records[i]);
      const auto& actual = std::get<ProcessEvent>(read.records[i]);
      CHECK(actual.kind == expected_event.kind);
      CHECK(actual.parameter_set == expected_event.parameter_set);
      CHECK(actual.seam == expected_event.seam);
      CHECK(actual.time == Approx(expected_event.time).margin(time_tolerance));
    }
  }
  // Writing what was read gives the same bytes: nothing drifts per round trip.
  CHECK(motionText(read) == motionText(original));
  // The arc program has its two circular moves (records 5 and 9) and blends.
  if (arcs) {
    CHECK(std::get<MotionRecord>(read.records[4]).kind == tw::planner::MotionKind::kCircularMove);
    CHECK(std::get<MotionRecord>(read.records[8]).kind == tw::planner::MotionKind::kCircularMove);
    CHECK(std::get<MotionRecord>(read.records[0]).blend_radius > 0.0);
  }
}

TEST_CASE("The reader refuses via fields where they do not belong and wants all three on arcs",
          "[motion-text]") {
  const std::string good = motionText(test::arcProgram());
  REQUIRE_NOTHROW(readMotionText(good, "cell_a.twm"));
  SECTION("a via position on a linear move") {
    const std::string edited = resealed(
        replaced(good, "tcp_speed=10.000 blend=2.000", "via_position=1.000,2.000,3.000 tcp_speed=10.000 blend=2.000"));
    const tw::InputError error = readError(edited);
    CHECK_THAT(error.message(), Catch::Contains("unknown field 'via_position' in a 'linear-move' line"));
    CHECK(error.line() == lineOf(edited, "linear-move n=4 "));
  }
  SECTION("a circular move without its via orientation") {
    const std::size_t at = good.find(" via_orientation=");
    REQUIRE(at != std::string::npos);
    const std::size_t end = good.find(' ', at + 1);
    std::string edited = good;
    edited.erase(at, end - at);
    edited = resealed(edited);
    const tw::InputError error = readError(edited);
    CHECK_THAT(error.message(), Catch::Contains("needs the field 'via_orientation'"));
    CHECK(error.line() == lineOf(edited, "circular-move n=5 "));
  }
  SECTION("a via on the chord of its arc, reported at the record's line") {
    const std::string edited =
        resealed(replaced(good, "via_position=975.000,25.000,410.000", "via_position=950.000,25.000,410.000"));
    const tw::InputError error = readError(edited);
    CHECK_THAT(error.message(), Catch::Contains("lie on one straight line"));
    CHECK(error.line() == lineOf(edited, "circular-move n=5 "));
  }
  SECTION("a blend before the process-off event") {
    std::string edited = good;
    const std::size_t line = edited.find("linear-move n=6 ");
    REQUIRE(line != std::string::npos);
    const std::size_t blend = edited.find(" blend=0.000", line);
    REQUIRE(blend < edited.find('\n', line));
    edited = resealed(edited.replace(blend, 12, " blend=1.000"));
    const tw::InputError error = readError(edited);
    CHECK_THAT(error.message(), Catch::Contains("a process event follows it"));
    CHECK(error.line() == lineOf(edited, "linear-move n=6 "));
  }
}

TEST_CASE("Motion text in metres and radians round-trips too", "[motion-text]") {
  Program original = test::sampleProgram();
  original.metadata.units = {tw::planner::LengthUnit::kMetre, tw::planner::AngleUnit::kRadian};
  const std::string text = motionText(original);
  CHECK_THAT(text, Catch::Contains("units length=m angle=rad time=s"));
  const Program read = readMotionText(text, "metric.twm");
  const auto& expected = std::get<MotionRecord>(original.records[3]);
  const auto& actual = std::get<MotionRecord>(read.records[3]);
  // Six decimals in m and rad.
  CHECK((actual.q - expected.q).cwiseAbs().maxCoeff() <= 0.5e-6 + 1e-15);
  CHECK((actual.X_RT.translation() - expected.X_RT.translation()).cwiseAbs().maxCoeff() <=
        0.5e-6 + 1e-15);
}

TEST_CASE("The motion text reader rejects damaged files with file:line errors",
          "[motion-text]") {
  const std::string good = motionText(test::sampleProgram());
  REQUIRE_NOTHROW(readMotionText(good, "cell_a.twm"));

  SECTION("a file cut off in the middle of a line") {
    const tw::InputError error = readError(good.substr(0, good.size() / 2));
    CHECK_THAT(error.what(), Catch::StartsWith("cell_a.twm:"));
    CHECK_THAT(error.message(), Catch::Contains("truncated"));
  }
  SECTION("a file cut off after a whole line") {
    const std::string cut = good.substr(0, good.rfind("end records="));
    const tw::InputError error = readError(cut);
    CHECK_THAT(error.message(), Catch::Contains("truncated or was edited"));
  }
  SECTION("one changed digit") {
    const tw::InputError error = readError(replaced(good, "joints=10.0000", "joints=10.0001"));
    CHECK_THAT(error.message(), Catch::Contains("integrity check failed"));
    CHECK(error.line() == lineOf(good, "integrity sha256="));
  }
  SECTION("a missing field, even with a correct integrity line") {
    const std::string edited = resealed(replaced(good, " blend=10.000", ""));
    const tw::InputError error = readError(edited);
    CHECK_THAT(error.message(), Catch::Contains("needs the field 'blend'"));
    CHECK(error.line() == lineOf(edited, "joint-move n=1 "));
  }
  SECTION("an unknown version") {
    const tw::InputError error = readError(
        resealed(replaced(good, "tracewright-motion version=1", "tracewright-motion version=2")));
    CHECK(error.line() == 1);
    CHECK_THAT(error.message(), Catch::Contains("unsupported motion text version '2'"));
  }
  SECTION("a file of another kind") {
    const tw::InputError error = readError("\nsolid part\n");
    CHECK(error.line() == 1);
    CHECK_THAT(error.message(), Catch::Contains("not a tracewright motion text file"));
  }
  SECTION("an unknown field") {
    const tw::InputError error =
        readError(resealed(replaced(good, " blend=10.000", " blend=10.000 colour=red")));
    CHECK_THAT(error.message(), Catch::Contains("unknown field 'colour'"));
  }
  SECTION("a number with a decimal comma") {
    const tw::InputError error =
        readError(resealed(replaced(good, "duration=1.5000", "duration=1,5000")));
    CHECK_THAT(error.message(), Catch::Contains("'duration' expects 1 comma-separated number"));
  }
  SECTION("records out of order") {
    const tw::InputError error = readError(resealed(replaced(good, "linear-move n=2 ", "linear-move n=3 ")));
    CHECK_THAT(error.message(), Catch::Contains("expected record number n=2"));
  }
  SECTION("a process switched on twice") {
    const std::string edited = resealed(replaced(good, "process-off n=6", "process-on n=6"));
    const tw::InputError error = readError(edited);
    CHECK_THAT(error.message(), Catch::Contains("on while 'steel_3mm_fillet' is still on"));
    CHECK(error.line() == lineOf(edited, "process-on n=6"));
  }
}

TEST_CASE("The example in FORMAT.md is a valid motion text file", "[motion-text]") {
  const std::string format = test::readWholeFile(std::string(TW_SOURCE_DIR) + "/postproc/FORMAT.md");
  const std::size_t begin = format.find("<!-- example-begin -->\n```\n");
  const std::size_t end = format.find("```\n<!-- example-end -->");
  REQUIRE(begin != std::string::npos);
  REQUIRE(end != std::string::npos);
  const std::size_t start = begin + std::string("<!-- example-begin -->\n```\n").size();
  const Program example = readMotionText(format.substr(start, end - start), "FORMAT.md");
  REQUIRE(example.records.size() == 5);
  CHECK(std::get<ProcessEvent>(example.records[1]).parameter_set == "steel_2mm");
  const auto& arc = std::get<MotionRecord>(example.records[3]);
  CHECK(arc.kind == tw::planner::MotionKind::kCircularMove);
  REQUIRE(arc.via);
  // The example's via: 720, 60, 400 mm (FORMAT.md), to the reader's rounding.
  CHECK((arc.via->X_RV.translation() - Eigen::Vector3d(0.720, 0.060, 0.400)).norm() < 1e-12);
}

TEST_CASE("The reader answers random edits with its own error or a valid program",
          "[motion-text]") {
  const bool arcs = GENERATE(false, true);
  CAPTURE(arcs);
  const std::string good = motionText(arcs ? test::arcProgram() : test::sampleProgram());
  const std::size_t body_size = good.rfind("integrity sha256=");
  const std::string alphabet = "0123456789.,-+=\" e#\\abcnz_";
  std::mt19937 random(20261201);  // fixed seed: the same edits on every run
  int accepted = 0;
  for (int trial = 0; trial < 400; ++trial) {
    // Damage the body only, then reseal it, so that the reader's field checks
    // (not its integrity check) meet the damage.
    const std::string edited = resealed(
        tw::test::damaged(good.substr(0, body_size), alphabet, random) + "integrity sha256=\n");
    CAPTURE(trial, edited);
    try {
      const Program read = readMotionText(edited, "edited.twm");
      // An edit the reader accepts must give a program that writes and reads back.
      CHECK_NOTHROW(readMotionText(motionText(read), "rewritten.twm"));
      ++accepted;
    } catch (const tw::InputError& error) {
      CHECK_THAT(error.what(), Catch::StartsWith("edited.twm:"));
    }
  }
  // Most edits break a field; some (a comment, a digit) do not: both occur.
  CHECK(accepted < 400);
  CHECK(accepted > 0);
}
