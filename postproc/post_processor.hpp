#pragma once

#include <ostream>
#include <string>

#include "planner/program/program.hpp"

namespace tw::postproc {

/// Choices a caller may make when writing; every field has a default that
/// suits a first review. Set fields by name.
struct WriteOptions {
  static constexpr double kDegree = 3.14159265358979323846 / 180.0;  ///< [rad]

  /// Name of the output for error messages ("" when writing to a stream).
  std::string output_name;
  /// Joint table: also write one interpolated row every `sample_period` [s];
  /// 0 writes only the records.
  double sample_period = 0.0;
  /// Template post-processor: the template file to render.
  std::string template_file;
  /// Summary warnings below these margins (common practice, no source; the
  /// 10° singularity margin follows the usual advice for |axis 5|).
  double clearance_warning = 0.005;                    ///< [m]
  double singularity_warning = 10.0 * kDegree;         ///< [rad]
  double revolute_limit_warning = 5.0 * kDegree;       ///< [rad]
  double prismatic_limit_warning = 0.010;              ///< [m]
};

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
