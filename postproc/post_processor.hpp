#pragma once

#include <ostream>
#include <string>

#include "planner/program/program.hpp"
#include "postproc/write_options.hpp"

namespace tw::postproc {

/// A writer that turns a program into one file. Implementations are
/// stateless: write() is const and may be called from several threads.
///
/// Contract of write(): the program is checked first (planner::checkProgram)
/// and bad input throws tw::InputError before anything reaches `out`;
/// output is deterministic (byte-identical for equal programs and options,
/// locale-independent, no clock).
class PostProcessor {
 public:
  virtual ~PostProcessor() = default;
  /// Registry key, lower-case words joined by '-', e.g. "motion-text".
  virtual std::string name() const = 0;
  /// One line for `--help` listings.
  virtual std::string description() const = 0;
  /// File extension without the dot, e.g. "csv".
  virtual std::string fileExtension() const = 0;
  virtual void write(const planner::Program& program, const WriteOptions& options,
                     std::ostream& out) const = 0;
};

}  // namespace tw::postproc
