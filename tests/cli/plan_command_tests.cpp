// The whole job end to end through the built executable: plan the sample,
// then re-verify the written motion file by routes of its own (forward
// kinematics, the seam geometry, the collision world, the joint limits and
// velocities), and check determinism and exit codes.
#include <catch2/catch.hpp>

#include <filesystem>
#include <map>
#include <nlohmann/json.hpp>
#include <optional>
#include <sstream>
#include <string>
#include <utility>
#include <variant>

#include "collision/collision_world.hpp"
#include "kinematics/common/angles.hpp"
#include "kinematics/common/number_text.hpp"
#include "kinematics/forward_kinematics.hpp"
#include "planner/cell/cell_collision_world.hpp"
#include "planner/job/job_loader.hpp"
#include "planner/toolpath/seam_sampler.hpp"
#include "planner/toolpath/tool_path_builder.hpp"
#include "postproc/motion_text/motion_text_reader.hpp"
#include "tests/cli/cli_test_support.hpp"

namespace tw::cli {
namespace {

// The bar of the end-to-end check (issue text): 0.1 mm and 0.1°, far above
// the motion text's printed precision (0.001 mm, 1e-9 in the quaternion).
constexpr double kPositionTolerance = 0.0001;
constexpr double kAngleTolerance = 0.1 * kPi / 180.0;

std::string outputDirectory(const std::string& name) {
  const std::string directory = std::string(TW_TEST_OUTPUT_DIR) + "/" + name;
  std::filesystem::remove_all(directory);
  return directory;
}

double angleBetween(const Eigen::Vector3d& a, const Eigen::Vector3d& b) {
  return std::atan2(a.cross(b).norm(), a.dot(b));
}

/// The collision world of one tool of a cell, with the part of it that may
/// touch a workpiece (none on free moves), and the workspace its queries use.
struct ToolWorld {
  ToolWorld(const planner::Cell& cell, const planner::Tool& tool,
            const std::optional<double>& contact_length)
      : world(planner::buildCellCollisionWorld(cell, tool, contactOptions(contact_length))),
        workspace(world) {}
  static planner::CellCollisionOptions contactOptions(const std::optional<double>& length) {
    planner::CellCollisionOptions options;
    options.contact_length = length;
    return options;
  }
  collision::CollisionWorld world;
  collision::CollisionWorkspace workspace;
};

/// The poses each seam or patch of `job` may take, by name: its approach,
/// waypoints and retract, in its frame; the spin about the tool axis is free.
std::map<std::string, planner::ToolPath> toolPaths(const planner::Job& job) {
  std::map<std::string, planner::ToolPath> paths;
  for (const planner::JobTask& task : job.tasks) {
    if (const auto* seam = std::get_if<planner::SeamSpec>(&task)) {
      paths.emplace(seam->name, planner::buildToolPath(*seam, *job.cell.findTool(seam->tool)));
    } else {
      const planner::PatchSpec& patch = std::get<planner::PatchSpec>(task);
      paths.emplace(patch.name,
                    planner::buildToolPath(patch, *job.cell.findTool(patch.tool), job.source));
    }
  }
  return paths;
}

/// Every motion record of a planned program, checked against the job it
/// came from, with the tool each record names.
void verifyProgram(const planner::Program& program, const planner::Job& job) {
  const planner::Cell& cell = job.cell;
  const kinematics::ArmModel& arm = cell.arm;
  const Eigen::Isometry3d X_WB = cell.frames.X_W(cell.arm_frame);
  const std::map<std::string, planner::ToolPath> paths = toolPaths(job);
  // Per tool and contact length: seams with their process's contact part,
  // free moves with none (key -1; a std::optional in the key trips g++ 12's
  // maybe-uninitialized warning at -O2).
  const auto key = [](const std::string& tool, const std::optional<double>& length) {
    return std::make_pair(tool, length.value_or(-1.0));
  };
  std::map<std::pair<std::string, double>, ToolWorld> worlds;
  for (const planner::Tool& tool : cell.tools) {
    worlds.try_emplace(key(tool.name, std::nullopt), cell, tool, std::nullopt);
    for (const auto& [name, path] : paths) {
      if (path.tool == tool.name) {
        worlds.try_emplace(key(tool.name, path.contact_length), cell, tool, path.contact_length);
      }
    }
  }

  int motions = 0;
  const kinematics::JointVector* previous = nullptr;
  // Each task's process parameter set: the job's parameter-set, or else
  // the process kind's name.
  std::map<std::string, std::string> parameter_sets;
  for (const planner::JobTask& task : job.tasks) {
    std::visit(
        [&](const auto& spec) {
          parameter_sets[spec.name] = spec.parameter_set.empty()
                                          ? planner::toString(paths.at(spec.name).process)
                                          : spec.parameter_set;
        },
        task);
  }
  for (const planner::ProgramRecord& record : program.records) {
    if (const auto* event = std::get_if<planner::ProcessEvent>(&record)) {
      CAPTURE(event->seam);
      CHECK(event->parameter_set == parameter_sets.at(event->seam));
    }
    const planner::MotionRecord* motion = std::get_if<planner::MotionRecord>(&record);
    if (motion == nullptr) continue;
    ++motions;
    CAPTURE(motions, motion->q.transpose(), motion->seam, motion->frame, motion->tool);
    const planner::Tool* tool = cell.findTool(motion->tool);
    REQUIRE(tool != nullptr);
    // File values are printed to 4 decimals of a degree: the limits hold
    // to that rounding.
    CHECK(((motion->q - arm.lowerLimits()).array() >= -1e-5).all());
    CHECK(((arm.upperLimits() - motion->q).array() >= -1e-5).all());

    const Eigen::Isometry3d X_WT = X_WB * kinematics::flangePose(arm, motion->q) * tool->X_FT;
    const Eigen::Isometry3d X_WR =
        motion->frame == "world" ? Eigen::Isometry3d::Identity() : cell.frames.X_W(motion->frame);
    const Eigen::Isometry3d X_WT_file = X_WR * motion->X_RT;
    CHECK((X_WT.translation() - X_WT_file.translation()).norm() < kPositionTolerance);
    CHECK(Eigen::AngleAxisd(X_WT.linear().transpose() * X_WT_file.linear()).angle() <
          kAngleTolerance);

    if (!motion->seam.empty()) {
      const planner::ToolPath& path = paths.at(motion->seam);
      CHECK(motion->frame == path.frame);
      std::vector<Eigen::Isometry3d> poses{path.approach, path.retract};
      for (const planner::Waypoint& waypoint : path.waypoints) poses.push_back(waypoint.X_XT);
      bool on_seam = false;
      for (const Eigen::Isometry3d& X_XT : poses) {
        on_seam = on_seam ||
                  ((X_XT.translation() - motion->X_RT.translation()).norm() < kPositionTolerance &&
                   angleBetween(X_XT.linear().col(2), motion->X_RT.linear().col(2)) < kAngleTolerance);
      }
      CHECK(on_seam);
    }
    // The solver and the transit planner keep the margin at every target.
    ToolWorld& tool_world = worlds.at(
        key(motion->tool, motion->seam.empty() ? std::nullopt : paths.at(motion->seam).contact_length));
    CHECK(tool_world.world.checkState(motion->q, tool_world.workspace).valid());
    // Average joint speed over each move within the joint's limit (the
    // limit is on the peak; the average can only be lower).
    if (previous != nullptr && motion->duration > 0.0) {
      for (int j = 0; j < arm.jointCount(); ++j) {
        CHECK(std::abs(motion->q[j] - (*previous)[j]) / motion->duration <=
              arm.joint(j).max_velocity * (1.0 + 1e-3));
      }
    }
    previous = &motion->q;
  }
  // Approach, at least one process move and retract per seam, transits.
  CHECK(motions > 3);
}

}  // namespace

TEST_CASE("plan writes a sample program that re-verifies on its own", "[cli][plan][e2e]") {
  const std::string directory = outputDirectory("plan_sample");
  const test::ToolRun run = test::runTool("plan samples/jobs/bracket_welds.xml --output '" + directory + "'");
  CAPTURE(run.output);
  REQUIRE(run.exit_code == 0);
  CHECK_THAT(run.output, Catch::Contains("cycle time") && Catch::Contains("CAUTION"));
  const planner::Job job =
      planner::loadJob(std::string(TW_SOURCE_DIR) + "/samples/jobs/bracket_welds.xml");
  verifyProgram(postproc::readMotionTextFile(directory + "/bracket_welds.twm"), job);
  for (const char* file : {"bracket_welds_joints.csv", "bracket_welds_summary.json",
                           "bracket_welds_report.html"}) {
    CHECK(std::filesystem::exists(directory + "/" + file));
  }
}

TEST_CASE("plan writes the sample paint programs, and they re-verify on their own",
          "[cli][plan][e2e]") {
  // Two jobs on one cell: a program works with one tool, and the seal uses
  // the bead nozzle, the coat the spray gun.
  for (const std::string name : {"panel_seal", "panel_coat"}) {
    CAPTURE(name);
    const std::string directory = outputDirectory("plan_" + name);
    const std::string job_file = "samples/jobs/" + name + ".xml";
    const test::ToolRun run = test::runTool("plan " + job_file + " --output '" + directory + "'");
    CAPTURE(run.output);
    REQUIRE(run.exit_code == 0);
    CHECK_THAT(run.output, Catch::Contains("cycle time") && Catch::Contains("CAUTION"));
    const planner::Job job = planner::loadJob(std::string(TW_SOURCE_DIR) + "/" + job_file);
    const planner::Program program = postproc::readMotionTextFile(directory + "/" + name + ".twm");
    verifyProgram(program, job);
    for (const std::string suffix : {"_joints.csv", "_summary.json"}) {
      CHECK(std::filesystem::exists(directory + "/" + name + suffix));
    }
    if (name == "panel_coat") {
      // The job's template output: the sample template writes one card per
      // record between "CARDS BEGIN <count>" and "CARDS END".
      std::istringstream cards(test::readText(directory + "/panel_coat_stepcard.txt"));
      std::string line;
      int card_lines = 0;
      bool ended = false;
      std::string begin;
      while (std::getline(cards, line)) {
        if (line.rfind("CARDS BEGIN ", 0) == 0) begin = line;
        if (line.rfind("CARD ", 0) == 0) ++card_lines;
        if (line == "CARDS END") ended = true;
      }
      CHECK(begin == "CARDS BEGIN " + std::to_string(program.records.size()));
      CHECK(card_lines == static_cast<int>(program.records.size()));
      CHECK(ended);
    }

    // The process is switched on once per stretch of the tool path with the
    // process on: once per raster pass (the spray is off on the turnarounds
    // beyond the panel), once for a seam.
    std::map<std::string, int> expected_starts;
    for (const auto& [task, path] : toolPaths(job)) {
      int stretches = 0;
      for (std::size_t i = 0; i < path.waypoints.size(); ++i) {
        stretches += path.waypoints[i].process_on &&
                     (i == 0 || !path.waypoints[i - 1].process_on);
      }
      expected_starts[task] = stretches;
    }
    std::map<std::string, int> starts;
    for (const planner::ProgramRecord& record : program.records) {
      const auto* event = std::get_if<planner::ProcessEvent>(&record);
      if (event != nullptr && event->kind == planner::ProcessEventKind::kStart) ++starts[event->seam];
    }
    CHECK(starts == expected_starts);
  }
}

TEST_CASE("plan after a fixture move re-verifies, and compare shows the change",
          "[cli][plan][e2e]") {
  const std::string before = outputDirectory("plan_before_move");
  const std::string after = outputDirectory("plan_after_move");
  REQUIRE(test::runTool("plan samples/jobs/bracket_welds.xml --output '" + before + "'").exit_code == 0);
  const test::ToolRun run =
      test::runTool("plan samples/jobs/bracket_welds_moved.xml --output '" + after + "'");
  CAPTURE(run.output);
  REQUIRE(run.exit_code == 0);
  const planner::Job moved =
      planner::loadJob(std::string(TW_SOURCE_DIR) + "/samples/jobs/bracket_welds_moved.xml");
  verifyProgram(postproc::readMotionTextFile(after + "/bracket_welds.twm"), moved);

  const test::ToolRun compare = test::runTool("compare '" + before + "/bracket_welds.twm' '" + after +
                                        "/bracket_welds.twm' --fail-on-change");
  CAPTURE(compare.output);
  CHECK(compare.exit_code == 3);
  CHECK_THAT(compare.output, Catch::Contains("largest TCP deviation"));
}

TEST_CASE("plan gives byte-identical outputs on repeat and at any thread count",
          "[cli][plan][determinism]") {
  const std::string one = outputDirectory("plan_threads_1");
  const std::string two = outputDirectory("plan_threads_2");
  REQUIRE(test::runTool("plan samples/jobs/bracket_welds.xml --threads 1 --output '" + one + "'").exit_code == 0);
  REQUIRE(test::runTool("plan samples/jobs/bracket_welds.xml --threads 2 --output '" + two + "'").exit_code == 0);
  for (const char* file : {"bracket_welds.twm", "bracket_welds_joints.csv",
                           "bracket_welds_summary.json", "bracket_welds_report.html"}) {
    CAPTURE(file);
    CHECK(test::readText(one + "/" + file) == test::readText(two + "/" + file));
  }
}

std::string samples() { return std::string(TW_SOURCE_DIR) + "/samples/"; }

/// Replaces the first `from` in `text` by `to`; the test fails without one.
void replaceFirst(std::string& text, const std::string& from, const std::string& to) {
  const std::size_t at = text.find(from);
  REQUIRE(at != std::string::npos);
  text.replace(at, from.size(), to);
}

/// The sample job's text with every input named by absolute path and its
/// outputs going to `directory`, for edited copies written elsewhere.
std::string sampleJobText(const std::string& directory) {
  std::string job = test::readText(std::string(TW_SOURCE_DIR) + "/samples/jobs/bracket_welds.xml");
  replaceFirst(job, "../cells/", samples() + "cells/");
  for (int seam = 0; seam < 4; ++seam) replaceFirst(job, "\"../seams/", "\"" + samples() + "seams/");
  replaceFirst(job, "../../out/bracket-welds", directory);
  return job;
}

TEST_CASE("plan and check exit with 3 for an infeasible job and write nothing",
          "[cli][plan][exit-codes]") {
  // The sample job with its first seam moved 5 m away from the arm.
  const std::string directory = outputDirectory("plan_infeasible");
  std::string job = sampleJobText(directory);
  replaceFirst(job, samples() + "seams/corner_left.csv",
               test::writeTestFile("far_seam.csv",
                                   "x_mm,y_mm,z_mm,nx,ny,nz\n5000,0,0,0,0,1\n5100,0,0,0,0,1\n"));
  const std::string job_file = test::writeTestFile("infeasible_job.xml", job);

  const test::ToolRun plan = test::runTool("plan '" + job_file + "'");
  CAPTURE(plan.output);
  CHECK(plan.exit_code == 3);
  CHECK_THAT(plan.output, Catch::Contains("out of reach") && Catch::Contains("no program written"));
  CHECK_FALSE(std::filesystem::exists(directory));

  const test::ToolRun check = test::runTool("check '" + job_file + "'");
  CAPTURE(check.output);
  CHECK(check.exit_code == 3);
  CHECK_THAT(check.output, Catch::Contains("corner-right") && Catch::Contains("reachable"));
}

TEST_CASE("plan counts and lists the same warnings as the summary file", "[cli][plan]") {
  // Every seam at 300 mm/s, above the 250 mm/s of reduced speed
  // (ISO 10218-1:2011, 5.6, from memory): every process move is a review
  // warning, more than the ten the command prints.
  const std::string directory = outputDirectory("plan_warnings");
  std::string job = sampleJobText(directory);
  for (std::size_t at = job.find(" speed=\""); at != std::string::npos; at = job.find(" speed=\"", at + 1)) {
    const std::size_t end = job.find('"', at + 8);
    job.replace(at, end - at + 1, " speed=\"300\"");
  }
  const std::string job_file = test::writeTestFile("fast_seam_job.xml", job);
  const test::ToolRun plan = test::runTool("plan '" + job_file + "' --json");
  CAPTURE(plan.output);
  REQUIRE(plan.exit_code == 0);
  const nlohmann::json result = nlohmann::json::parse(plan.output.substr(plan.output.find('{')));
  const nlohmann::json summary =
      nlohmann::json::parse(test::readText(directory + "/bracket_welds_summary.json"));
  REQUIRE(summary["warnings"].is_array());
  // One per process move at a fixed speed (lug-wrap's speeds come from its
  // point list and stay low).
  CHECK(summary["warnings"].size() >= 3);
  CHECK(result["warnings"].size() == summary["warnings"].size());

  const test::ToolRun text = test::runTool("plan '" + job_file + "'");
  CHECK_THAT(text.output, Catch::Contains(std::to_string(summary["warnings"].size()) + " warning(s)"));
  // All of them are of one kind here, counted once by kind.
  CHECK_THAT(text.output, Catch::Contains(std::to_string(summary["warnings"].size()) +
                                          " moves above the reduced speed"));
}

/// Each seam's branch words in a program, by seam name.
std::map<std::string, std::string> seamBranches(const planner::Program& program) {
  std::map<std::string, std::string> branches;
  for (const planner::ProgramRecord& record : program.records) {
    const auto* motion = std::get_if<planner::MotionRecord>(&record);
    if (motion != nullptr && !motion->seam.empty()) branches.emplace(motion->seam, motion->branch);
  }
  return branches;
}

TEST_CASE("plan --like keeps each seam's branch from an earlier program", "[cli][plan]") {
  // An earlier program in other branches: the sample cell with its home's
  // wrist flipped (axis 4 and 6 half a turn round, axis 5 negated: the same
  // flange pose), from which the solver prefers flipped wrists.
  std::string cell = test::sampleCellText();
  replaceFirst(cell, "<home joints=\"0 -20 10 0 60 0\"/>", "<home joints=\"0 -20 10 180 -60 -180\"/>");
  const std::string flipped_directory = outputDirectory("plan_like_flipped");
  std::string job = sampleJobText(flipped_directory);
  replaceFirst(job, samples() + "cells/bracket_weld_cell.xml",
               test::writeTestFile("flipped_home_cell.xml", cell));
  const std::string flipped_job = test::writeTestFile("flipped_home_job.xml", job);
  REQUIRE(test::runTool("plan '" + flipped_job + "'").exit_code == 0);
  const std::string earlier_file = flipped_directory + "/bracket_welds.twm";
  const std::map<std::string, std::string> earlier =
      seamBranches(postproc::readMotionTextFile(earlier_file));

  const std::string plain_directory = outputDirectory("plan_like_plain");
  REQUIRE(test::runTool("plan samples/jobs/bracket_welds.xml --output '" + plain_directory + "'")
              .exit_code == 0);
  const std::map<std::string, std::string> plain =
      seamBranches(postproc::readMotionTextFile(plain_directory + "/bracket_welds.twm"));
  REQUIRE(plain.size() == 4);
  // Without --like the sample's own home decides, and some branch differs:
  // otherwise this test could not tell the option from its absence.
  REQUIRE(plain != earlier);

  const std::string liked_directory = outputDirectory("plan_like_liked");
  const test::ToolRun liked_run = test::runTool("plan samples/jobs/bracket_welds.xml --output '" +
                                                liked_directory + "' --like '" + earlier_file + "'");
  CAPTURE(liked_run.output);
  REQUIRE(liked_run.exit_code == 0);
  CHECK_THAT(liked_run.output, Catch::Contains("every seam kept its branch from"));
  const planner::Program liked = postproc::readMotionTextFile(liked_directory + "/bracket_welds.twm");
  CHECK(seamBranches(liked) == earlier);
  const planner::Job sample = planner::loadJob(std::string(TW_SOURCE_DIR) + "/samples/jobs/bracket_welds.xml");
  verifyProgram(liked, sample);

  // Something that is not a motion file is bad input.
  CHECK(test::runTool("plan samples/jobs/bracket_welds.xml --output '" + liked_directory +
                      "' --like samples/jobs/bracket_welds.xml")
            .exit_code == 2);
}

TEST_CASE("check passes the sample job; plan and check refuse bad input with exit code 2",
          "[cli][plan][exit-codes]") {
  const test::ToolRun check = test::runTool("check samples/jobs/bracket_welds.xml");
  CAPTURE(check.output);
  CHECK(check.exit_code == 0);
  CHECK_THAT(check.output, Catch::Contains("every seam is reachable"));
  CHECK(test::runTool("plan samples/jobs/no_such_job.xml").exit_code == 2);
  CHECK(test::runTool("check samples/jobs/no_such_job.xml").exit_code == 2);
  CHECK(test::runTool("plan samples/jobs/bracket_welds.xml --threads 0").exit_code == 2);
  CHECK(test::runTool("plan --help").exit_code == 0);
  CHECK(test::runTool("check --help").exit_code == 0);
}

/// The sample bracket cell with its arm and meshes named by absolute path,
/// `extra` added before its end, written as a test file named `name`.
std::string writeBracketCell(const std::string& name, const std::string& extra) {
  std::string cell = test::readText(samples() + "cells/bracket_weld_cell.xml");
  replaceFirst(cell, "file=\"../arms/", "file=\"" + samples() + "arms/");
  replaceFirst(cell, "file=\"meshes/", "file=\"" + samples() + "cells/meshes/");
  replaceFirst(cell, "</cell>", extra + "</cell>");
  return test::writeTestFile(name, cell);
}

TEST_CASE("plan refuses a thin sheet workpiece lying across the torch nozzle",
          "[cli][plan][exit-codes]") {
  // A 2 mm sheet 22 mm above the bracket's base plate, over corner-left
  // (x 10..120 along the fillet of base and upright): the torch axis leaves
  // the seam at 45° between the plates, so the nozzle (from 18 mm back along
  // it) passes through the sheet at every waypoint, while the wire stick-out
  // with its 3 mm allowance stays below z = 8 + (15 + 3)·sin 45° < 21 mm.
  // Only the contact part may touch a workpiece: the nozzle may not.
  const std::string directory = outputDirectory("plan_sheet");
  std::string job = sampleJobText(directory);
  replaceFirst(job, samples() + "cells/bracket_weld_cell.xml",
               writeBracketCell("sheet_cell.xml",
                                "  <workpiece name=\"sheet\" frame=\"bracket\">\n"
                                "    <box size=\"140 40 2\" xyz=\"70 40 31\"/>\n"
                                "  </workpiece>\n"));
  const std::string job_file = test::writeTestFile("sheet_job.xml", job);
  const test::ToolRun plan = test::runTool("plan '" + job_file + "'");
  CAPTURE(plan.output);
  CHECK(plan.exit_code == 3);
  CHECK_THAT(plan.output, Catch::Contains("corner-left") && Catch::Contains("sheet / torch") &&
                              Catch::Contains("no program written"));
  CHECK_FALSE(std::filesystem::exists(directory));
}

TEST_CASE("The point on a circular seam moves at the programmed speed", "[cli][plan]") {
  // 120° of a circle of radius 40 mm on the bracket's base plate (the part
  // the sample arm reaches with the torch leant in), a point every 5°, the
  // torch leaning 30° towards the centre (work angle 60°): a TCP held off
  // the seam point would run on a circle of another radius (32.5 mm at the
  // former 15 mm contact-tip offset), at another speed.
  const double radius_mm = 40.0;
  std::string points = "x_mm,y_mm,z_mm,nx,ny,nz\n";
  for (int degrees = 190; degrees <= 310; degrees += 5) {
    const double angle = degrees * kPi / 180.0;
    points += formatFixed(90.0 + radius_mm * std::cos(angle), 6) + ',' +
              formatFixed(70.0 + radius_mm * std::sin(angle), 6) + ",8,0,0,1\n";
  }
  const std::string directory = outputDirectory("plan_circle");
  const std::string job_file = test::writeTestFile(
      "circle_job.xml",
      "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n"
      "<job format-version=\"1\" name=\"circle\" length-unit=\"mm\" angle-unit=\"deg\" "
      "time-unit=\"s\">\n"
      "  <cell file=\"" + samples() + "cells/bracket_weld_cell.xml\"/>\n"
      "  <seam name=\"circle\" points=\"" + test::writeTestFile("circle.csv", points) +
      "\" frame=\"bracket\" tool=\"torch\" speed=\"8\" approach=\"30\" retract=\"30\" "
      "step=\"2\">\n"
      "    <weld work-angle=\"60\" travel-angle=\"10\" contact-tip-distance=\"15\"/>\n"
      "  </seam>\n"
      "  <outputs directory=\"" + directory + "\">\n"
      "    <output writer=\"motion-text\" file=\"circle.twm\"/>\n"
      "  </outputs>\n"
      "</job>\n");
  const test::ToolRun plan = test::runTool("plan '" + job_file + "'");
  CAPTURE(plan.output);
  REQUIRE(plan.exit_code == 0);

  // The seam points by the sampler alone (no tool pose involved), with
  // their length along the seam. The program's moves of the seam are the
  // approach onto the first point, the compacted process moves (linear or
  // circular, each ending on a seam point), and the retract.
  const planner::Job job = planner::loadJob(job_file);
  const auto& seam = std::get<planner::SeamSpec>(job.tasks.front());
  const std::vector<planner::SeamSample> samples = planner::sampleSeam(seam.points, seam.sampling);
  std::vector<double> along(samples.size(), 0.0);
  for (std::size_t k = 1; k < samples.size(); ++k) {
    along[k] = along[k - 1] + (samples[k].p_XP - samples[k - 1].p_XP).norm();
  }
  const auto length_at = [&](const Eigen::Vector3d& p_XT) {
    std::size_t nearest = 0;
    for (std::size_t k = 1; k < samples.size(); ++k) {
      if ((samples[k].p_XP - p_XT).norm() < (samples[nearest].p_XP - p_XT).norm()) nearest = k;
    }
    // The TCP is on the seam: each move ends on a seam point (0.01 mm: the
    // file's rounding of positions and joints).
    CHECK((samples[nearest].p_XP - p_XT).norm() < 1e-5);
    return along[nearest];
  };
  const planner::Program program = postproc::readMotionTextFile(directory + "/circle.twm");
  std::vector<const planner::MotionRecord*> moves;
  for (const planner::ProgramRecord& record : program.records) {
    const auto* motion = std::get_if<planner::MotionRecord>(&record);
    if (motion != nullptr && motion->seam == "circle") moves.push_back(motion);
  }
  REQUIRE(samples.size() > 30);
  // The approach, at least three process moves, the retract.
  REQUIRE(moves.size() >= 5);
  // The curved seam is written with arcs, and the program runs as written
  // when replayed with the controller's arc interpolation.
  int arcs = 0;
  for (const planner::MotionRecord* move : moves) arcs += move->kind == planner::MotionKind::kCircularMove;
  CHECK(arcs > 0);
  const test::ToolRun verify = test::runTool("verify '" + directory + "/circle.twm' --job '" + job_file + "'");
  CAPTURE(verify.output);
  CHECK(verify.exit_code == 0);
  // The first and last process moves ramp up from and down to a stop
  // (time-optimal timing); between them the arm runs through blends at the
  // programmed speed.
  for (std::size_t k = 2; k + 2 < moves.size(); ++k) {
    CAPTURE(k);
    REQUIRE(moves[k]->duration > 0.0);
    const double seam_length =
        length_at(moves[k]->X_RT.translation()) - length_at(moves[k - 1]->X_RT.translation());
    // 1 %: the bar; the file's durations are printed to 0.1 ms.
    CHECK(seam_length / moves[k]->duration == Approx(0.008).epsilon(0.01));
  }
}

}  // namespace tw::cli
