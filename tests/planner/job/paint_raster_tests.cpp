#include "kinematics/common/angles.hpp"
#include "planner/job/paint_raster.hpp"

#include <catch2/catch.hpp>

namespace tw::planner {
namespace {

// Sums of a few 0.1 m lengths: rounding stays near 1e-16 m.
constexpr double kExact = 1e-12;

RasterParameters spray(double width, double overlap) {
  RasterParameters raster;
  raster.spray_width = width;
  raster.overlap = overlap;
  return raster;
}

PaintPatch rectangle(double width, double height) {
  PaintPatch patch;
  patch.outline = {{0, 0, 0}, {width, 0, 0}, {width, height, 0}, {0, height, 0}};
  return patch;
}

TEST_CASE("Fan width and pass spacing reproduce the reference vector",
          "[planner][paint][reference]") {
  // domain-facts.md §2 [C]: h = 200 mm, φ = 30° → w = 230.9 mm; 50 % overlap
  // → spacing 115.5 mm. Values given to 0.1 mm, checked to half of that.
  const double w = fanWidth(0.200, 30.0 * kPi / 180.0);
  CHECK(w == Approx(0.2309).margin(5e-5));
  CHECK(w * (1.0 - 0.5) == Approx(0.1155).margin(5e-5));
  // domain-facts.md §2 [C + M]: 0.5 m/s at 5 m/s² needs 25 mm to reach speed.
  CHECK(defaultLead(0.0, 0.5, 5.0) == Approx(0.025).margin(kExact));
  CHECK(defaultLead(w, 0.5, 5.0) == Approx(0.5 * w + 0.025).margin(kExact));
}

TEST_CASE("A rectangular patch gets evenly spaced zig-zag passes past both edges",
          "[planner][paint]") {
  RasterParameters raster;
  raster.stand_off = 0.200;
  raster.spray_width = fanWidth(0.200, 30.0 * kPi / 180.0);
  raster.overlap = 0.5;
  raster.lead = defaultLead(raster.spray_width, 0.5, 5.0);
  const double spacing = raster.spray_width * 0.5;
  const std::vector<RasterPass> passes = paintRaster(rectangle(0.6, 0.4), raster);

  // 400 mm across at 115.47 mm: ceil(3.46) + 1 = 5 passes (the rule in paint_raster.hpp).
  REQUIRE(passes.size() == 5);
  // Centred on the patch: the middle pass runs along y = 200 mm.
  CHECK(passes[2].offset == Approx(0.2).margin(kExact));
  for (std::size_t k = 0; k < passes.size(); ++k) {
    const RasterPass& pass = passes[k];
    CAPTURE(k);
    if (k > 0) CHECK(pass.offset - passes[k - 1].offset == Approx(spacing).margin(kExact));
    const double sign = k % 2 == 0 ? 1.0 : -1.0;
    CHECK(pass.direction == Eigen::Vector3d(sign, 0, 0));
    // The fan meets the part at its edges and the lead runs beyond them.
    const double in = sign > 0 ? 0.0 : 0.6;
    const double out = sign > 0 ? 0.6 : 0.0;
    CHECK((pass.edge_in - Eigen::Vector3d(in, pass.offset, 0)).norm() < kExact);
    CHECK((pass.edge_out - Eigen::Vector3d(out, pass.offset, 0)).norm() < kExact);
    CHECK((pass.start - pass.edge_in).dot(pass.direction) == Approx(-raster.lead).margin(kExact));
    CHECK((pass.end - pass.edge_out).dot(pass.direction) == Approx(raster.lead).margin(kExact));
  }
  // The outermost passes sit at or beyond the edges, less than half a spacing out.
  CHECK(passes.front().offset <= 0.0);
  CHECK(passes.front().offset > -0.5 * spacing);
  CHECK(passes.back().offset >= 0.4);
  CHECK(passes.back().offset - 0.4 == Approx(-passes.front().offset).margin(kExact));
}

TEST_CASE("Pass count follows ceil(H / spacing) + 1", "[planner][paint]") {
  RasterParameters raster = spray(0.1, 0.5);  // spacing 50 mm
  // An exact multiple: 200 mm → 4 spacings → 5 passes, the outer ones on the edges.
  const std::vector<RasterPass> exact = paintRaster(rectangle(0.3, 0.2), raster);
  REQUIRE(exact.size() == 5);
  CHECK(exact.front().offset == Approx(0.0).margin(kExact));
  CHECK(exact.back().offset == Approx(0.2).margin(kExact));
  // 201 mm needs one more.
  CHECK(paintRaster(rectangle(0.3, 0.201), raster).size() == 6);
  raster.overlap = 0.0;
  CHECK(paintRaster(rectangle(0.3, 0.2), raster).size() == 3);
}

TEST_CASE("A non-rectangular patch: each pass covers the outline inside its fan band",
          "[planner][paint]") {
  // A right triangle with legs 400 mm (x) and 200 mm (y); passes along x.
  PaintPatch triangle;
  triangle.outline = {{0, 0, 0}, {0.4, 0, 0}, {0, 0.2, 0}};
  const std::vector<RasterPass> passes = paintRaster(triangle, spray(0.1, 0.5));
  REQUIRE(passes.size() == 5);
  for (const RasterPass& pass : passes) {
    CAPTURE(pass.offset);
    // The band's lowest edge y = max(offset − 50 mm, 0) reaches furthest:
    // x = 0.4·(1 − y/0.2) (plane geometry, common practice, no source).
    const double y_low = std::max(pass.offset - 0.05, 0.0);
    const double x_far = 0.4 * (1.0 - y_low / 0.2);
    const double far = std::max(pass.edge_in.x(), pass.edge_out.x());
    const double near = std::min(pass.edge_in.x(), pass.edge_out.x());
    CHECK(far == Approx(x_far).margin(kExact));
    CHECK(near == Approx(0.0).margin(kExact));
  }
}

TEST_CASE("The pass direction may point anywhere in a tilted plane", "[planner][paint]") {
  // The 600 x 400 rectangle turned 90° about x: the plane y = 0 with normal −y.
  PaintPatch patch;
  patch.outline = {{0, 0, 0}, {0.6, 0, 0}, {0.6, 0, 0.4}, {0, 0, 0.4}};
  patch.normal = -Eigen::Vector3d::UnitY();
  patch.pass_direction = Eigen::Vector3d(0, 0, 1);  // passes run vertically
  const std::vector<RasterPass> passes = paintRaster(patch, spray(0.2, 0.5));
  // 600 mm across at 100 mm: 7 passes.
  REQUIRE(passes.size() == 7);
  for (const RasterPass& pass : passes) {
    CHECK(std::abs(pass.direction.z()) == Approx(1.0).margin(kExact));
    CHECK(pass.start.y() == Approx(0.0).margin(kExact));
  }
}

TEST_CASE("Bad patches are reported", "[planner][paint][errors]") {
  PaintPatch patch = rectangle(0.6, 0.4);
  CHECK_FALSE(paintPatchProblem(patch));
  SECTION("two corners") {
    patch.outline.resize(2);
    CHECK_THAT(*paintPatchProblem(patch), Catch::Contains("at least 3 corners"));
  }
  SECTION("a corner off the plane") {
    patch.outline[2].z() = 0.001;
    CHECK_THAT(*paintPatchProblem(patch), Catch::Contains("one plane"));
  }
  SECTION("a normal in the plane") {
    patch.normal = Eigen::Vector3d::UnitX();
    CHECK_THAT(*paintPatchProblem(patch), Catch::Contains("not perpendicular"));
  }
  SECTION("a pass direction along the normal") {
    patch.pass_direction = Eigen::Vector3d::UnitZ();
    CHECK_THAT(*paintPatchProblem(patch), Catch::Contains("pass direction"));
  }
  SECTION("collinear corners") {
    patch.outline = {{0, 0, 0}, {0.1, 0, 0}, {0.2, 0, 0}};
    CHECK_THAT(*paintPatchProblem(patch), Catch::Contains("no area"));
  }
}

}  // namespace
}  // namespace tw::planner
