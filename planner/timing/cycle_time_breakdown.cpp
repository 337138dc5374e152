#include "planner/timing/cycle_time_breakdown.hpp"

#include <algorithm>
#include <variant>

namespace tw::planner {

namespace {

/// Adds to the right seam or transit as records arrive in program order.
class Tally {
 public:
  explicit Tally(CycleTimeBreakdown& breakdown) : breakdown_(breakdown) {}

  /// The share of `seam`, or of the current transit when seam is empty.
  CycleTimeShare& shareOf(const std::string& seam) {
    if (seam.empty()) {
      if (!in_transit_) {
        breakdown_.transits.push_back({last_seam_, "", {}});
        in_transit_ = true;
      }
      return breakdown_.transits.back().time;
    }
    if (in_transit_) breakdown_.transits.back().to_seam = seam;
    in_transit_ = false;
    last_seam_ = seam;
    const auto found = std::find_if(breakdown_.seams.begin(), breakdown_.seams.end(),
                                    [&](const SeamCycleTime& item) { return item.seam == seam; });
    if (found != breakdown_.seams.end()) return found->time;
    breakdown_.seams.push_back({seam, {}});
    return breakdown_.seams.back().time;
  }

 private:
  CycleTimeBreakdown& breakdown_;
  bool in_transit_ = false;
  std::string last_seam_;
};

}  // namespace

CycleTimeBreakdown cycleTimeBreakdown(const Program& program) {
  CycleTimeBreakdown breakdown;
  Tally tally(breakdown);
  double cursor = 0.0;  // end of everything so far [s]
  bool process_on = false;
  for (const ProgramRecord& record : program.records) {
    if (const auto* motion = std::get_if<MotionRecord>(&record)) {
      CycleTimeShare& share = tally.shareOf(motion->seam);
      const double dwell = std::max(0.0, motion->start_time - cursor);
      share.dwell += dwell;
      breakdown.total.dwell += dwell;
      (process_on ? share.process : share.air) += motion->duration;
      (process_on ? breakdown.total.process : breakdown.total.air) += motion->duration;
      cursor = std::max(cursor, motion->start_time + motion->duration);
    } else {
      const ProcessEvent& event = std::get<ProcessEvent>(record);
      const double dwell = std::max(0.0, event.time - cursor);
      if (dwell > 0.0) {
        tally.shareOf(event.seam).dwell += dwell;
        breakdown.total.dwell += dwell;
      }
      cursor = std::max(cursor, event.time);
      process_on = event.kind == ProcessEventKind::kStart;
    }
  }
  return breakdown;
}

}  // namespace tw::planner
