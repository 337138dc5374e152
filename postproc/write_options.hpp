#pragma once

#include <string>

#include "kinematics/common/angles.hpp"
#include "postproc/report/report_cell.hpp"

namespace tw::postproc {

/// Choices a caller may make when writing; every field has a default that
/// suits a first review. Set fields by name.
struct WriteOptions {
  static constexpr double kDegree = kPi / 180.0;  ///< [rad]

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
  /// Review report: cell geometry for the top, front and side views (frame
  /// poses, arm base, obstacle triangles); empty draws the TCP path only.
  ReportCell report_cell;
};

}  // namespace tw::postproc
