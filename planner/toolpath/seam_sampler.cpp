#include "planner/toolpath/seam_sampler.hpp"

#include <algorithm>
#include <cmath>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"

namespace tw::planner {
namespace {

// Above this a "smooth" vertex could be a near reversal with no mean direction.
constexpr double kMaxCornerAngle = 170.0 * kPi / 180.0;
/// A sample this near an input point along the polyline [m] is on it: far
/// below any listed precision, far above the rounding of summed lengths.
constexpr double kOnPoint = 1e-9;

/// Unit direction between two unit vectors less than 90° apart (their
/// linear blend is then at least 1/√2 long, never zero).
Eigen::Vector3d blended(const Eigen::Vector3d& a, const Eigen::Vector3d& b, double f) {
  return ((1.0 - f) * a + f * b).normalized();
}

void checkNormalTurn(const std::optional<Eigen::Vector3d>& a,
                     const std::optional<Eigen::Vector3d>& b, const std::string& source, int line,
                     const char* what) {
  if (a && b && a->dot(*b) < 0.0) {
    throw InputError(source, line,
                     std::string("the ") + what +
                         " turns by more than 90 degrees from the previous point; add points in "
                         "between or check its sign");
  }
}

/// A run of segments [first, last) between two corners or ends.
struct Span {
  std::size_t first = 0;
  std::size_t last = 0;
};

}  // namespace

std::vector<SeamSample> sampleSeam(const SeamPointList& list, const SamplingOptions& options) {
  const std::vector<SeamPoint>& p = list.points;
  if (p.size() < 2) {
    throw InputError(list.source, p.empty() ? 0 : p.front().line, "a seam needs at least 2 points");
  }
  if (!(options.step > 0.0)) throw InputError(list.source, 0, "the sampling step must be > 0");
  if (!(options.corner_angle > 0.0 && options.corner_angle <= kMaxCornerAngle)) {
    throw InputError(list.source, 0, "the corner angle must lie between 0 and 170 degrees");
  }

  const std::size_t segment_count = p.size() - 1;
  std::vector<Eigen::Vector3d> direction(segment_count);
  std::vector<double> length(segment_count);
  for (std::size_t i = 0; i < segment_count; ++i) {
    const Eigen::Vector3d d = p[i + 1].p_XP - p[i].p_XP;
    length[i] = d.norm();
    if (length[i] == 0.0) {
      throw InputError(list.source, p[i + 1].line, "this point repeats the previous one");
    }
    direction[i] = d / length[i];
    checkNormalTurn(p[i].normal, p[i + 1].normal, list.source, p[i + 1].line, "surface normal");
    checkNormalTurn(p[i].second_normal, p[i + 1].second_normal, list.source, p[i + 1].line,
                    "second normal");
  }

  // Split at corners; within a span every vertex gets one tangent.
  std::vector<Span> spans(1);
  const double corner_cos = std::cos(options.corner_angle);
  for (std::size_t i = 1; i < segment_count; ++i) {
    const double turn_cos = direction[i - 1].dot(direction[i]);
    if (turn_cos <= -1.0 + 1e-12) {
      throw InputError(list.source, p[i].line,
                       "the seam turns back on itself here (a 180 degree turn)");
    }
    if (turn_cos < corner_cos) {
      spans.back().last = i;
      spans.push_back(Span{i, 0});
    }
  }
  spans.back().last = segment_count;

  std::vector<SeamSample> samples;
  double span_start_s = 0.0;
  for (std::size_t k = 0; k < spans.size(); ++k) {
    const Span span = spans[k];
    // Vertex tangents: segment direction at span ends, the mean of the two
    // neighbouring directions at smooth vertices inside.
    std::vector<Eigen::Vector3d> vertex_tangent;
    vertex_tangent.push_back(direction[span.first]);
    for (std::size_t i = span.first + 1; i < span.last; ++i) {
      vertex_tangent.push_back((direction[i - 1] + direction[i]).normalized());
    }
    vertex_tangent.push_back(direction[span.last - 1]);

    double span_length = 0.0;
    for (std::size_t i = span.first; i < span.last; ++i) span_length += length[i];
    // The 1e-9 keeps an exact multiple of the step from adding a sample.
    const int pieces = std::max(1, static_cast<int>(std::ceil(span_length / options.step - 1e-9)));
    std::size_t segment = span.first;
    double segment_start = 0.0;
    for (int j = 0; j <= pieces; ++j) {
      const double s = span_length * j / pieces;
      while (segment + 1 < span.last && s > segment_start + length[segment]) {
        segment_start += length[segment];
        ++segment;
      }
      // Rounding may leave the last sample one segment short.
      if (j == pieces) segment = span.last - 1;
      const double f =
          j == pieces ? 1.0 : std::clamp((s - segment_start) / length[segment], 0.0, 1.0);
      const SeamPoint& a = p[segment];
      const SeamPoint& b = p[segment + 1];
      SeamSample sample;
      sample.p_XP = j == 0 ? a.p_XP : (j == pieces ? b.p_XP : a.p_XP + f * (b.p_XP - a.p_XP));
      // Neighbouring vertex tangents differ by less than the corner angle.
      sample.tangent = blended(vertex_tangent[segment - span.first],
                               vertex_tangent[segment - span.first + 1], f);
      sample.normal = blended(a.normal, b.normal, f);
      if (a.second_normal && b.second_normal) {
        sample.second_normal = blended(*a.second_normal, *b.second_normal, f);
      }
      if (a.speed && b.speed) sample.speed = (1.0 - f) * *a.speed + f * *b.speed;
      sample.arc_length = span_start_s + s;
      sample.corner = (j == 0 && k > 0) || (j == pieces && k + 1 < spans.size());
      // A sample on an input point names that point's line: a sample that
      // lands exactly on a vertex inside a span stays, by the loop above, at
      // the end of the segment before it (f = 1, up to rounding).
      const double to_end = segment_start + length[segment] - s;
      sample.line = j == pieces || to_end <= kOnPoint ? b.line : a.line;
      samples.push_back(sample);
    }
    span_start_s += span_length;
  }
  return samples;
}

}  // namespace tw::planner
