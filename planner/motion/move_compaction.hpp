#pragma once

#include <Eigen/Geometry>

#include <optional>
#include <vector>

#include "planner/motion/compact_move.hpp"

namespace tw::planner {

/// The dense sampled tool poses of a solved seam: TCP poses (X_FT, tool T in
/// the seam's fixture frame F, SI units) about every 2 mm, in path order.
struct CompactionInput {
  std::vector<Eigen::Isometry3d> poses;  ///< ≥ 2; consecutive positions distinct
  /// Same size as poses. true at corners and process on/off points: a move
  /// must start or end exactly there. The first and last pose are always
  /// move ends, whatever their flag says.
  std::vector<bool> must_keep;
};

/// How far the controller's interpolated path may leave the sampled seam.
struct CompactionTolerance {
  double position = 0.1e-3;          ///< [m]
  double angle = 0.5 * kPi / 180.0;  ///< [rad]
};

/// What a move must satisfy to replace the seam between its start and end
/// samples (the "fit" used by MoveFitter and compactMoves):
///
/// 1. Position: every sample strictly between start and end lies within
///    `position` of the move's geometric path; for an arc, so does every
///    point of the polyline joining consecutive samples (the seam between
///    samples is that straight chord). For a line the samples suffice: the
///    distance to a segment is convex along a chord, so it peaks at a chord
///    end. For an arc the distance to the circle's centre is convex along a
///    chord, so the deepest inward point is the chord's point nearest the
///    centre (the chord midpoint when its ends are equally far from the
///    centre), which is checked together with the midpoint.
/// 2. Orientation: each such sample's orientation is within `angle` of the
///    controller's slerp at the fraction of the sample's foot point (its
///    nearest point on the path), i.e. of the orientation the controller
///    holds where it passes that sample.
/// 3. Order: feet advance along the path (each at most `position` behind the
///    previous), so the controller passes the samples in seam order and
///    cannot short-cut a seam that doubles back on itself.
///
/// Why this is the check that matters: the controller, not the samples, puts
/// the tool on the part. Comparing the seam to the path the controller will
/// actually interpolate (line/arc plus slerp by path fraction) bounds the
/// process error directly; the dense samples are the solved seam, so every
/// sample (and, for arcs, every chord between them) must be within tolerance
/// of what the controller does there. Fitting only the move ends, or checking
/// position alone, lets the torch leave the seam or tilt off the process
/// angles between the programmed points.
///
/// Prepared once per seam, then immutable and thread-safe.
class MoveFitter {
 public:
  /// Throws std::invalid_argument (the input comes from the seam solver, so
  /// a bad one is a programming error) for fewer than 2 poses, a must_keep
  /// of another size, non-finite values, a linear part that is not a
  /// rotation (|RᵀR − I| > 1e-6 or det < 0), two consecutive positions
  /// closer than 1e-9 m, or a tolerance that is not positive and finite.
  MoveFitter(const CompactionInput& input, const CompactionTolerance& tolerance);

  /// The move from sample `start` to sample `end` if one fits: a line when
  /// a line fits, else an arc through the sample nearest the middle of the
  /// seam's arc length between them, else nullopt. Ignores must_keep.
  /// end = start + 1 always fits as a line. Throws std::invalid_argument
  /// unless 0 ≤ start < end < sampleCount().
  std::optional<CompactMove> fit(int start, int end) const;

  int sampleCount() const { return static_cast<int>(positions_.size()); }

 private:
  bool fitsLine(int start, int end) const;
  std::optional<int> fitsArc(int start, int end) const;
  int viaNearestMiddle(int start, int end) const;

  std::vector<Eigen::Vector3d> positions_;
  std::vector<Eigen::Quaterniond> orientations_;
  std::vector<double> arc_length_;  ///< cumulative polyline length [m]
  double position_tolerance_squared_;
  double position_tolerance_;
  double angle_cosine_half_;  ///< cos(angle/2): |q_a · q_b| ≥ it ⇔ angle ≤ tolerance
};

/// The fewest controller moves that reproduce the seam within `tolerance`
/// (see MoveFitter for the fit), chained end to start from sample 0 to the
/// last sample, each starting and ending on must-keep samples where the
/// seam has them (no move crosses one).
///
/// Method: shortest path over sample indices within each stretch between
/// must-keep samples; an edge i → j exists when MoveFitter::fit(i, j) holds.
/// Samples are processed in order with their move count d; from sample i:
/// - every end j ≤ i + 16 (kExactSpan) is tried when it would improve j;
/// - beyond the farthest sample already reachable in d + 1 moves, the
///   farthest fitting end is found by a monotone search (doubling, then
///   bisection), and the ends up to it are verified one by one.
/// The result is the exact minimum over all fitting moves of up to 16
/// samples, and the exact minimum overall when a fit failing at end j also
/// fails for every end past j from the same start. Seams can break that with
/// isolated fits (an arc that happens to fit far past the reach); then every
/// move is still verified, only the count may exceed the minimum: on random
/// wavy and line-and-arc seams of 200 samples, 10 of 400 came out one move
/// above the minimum over all pairs, none more (see the tests). Trying every
/// pair instead cost 10–16× as much on curved 500-sample seams (see the
/// benchmark).
///
/// Work: per start at most 16 + 1 + 2·log2(N) fit tests plus one
/// verification per improved sample, each test O(span) → about
/// O(N·(16 + log N)·S) point checks for N samples and moves spanning at most
/// S samples, instead of O(N²·S) for trying every pair. The worst case is one
/// long move (S = N, e.g. a straight seam): every end is verified once,
/// O(N²) point checks, about 3.5 ms for 500 samples.
/// Ties between equally short move sets go to the one found first (earlier
/// starts, shorter searches); the output is deterministic.
///
/// Throws as MoveFitter's constructor does.
std::vector<CompactMove> compactMoves(const CompactionInput& input,
                                      const CompactionTolerance& tolerance);

}  // namespace tw::planner
