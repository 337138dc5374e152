#include "postproc/report/report_timeline.hpp"

#include <algorithm>
#include <variant>

namespace tw::postproc {

std::vector<TimelineMotion> reportTimeline(const planner::Program& program,
                                           const ReportCell& cell) {
  std::vector<TimelineMotion> timeline;
  bool process_on = false;
  for (std::size_t i = 0; i < program.records.size(); ++i) {
    if (const auto* event = std::get_if<planner::ProcessEvent>(&program.records[i])) {
      process_on = event->kind == planner::ProcessEventKind::kStart;
      continue;
    }
    const auto& motion = std::get<planner::MotionRecord>(program.records[i]);
    TimelineMotion entry;
    entry.record = i;
    entry.motion = &motion;
    entry.end_time = motion.start_time + motion.duration;
    const auto frame = cell.X_CR.find(motion.frame);
    entry.frame_known = frame != cell.X_CR.end();
    entry.p_CT = entry.frame_known ? Eigen::Vector3d(frame->second * motion.X_RT.translation())
                                   : Eigen::Vector3d(motion.X_RT.translation());
    entry.process_on = process_on;
    if (!timeline.empty() && motion.duration > 0.0) {
      const TimelineMotion& previous = timeline.back();
      const bool comparable = (previous.frame_known && entry.frame_known) ||
                              previous.motion->frame == motion.frame;
      if (comparable) entry.chord_speed = (entry.p_CT - previous.p_CT).norm() / motion.duration;
    }
    timeline.push_back(entry);
  }
  return timeline;
}

std::vector<std::string> seamNames(const std::vector<TimelineMotion>& timeline) {
  std::vector<std::string> names;
  for (const TimelineMotion& entry : timeline) {
    const std::string& seam = entry.motion->seam;
    if (!seam.empty() && std::find(names.begin(), names.end(), seam) == names.end()) {
      names.push_back(seam);
    }
  }
  return names;
}

ReportScope reportScope(const std::vector<TimelineMotion>& timeline, const std::string& seam) {
  ReportScope scope;
  scope.seam = seam;
  for (std::size_t i = 0; i < timeline.size(); ++i) {
    if (!seam.empty() && timeline[i].motion->seam != seam) continue;
    if (scope.motions.empty() && !seam.empty() && i > 0) scope.lead_in = i - 1;
    scope.motions.push_back(i);
  }
  return scope;
}

}  // namespace tw::postproc
