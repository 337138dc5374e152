#include "tests/postproc/demo_report_program.hpp"

#include <cmath>
#include <limits>
#include <string>

#include "kinematics/arm_loader.hpp"
#include "kinematics/arm_model.hpp"
#include "kinematics/common/angles.hpp"
#include "kinematics/ortho_parallel_ik.hpp"
#include "planner/program/sha256.hpp"

namespace tw::postproc::test {
namespace {

using planner::MotionKind;
using planner::MotionRecord;
using planner::ProcessEvent;
using planner::ProcessEventKind;
using planner::SpeedKind;

double deg(double value) { return value * tw::kPi / 180.0; }

/// An axis-aligned box as 12 triangles, corners in mm.
ReportBody box(const std::string& name, const Eigen::Vector3d& low_mm,
               const Eigen::Vector3d& high_mm) {
  const Eigen::Vector3d low = low_mm / 1000.0;
  const Eigen::Vector3d high = high_mm / 1000.0;
  auto corner = [&](int bits) {
    return Eigen::Vector3d(bits & 1 ? high.x() : low.x(), bits & 2 ? high.y() : low.y(),
                           bits & 4 ? high.z() : low.z());
  };
  // Faces as corner-bit quadruples (x−, x+, y−, y+, z−, z+).
  const int faces[6][4] = {{0, 2, 6, 4}, {1, 5, 7, 3}, {0, 4, 5, 1},
                           {2, 3, 7, 6}, {0, 1, 3, 2}, {4, 6, 7, 5}};
  ReportBody body;
  body.name = name;
  for (const auto& face : faces) {
    body.triangles_C.push_back({corner(face[0]), corner(face[1]), corner(face[2])});
    body.triangles_C.push_back({corner(face[0]), corner(face[2]), corner(face[3])});
  }
  return body;
}

/// Distance [m] from a point to an axis-aligned box (0 inside).
double distanceToBox(const Eigen::Vector3d& p, const Eigen::Vector3d& low,
                     const Eigen::Vector3d& high) {
  const Eigen::Vector3d outside = (low - p).cwiseMax(p - high).cwiseMax(0.0);
  return outside.norm();
}

class JobBuilder {
 public:
  JobBuilder()
      : arm_(kinematics::loadArmDescription(std::string(TW_SOURCE_DIR) +
                                            "/samples/arms/weld_arm_1400.xml")),
        solver_(arm_) {
    X_CR_.setIdentity();
    X_CR_.translation() = Eigen::Vector3d(0.95, -0.30, 0.32);
    X_CR_.linear() = Eigen::AngleAxisd(deg(90.0), Eigen::Vector3d::UnitZ()).toRotationMatrix();
    X_FT_.setIdentity();
    X_FT_.translation() = Eigen::Vector3d(0.0, 0.0, 0.30);  // torch of 300 mm along the flange axis
    X_FT_.linear() = Eigen::AngleAxisd(deg(20.0), Eigen::Vector3d::UnitY()).toRotationMatrix();
    q_ = kinematics::JointVector::Zero(arm_.jointCount());
    q_[1] = deg(10.0);
    q_[4] = deg(-60.0);
  }

  const kinematics::ArmModel& arm() const { return arm_; }
  const Eigen::Isometry3d& fixturePose() const { return X_CR_; }

  /// The torch pose at fixture point `p_mm`: pointing down, tilted along the seam.
  static Eigen::Isometry3d torchPose(const Eigen::Vector3d& p_mm, double heading_deg) {
    Eigen::Isometry3d X_RT = Eigen::Isometry3d::Identity();
    X_RT.linear() = (Eigen::AngleAxisd(deg(heading_deg), Eigen::Vector3d::UnitZ()) *
                     Eigen::AngleAxisd(deg(180.0 - 15.0), Eigen::Vector3d::UnitX()))
                        .toRotationMatrix();
    X_RT.translation() = p_mm / 1000.0;
    return X_RT;
  }

  void jointMove(const Eigen::Isometry3d& X_RT, double fraction) {
    MotionRecord record = target(MotionKind::kJointMove, X_RT, "");
    double slowest = 0.0;
    for (int j = 0; j < record.q.size(); ++j) {
      slowest = std::max(slowest, std::abs(record.q[j] - q_[j]) / arm_.joints()[j].max_velocity);
    }
    record.speed = {SpeedKind::kJointSpeedFraction, fraction};
    finish(record, slowest / fraction + 0.2);  // 0.2 s for acceleration, an invented figure
  }

  void linearMove(const Eigen::Isometry3d& X_RT, double speed_mm_s, const std::string& seam,
                  int steps = 1) {
    const Eigen::Vector3d from = last_X_RT_.translation();
    const Eigen::Quaterniond q_from(last_X_RT_.linear());
    const Eigen::Quaterniond q_to(X_RT.linear());
    for (int k = 1; k <= steps; ++k) {
      const double s = static_cast<double>(k) / steps;
      Eigen::Isometry3d X_RS = Eigen::Isometry3d::Identity();
      X_RS.linear() = q_from.slerp(s, q_to).toRotationMatrix();
      X_RS.translation() = from + s * (X_RT.translation() - from);
      const Eigen::Vector3d start = last_X_RT_.translation();
      MotionRecord record = target(MotionKind::kLinearMove, X_RS, seam);
      record.speed = {SpeedKind::kTcpSpeed, speed_mm_s / 1000.0};
      finish(record, (X_RS.translation() - start).norm() / record.speed.value);
    }
  }

  void process(ProcessEventKind kind, const std::string& seam) {
    program_.records.emplace_back(ProcessEvent{kind, "steel_4mm_fillet", seam, time_});
  }

  planner::Program take() { return std::move(program_); }

  // Invented clamp on the fixture plate [m, cell frame].
  static inline const Eigen::Vector3d kClampLow{0.78, 0.02, 0.32};
  static inline const Eigen::Vector3d kClampHigh{0.86, 0.116, 0.42};

 private:
  MotionRecord target(MotionKind kind, const Eigen::Isometry3d& X_RT, const std::string& seam) {
    const Eigen::Isometry3d X_BF = X_CR_ * X_RT * X_FT_.inverse();  // base frame = cell frame
    const kinematics::IkSolutions solutions = solver_.solve(X_BF);
    const kinematics::IkSolution* nearest = nullptr;
    double best = std::numeric_limits<double>::infinity();
    for (const kinematics::IkSolution& solution : solutions.solutions) {
      const double distance = (solution.q - q_).norm();
      if (distance < best) {
        best = distance;
        nearest = &solution;
      }
    }
    if (!nearest) throw std::runtime_error("demo job: a torch pose is out of reach");
    MotionRecord record;
    record.kind = kind;
    record.q = nearest->q;
    record.branch = kinematics::ArmBranch::fromIndex(nearest->branch_index).toString();
    record.X_RT = X_RT;
    record.tool = "torch_20deg";
    record.frame = "fixture_a";
    record.seam = seam;
    const Eigen::Vector3d p_CT = X_CR_ * X_RT.translation();
    record.clearance = distanceToBox(p_CT, kClampLow, kClampHigh);
    record.singularity_margin = std::abs(record.q[4]);
    return record;
  }

  void finish(MotionRecord& record, double duration) {
    record.start_time = time_;
    record.duration = std::round(duration * 1e4) / 1e4;  // the 0.1 ms the files print
    time_ += record.duration;
    q_ = record.q;
    last_X_RT_ = record.X_RT;
    program_.records.emplace_back(record);
  }

  kinematics::ArmModel arm_;
  kinematics::OrthoParallelSolver solver_;
  Eigen::Isometry3d X_CR_;
  Eigen::Isometry3d X_FT_;
  kinematics::JointVector q_;
  Eigen::Isometry3d last_X_RT_ = Eigen::Isometry3d::Identity();
  planner::Program program_;
  double time_ = 0.0;
};

}  // namespace

DemoReportJob demoReportJob() {
  JobBuilder builder;
  using Vec = Eigen::Vector3d;
  const Eigen::Isometry3d home = JobBuilder::torchPose(Vec(-150.0, -250.0, 450.0), 0.0);
  builder.jointMove(home, 0.5);
  // seam_1: a fillet 400 mm along the fixture's x axis.
  builder.jointMove(JobBuilder::torchPose(Vec(0.0, 0.0, 60.0), 0.0), 0.4);
  builder.linearMove(JobBuilder::torchPose(Vec(0.0, 0.0, 5.0), 0.0), 50.0, "seam_1");
  builder.process(ProcessEventKind::kStart, "seam_1");
  builder.linearMove(JobBuilder::torchPose(Vec(400.0, 0.0, 5.0), 0.0), 12.0, "seam_1", 8);
  builder.process(ProcessEventKind::kStop, "seam_1");
  builder.linearMove(JobBuilder::torchPose(Vec(400.0, 0.0, 80.0), 0.0), 300.0, "seam_1");
  // seam_2: 250 mm along the fixture's y axis, past the clamp.
  builder.jointMove(JobBuilder::torchPose(Vec(420.0, 60.0, 70.0), 90.0), 0.4);
  builder.linearMove(JobBuilder::torchPose(Vec(420.0, 60.0, 5.0), 90.0), 50.0, "seam_2");
  builder.process(ProcessEventKind::kStart, "seam_2");
  builder.linearMove(JobBuilder::torchPose(Vec(420.0, 310.0, 5.0), 90.0), 10.0, "seam_2", 6);
  builder.process(ProcessEventKind::kStop, "seam_2");
  builder.linearMove(JobBuilder::torchPose(Vec(420.0, 310.0, 70.0), 90.0), 100.0, "seam_2");
  builder.jointMove(home, 0.8);

  DemoReportJob job;
  job.program = builder.take();
  planner::ProgramMetadata& meta = job.program.metadata;
  meta.job = "demo_frame_welds";
  meta.arm = builder.arm().name();
  meta.generator = "tracewright 0.1.0";
  meta.seed = 7;
  meta.inputs = {{"samples/arms/weld_arm_1400.xml",
                  planner::sha256OfFile(std::string(TW_SOURCE_DIR) +
                                        "/samples/arms/weld_arm_1400.xml")}};
  meta.joints = planner::programJoints(builder.arm());
  job.program.warnings = {"seam_2: torch angle held at 15° instead of 20° near the clamp"};

  job.cell.X_CR["fixture_a"] = builder.fixturePose();
  job.cell.X_CB = Eigen::Isometry3d::Identity();
  job.cell.bodies.push_back(box("work table", {550.0, -500.0, 0.0}, {1450.0, 500.0, 300.0}));
  job.cell.bodies.push_back(box("fixture plate", {600.0, -350.0, 300.0}, {1300.0, 100.0, 320.0}));
  job.cell.bodies.push_back(box("clamp", JobBuilder::kClampLow * 1000.0, JobBuilder::kClampHigh * 1000.0));
  job.cell.bodies.push_back(box("fence", {-600.0, 900.0, 0.0}, {1600.0, 950.0, 1600.0}));
  return job;
}

}  // namespace tw::postproc::test
