#include "kinematics/common/angles.hpp"
#include "planner/job/job_loader.hpp"

#include <catch2/catch.hpp>

#include "tests/planner/test_files.hpp"

namespace tw::planner {
namespace {

// mm and deg converted once: rounding near 1e-16.
constexpr double kExact = 1e-12;

/// A valid job; its point list is written as `<prefix>_seam.csv`, so that
/// test cases run in parallel by ctest never share a file.
std::string validJob(const std::string& prefix) {
  test::writeTestFile(
      prefix + "_seam.csv",
      "x_mm,y_mm,z_mm,nx,ny,nz,n2x,n2y,n2z\n10,8,8,0,0,1,0,1,0\n140,8,8,0,0,1,0,1,0\n");
  return R"(<?xml version="1.0"?>
<job format-version="1" name="test-job" length-unit="mm" angle-unit="deg" time-unit="s">
  <cell file=")" +
         test::sourcePath("samples/cells/bracket_weld_cell.xml") + R"("/>
  <seam name="a" points=")" +
         prefix + R"(_seam.csv" frame="bracket" tool="torch" speed="12" approach="25" step="3"
        parameter-set="fillet 4 mm">
    <weld work-angle="40" travel-angle="12" tilt="drag" contact-tip-distance="16"/>
  </seam>
  <seam name="b" points=")" +
         prefix + R"(_seam.csv" frame="bracket" tool="torch" speed="30" corner-angle="30"
        direction="reversed">
    <dispense stand-off="4"/>
  </seam>
  <patch name="c" frame="table-top" tool="torch" speed="400" step="40">
    <outline normal="0 0 2" pass-direction="0 1 0">
      <corner xyz="0 0 0"/>
      <corner xyz="300 0 0"/>
      <corner xyz="300 200 0"/>
    </outline>
    <paint stand-off="180" spray-width="150" overlap="40" turnaround-acceleration="4000"/>
  </patch>
  <transit joint-speed="30" clearance="15" time-limit="2" seed="99"/>
  <outputs directory="out">
    <output writer="motion-text" file="a.twm"/>
    <output writer="joint-table" file="a.csv"/>
    <output writer="template" file="a.txt" template="../templates/card.twt"/>
  </outputs>
</job>
)";
}

TEST_CASE("A job file loads its cell, seams, patches, transit and outputs in SI",
          "[planner][job]") {
  const std::string path = test::writeTestFile("valid_job.xml", validJob("valid"));
  const Job job = loadJob(path);
  CHECK(job.name == "test-job");
  CHECK(job.cell.name == "bracket-weld-cell");
  REQUIRE(job.tasks.size() == 3);

  const SeamSpec& a = std::get<SeamSpec>(job.tasks[0]);
  CHECK(a.frame == "bracket");
  CHECK(a.points.points.size() == 2);
  CHECK(a.speed == Approx(0.012).margin(kExact));
  CHECK(a.approach == Approx(0.025).margin(kExact));
  CHECK(a.retract == Approx(0.030).margin(kExact));  // default
  CHECK(a.sampling.step == Approx(0.003).margin(kExact));
  CHECK(a.parameter_set == "fillet 4 mm");
  CHECK(std::get<SeamSpec>(job.tasks[1]).parameter_set.empty());  // default: the process kind
  const WeldParameters& weld = std::get<WeldParameters>(a.process);
  CHECK(*weld.work_angle == Approx(40.0 * kPi / 180.0).margin(kExact));
  CHECK(weld.travel_angle == Approx(12.0 * kPi / 180.0).margin(kExact));
  CHECK(weld.tilt == TravelTilt::kDrag);
  CHECK(weld.contact_tip_distance == Approx(0.016).margin(kExact));

  const SeamSpec& b = std::get<SeamSpec>(job.tasks[1]);
  CHECK(kindOf(b.process) == ProcessKind::kDispense);
  CHECK(std::get<DispenseParameters>(b.process).stand_off == Approx(0.004).margin(kExact));
  // direction="reversed": worked from the file's last point to its first.
  CHECK(b.reversed);
  CHECK(b.points.points.front().p_XP.x() == Approx(0.140).margin(kExact));
  CHECK(b.points.points.front().line == 3);
  CHECK_FALSE(a.reversed);
  CHECK(b.sampling.corner_angle == Approx(30.0 * kPi / 180.0).margin(kExact));

  const PatchSpec& c = std::get<PatchSpec>(job.tasks[2]);
  CHECK(c.patch.normal == Eigen::Vector3d::UnitZ());
  CHECK(c.patch.outline.size() == 3);
  CHECK(c.raster.spray_width == Approx(0.150).margin(kExact));
  CHECK(c.raster.overlap == Approx(0.4).margin(kExact));
  // lead = w/2 + v²/(2a) = 75 mm + 0.4²/(2·4) m = 95 mm (domain-facts §2, computed).
  CHECK(c.raster.lead == Approx(0.095).margin(kExact));

  CHECK(job.transit.joint_speed_fraction == Approx(0.3).margin(kExact));
  CHECK(job.transit.clearance == Approx(0.015).margin(kExact));
  CHECK(job.transit.time_limit == 2.0);
  CHECK(job.transit.seed == 99u);
  REQUIRE(job.outputs.size() == 3);
  CHECK(job.outputs[1].writer == "joint-table");
  CHECK(job.outputs[1].path == std::string(TW_TEST_OUTPUT_DIR) + "/out/a.csv");
  CHECK(job.outputs[1].template_path.empty());
  // The template is found from the job file's folder, like every input.
  CHECK(job.outputs[2].template_path == std::string(TW_TEST_OUTPUT_DIR) + "/../templates/card.twt");
}

TEST_CASE("Every malformed job element is a located error", "[planner][job][errors]") {
  const std::vector<test::BadInput> cases = {
      {"unknown frame", R"(frame="bracket" tool="torch" speed="12")",
       R"(frame="brackett" tool="torch" speed="12")", R"(<seam name="a")",
       "unknown frame 'brackett'"},
      {"unknown tool", R"(tool="torch" speed="30")", R"(tool="nozzle" speed="30")",
       R"(<seam name="b")", "unknown tool 'nozzle'"},
      {"missing speed", R"( speed="30")", "", R"(<seam name="b")", "missing attribute 'speed'"},
      {"zero speed", R"(speed="400")", R"(speed="0")", "<patch", "speed must be greater than 0"},
      {"two processes", R"(<dispense stand-off="4"/>)", R"(<dispense stand-off="4"/>
    <paint/>)",
       "<paint/>", "exactly one process element"},
      {"no process", R"(<dispense stand-off="4"/>)", "", R"(<seam name="b")",
       "exactly one process element"},
      {"unknown process", R"(<dispense stand-off="4"/>)", R"(<glue/>)", "<glue", "unknown element"},
      {"dispense without stand-off", R"(<dispense stand-off="4"/>)", R"(<dispense/>)", "<dispense",
       "missing attribute 'stand-off'"},
      {"travel angle too large", R"(travel-angle="12")", R"(travel-angle="50")", "<weld",
       "travel-angle must be from 0 to 45"},
      {"bad tilt", R"(tilt="drag")", R"(tilt="pull")", "<weld", "expected one of: push, drag"},
      {"non-finite work angle", R"(work-angle="40")", R"(work-angle="inf")", "<weld",
       "not a finite number"},
      {"repeated name", R"(<seam name="b")", R"(<seam name="a")", R"(speed="30")", "already used"},
      {"both fan widths", R"(spray-width="150")", R"(spray-width="150" fan-half-angle="30")",
       "<paint", "exactly one of spray-width"},
      {"overlap of 100 %", R"(overlap="40")", R"(overlap="100")", "<paint", "overlap must be"},
      {"corner off the plane", R"(<corner xyz="300 200 0"/>)",
       R"(<corner xyz="300 200 0"/><corner xyz="0 200 5"/>)", "<outline", "one plane"},
      {"normal in the plane", R"(normal="0 0 2")", R"(normal="1 0 0")", "<outline",
       "not perpendicular"},
      {"joint speed over 100 %", R"(joint-speed="30")", R"(joint-speed="130")", "<transit",
       "joint-speed must be"},
      {"bad direction", R"(direction="reversed")", R"(direction="backwards")",
       R"(<seam name="b")", "expected one of: as-listed, reversed"},
      {"fractional seed", R"(seed="99")", R"(seed="9.5")", "<transit", "whole number"},
      {"repeated output file", R"(file="a.csv")", R"(file="a.twm")", R"(writer="joint-table")",
       "already written"},
      {"template writer without its template", R"( template="../templates/card.twt")", "",
       R"(writer="template")", "needs template="},
      {"template on another writer", R"(writer="template")", R"(writer="summary")",
       R"(file="a.txt")", "only for writer=\"template\""},
      {"empty parameter set", R"(parameter-set="fillet 4 mm")", R"(parameter-set="")",
       R"(<seam name="a")", "parameter-set must not be empty"},
      {"wrong time unit", R"(time-unit="s")", R"(time-unit="ms")", "<job", "time-unit must be"},
      {"unknown frame name via typo in patch", R"(frame="table-top")", R"(frame="tabletop")",
       "<patch", "unknown frame 'tabletop'"},
  };
  test::checkBadInputs(
      cases, [] { return validJob("bad"); }, "bad_job.xml",
      [](const std::string& path) { loadJob(path); });
}

TEST_CASE("Point list problems found through a job name the point list", "[planner][job][errors]") {
  SECTION("a missing point list") {
    const std::string text = test::replaced(
        validJob("missing"), R"(points="missing_seam.csv" frame="bracket" tool="torch" speed="30")",
        R"(points="missing.csv" frame="bracket" tool="torch" speed="30")");
    const std::string path = test::writeTestFile("missing_csv_job.xml", text);
    CHECK_THROWS_WITH(loadJob(path), Catch::Contains("missing.csv: cannot open"));
  }
  SECTION("a malformed row, with its line in the point list") {
    const std::string csv =
        test::writeTestFile("bad_rows.csv", "x_mm,y_mm,z_mm,nx,ny,nz\n0,0,0,0,0,1\n1,0,0,0,0,0\n");
    const std::string text = test::replaced(
        validJob("rows"), R"(points="rows_seam.csv" frame="bracket" tool="torch" speed="12")",
        R"(points="bad_rows.csv" frame="bracket" tool="torch" speed="12")");
    const std::string path = test::writeTestFile("bad_rows_job.xml", text);
    CHECK_THROWS_WITH(loadJob(path), Catch::StartsWith(csv + ":3: the surface normal"));
  }
  SECTION("a job without work") {
    const std::string path = test::writeTestFile(
        "empty_job.xml",
        R"(<job format-version="1" name="e" length-unit="mm" angle-unit="deg" time-unit="s">
  <cell file=")" +
            test::sourcePath("samples/cells/bracket_weld_cell.xml") + R"("/>
</job>
)");
    CHECK_THROWS_WITH(loadJob(path), Catch::StartsWith(path + ":1: <job>: expected at least one"));
  }
}

}  // namespace
}  // namespace tw::planner
