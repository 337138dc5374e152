#include "tests/postproc/two_programs.hpp"

#include <variant>

#include "kinematics/common/angles.hpp"
#include "tests/postproc/sample_program.hpp"

namespace tw::postproc::test {

planner::Program programA() { return sampleProgram(); }

planner::Program programB() {
  constexpr double kDeg = kPi / 180.0;
  planner::Program program = programA();
  std::get<planner::MotionRecord>(program.records[3]).q[0] += 0.5 * kDeg;
  std::get<planner::MotionRecord>(program.records[4]).branch =
      "shoulder front, elbow down, wrist not flipped";
  std::get<planner::MotionRecord>(program.records[6]).X_RT.translation().z() += 0.002;
  planner::MotionRecord extra = std::get<planner::MotionRecord>(program.records[6]);
  extra.start_time = 12.7;
  extra.duration = 1.0;
  program.records.back() = extra;
  return program;
}

}  // namespace tw::postproc::test
