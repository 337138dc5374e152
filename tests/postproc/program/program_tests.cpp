#include <catch2/catch.hpp>
#include <cmath>
#include <limits>

#include "kinematics/arm_model.hpp"
#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"
#include "planner/program/program.hpp"
#include "tests/postproc/sample_program.hpp"

using namespace tw::planner;
using tw::postproc::test::arcProgram;
using tw::postproc::test::sampleProgram;

namespace {

MotionRecord& motionAt(Program& program, int index) {
  return std::get<MotionRecord>(program.records[index]);
}

std::string problemOf(const Program& program) {
  const std::optional<ProgramProblem> problem = findProgramProblem(program);
  return problem ? problem->message : std::string("(none)");
}

}  // namespace

TEST_CASE("The sample program is consistent", "[program]") {
  CHECK(problemOf(sampleProgram()) == "(none)");
}

TEST_CASE("findProgramProblem names the first inconsistency and its record", "[program]") {
  Program program = sampleProgram();

  SECTION("a joint vector of the wrong size") {
    motionAt(program, 1).q.resize(5);
    const std::optional<ProgramProblem> problem = findProgramProblem(program);
    REQUIRE(problem);
    CHECK(problem->record == 1);
    CHECK_THAT(problem->message, Catch::Contains("5 joint values; the arm has 6"));
  }
  SECTION("a joint outside its limits") {
    motionAt(program, 0).q[1] = -121.0 * tw::kPi / 180.0;
    CHECK_THAT(problemOf(program), Catch::Contains("'axis_2' value is not finite or outside"));
  }
  SECTION("a rotation that is not proper") {
    motionAt(program, 3).X_RT.linear() *= -1.0;
    CHECK_THAT(problemOf(program), Catch::Contains("not a proper rotation"));
  }
  SECTION("a joint speed fraction above 1") {
    motionAt(program, 0).speed.value = 1.5;
    CHECK_THAT(problemOf(program), Catch::Contains("at most 1"));
  }
  SECTION("a process left on at the end") {
    program.records.erase(program.records.begin() + 5);
    CHECK_THAT(problemOf(program), Catch::Contains("ends with the process 'steel_3mm_fillet' still on"));
  }
  SECTION("a process switched off with another parameter set") {
    std::get<ProcessEvent>(program.records[5]).parameter_set = "other";
    CHECK_THAT(problemOf(program), Catch::Contains("switches off parameter set 'other'"));
  }
  SECTION("a record starting before the one ahead of it") {
    motionAt(program, 4).start_time = 1.0;
    const std::optional<ProgramProblem> problem = findProgramProblem(program);
    REQUIRE(problem);
    CHECK(problem->record == 4);
  }
  SECTION("a line break in a tool id") {
    motionAt(program, 3).tool = "torch\nG0";
    CHECK_THAT(problemOf(program), Catch::Contains("control character"));
  }
  SECTION("an input hash that is not SHA-256 hex") {
    program.metadata.inputs.front().sha256 = "ABC";
    const std::optional<ProgramProblem> problem = findProgramProblem(program);
    REQUIRE(problem);
    CHECK(problem->record == -1);
  }
  SECTION("checkProgram throws the project's error") {
    program.metadata.joints.clear();
    CHECK_THROWS_AS(checkProgram(program, "out.twm"), tw::InputError);
  }
}

TEST_CASE("The arc program is consistent", "[program]") {
  CHECK(problemOf(arcProgram()) == "(none)");
}

TEST_CASE("findProgramProblem checks circular moves and their via points", "[program]") {
  Program program = arcProgram();
  MotionRecord& half_circle = motionAt(program, 4);

  SECTION("a circular move without a via point") {
    half_circle.via.reset();
    const std::optional<ProgramProblem> problem = findProgramProblem(program);
    REQUIRE(problem);
    CHECK(problem->record == 4);
    CHECK_THAT(problem->message, Catch::Contains("(circular-move) needs a via point"));
  }
  SECTION("a via point on a linear move") {
    motionAt(program, 3).via = half_circle.via;
    CHECK_THAT(problemOf(program), Catch::Contains("(linear-move) has a via point"));
  }
  SECTION("via joints of the wrong size or outside the limits") {
    half_circle.via->q_via.resize(5);
    CHECK_THAT(problemOf(program), Catch::Contains("5 via joint values"));
    half_circle.via->q_via = half_circle.q;
    half_circle.via->q_via[4] = 126.0 * tw::kPi / 180.0;
    CHECK_THAT(problemOf(program), Catch::Contains("via joint 'axis_5' value is not finite"));
  }
  SECTION("a via pose that is not a proper rotation") {
    half_circle.via->X_RV.linear() *= -1.0;
    CHECK_THAT(problemOf(program), Catch::Contains("via TCP pose is not finite"));
  }
  SECTION("a circular move as the first motion") {
    program.records.erase(program.records.begin(), program.records.begin() + 4);
    program.records.erase(program.records.begin() + 2);  // the process-off left alone
    const std::optional<ProgramProblem> problem = findProgramProblem(program);
    REQUIRE(problem);
    CHECK(problem->record == 0);
    CHECK_THAT(problem->message, Catch::Contains("is the first motion"));
  }
  SECTION("a circular move after a motion in another frame") {
    motionAt(program, 3).frame = "fixture_c";
    const std::optional<ProgramProblem> problem = findProgramProblem(program);
    REQUIRE(problem);
    CHECK(problem->record == 4);
    CHECK_THAT(problem->message, Catch::Contains("another tool or frame"));
  }
  SECTION("a via on the straight line from start to target") {
    // Start (950, 0, 410) mm, target (950, 50, 410) mm: a via at (950, 25,
    // 410.009) mm is 9 µm off the line, under the 10 µm of kArcPointSeparation.
    half_circle.via->X_RV.translation() = Eigen::Vector3d(0.950, 0.025, 0.410009);
    CHECK_THAT(problemOf(program), Catch::Contains("lie on one straight line"));
  }
  SECTION("a via on the start") {
    half_circle.via->X_RV.translation() = motionAt(program, 3).X_RT.translation();
    CHECK_THAT(problemOf(program), Catch::Contains("not distinct"));
  }
}

TEST_CASE("findProgramProblem checks the blend rules", "[program]") {
  Program program = arcProgram();

  SECTION("a blend on the last motion") {
    motionAt(program, 9).blend_radius = 0.001;
    const std::optional<ProgramProblem> problem = findProgramProblem(program);
    REQUIRE(problem);
    CHECK(problem->record == 9);
    CHECK_THAT(problem->message, Catch::Contains("is the last motion and has a blend radius"));
  }
  SECTION("a blend into the process-on event") {
    motionAt(program, 1).blend_radius = 0.001;
    const std::optional<ProgramProblem> problem = findProgramProblem(program);
    REQUIRE(problem);
    CHECK(problem->record == 1);
    CHECK_THAT(problem->message, Catch::Contains("a process event follows it"));
  }
  SECTION("a blend into the process-off event") {
    motionAt(program, 5).blend_radius = 0.001;
    const std::optional<ProgramProblem> problem = findProgramProblem(program);
    REQUIRE(problem);
    CHECK(problem->record == 5);
  }
  SECTION("blend zones that overlap") {
    // Targets 4 and 5 are 50 mm apart (sample data): 2 mm + 48.1 mm is too much,
    // 2 mm + 48 mm just fits.
    motionAt(program, 4).blend_radius = 0.0480;
    motionAt(program, 5).blend_radius = 0.0;
    CHECK(problemOf(program) == "(none)");
    motionAt(program, 4).blend_radius = 0.0481;
    const std::optional<ProgramProblem> problem = findProgramProblem(program);
    REQUIRE(problem);
    CHECK(problem->record == 4);
    CHECK_THAT(problem->message, Catch::Contains("blend zones would overlap"));
  }
  SECTION("a blend before a change of tool") {
    for (std::size_t i = 8; i < program.records.size(); ++i) motionAt(program, static_cast<int>(i)).tool = "probe";
    const std::optional<ProgramProblem> problem = findProgramProblem(program);
    REQUIRE(problem);
    CHECK(problem->record == 7);
    CHECK_THAT(problem->message, Catch::Contains("uses another tool"));
  }
  SECTION("a negative or infinite blend") {
    motionAt(program, 3).blend_radius = -0.001;
    CHECK_THAT(problemOf(program), Catch::Contains("blend radius must be zero or positive"));
    motionAt(program, 3).blend_radius = std::numeric_limits<double>::infinity();
    CHECK_THAT(problemOf(program), Catch::Contains("blend radius must be zero or positive"));
  }
}

TEST_CASE("Cycle time and joint-limit margins of the sample program", "[program]") {
  Program program = sampleProgram();
  // The home move starts at 12.7 s and lasts 2.0 s (sample data); the margin
  // covers the rounding of one double addition.
  CHECK(cycleTime(program) == Approx(14.7).margin(1e-12));

  // Record 1 at (10, -20, 30, 0, 45, -15)° against ±(170, 120, 150, 190, 125,
  // 360)°: margins 160, 100, 120, 190, 80, 345° (hand arithmetic).
  const tw::kinematics::JointVector margins =
      jointLimitMargins(program.metadata, motionAt(program, 0).q);
  const double expected_deg[6] = {160.0, 100.0, 120.0, 190.0, 80.0, 345.0};
  for (int i = 0; i < 6; ++i) {
    CAPTURE(i);
    // Degree-radian conversion rounding only.
    CHECK(margins[i] * 180.0 / tw::kPi == Approx(expected_deg[i]).margin(1e-9));
  }
}

TEST_CASE("programJoints copies names, types and limits from the arm model", "[program]") {
  tw::kinematics::ArmDescription description;
  description.name = "track_and_axis";
  tw::kinematics::JointSpec track;
  track.name = "track";
  track.type = tw::kinematics::JointType::kPrismatic;
  track.axis = Eigen::Vector3d::UnitX();
  track.lower = 0.0;
  track.upper = 4.0;
  track.max_velocity = 1.0;
  track.max_acceleration = 2.0;
  tw::kinematics::JointSpec axis = track;
  axis.name = "axis_1";
  axis.type = tw::kinematics::JointType::kRevolute;
  axis.axis = Eigen::Vector3d::UnitZ();
  axis.lower = -3.0;
  axis.upper = 3.0;
  description.joints = {track, axis};
  const tw::kinematics::ArmModel arm(description);

  const std::vector<ProgramJoint> joints = programJoints(arm);
  REQUIRE(joints.size() == 2);
  CHECK(joints[0].name == "track");
  CHECK(joints[0].type == tw::kinematics::JointType::kPrismatic);
  CHECK(joints[0].upper == 4.0);
  CHECK(joints[1].name == "axis_1");
  CHECK(joints[1].lower == -3.0);
}
