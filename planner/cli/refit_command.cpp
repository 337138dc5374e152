#include "planner/cli/refit_command.hpp"

#include <cmath>
#include <cstdio>
#include <fstream>
#include <memory>
#include <sstream>
#include <string>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"
#include "kinematics/common/number_text.hpp"
#include "kinematics/common/rotations.hpp"
#include "planner/cell/cell.hpp"
#include "planner/cell/cell_loader.hpp"
#include "planner/cli/exit_codes.hpp"
#include "planner/refit/cell_frame_edit.hpp"
#include "planner/refit/reference_points_csv.hpp"
#include "planner/refit/rigid_fit.hpp"
#include "postproc/atomic_file.hpp"
#include "postproc/safety_caution.hpp"

namespace tw::cli {
namespace {

constexpr double kMToMm = 1000.0;
constexpr double kRadToDeg = 180.0 / kPi;
// Below 4 points the residuals check only the distances between the points.
constexpr std::size_t kPointsForResidualCheck = 4;

struct RefitArguments {
  std::string cell_path;
  std::string frame;
  std::string points_path;
  std::string measured_in;
  /// Largest acceptable residual [mm]; 0.5 mm lies in the 0.2–1.0 mm range
  /// of common practice for re-registering a fixture (no published source).
  double tolerance_mm = 0.5;
  bool write_cell = false;
};

std::string mm(double metres) { return formatFixed(metres * kMToMm, 3); }
std::string deg(double radians) { return formatFixed(radians * kRadToDeg, 4); }

std::string poseLine(const Eigen::Isometry3d& X_PF) {
  const Eigen::Vector3d& p = X_PF.translation();
  const Eigen::Quaterniond q = canonicalQuaternion(X_PF);
  const Eigen::Vector3d rpy = rollPitchYaw(X_PF.linear());
  return "xyz " + mm(p.x()) + " " + mm(p.y()) + " " + mm(p.z()) + " mm, quaternion w x y z " +
         formatFixed(q.w(), 9) + " " + formatFixed(q.x(), 9) + " " +
         formatFixed(q.y(), 9) + " " + formatFixed(q.z(), 9) +
         ", roll/pitch/yaw " + deg(rpy.x()) + " " + deg(rpy.y()) + " " + deg(rpy.z()) + " deg";
}

/// The measuring frame must not move with the fixture: neither the fixture
/// frame itself nor a frame below it.
void requireIndependentFrame(const planner::FrameTree& frames, const std::string& measured,
                             const std::string& fixture, const std::string& source) {
  if (!frames.contains(measured)) {
    throw InputError("--measured-in: unknown frame '" + measured + "' in the cell " + source);
  }
  for (std::string name = measured; !name.empty(); name = frames.parent(name)) {
    if (name == fixture) {
      throw InputError("--measured-in: frame '" + measured + "' moves with frame '" + fixture +
                       "'; expected a frame that stays put while the fixture moves (e.g. its "
                       "parent or 'world')");
    }
  }
}

std::string readText(const std::string& path) {
  std::ifstream input(path, std::ios::binary);
  if (!input) throw InputError(path, 0, "cannot open the cell file to update it");
  std::ostringstream text;
  text << input.rdbuf();
  return text.str();
}

int runRefit(const RefitArguments& arguments) {
  if (!(arguments.tolerance_mm > 0.0)) {
    throw InputError("--tolerance: expected a residual tolerance above 0 mm");
  }
  const planner::Cell cell = planner::loadCell(arguments.cell_path);
  const planner::FrameTree& frames = cell.frames;
  if (arguments.frame == planner::FrameTree::kWorld || !frames.contains(arguments.frame)) {
    throw InputError("--frame: '" + arguments.frame + "' is not a <frame> of the cell " +
                     cell.source + "; expected one of its named frames other than 'world'");
  }
  const std::string& parent = frames.parent(arguments.frame);
  const std::string measured = arguments.measured_in.empty() ? parent : arguments.measured_in;
  requireIndependentFrame(frames, measured, arguments.frame, cell.source);

  const planner::ReferencePointList list = planner::loadReferencePointsCsv(arguments.points_path);
  const Eigen::Index n = static_cast<Eigen::Index>(list.points.size());
  Eigen::Matrix3Xd p_N(3, n);
  Eigen::Matrix3Xd p_M(3, n);
  for (Eigen::Index i = 0; i < n; ++i) {
    p_N.col(i) = list.points[i].p_N;
    p_M.col(i) = list.points[i].p_M;
  }
  const planner::RigidFit fit = planner::fitRigidTransform(p_N, p_M, list.source);
  const Eigen::Isometry3d X_PF_old = frames.X_PF(arguments.frame);
  const Eigen::Isometry3d X_PF_new = frames.relative(parent, measured) * fit.X_MN;
  const double moved = (X_PF_new.translation() - X_PF_old.translation()).norm();
  const double turned =
      Eigen::AngleAxisd(X_PF_new.linear() * X_PF_old.linear().transpose()).angle();

  std::printf("refit of frame '%s' from %d reference points (%s), measured in frame '%s'\n",
              arguments.frame.c_str(), static_cast<int>(n), list.source.c_str(), measured.c_str());
  std::printf("pose in parent '%s' before: %s\n", parent.c_str(), poseLine(X_PF_old).c_str());
  std::printf("pose in parent '%s' after:  %s\n", parent.c_str(), poseLine(X_PF_new).c_str());
  std::printf("the frame origin moved %s mm and the frame turned %s deg\n", mm(moved).c_str(),
              deg(turned).c_str());
  std::printf("%-16s %12s\n", "point", "residual_mm");
  const double tolerance = arguments.tolerance_mm / kMToMm;
  int above = 0;
  for (Eigen::Index i = 0; i < n; ++i) {
    // Judged as printed (to 1 µm): a residual shown equal to the tolerance is within it.
    const bool too_large =
        std::round(fit.residuals[i] * kMToMm * 1000.0) > std::round(arguments.tolerance_mm * 1000.0);
    above += too_large;
    std::printf("%-16s %12s%s\n", list.points[i].name.c_str(), mm(fit.residuals[i]).c_str(),
                too_large ? "  above the tolerance" : "");
  }
  std::printf("RMS %s mm, tolerance %s mm per point\n", mm(fit.rms).c_str(), mm(tolerance).c_str());
  if (list.points.size() < kPointsForResidualCheck) {
    std::printf(
        "warning: with only %d points the residuals check just the distances between "
        "them; measure a 4th point for an independent check of the fit\n",
        static_cast<int>(n));
  }
  if (above > 0) {
    std::printf(
        "warning: %d point(s) above the %s mm tolerance: a mis-measured point or a "
        "deformed or loose fixture; re-measure before using this frame\n",
        above, mm(tolerance).c_str());
  }
  std::printf(
      "CAUTION: every program that uses frame '%s' or a frame below it must be "
      "regenerated and verified again: in simulation, then a first run at reduced speed "
      "(ISO 10218-1: at most %s mm/s at the TCP); the integrator's risk assessment and "
      "local codes take precedence.\n",
      arguments.frame.c_str(),
      formatFixed(postproc::kReducedSpeedLimit * kMToMm, 0).c_str());

  if (!arguments.write_cell) return kExitOk;
  if (above > 0) {
    std::printf("the cell file was not written: residuals above the tolerance\n");
    return kExitInfeasible;
  }
  const std::string text =
      planner::cellTextWithFramePose(readText(cell.source), cell.source, arguments.frame, X_PF_new);
  postproc::writeFileAtomically(cell.source, [&](std::ostream& out) { out << text; });
  std::printf("wrote the new pose of frame '%s' into %s\n", arguments.frame.c_str(),
              cell.source.c_str());
  return kExitOk;
}

}  // namespace

void addRefitCommand(CLI::App& app, int& exit_code) {
  auto arguments = std::make_shared<RefitArguments>();
  CLI::App* command = app.add_subcommand(
      "refit", "Re-register a moved fixture frame from measured reference points");
  command->add_option("cell", arguments->cell_path, "Cell file")->required();
  command->add_option("--frame", arguments->frame, "The fixture frame to re-register")->required();
  command
      ->add_option("--points", arguments->points_path,
                   "Reference point list (CSV: point, nominal_x_mm, ..., measured_z_mm; nominal "
                   "in the fixture frame, measured in the --measured-in frame)")
      ->required();
  command->add_option("--measured-in", arguments->measured_in,
                      "Frame of the measured points (default: the fixture frame's parent)");
  command
      ->add_option("--tolerance", arguments->tolerance_mm,
                   "Largest acceptable residual per point [mm]")
      ->capture_default_str();
  command->add_flag("--write-cell", arguments->write_cell,
                    "Write the new pose into the cell file (atomically; only when every residual "
                    "is within the tolerance)");
  command->callback([arguments, &exit_code] { exit_code = runRefit(*arguments); });
}

}  // namespace tw::cli
