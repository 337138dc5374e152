#include "tests/postproc/sample_program.hpp"

#include <cmath>
#include <fstream>
#include <optional>
#include <sstream>
#include <stdexcept>

#include "kinematics/common/angles.hpp"

namespace tw::postproc::test {
namespace {

using planner::MotionKind;
using planner::MotionRecord;
using planner::ProcessEvent;
using planner::ProcessEventKind;
using planner::SpeedKind;

double deg(double value) { return value * tw::kPi / 180.0; }

MotionRecord motion(MotionKind kind, std::initializer_list<double> q_deg,
                    const Eigen::Vector3d& p_RT_mm, double start, double duration) {
  MotionRecord record;
  record.kind = kind;
  record.q.resize(static_cast<int>(q_deg.size()));
  int i = 0;
  for (const double value : q_deg) record.q[i++] = deg(value);
  // Torch pointing down, turned 30° about the world z axis.
  record.X_RT = Eigen::Isometry3d::Identity();
  record.X_RT.linear() = (Eigen::AngleAxisd(deg(30.0), Eigen::Vector3d::UnitZ()) *
                          Eigen::AngleAxisd(tw::kPi, Eigen::Vector3d::UnitX()))
                             .toRotationMatrix();
  record.X_RT.translation() = p_RT_mm / 1000.0;
  record.tool = "torch_22deg";
  record.frame = "fixture_a";
  record.branch = "shoulder front, elbow up, wrist not flipped";
  record.start_time = start;
  record.duration = duration;
  return record;
}

MotionRecord linear(std::initializer_list<double> q_deg, const Eigen::Vector3d& p_RT_mm,
                    double start, double duration, double speed_mm_s, double clearance_mm,
                    std::optional<double> singularity_margin_deg) {
  MotionRecord record = motion(MotionKind::kLinearMove, q_deg, p_RT_mm, start, duration);
  record.speed = {SpeedKind::kTcpSpeed, speed_mm_s / 1000.0};
  record.seam = "seam_1";
  record.clearance = clearance_mm / 1000.0;
  if (singularity_margin_deg) record.singularity_margin = deg(*singularity_margin_deg);
  return record;
}

}  // namespace

planner::Program sampleProgram() {
  planner::Program program;
  planner::ProgramMetadata& meta = program.metadata;
  meta.job = "bracket \"A\" welds";
  meta.arm = "weld_arm_1400";
  meta.generator = "tracewright 0.1.0";
  meta.seed = 42;
  meta.inputs = {{"samples/cells/demo_cell.xml",
                  "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"}};
  const double limits_deg[6] = {170.0, 120.0, 150.0, 190.0, 125.0, 360.0};
  for (int i = 0; i < 6; ++i) {
    meta.joints.push_back({"axis_" + std::to_string(i + 1), kinematics::JointType::kRevolute,
                           deg(-limits_deg[i]), deg(limits_deg[i])});
  }
  program.warnings = {"seam_1 point 2: clearance to the clamp below 10 mm"};

  MotionRecord start = motion(MotionKind::kJointMove, {10.0, -20.0, 30.0, 0.0, 45.0, -15.0},
                              {800.0, 100.0, 450.0}, 0.0, 1.5);
  start.speed = {SpeedKind::kJointSpeedFraction, 0.5};
  start.blend_radius = 0.010;
  start.clearance = 0.120;
  program.records.emplace_back(start);

  program.records.emplace_back(linear({10.5, -18.0, 31.0, 0.0, 44.0, -15.5},
                                      {800.0, 100.0, 420.0}, 1.5, 0.6, 50.0, 30.0, 44.0));
  program.records.emplace_back(
      ProcessEvent{ProcessEventKind::kStart, "steel_3mm_fillet", "seam_1", 2.1});
  MotionRecord weld_1 = linear({14.0, -17.5, 30.5, 1.0, 43.5, -19.0}, {800.0, 150.0, 420.0},
                               2.1, 5.0, 10.0, 8.0, 43.5);
  weld_1.blend_radius = 0.002;
  program.records.emplace_back(weld_1);
  program.records.emplace_back(linear({17.25, -16.75, 29.75, 2.0, 42.75, -22.5},
                                      {810.5, 200.25, 420.0}, 7.1, 5.1, 10.0, 9.5, 42.75));
  program.records.emplace_back(
      ProcessEvent{ProcessEventKind::kStop, "steel_3mm_fillet", "seam_1", 12.2});
  program.records.emplace_back(linear({17.0, -18.5, 29.0, 2.0, 44.0, -22.0},
                                      {810.5, 200.25, 470.0}, 12.2, 0.5, 100.0, 25.0,
                                      std::nullopt));

  MotionRecord home = motion(MotionKind::kJointMove, {0.0, -30.0, 45.0, 0.0, 60.0, 0.0},
                             {600.0, 0.0, 700.0}, 12.7, 2.0);
  home.speed = {SpeedKind::kJointSpeedFraction, 1.0};
  program.records.emplace_back(home);
  return program;
}

std::string readWholeFile(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw std::runtime_error("cannot open " + path);
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

std::string readDataFile(const std::string& name) {
  return readWholeFile(std::string(TW_SOURCE_DIR) + "/tests/postproc/data/" + name);
}

void writeWholeFile(const std::string& path, const std::string& text) {
  std::ofstream out(path, std::ios::binary | std::ios::trunc);
  out << text;
  if (!out) throw std::runtime_error("cannot write " + path);
}

}  // namespace tw::postproc::test
