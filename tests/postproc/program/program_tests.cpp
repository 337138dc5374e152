#include <catch2/catch.hpp>
#include <cmath>

#include "kinematics/arm_model.hpp"
#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"
#include "planner/program/program.hpp"
#include "tests/postproc/sample_program.hpp"

using namespace tw::planner;
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
