#pragma once

namespace tw::postproc {

/// Keyword of the first line of a motion text file (postproc/FORMAT.md).
inline constexpr const char* kMotionTextKeyword = "tracewright-motion";
/// The format version this code writes and reads.
inline constexpr int kMotionTextVersion = 1;

}  // namespace tw::postproc
