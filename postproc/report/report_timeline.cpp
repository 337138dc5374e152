#include "postproc/report/report_timeline.hpp"

#include <algorithm>
#include <cmath>
#include <variant>

#include "kinematics/common/angles.hpp"
#include "planner/program/motion_path.hpp"

namespace tw::postproc {
namespace {

// At most 5° of arc per drawn segment: the chord then misses the arc by
// r·(1 − cos 2.5°) < 0.001·r, below a pixel for any arc that fits a view.
constexpr double kArcStepAngle = 5.0 * kPi / 180.0;
constexpr int kMinArcSegments = 8;

/// Points along circular move `motion` from `p_RS` (the previous target,
/// same frame R), mapped by `X_CR` into the cell frame.
std::vector<Eigen::Vector3d> arcPoints(const Eigen::Vector3d& p_RS,
                                       const planner::MotionRecord& motion,
                                       const Eigen::Isometry3d& X_CR) {
  // checkProgram() made sure the points define an arc.
  const planner::CircularArc arc =
      *planner::CircularArc::through(p_RS, motion.via->X_RV.translation(), motion.X_RT.translation());
  // The 1e-9 keeps a sweep of exactly n steps, rounded up by a last bit, at n.
  const int segments = std::max(
      kMinArcSegments, static_cast<int>(std::ceil(arc.sweep() / kArcStepAngle - 1e-9)));
  std::vector<Eigen::Vector3d> points;
  points.reserve(segments + 1);
  for (int k = 0; k <= segments; ++k) {
    points.push_back(X_CR * arc.position(static_cast<double>(k) / segments));
  }
  return points;
}

}  // namespace

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
    if (motion.via) {
      // A circular move follows a motion in its own frame (checkProgram()).
      const Eigen::Isometry3d X_CR =
          entry.frame_known ? frame->second : Eigen::Isometry3d::Identity();
      const Eigen::Vector3d p_RS = timeline.back().motion->X_RT.translation();
      entry.arc_C = arcPoints(p_RS, motion, X_CR);
      if (motion.duration > 0.0) {
        entry.chord_speed = planner::pathLength(p_RS, motion) / motion.duration;
      }
    } else if (!timeline.empty() && motion.duration > 0.0) {
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
