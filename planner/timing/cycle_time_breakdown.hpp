#pragma once

#include <string>
#include <vector>

#include "planner/program/program.hpp"

namespace tw::planner {

/// Time [s] split by what the arm does: moving with the process on
/// (process), moving with it off (air moves: approach, retract, transit,
/// home), and standing still between records (dwell: e.g. a process start
/// delay).
struct CycleTimeShare {
  double process = 0.0;
  double air = 0.0;
  double dwell = 0.0;
  double total() const { return process + air + dwell; }
};

/// One seam's share: its approach, process moves, retract, and the dwells
/// just before them or at its process events.
struct SeamCycleTime {
  std::string seam;
  CycleTimeShare time;
};

/// One run of consecutive motions outside any seam (a transit, or the move
/// from or to home), between the seams named ("" at the program's ends).
struct TransitCycleTime {
  std::string from_seam;
  std::string to_seam;
  CycleTimeShare time;
};

/// The cycle time of a program itemised per seam, per transit and in total.
struct CycleTimeBreakdown {
  std::vector<SeamCycleTime> seams;  ///< in order of first appearance
  std::vector<TransitCycleTime> transits;  ///< in program order
  CycleTimeShare total;                ///< total.total() == cycleTime(program)
};

/// Itemises `program` record by record, in order: a motion counts as process
/// time while a process is on (after a start event, before its stop), else
/// as an air move; time between the end of what came before and the start of
/// a motion or the time of an event is dwell, charged to that motion's or
/// event's seam (a transit for a motion outside any seam; an event outside
/// any seam to the transit it falls in). Precondition: the program passes
/// findProgramProblem() (start times non-decreasing, events paired).
CycleTimeBreakdown cycleTimeBreakdown(const Program& program);

}  // namespace tw::planner
