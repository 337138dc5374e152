#pragma once

#include <array>
#include <optional>
#include <ostream>
#include <string>
#include <string_view>
#include <vector>

#include "planner/program/program.hpp"

namespace tw::postproc {

/// A user-written text template that renders a program in a controller's
/// language; the syntax is specified in postproc/FORMAT.md ("Templates").
///
/// In short: `@@ <section>` starts one of the sections header, joint-move,
/// linear-move, circular-move, process-on, process-off, footer; `@@#` starts a comment
/// line; in a section every line is copied as it stands except for
/// placeholders `[[name]]` and `[[name;D]]` (a number with D decimals;
/// `via_...` placeholders only in the circular-move section). The
/// header must hold `[[caution]]`, which repeats its line once per line of
/// the safety caution.
///
/// Immutable once parsed; render() may be called from several threads.
class ProgramTemplate {
 public:
  /// Parses template text; throws tw::InputError naming `file` and the line
  /// for an unknown section or placeholder, a placeholder not allowed in its
  /// section, bad decimals, an unclosed `[[`, text outside any section, a
  /// section given twice, or a header without `[[caution]]`.
  static ProgramTemplate parse(std::string_view text, const std::string& file);
  /// Reads and parses the file at `path`.
  static ProgramTemplate load(const std::string& path);

  /// Renders `program` into `out`. The program is checked first; a record
  /// kind without a section, or a placeholder whose value the record lacks
  /// (a TCP speed on a joint-speed move, a clearance not measured, a joint
  /// beyond the arm's count) throws tw::InputError naming the template line
  /// and the record. Nothing reaches `out` when rendering fails.
  void render(const planner::Program& program, std::ostream& out) const;

  enum class Section {
    kHeader,
    kJointMove,
    kLinearMove,
    kCircularMove,
    kProcessOn,
    kProcessOff,
    kFooter
  };
  static constexpr int kSectionCount = 7;

  /// One piece of a template line: literal text or a placeholder.
  struct Segment {
    std::string text;  ///< the literal text, or the placeholder name
    bool placeholder = false;
    std::optional<int> decimals;
  };
  struct Line {
    std::vector<Segment> segments;
    int number = 0;  ///< line in the template file
  };

 private:
  std::string file_;
  std::array<std::optional<std::vector<Line>>, kSectionCount> sections_;
};

}  // namespace tw::postproc
