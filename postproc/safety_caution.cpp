#include "postproc/safety_caution.hpp"

#include <variant>

namespace tw::postproc {

std::vector<std::string> safetyCaution(const planner::Program& program) {
  std::vector<std::string> lines = {
      "CAUTION: generated offline and not yet verified on the robot.",
      "Verify this program in simulation, then run it first in the real cell at reduced",
      "speed (ISO 10218-1: at most 250 mm/s at the TCP).",
      "Collision freedom holds only for the cell model and its calibration, not for the",
      "real cell; re-check after any change to the cell, tool or fixture.",
      "Speeds, zones, safety I/O and stopping distances are the integrator's",
      "responsibility: the integrator's risk assessment (ISO 10218-2, ISO 12100) and",
      "local codes take precedence over this program.",
  };
  int fast_motions = 0;
  for (const planner::ProgramRecord& record : program.records) {
    const auto* motion = std::get_if<planner::MotionRecord>(&record);
    if (motion && motion->speed.kind == planner::SpeedKind::kTcpSpeed &&
        motion->speed.value > kReducedSpeedLimit) {
      ++fast_motions;
    }
  }
  if (fast_motions > 0) {
    lines.push_back(std::to_string(fast_motions) +
                    " linear motion(s) are programmed faster than 250 mm/s and cannot be "
                    "verified at reduced speed without scaling.");
  }
  return lines;
}

}  // namespace tw::postproc
