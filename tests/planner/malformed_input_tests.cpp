#include <catch2/catch.hpp>
#include <cmath>
#include <random>
#include <set>
#include <sstream>
#include <variant>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"
#include "planner/cell/cell_loader.hpp"
#include "planner/job/job_loader.hpp"
#include "planner/job/seam_points_csv.hpp"
#include "planner/refit/reference_points_csv.hpp"
#include "tests/planner/test_files.hpp"
#include "tests/test_support/text_damage.hpp"

namespace tw::planner {
namespace {

TEST_CASE("Randomly damaged point lists either read cleanly or give a located error",
          "[planner][csv][errors]") {
  const std::string original =
      tw::test::readTextFile(test::sourcePath("samples/seams/lug_wrap.csv"));
  REQUIRE_FALSE(original.empty());
  std::mt19937 random(977);
  int accepted = 0;
  int rejected = 0;
  for (int trial = 0; trial < 2000; ++trial) {
    const std::string text = tw::test::damaged(original, tw::test::kCsvDamage, random);
    CAPTURE(trial, text);
    std::istringstream input(text);
    try {
      const SeamPointList list = parseSeamPointsCsv(input, "damaged.csv");
      ++accepted;
      // Whatever is accepted keeps the documented guarantees.
      REQUIRE(list.points.size() >= 2);
      for (std::size_t i = 0; i < list.points.size(); ++i) {
        const SeamPoint& point = list.points[i];
        CHECK(point.p_XP.allFinite());
        // Normalised on reading: unit to rounding.
        CHECK(point.normal.norm() == Approx(1.0).margin(1e-12));
        if (i > 0) CHECK(point.p_XP != list.points[i - 1].p_XP);
      }
    } catch (const InputError& error) {
      ++rejected;
      CHECK(error.file() == "damaged.csv");
      CHECK(error.line() > 0);
    }
  }
  // Both outcomes occur, so the loop exercised the error paths and the readers.
  CHECK(accepted > 0);
  CHECK(rejected > 0);
}

TEST_CASE("Randomly damaged cell files either load or give a located error",
          "[planner][cell][errors]") {
  // The sample cell with its references (arm, mesh) made absolute, so that
  // a copy in the scratch folder loads.
  const std::string original = test::replaced(
      test::replaced(
          tw::test::readTextFile(test::sourcePath("samples/cells/bracket_weld_cell.xml")),
          "../arms/weld_arm_1400.xml", test::sourcePath("samples/arms/weld_arm_1400.xml")),
      "meshes/gusset.obj", test::sourcePath("samples/cells/meshes/gusset.obj"));
  REQUIRE_NOTHROW(loadCell(test::writeTestFile("damaged_cell.xml", original)));
  std::mt19937 random(31337);
  int accepted = 0;
  int rejected = 0;
  for (int trial = 0; trial < 300; ++trial) {
    const std::string text = tw::test::damaged(original, tw::test::kXmlDamage, random);
    CAPTURE(trial);
    const std::string path = test::writeTestFile("damaged_cell.xml", text);
    try {
      loadCell(path);
      ++accepted;
    } catch (const InputError& error) {
      ++rejected;
      // Errors name the damaged file (or, for a damaged reference, the file
      // it names); a located error carries a line.
      CHECK_FALSE(error.file().empty());
      if (error.file() == path) CHECK(error.line() > 0);
    }
  }
  // Both outcomes occur, so the loop exercised the error paths and the loader.
  CHECK(accepted > 0);
  CHECK(rejected > 0);
}

TEST_CASE("Randomly damaged reference point lists either read cleanly or give a located error",
          "[planner][csv][refit][errors]") {
  const std::string original = tw::test::readTextFile(
      test::sourcePath("samples/fixture_moved/bracket_reference_points.csv"));
  std::mt19937 random(4099);  // fixed seed: the same damage on every run
  int accepted = 0;
  int rejected = 0;
  for (int trial = 0; trial < 2000; ++trial) {
    const std::string text = tw::test::damaged(original, tw::test::kCsvDamage, random);
    CAPTURE(trial, text);
    std::istringstream input(text);
    try {
      const ReferencePointList list = parseReferencePointsCsv(input, "damaged.csv");
      ++accepted;
      // The guarantees of reference_points_csv.hpp: at least 3 points, named,
      // names unique, every coordinate finite, each with its line.
      CHECK(list.points.size() >= 3);
      std::set<std::string> names;
      for (const ReferencePoint& point : list.points) {
        CHECK_FALSE(point.name.empty());
        CHECK(names.insert(point.name).second);
        CHECK(point.p_N.allFinite());
        CHECK(point.p_M.allFinite());
        CHECK(point.line > 0);
      }
    } catch (const InputError& error) {
      ++rejected;
      CHECK(error.file() == "damaged.csv");
      CHECK(error.line() > 0);
    }
  }
  // Both outcomes occur, so the loop exercised the error paths and the reader.
  CHECK(accepted > 0);
  CHECK(rejected > 0);
}

/// The sample job with its relative references (cell, point lists, output
/// folder) made absolute, so that a copy in the scratch folder loads.
std::string sampleJobText() {
  std::string text = tw::test::readTextFile(test::sourcePath("samples/jobs/bracket_welds.xml"));
  const std::string relative = "=\"../";
  const std::string absolute = "=\"" + test::sourcePath("samples/");
  while (text.find(relative) != std::string::npos) text = test::replaced(text, relative, absolute);
  return text;
}

constexpr double kDeg = kPi / 180.0;
// Limits are compared in radians after the degree conversion; allow its rounding.
constexpr double kAngleRounding = 1e-12;

/// Checks what job.hpp and job_loader.hpp promise of a loaded seam.
void checkSeam(const SeamSpec& seam, const Cell& cell) {
  CAPTURE(seam.name);
  CHECK(cell.frames.contains(seam.frame));
  CHECK(cell.findTool(seam.tool) != nullptr);
  CHECK(std::isfinite(seam.speed));
  CHECK(seam.speed > 0.0);
  CHECK(seam.approach >= 0.0);
  CHECK(seam.retract >= 0.0);
  CHECK(seam.sampling.step > 0.0);
  CHECK(seam.sampling.corner_angle > 0.0);
  CHECK(seam.sampling.corner_angle <= 170.0 * kDeg + kAngleRounding);
  // A point list has at least two points, finite, with unit normals.
  REQUIRE(seam.points.points.size() >= 2);
  for (const SeamPoint& point : seam.points.points) {
    CHECK(point.p_XP.allFinite());
    // Normalised on reading: unit to rounding.
    CHECK(point.normal.norm() == Approx(1.0).margin(1e-12));
  }
  REQUIRE(std::holds_alternative<WeldParameters>(seam.process));  // the sample welds
  const WeldParameters& weld = std::get<WeldParameters>(seam.process);
  CHECK(weld.travel_angle >= 0.0);
  CHECK(weld.travel_angle <= 45.0 * kDeg + kAngleRounding);
  CHECK(weld.contact_tip_distance > 0.0);
  if (weld.work_angle) {
    CHECK(*weld.work_angle > 0.0);
    CHECK(*weld.work_angle < 180.0 * kDeg);
  }
}

TEST_CASE("Randomly damaged job files either load or give a located error",
          "[planner][job][errors]") {
  const std::string original = sampleJobText();
  REQUIRE_NOTHROW(loadJob(test::writeTestFile("damaged_job.xml", original)));
  std::mt19937 random(65537);  // fixed seed: the same damage on every run
  int accepted = 0;
  int rejected = 0;
  for (int trial = 0; trial < 300; ++trial) {
    const std::string text = tw::test::damaged(original, tw::test::kXmlDamage, random);
    CAPTURE(trial, text);
    const std::string path = test::writeTestFile("damaged_job.xml", text);
    try {
      const Job job = loadJob(path);
      ++accepted;
      REQUIRE_FALSE(job.tasks.empty());
      std::set<std::string> names;
      for (const JobTask& task : job.tasks) {
        REQUIRE(std::holds_alternative<SeamSpec>(task));  // the sample has seams only
        const SeamSpec& seam = std::get<SeamSpec>(task);
        CHECK(names.insert(seam.name).second);
        checkSeam(seam, job.cell);
      }
      CHECK(job.transit.joint_speed_fraction > 0.0);
      CHECK(job.transit.joint_speed_fraction <= 1.0);
      CHECK(job.transit.clearance >= 0.0);
      CHECK(job.transit.time_limit > 0.0);
      std::set<std::string> files;
      for (const OutputRequest& output : job.outputs) CHECK(files.insert(output.path).second);
    } catch (const InputError& error) {
      ++rejected;
      // Errors name the damaged job (or, for a damaged reference, the file it
      // names); an error in the job file carries its line.
      CHECK_FALSE(error.file().empty());
      if (error.file() == path) CHECK(error.line() > 0);
    }
  }
  // Both outcomes occur, so the loop exercised the error paths and the loader.
  CHECK(accepted > 0);
  CHECK(rejected > 0);
}

}  // namespace
}  // namespace tw::planner
