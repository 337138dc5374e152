#include "planner/timing/cycle_time_breakdown.hpp"

#include <catch2/catch.hpp>

namespace tw::planner {
namespace {

MotionRecord motion(const std::string& seam, double start, double duration) {
  MotionRecord record;
  record.q = kinematics::JointVector::Zero(6);
  record.seam = seam;
  record.start_time = start;
  record.duration = duration;
  return record;
}

ProcessEvent event(ProcessEventKind kind, const std::string& seam, double time) {
  return ProcessEvent{kind, "weld-a", seam, time};
}

TEST_CASE("Cycle time is itemised per seam, per transit and in total", "[timing]") {
  // An invented two-seam program with round numbers, added up by hand below.
  Program program;
  program.records = {
      motion("", 0.0, 2.0),                                 // home → seam 1
      motion("s1", 2.0, 0.5),                               // approach
      event(ProcessEventKind::kStart, "s1", 3.0),           // 0.5 s dwell
      motion("s1", 3.3, 4.0),                               // 0.3 s dwell, weld
      event(ProcessEventKind::kStop, "s1", 7.3),
      motion("s1", 7.3, 0.5),                               // retract
      motion("", 7.8, 1.5),                                 // transit
      motion("s2", 9.3, 0.5),                               // approach
      event(ProcessEventKind::kStart, "s2", 9.8),
      motion("s2", 9.8, 2.0),                               // weld
      event(ProcessEventKind::kStop, "s2", 11.8),
      motion("s2", 11.8, 0.5),                              // retract
      motion("", 12.3, 2.0),                                // home
  };
  const CycleTimeBreakdown breakdown = cycleTimeBreakdown(program);
  // Sums of a few decimals: 1e-12 absolute covers their rounding.
  constexpr double kSum = 1e-12;

  REQUIRE(breakdown.seams.size() == 2);
  CHECK(breakdown.seams[0].seam == "s1");
  CHECK(breakdown.seams[0].time.process == Approx(4.0).margin(kSum));
  CHECK(breakdown.seams[0].time.air == Approx(1.0).margin(kSum));
  CHECK(breakdown.seams[0].time.dwell == Approx(0.8).margin(kSum));
  CHECK(breakdown.seams[1].seam == "s2");
  CHECK(breakdown.seams[1].time.process == Approx(2.0).margin(kSum));
  CHECK(breakdown.seams[1].time.air == Approx(1.0).margin(kSum));
  CHECK(breakdown.seams[1].time.dwell == Approx(0.0).margin(kSum));

  REQUIRE(breakdown.transits.size() == 3);
  CHECK(breakdown.transits[0].from_seam.empty());
  CHECK(breakdown.transits[0].to_seam == "s1");
  CHECK(breakdown.transits[1].from_seam == "s1");
  CHECK(breakdown.transits[1].to_seam == "s2");
  CHECK(breakdown.transits[1].time.air == Approx(1.5).margin(kSum));
  CHECK(breakdown.transits[2].from_seam == "s2");
  CHECK(breakdown.transits[2].to_seam.empty());
  CHECK(breakdown.transits[2].time.total() == Approx(2.0).margin(kSum));

  CHECK(breakdown.total.process == Approx(6.0).margin(kSum));
  CHECK(breakdown.total.dwell == Approx(0.8).margin(kSum));
  // Two routes to the cycle time: the itemised sum and the program's end.
  CHECK(breakdown.total.total() == Approx(cycleTime(program)).margin(kSum));
  CHECK(cycleTime(program) == Approx(14.3).margin(kSum));
}

TEST_CASE("An empty program has no cycle time", "[timing]") {
  const CycleTimeBreakdown breakdown = cycleTimeBreakdown(Program{});
  CHECK(breakdown.seams.empty());
  CHECK(breakdown.transits.empty());
  CHECK(breakdown.total.total() == 0.0);
}

}  // namespace
}  // namespace tw::planner
