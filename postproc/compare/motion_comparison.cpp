#include "postproc/compare/motion_comparison.hpp"

#include <Eigen/Geometry>
#include <cmath>
#include <map>
#include <tuple>
#include <variant>

#include "kinematics/common/input_error.hpp"

namespace tw::postproc {
namespace {

using planner::MotionRecord;
using planner::ProcessEvent;
using planner::ProgramRecord;

/// kind, seam, ordinal among the records of that kind and seam.
using RecordKey = std::tuple<std::string, std::string, int>;

std::vector<RecordKey> recordKeys(const planner::Program& program) {
  std::map<std::pair<std::string, std::string>, int> seen;
  std::vector<RecordKey> keys;
  for (const ProgramRecord& record : program.records) {
    std::pair<std::string, std::string> kind_and_seam;
    if (const auto* motion = std::get_if<MotionRecord>(&record)) {
      kind_and_seam = {planner::toString(motion->kind), motion->seam};
    } else {
      const auto& event = std::get<ProcessEvent>(record);
      kind_and_seam = {planner::toString(event.kind), event.seam};
    }
    keys.emplace_back(kind_and_seam.first, kind_and_seam.second, seen[kind_and_seam]++);
  }
  return keys;
}

void requireSameJoints(const planner::Program& a, const planner::Program& b,
                       const std::string& source_b) {
  const std::vector<planner::ProgramJoint>& ja = a.metadata.joints;
  const std::vector<planner::ProgramJoint>& jb = b.metadata.joints;
  bool same = ja.size() == jb.size();
  for (std::size_t j = 0; same && j < ja.size(); ++j) {
    same = ja[j].name == jb[j].name && ja[j].type == jb[j].type;
  }
  if (!same) {
    throw InputError(source_b, 0,
                     "its joints differ from the first file's (names, types or count); expected "
                     "two programs for the same arm");
  }
}

void keepLargest(LargestChange& largest, double value, const RecordChange& change) {
  if (std::abs(value) > largest.value) {
    largest = LargestChange{std::abs(value), change.record_a, change.record_b};
  }
}

/// Joint deltas q_b − q_a into `deltas`; returns whether one is beyond the tolerances.
bool jointDeltas(const kinematics::JointVector& q_a, const kinematics::JointVector& q_b,
                 const planner::Program& a, const ComparisonTolerances& tolerances,
                 std::vector<double>& deltas) {
  bool changed = false;
  for (int j = 0; j < q_a.size(); ++j) {
    const double delta = q_b[j] - q_a[j];
    deltas.push_back(delta);
    const bool revolute = a.metadata.joints[j].type == kinematics::JointType::kRevolute;
    changed |= std::abs(delta) > (revolute ? tolerances.revolute : tolerances.prismatic);
  }
  return changed;
}

double angleBetween(const Eigen::Isometry3d& X_a, const Eigen::Isometry3d& X_b) {
  return Eigen::AngleAxisd(X_a.linear().transpose() * X_b.linear()).angle();
}

/// Fills the deltas of a matched pair; returns whether it differs beyond the tolerances.
bool measure(const ProgramRecord& ra, const ProgramRecord& rb, const planner::Program& a,
             const ComparisonTolerances& tolerances, RecordChange& change) {
  const auto* ma = std::get_if<MotionRecord>(&ra);
  const auto* mb = std::get_if<MotionRecord>(&rb);
  if (ma == nullptr || mb == nullptr) {
    const auto& ea = std::get<ProcessEvent>(ra);
    const auto& eb = std::get<ProcessEvent>(rb);
    change.tool_frame_or_set_changed = ea.parameter_set != eb.parameter_set;
    return change.tool_frame_or_set_changed;
  }
  bool changed = jointDeltas(ma->q, mb->q, a, tolerances, change.joint_deltas);
  change.position_deviation = (mb->X_RT.translation() - ma->X_RT.translation()).norm();
  change.angle_deviation = angleBetween(ma->X_RT, mb->X_RT);
  // Records are matched by kind, so both or neither are circular moves.
  if (ma->via && mb->via) {
    changed |= jointDeltas(ma->via->q_via, mb->via->q_via, a, tolerances, change.via_joint_deltas);
    change.via_position_deviation =
        (mb->via->X_RV.translation() - ma->via->X_RV.translation()).norm();
    change.via_angle_deviation = angleBetween(ma->via->X_RV, mb->via->X_RV);
    changed |= change.via_position_deviation > tolerances.position ||
               change.via_angle_deviation > tolerances.angle;
  }
  change.branch_changed = ma->branch != mb->branch;
  change.branch_a = ma->branch;
  change.branch_b = mb->branch;
  change.tool_frame_or_set_changed = ma->tool != mb->tool || ma->frame != mb->frame;
  return changed || change.position_deviation > tolerances.position ||
         change.angle_deviation > tolerances.angle || change.branch_changed ||
         change.tool_frame_or_set_changed;
}

}  // namespace

MotionComparison compareMotionPrograms(const planner::Program& a, const planner::Program& b,
                                       const std::string& source_b,
                                       const ComparisonTolerances& tolerances) {
  requireSameJoints(a, b, source_b);
  const std::vector<RecordKey> keys_a = recordKeys(a);
  const std::vector<RecordKey> keys_b = recordKeys(b);
  std::map<RecordKey, int> index_b;
  for (std::size_t i = 0; i < keys_b.size(); ++i) index_b[keys_b[i]] = static_cast<int>(i);

  MotionComparison result;
  result.largest_joint_delta.resize(a.metadata.joints.size());
  std::vector<bool> matched_b(keys_b.size(), false);
  for (std::size_t i = 0; i < keys_a.size(); ++i) {
    const auto found = index_b.find(keys_a[i]);
    if (found == index_b.end()) {
      result.removed.push_back(static_cast<int>(i) + 1);
      continue;
    }
    matched_b[found->second] = true;
    ++result.matched;
    RecordChange change;
    change.record_a = static_cast<int>(i) + 1;
    change.record_b = found->second + 1;
    const bool changed = measure(a.records[i], b.records[found->second], a, tolerances, change);
    for (std::size_t j = 0; j < change.joint_deltas.size(); ++j) {
      keepLargest(result.largest_joint_delta[j], change.joint_deltas[j], change);
    }
    for (std::size_t j = 0; j < change.via_joint_deltas.size(); ++j) {
      keepLargest(result.largest_joint_delta[j], change.via_joint_deltas[j], change);
    }
    keepLargest(result.largest_position_deviation, change.position_deviation, change);
    keepLargest(result.largest_angle_deviation, change.angle_deviation, change);
    keepLargest(result.largest_position_deviation, change.via_position_deviation, change);
    keepLargest(result.largest_angle_deviation, change.via_angle_deviation, change);
    result.branch_changes += change.branch_changed;
    if (changed) result.changes.push_back(change);
  }
  for (std::size_t i = 0; i < keys_b.size(); ++i) {
    if (!matched_b[i]) result.added.push_back(static_cast<int>(i) + 1);
  }
  result.cycle_time_a = planner::cycleTime(a);
  result.cycle_time_b = planner::cycleTime(b);
  result.equal = result.removed.empty() && result.added.empty() && result.changes.empty() &&
                 std::abs(result.cycle_time_b - result.cycle_time_a) <= tolerances.time;
  return result;
}

}  // namespace tw::postproc
