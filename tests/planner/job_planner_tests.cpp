// planJob's collision settings: the job's transit clearance against the
// cell, the base self margin between the arm and its own tool, and the
// per-record clearance measured to the cell.
#include <catch2/catch.hpp>

#include <limits>
#include <variant>

#include "collision/collision_world.hpp"
#include "collision/world_description.hpp"
#include "kinematics/common/angles.hpp"
#include "kinematics/singularity.hpp"
#include "planner/cell/cell_collision_world.hpp"
#include "planner/job/job_loader.hpp"
#include "planner/job_planner.hpp"
#include "tests/planner/test_files.hpp"

namespace tw::planner {
namespace {

constexpr double kInfinity = std::numeric_limits<double>::infinity();

TEST_CASE("A transit clearance beyond the wrist-to-tool distance plans, records give the clearance "
          "to the cell",
          "[planner][plan]") {
  Job job = loadJob(test::sourcePath("samples/jobs/panel_coat.xml"));
  const Tool& gun = *job.cell.findTool("spray-gun");
  const collision::CollisionWorld reference = buildCellCollisionWorld(job.cell, gun);
  collision::CollisionWorkspace workspace(reference);
  collision::ClearanceQuery self;
  self.pairs = collision::PairGroup::kSelf;
  collision::ClearanceQuery to_cell;
  to_cell.pairs = collision::PairGroup::kCell;

  const collision::Clearance wrist = reference.clearance(job.cell.home, workspace, self);
  // The arm file's ball of link 5 (r = 70 mm) sits on the wrist centre,
  // 95 mm (c4) from the flange where the gun's box starts: 25 mm in every
  // pose, as CELL_AND_JOB_FORMAT.md says (elementary geometry; primitives
  // are exact, 1e-9 m covers rounding).
  CHECK(wrist.distance == Approx(0.025).margin(1e-9));
  CHECK(reference.bodyName(wrist.body_a) + "+" + reference.bodyName(wrist.body_b) ==
        "j5+spray-gun");
  // 5 mm more than that: applied to the self pairs too, no state would be valid.
  job.transit.clearance = wrist.distance + 0.005;

  const PlanOptions options;
  const PlanResult result = planJob(job, options);
  for (const TransitFailure& failure : result.transit_failures) {
    FAIL_CHECK("transit " << failure.from << " -> " << failure.to << ": "
                          << failure.result.reason);
  }
  REQUIRE(result.feasible());

  int motions = 0;
  for (const ProgramRecord& record : result.program->records) {
    const MotionRecord* motion = std::get_if<MotionRecord>(&record);
    if (motion == nullptr) continue;
    ++motions;
    CAPTURE(motions, motion->q.transpose());
    REQUIRE(motion->clearance.has_value());
    // The same distance from a world of our own, cell pairs only: the
    // margins play no part in it, and both figures lie within the query's
    // 0.1 mm tolerance above the true distance.
    CHECK(*motion->clearance ==
          Approx(reference.clearance(motion->q, workspace, to_cell).distance).margin(1e-4));
    // Transit targets are valid states of the transit world, so they keep
    // the clearance from the cell; the wrist stays 25 mm from the gun.
    if (motion->kind == MotionKind::kJointMove) {
      CHECK(*motion->clearance >= job.transit.clearance);
      CHECK(*motion->clearance > wrist.distance);
    }
  }
  CHECK(motions > 20);
}

TEST_CASE("The cell's collision world takes both margins, and refuses a bad one by name",
          "[planner]") {
  const Job job = loadJob(test::sourcePath("samples/jobs/panel_coat.xml"));
  const Tool& gun = *job.cell.findTool("spray-gun");
  CellCollisionOptions options;
  options.clearance_margin = 0.030;
  options.self_margin = 0.004;
  const collision::WorldDescription description = cellWorldDescription(job.cell, gun, options);
  CHECK(description.clearance_margin == 0.030);
  CHECK(description.self_margin == 0.004);
  const collision::CollisionWorld world = buildCellCollisionWorld(job.cell, gun, options);
  CHECK(world.clearanceMargin() == 0.030);
  CHECK(world.selfMargin() == 0.004);

  options.self_margin = -0.001;
  CHECK_THROWS_WITH(buildCellCollisionWorld(job.cell, gun, options),
                    Catch::Contains("panel_paint_cell.xml") &&
                        Catch::Contains("self margin") &&
                        Catch::Contains("must be a positive length"));
}

}  // namespace
}  // namespace tw::planner

namespace tw::planner {
namespace {

TEST_CASE("A waypoint near the wrist singularity is warned about once, on its record",
          "[planner][job]") {
  const Job job = loadJob(test::sourcePath("samples/jobs/panel_seal.xml"));
  // The sample keeps axis 5 above 60°; an 80° warning margin flags waypoints.
  constexpr double kMargin = 80.0 * kPi / 180.0;
  PlanOptions options;
  options.solver.wrist_warning_margin = kMargin;
  const PlanResult result = planJob(job, options);
  REQUIRE(result.feasible());
  const SolvedSeam& seam = std::get<SolvedSeam>(result.seams.tasks.at(0));
  int flagged = 0;
  for (const SolvedPose& pose : seam.waypoints) flagged += pose.wrist_warning;
  CAPTURE(flagged);
  REQUIRE(flagged > 0);
  // The planner adds no warning of its own per flagged waypoint ...
  for (const std::string& warning : result.program->warnings) {
    CAPTURE(warning);
    CHECK(warning.find("axis 5") == std::string::npos);
  }
  // ... because the record of the move through a flagged waypoint carries
  // the smallest margin along its path, which the review warns about: no
  // flagged waypoint is lost when moves are compacted.
  double smallest_waypoint = kInfinity;
  for (const SolvedPose& pose : seam.waypoints) {
    const std::optional<double> wrist = kinematics::singularityMeasures(job.cell.arm, pose.q).wrist;
    if (wrist) smallest_waypoint = std::min(smallest_waypoint, *wrist);
  }
  int records_below = 0;
  double smallest_record = kInfinity;
  for (const ProgramRecord& record : result.program->records) {
    const auto* motion = std::get_if<MotionRecord>(&record);
    if (motion && motion->seam == seam.name && motion->singularity_margin) {
      smallest_record = std::min(smallest_record, *motion->singularity_margin);
      records_below += *motion->singularity_margin < kMargin;
    }
  }
  CHECK(records_below > 0);
  CHECK(smallest_record <= smallest_waypoint);
}

}  // namespace
}  // namespace tw::planner
