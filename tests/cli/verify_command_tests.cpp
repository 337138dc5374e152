// `plan` then `verify` end to end on the sample weld job: the compacted
// program is short, blended and runs as written; a program edited to drive
// through a clamp, and the same program after a fixture move, are refused
// with the records and reasons named.
#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>
#include <regex>
#include <set>
#include <sstream>
#include <string>
#include <variant>

#include "kinematics/arm_branch.hpp"
#include "kinematics/common/angles.hpp"
#include "kinematics/forward_kinematics.hpp"
#include "kinematics/ortho_parallel_ik.hpp"
#include "planner/job/job_loader.hpp"
#include "postproc/motion_text/motion_text_post_processor.hpp"
#include "postproc/motion_text/motion_text_reader.hpp"
#include "tests/cli/cli_test_support.hpp"

namespace tw::cli {
namespace {

const std::string kSampleJob = "samples/jobs/bracket_welds.xml";

/// Plans the sample weld job into a fresh folder once; returns its program.
const std::string& sampleProgramPath() {
  static const std::string path = [] {
    const std::string directory = std::string(TW_TEST_OUTPUT_DIR) + "/verify_sample";
    std::filesystem::remove_all(directory);
    const test::ToolRun run = test::runTool("plan " + kSampleJob + " --output '" + directory + "'");
    if (run.exit_code != 0) throw std::runtime_error("plan failed: " + run.output);
    return directory + "/bracket_welds.twm";
  }();
  return path;
}

std::string writeProgram(const planner::Program& program, const std::string& name) {
  const std::string path = std::string(TW_TEST_OUTPUT_DIR) + "/" + name;
  std::ofstream out(path, std::ios::binary);
  postproc::MotionTextPostProcessor().write(program, postproc::WriteOptions{}, out);
  return path;
}

/// The record numbers `verify` names in its report.
std::set<int> namedRecords(const std::string& output) {
  std::set<int> records;
  const std::regex line("^record ([0-9]+) ");
  std::istringstream lines(output);
  for (std::string text; std::getline(lines, text);) {
    std::smatch match;
    if (std::regex_search(text, match, line)) records.insert(std::stoi(match[1]));
  }
  return records;
}

TEST_CASE("The sample weld program is compacted, blended, and verify accepts it", "[cli][verify][e2e]") {
  const planner::Program program = postproc::readMotionTextFile(sampleProgramPath());
  int motions = 0;
  bool process_on = false;
  bool previous_in_process = false;  // the process ran during `previous`
  int interior_points = 0;
  const planner::MotionRecord* previous = nullptr;
  for (const planner::ProgramRecord& record : program.records) {
    if (const auto* event = std::get_if<planner::ProcessEvent>(&record)) {
      process_on = event->kind == planner::ProcessEventKind::kStart;
      // The arm stops exactly where the process switches (FORMAT.md).
      REQUIRE(previous != nullptr);
      CHECK(previous->blend_radius == 0.0);
      previous = nullptr;
      continue;
    }
    const auto& motion = std::get<planner::MotionRecord>(record);
    ++motions;
    if (process_on && previous != nullptr && previous_in_process && previous->seam == motion.seam) {
      // `previous` ends at an interior point of a process path: blended.
      ++interior_points;
      CAPTURE(motions);
      CHECK(previous->blend_radius > 0.0);
    }
    previous = &motion;
    previous_in_process = process_on;
  }
  // The bar of the compaction: at most 40 motion records for the sample
  // (the waypoint-by-waypoint program had 179).
  CHECK(motions <= 40);
  CHECK(interior_points > 0);  // the sample has blended points to check
  const test::ToolRun run = test::runTool("verify '" + sampleProgramPath() + "' --job " + kSampleJob);
  CAPTURE(run.output);
  CHECK(run.exit_code == 0);
  CHECK_THAT(run.output, Catch::Contains("runs as written"));
}

TEST_CASE("verify names a planted linear move through a clamp and the bodies it hits", "[cli][verify]") {
  planner::Program program = postproc::readMotionTextFile(sampleProgramPath());
  const planner::Job job = planner::loadJob(test::sourcePath(kSampleJob));
  const planner::Cell& cell = job.cell;
  const planner::Tool& tool = *cell.findTool("torch");
  // From where corner-left's approach starts (30 mm above the seam, a pose
  // the arm reaches), straight down 80 mm, in the same branch and
  // orientation: through the left clamp's bar, which presses on the base
  // plate right below that point (samples/cells/bracket_weld_cell.xml).
  const planner::MotionRecord* approach = nullptr;
  for (const planner::ProgramRecord& record : program.records) {
    const auto* motion = std::get_if<planner::MotionRecord>(&record);
    if (motion != nullptr && motion->seam == "corner-left" && approach == nullptr) approach = motion;
  }
  REQUIRE(approach != nullptr);
  const planner::MotionRecord* before = nullptr;
  for (const planner::ProgramRecord& record : program.records) {
    const auto* motion = std::get_if<planner::MotionRecord>(&record);
    if (motion == approach) break;
    if (motion != nullptr) before = motion;
  }
  REQUIRE(before != nullptr);  // the transit's end: where the approach starts
  const Eigen::Isometry3d X_WB = cell.frames.X_W(cell.arm_frame);
  const Eigen::Isometry3d X_WA = X_WB * kinematics::flangePose(cell.arm, before->q) * tool.X_FT;
  Eigen::Isometry3d X_WD = X_WA;
  X_WD.translation().z() -= 0.080;
  const kinematics::IkSolutions solutions =
      kinematics::OrthoParallelSolver(cell.arm).solve(X_WB.inverse() * X_WD * tool.X_FT.inverse());
  const kinematics::ArmBranch branch = kinematics::ArmBranch::fromIndex(0);
  const kinematics::BranchOutcome& front_up = solutions.branches[branch.index()];
  REQUIRE(front_up.solution_count > 0);
  const auto joints_at = [&](const kinematics::IkSolutions&) {
    return solutions.solutions[front_up.first_solution].q;
  };
  planner::MotionRecord to_start = *before;
  to_start.X_RT = cell.frames.X_W(to_start.frame).inverse() * X_WA;
  const kinematics::IkSolutions at_end = solutions;
  const planner::MotionRecord& last = std::get<planner::MotionRecord>(program.records.back());
  const double end_time = last.start_time + last.duration;
  to_start.start_time = end_time;
  to_start.duration = 2.0;
  planner::MotionRecord through = to_start;
  through.kind = planner::MotionKind::kLinearMove;
  through.q = joints_at(at_end);
  through.frame = "world";
  through.seam.clear();
  through.X_RT = X_WD;
  through.speed = {planner::SpeedKind::kTcpSpeed, 0.05};
  through.start_time = end_time + 2.0;
  through.duration = 4.8;
  through.branch = branch.toString();
  program.records.push_back(to_start);
  program.records.push_back(through);
  const int planted = static_cast<int>(program.records.size());
  const std::string path = writeProgram(program, "verify_through_clamp.twm");

  const test::ToolRun run = test::runTool("verify '" + path + "' --job " + kSampleJob);
  CAPTURE(run.output);
  CHECK(run.exit_code == 3);
  CHECK(namedRecords(run.output).count(planted) == 1);
  CHECK_THAT(run.output, Catch::Contains("record " + std::to_string(planted) + " (linear-move)") &&
                             Catch::Contains("collision") && Catch::Contains("torch against clamp-left"));
  // Everything the planner wrote still runs: only the planted records are named.
  for (const int record : namedRecords(run.output)) CHECK(record >= planted - 1);
}

TEST_CASE("verify reports the records a 30 mm fixture move breaks", "[cli][verify]") {
  // The sample cell and job with the bracket frame moved 30 mm along the
  // table (x 100 → 130 in the table top); everything else as planned.
  std::string cell = test::sampleCellText();
  const std::string frame = "<frame name=\"bracket\" parent=\"table-top\" xyz=\"100 -50 0\"";
  const std::size_t at = cell.find(frame);
  REQUIRE(at != std::string::npos);
  cell.replace(at, frame.size(), "<frame name=\"bracket\" parent=\"table-top\" xyz=\"130 -50 0\"");
  const std::string cell_path = test::writeTestFile("verify_moved_cell.xml", cell);
  std::string job = test::readText(test::sourcePath(kSampleJob));
  job = std::regex_replace(job, std::regex("\\.\\./cells/bracket_weld_cell\\.xml"), cell_path);
  job = std::regex_replace(job, std::regex("\\.\\./seams/"),
                           std::string(TW_SOURCE_DIR) + "/samples/seams/");
  const std::string job_path = test::writeTestFile("verify_moved_job.xml", job);

  const test::ToolRun run = test::runTool("verify '" + sampleProgramPath() + "' --job '" + job_path + "'");
  CAPTURE(run.output);
  CHECK(run.exit_code == 3);
  // Every process move is in the bracket frame, so each is named; the first
  // record (the home position, in the world frame) is not.
  const planner::Program program = postproc::readMotionTextFile(sampleProgramPath());
  const std::set<int> named = namedRecords(run.output);
  CHECK(named.count(1) == 0);
  for (std::size_t i = 0; i < program.records.size(); ++i) {
    const auto* motion = std::get_if<planner::MotionRecord>(&program.records[i]);
    if (motion != nullptr && motion->frame == "bracket") {
      CAPTURE(i + 1);
      CHECK(named.count(static_cast<int>(i) + 1) == 1);
    }
  }
}

}  // namespace
}  // namespace tw::cli
