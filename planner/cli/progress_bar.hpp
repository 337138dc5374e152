#pragma once

#include <cstdio>
#include <string>

namespace tw::cli {

/// A one-line progress bar, redrawn in place on a terminal:
///   [##########..........]  5/10  transit home to corner-left
/// Silent when disabled (stderr not a terminal: logs and pipes get no
/// control characters). Not thread-safe; planJob serialises its calls.
class ProgressBar {
 public:
  /// `total` steps are expected; more are shown as total (never past full).
  ProgressBar(std::FILE* out, bool enabled, int total);
  /// Shows what the work is about to do, without counting a step.
  void stage(const std::string& what);
  /// Counts one finished step and shows what it was.
  void step(const std::string& finished);
  /// Clears the line, so that the summary starts on a clean one.
  void finish();

  /// The bar's text for `done` of `total` steps, without control characters.
  static std::string render(int done, int total, const std::string& what);

 private:
  void draw(const std::string& what);

  std::FILE* out_;
  bool enabled_;
  int total_;
  int done_ = 0;
};

/// Whether stderr is a terminal (where the bar is wanted).
bool stderrIsTerminal();

}  // namespace tw::cli
