#include "planner/motion/move_compaction.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>
#include <string>

#include "planner/motion/move_geometry.hpp"

namespace tw::planner {
namespace {

constexpr int kExactSpan = 16;
constexpr double kRotationTolerance = 1e-6;   // |RᵀR − I|: a rotation up to rounding
constexpr double kMinSampleSpacing = 1e-9;    // [m] below it the seam's direction is undefined
constexpr int kUnreached = std::numeric_limits<int>::max();

std::string poseLabel(std::size_t index) { return "pose " + std::to_string(index); }

void validate(const CompactionInput& input, const CompactionTolerance& tolerance) {
  if (input.poses.size() < 2) {
    throw std::invalid_argument("compaction needs at least 2 poses, got " +
                                std::to_string(input.poses.size()));
  }
  if (input.must_keep.size() != input.poses.size()) {
    throw std::invalid_argument("compaction: must_keep has " +
                                std::to_string(input.must_keep.size()) + " entries for " +
                                std::to_string(input.poses.size()) + " poses");
  }
  if (!(tolerance.position > 0.0 && std::isfinite(tolerance.position) && tolerance.angle > 0.0 &&
        std::isfinite(tolerance.angle))) {
    throw std::invalid_argument("compaction: tolerances must be positive and finite (position " +
                                std::to_string(tolerance.position) + " m, angle " +
                                std::to_string(tolerance.angle) + " rad)");
  }
  for (std::size_t k = 0; k < input.poses.size(); ++k) {
    const Eigen::Matrix4d& m = input.poses[k].matrix();
    if (!m.allFinite()) throw std::invalid_argument("compaction: " + poseLabel(k) + " is not finite");
    const Eigen::Matrix3d rotation = input.poses[k].linear();
    if ((rotation.transpose() * rotation - Eigen::Matrix3d::Identity()).norm() > kRotationTolerance ||
        rotation.determinant() < 0.0) {
      throw std::invalid_argument("compaction: " + poseLabel(k) + " has a linear part that is not a rotation");
    }
    if (k > 0 && (input.poses[k].translation() - input.poses[k - 1].translation()).norm() <
                     kMinSampleSpacing) {
      throw std::invalid_argument("compaction: " + poseLabel(k - 1) + " and " + poseLabel(k) +
                                  " have the same position; the seam must advance between samples");
    }
  }
}

}  // namespace

MoveFitter::MoveFitter(const CompactionInput& input, const CompactionTolerance& tolerance) {
  validate(input, tolerance);
  const std::size_t count = input.poses.size();
  positions_.reserve(count);
  orientations_.reserve(count);
  arc_length_.reserve(count);
  for (std::size_t k = 0; k < count; ++k) {
    positions_.push_back(input.poses[k].translation());
    orientations_.push_back(Eigen::Quaterniond(input.poses[k].linear()).normalized());
    arc_length_.push_back(k == 0 ? 0.0
                                 : arc_length_.back() + (positions_[k] - positions_[k - 1]).norm());
  }
  position_tolerance_ = tolerance.position;
  position_tolerance_squared_ = tolerance.position * tolerance.position;
  angle_cosine_half_ = std::cos(0.5 * tolerance.angle);
}

namespace {

// Criteria 1 (samples) to 3 of MoveFitter's contract for the samples
// strictly between start and end.
bool samplesFit(const detail::MoveGeometry& geometry, const std::vector<Eigen::Vector3d>& positions,
                const std::vector<Eigen::Quaterniond>& orientations, int start, int end,
                double tolerance_squared, double tolerance, double angle_cosine_half) {
  double farthest_along = 0.0;
  for (int k = start + 1; k < end; ++k) {
    const detail::PathFoot foot = detail::footOnPath(geometry, positions[k]);
    if (foot.distance_squared > tolerance_squared) return false;
    const double along = foot.fraction * geometry.length;
    if (along < farthest_along - tolerance) return false;
    farthest_along = std::max(farthest_along, along);
    const Eigen::Quaterniond relative_sample = geometry.q_start_inverse * orientations[k];
    const Eigen::Quaterniond relative_path = geometry.relativeRotationAt(foot.fraction);
    if (std::abs(relative_sample.coeffs().dot(relative_path.coeffs())) < angle_cosine_half) {
      return false;
    }
  }
  return true;
}

// Criterion 1 for the chords of an arc: the chord midpoint and the chord's
// point nearest the centre (where the inward deviation peaks).
bool chordsFitArc(const detail::MoveGeometry& arc, const std::vector<Eigen::Vector3d>& positions,
                  int start, int end, double tolerance_squared) {
  for (int k = start; k < end; ++k) {
    const Eigen::Vector3d& a = positions[k];
    const Eigen::Vector3d chord = positions[k + 1] - a;
    const double nearest_centre =
        std::clamp((arc.centre - a).dot(chord) / chord.squaredNorm(), 0.0, 1.0);
    if (detail::footOnPath(arc, a + 0.5 * chord).distance_squared > tolerance_squared ||
        detail::footOnPath(arc, a + nearest_centre * chord).distance_squared > tolerance_squared) {
      return false;
    }
  }
  return true;
}

}  // namespace

bool MoveFitter::fitsLine(int start, int end) const {
  std::optional<detail::MoveGeometry> line = detail::lineGeometry(positions_[start], positions_[end]);
  if (!line) return false;
  detail::setOrientation(*line, orientations_[start], orientations_[end]);
  return samplesFit(*line, positions_, orientations_, start, end, position_tolerance_squared_,
                    position_tolerance_, angle_cosine_half_);
}

int MoveFitter::viaNearestMiddle(int start, int end) const {
  const double middle = 0.5 * (arc_length_[start] + arc_length_[end]);
  const auto first = arc_length_.begin() + start + 1;
  const auto last = arc_length_.begin() + end;
  const auto above = std::lower_bound(first, last, middle);
  int via = static_cast<int>(above - arc_length_.begin());
  if (above == last || (above != first && middle - *(above - 1) <= *above - middle)) --via;
  return via;
}

std::optional<int> MoveFitter::fitsArc(int start, int end) const {
  if (end - start < 2) return std::nullopt;
  const int via = viaNearestMiddle(start, end);
  std::optional<detail::MoveGeometry> arc =
      detail::arcGeometry(positions_[start], positions_[via], positions_[end]);
  if (!arc) return std::nullopt;
  detail::setOrientation(*arc, orientations_[start], orientations_[end]);
  if (!samplesFit(*arc, positions_, orientations_, start, end, position_tolerance_squared_,
                  position_tolerance_, angle_cosine_half_) ||
      !chordsFitArc(*arc, positions_, start, end, position_tolerance_squared_)) {
    return std::nullopt;
  }
  return via;
}

std::optional<CompactMove> MoveFitter::fit(int start, int end) const {
  if (start < 0 || end >= sampleCount() || start >= end) {
    throw std::invalid_argument("MoveFitter::fit(" + std::to_string(start) + ", " +
                                std::to_string(end) + "): need 0 <= start < end < " +
                                std::to_string(sampleCount()));
  }
  if (fitsLine(start, end)) return CompactMove{MoveShape::kLine, start, end, -1};
  if (const std::optional<int> via = fitsArc(start, end)) {
    return CompactMove{MoveShape::kArc, start, end, *via};
  }
  return std::nullopt;
}

namespace {

// Fewest moves from `first` to `last` (no must-keep sample strictly inside);
// see compactMoves for the method. Appends the moves in path order.
void compactStretch(const MoveFitter& fitter, int first, int last,
                    std::vector<int>& move_count, std::vector<CompactMove>& move_into,
                    std::vector<int>& farthest_with_count, std::vector<CompactMove>& out) {
  farthest_with_count.clear();
  std::fill(move_count.begin() + first, move_count.begin() + last + 1, kUnreached);
  move_count[first] = 0;
  const auto reach = [&](int end, int count, const CompactMove& move) {
    move_count[end] = count;
    move_into[end] = move;
    if (static_cast<int>(farthest_with_count.size()) <= count) {
      farthest_with_count.resize(count + 1, first);
    }
    farthest_with_count[count] = std::max(farthest_with_count[count], end);
  };
  const auto farthestWithin = [&](int count) {
    int farthest = first;
    const int top = std::min(count, static_cast<int>(farthest_with_count.size()) - 1);
    for (int c = 0; c <= top; ++c) farthest = std::max(farthest, farthest_with_count[c]);
    return farthest;
  };

  for (int start = first; start < last; ++start) {
    const int next_count = move_count[start] + 1;
    const int window_end = std::min(last, start + kExactSpan);
    for (int end = start + 1; end <= window_end; ++end) {
      if (move_count[end] <= next_count) continue;
      if (const std::optional<CompactMove> move = fitter.fit(start, end)) reach(end, next_count, *move);
    }

    const int search_from = std::max(farthestWithin(next_count), window_end) + 1;
    if (search_from > last) continue;
    const std::optional<CompactMove> first_far = fitter.fit(start, search_from);
    if (!first_far) continue;
    int good = search_from;
    CompactMove good_move = *first_far;
    int bad = last + 1;
    for (int step = 1; good < last; step *= 2) {
      const int probe = std::min(last, good + step);
      if (const std::optional<CompactMove> move = fitter.fit(start, probe)) {
        good = probe;
        good_move = *move;
      } else {
        bad = probe;
        break;
      }
    }
    while (bad - good > 1) {
      const int probe = good + (bad - good) / 2;
      if (const std::optional<CompactMove> move = fitter.fit(start, probe)) {
        good = probe;
        good_move = *move;
      } else {
        bad = probe;
      }
    }
    reach(search_from, next_count, *first_far);
    for (int end = search_from + 1; end < good; ++end) {
      if (move_count[end] <= next_count) continue;
      if (const std::optional<CompactMove> move = fitter.fit(start, end)) reach(end, next_count, *move);
    }
    if (good > search_from) reach(good, next_count, good_move);
  }

  const std::size_t stretch_begin = out.size();
  for (int end = last; end != first; end = move_into[end].start) out.push_back(move_into[end]);
  std::reverse(out.begin() + static_cast<std::ptrdiff_t>(stretch_begin), out.end());
}

}  // namespace

std::vector<CompactMove> compactMoves(const CompactionInput& input,
                                      const CompactionTolerance& tolerance) {
  const MoveFitter fitter(input, tolerance);
  const int count = fitter.sampleCount();
  std::vector<int> move_count(count, kUnreached);
  std::vector<CompactMove> move_into(count);
  std::vector<int> farthest_with_count;
  std::vector<CompactMove> moves;
  int stretch_first = 0;
  for (int k = 1; k < count; ++k) {
    if (k == count - 1 || input.must_keep[k]) {
      compactStretch(fitter, stretch_first, k, move_count, move_into, farthest_with_count, moves);
      stretch_first = k;
    }
  }
  return moves;
}

}  // namespace tw::planner
