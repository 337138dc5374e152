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

planner::Program arcProgram() {
  planner::Program program;
  planner::ProgramMetadata& meta = program.metadata;
  meta.job = "boss ring weld";
  meta.arm = "weld_arm_1400";
  meta.generator = "tracewright 0.1.0";
  meta.seed = 7;
  meta.inputs = {{"samples/jobs/boss_ring.xml",
                  "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855"}};
  const double limits_deg[6] = {170.0, 120.0, 150.0, 190.0, 125.0, 360.0};
  for (int i = 0; i < 6; ++i) {
    meta.joints.push_back({"axis_" + std::to_string(i + 1), kinematics::JointType::kRevolute,
                           deg(-limits_deg[i]), deg(limits_deg[i])});
  }
  // Torch pointing down, turned `turn_deg` about the frame's z axis.
  const auto pose = [](const Eigen::Vector3d& p_mm, double turn_deg) {
    Eigen::Isometry3d X = Eigen::Isometry3d::Identity();
    X.linear() = (Eigen::AngleAxisd(deg(turn_deg), Eigen::Vector3d::UnitZ()) *
                  Eigen::AngleAxisd(tw::kPi, Eigen::Vector3d::UnitX()))
                     .toRotationMatrix();
    X.translation() = p_mm / 1000.0;
    return X;
  };
  const auto joints = [](std::initializer_list<double> q_deg) {
    kinematics::JointVector q(static_cast<int>(q_deg.size()));
    int i = 0;
    for (const double value : q_deg) q[i++] = deg(value);
    return q;
  };
  const auto move = [&](MotionKind kind, std::initializer_list<double> q_deg,
                        const Eigen::Vector3d& p_mm, double turn_deg, double start,
                        double duration, double blend_mm) {
    MotionRecord record;
    record.kind = kind;
    record.q = joints(q_deg);
    record.X_RT = pose(p_mm, turn_deg);
    record.tool = "torch_22deg";
    record.frame = "fixture_b";
    record.branch = "shoulder front, elbow up, wrist not flipped";
    record.start_time = start;
    record.duration = duration;
    record.blend_radius = blend_mm / 1000.0;
    record.speed = {SpeedKind::kTcpSpeed, 0.010};
    record.seam = "ring";
    return record;
  };

  MotionRecord start = move(MotionKind::kJointMove, {20.0, -15.0, 25.0, 0.0, 50.0, -10.0},
                            {900.0, 0.0, 450.0}, 30.0, 0.0, 1.6, 20.0);
  start.speed = {SpeedKind::kJointSpeedFraction, 0.5};
  start.seam.clear();
  program.records.emplace_back(start);
  MotionRecord approach = move(MotionKind::kLinearMove, {20.5, -13.0, 26.0, 0.0, 49.0, -10.5},
                               {900.0, 0.0, 410.0}, 30.0, 1.6, 0.8, 0.0);
  approach.speed.value = 0.050;
  program.records.emplace_back(approach);
  program.records.emplace_back(ProcessEvent{ProcessEventKind::kStart, "alu_2mm", "ring", 2.4});
  MotionRecord straight = move(MotionKind::kLinearMove, {17.0, -12.5, 25.5, 1.0, 48.5, -7.0},
                               {950.0, 0.0, 410.0}, 30.0, 2.4, 5.0, 2.0);
  straight.clearance = 0.008;
  program.records.emplace_back(straight);
  // Half a circle of radius 25 mm about (950, 25, 410), turning positively
  // about +z; the torch turns 90° with it, and at the via (half the arc
  // length) it is at half that turn. 78.540 mm at 10 mm/s.
  MotionRecord half_circle = move(MotionKind::kCircularMove, {13.0, -10.0, 24.0, 2.0, 47.0, 80.0},
                                  {950.0, 50.0, 410.0}, 120.0, 7.4, 7.854, 2.0);
  half_circle.via = planner::ViaPoint{joints({19.0, -11.0, 24.5, 1.5, 47.5, 36.0}),
                                      pose({975.0, 25.0, 410.0}, 75.0)};
  half_circle.clearance = 0.0095;
  half_circle.singularity_margin = deg(47.0);
  program.records.emplace_back(half_circle);
  MotionRecord back = move(MotionKind::kLinearMove, {10.0, -12.0, 25.0, 2.0, 48.0, 83.0},
                           {900.0, 50.0, 410.0}, 120.0, 15.254, 5.0, 0.0);
  program.records.emplace_back(back);
  program.records.emplace_back(ProcessEvent{ProcessEventKind::kStop, "alu_2mm", "ring", 20.254});
  MotionRecord lift = move(MotionKind::kLinearMove, {10.0, -14.0, 23.0, 2.0, 50.0, 83.0},
                           {900.0, 50.0, 460.0}, 120.0, 20.254, 0.5, 5.0);
  lift.speed.value = 0.100;
  program.records.emplace_back(lift);
  // Three quarters of a circle of radius 50 mm about (900, 50, 510) in the
  // plane x = 900: from the bottom over the +y side to the top (the via)
  // and on to the -y side. 235.619 mm at 100 mm/s.
  MotionRecord clear_arc = move(MotionKind::kCircularMove, {4.0, -15.0, 27.0, 2.0, 51.0, 89.0},
                                {900.0, 0.0, 510.0}, 120.0, 20.754, 2.3562, 0.0);
  clear_arc.speed.value = 0.100;
  clear_arc.via = planner::ViaPoint{joints({10.0, -18.0, 35.0, 2.0, 45.0, 83.0}),
                                    pose({900.0, 50.0, 560.0}, 120.0)};
  program.records.emplace_back(clear_arc);
  MotionRecord home = move(MotionKind::kJointMove, {0.0, -30.0, 45.0, 0.0, 60.0, 0.0},
                           {600.0, 0.0, 700.0}, 30.0, 23.1102, 2.0, 0.0);
  home.speed = {SpeedKind::kJointSpeedFraction, 1.0};
  home.seam.clear();
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
