#pragma once

#include "planner/program/program.hpp"
#include "postproc/report/report_cell.hpp"

namespace tw::postproc::test {

/// An invented two-seam weld job on the sample arm
/// (samples/arms/weld_arm_1400.xml), for the review report: joint values
/// from the arm's closed-form inverse kinematics of straight seams on a
/// fixture plate, so that the plotted joints and the drawn TCP path belong
/// together. Clearance is the distance of the TCP to an invented clamp,
/// the singularity margin |axis 5|. One retract is programmed at 300 mm/s
/// and seam_2 passes close to the clamp, so the report has warnings to show.
struct DemoReportJob {
  planner::Program program;
  ReportCell cell;  ///< cell frame = arm base frame; fixture frame, table, plate, clamp, fence
};

DemoReportJob demoReportJob();

}  // namespace tw::postproc::test
