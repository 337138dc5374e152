#include <catch2/catch.hpp>

#include <cstdint>
#include <cstring>
#include <limits>
#include <random>
#include <string>

#include "collision/mesh_loader.hpp"
#include "kinematics/common/input_error.hpp"
#include "tests/collision/mesh_files.hpp"
#include "tests/test_support/text_damage.hpp"

namespace tw::collision {
namespace {

const std::string kOut = TW_TEST_OUTPUT_DIR;

/// A right-corner tetrahedron with legs 30, 40, 50 mm along x, y, z, its
/// corner at (100, -50, 20) mm, triangles facing outward. Integer mm values
/// are exact in float32, so every format carries the same numbers.
TriangleMesh cornerTetrahedron() {
  TriangleMesh mesh;
  const Eigen::Vector3d corner(0.100, -0.050, 0.020);
  mesh.vertices = {corner, corner + Eigen::Vector3d(0.030, 0, 0),
                   corner + Eigen::Vector3d(0, 0.040, 0), corner + Eigen::Vector3d(0, 0, 0.050)};
  mesh.triangles = {{{0, 2, 1}}, {{0, 1, 3}}, {{0, 3, 2}}, {{1, 2, 3}}};
  return mesh;
}

std::string errorOf(const std::string& path, double scale = 0.001) {
  try {
    loadMesh(path, scale);
  } catch (const InputError& error) {
    return error.what();
  }
  return "no error";
}

std::string binaryStlHeader(std::uint32_t count) {
  std::string bytes(80, ' ');
  for (int i = 0; i < 4; ++i) bytes.push_back(static_cast<char>((count >> (8 * i)) & 0xffu));
  return bytes;
}

TEST_CASE("One solid written as binary STL, ASCII STL, OBJ and PLY loads the same") {
  const TriangleMesh solid = cornerTetrahedron();
  test::writeBinaryStl(kOut + "/tetra_binary.stl", solid);
  test::writeAsciiStl(kOut + "/tetra_ascii.stl", solid);
  test::writeObj(kOut + "/tetra.obj", solid);
  test::writeAsciiPly(kOut + "/tetra.ply", solid);

  for (const char* name : {"tetra_binary.stl", "tetra_ascii.stl", "tetra.obj", "tetra.ply"}) {
    CAPTURE(name);
    const TriangleMesh mesh = loadMesh(kOut + "/" + name, 0.001);
    CHECK(mesh.triangles.size() == 4);
    CHECK(mesh.vertices.size() == 4);
    CHECK(mesh.degenerate_triangles == 0);
    CHECK(mesh.closed);
    const Eigen::AlignedBox3d bounds = meshBounds(mesh);
    // Bounds are the corner and the corner plus the legs (construction above);
    // 1e-12 m: float32 holds these integer mm exactly, only mm→m rounding remains.
    CHECK(bounds.min().isApprox(Eigen::Vector3d(0.100, -0.050, 0.020), 1e-12));
    CHECK((bounds.max() - Eigen::Vector3d(0.130, -0.010, 0.070)).norm() < 1e-12);
    // Volume of a right-corner tetrahedron = a·b·c / 6 (elementary geometry,
    // from memory) = 30·40·50/6 mm³; relative 1e-9 covers double rounding.
    CHECK(meshVolume(mesh) == Approx(0.030 * 0.040 * 0.050 / 6.0).epsilon(1e-9));
  }
}

TEST_CASE("The unit scale converts file units to metres") {
  test::writeBinaryStl(kOut + "/tetra_scale.stl", cornerTetrahedron());
  // Written in mm; read as metres the mesh is 1000 times larger.
  const TriangleMesh mesh = loadMesh(kOut + "/tetra_scale.stl", 1.0);
  CHECK(meshBounds(mesh).max().x() == Approx(130.0).epsilon(1e-12));
}

TEST_CASE("Degenerate triangles are counted and dropped, not fatal") {
  TriangleMesh mesh = cornerTetrahedron();
  // A triangle with a repeated corner and one with three collinear corners.
  mesh.vertices.push_back(0.5 * (mesh.vertices[0] + mesh.vertices[1]));
  mesh.triangles.push_back({{0, 0, 3}});
  mesh.triangles.push_back({{0, 4, 1}});
  test::writeObj(kOut + "/tetra_degenerate.obj", mesh);
  const TriangleMesh loaded = loadMesh(kOut + "/tetra_degenerate.obj", 0.001);
  CHECK(loaded.triangles.size() == 4);
  CHECK(loaded.degenerate_triangles == 2);
  CHECK(loaded.closed);
}

TEST_CASE("Every bad mesh gives an error naming the file and the problem") {
  SECTION("missing file") {
    const std::string path = kOut + "/no_such_mesh.stl";
    const std::string error = errorOf(path);
    CHECK_THAT(error, Catch::Contains(path) && Catch::Contains("cannot open mesh file"));
  }
  SECTION("unsupported format") {
    const std::string path = kOut + "/part.step";
    test::writeText(path, "ISO-10303-21;");
    CHECK_THAT(errorOf(path), Catch::Contains(path) && Catch::Contains("unsupported mesh format"));
  }
  SECTION("not a mesh") {
    const std::string path = kOut + "/garbage.stl";
    test::writeText(path, "this is not a mesh");
    CHECK_THAT(errorOf(path), Catch::Contains(path) && Catch::Contains("cannot read mesh"));
  }
  SECTION("binary STL shorter than its triangle count says") {
    const std::string path = kOut + "/truncated.stl";
    // Header claims 4 triangles (200 bytes) but only 100 bytes follow.
    test::writeText(path, binaryStlHeader(4) + std::string(100, '\0'));
    CHECK_THAT(errorOf(path), Catch::Contains(path) && Catch::Contains("cannot read mesh"));
  }
  SECTION("binary STL with no triangles") {
    const std::string path = kOut + "/empty.stl";
    test::writeText(path, binaryStlHeader(0));
    CHECK_THAT(errorOf(path), Catch::Contains(path) && Catch::Contains("empty"));
  }
  SECTION("OBJ with vertices but no faces") {
    const std::string path = kOut + "/no_faces.obj";
    test::writeText(path, "v 0 0 0\nv 1 0 0\nv 0 1 0\n");
    CHECK_THAT(errorOf(path), Catch::Contains(path) && Catch::Contains("empty"));
  }
  SECTION("mesh whose only triangle has no area") {
    const std::string path = kOut + "/flat.obj";
    test::writeText(path, "v 0 0 0\nv 1 0 0\nv 2 0 0\nf 1 2 3\n");
    CHECK_THAT(errorOf(path), Catch::Contains(path) && Catch::Contains("empty") &&
                                  Catch::Contains("no area"));
  }
  SECTION("vertex that is not a finite number") {
    const std::string path = kOut + "/nan_vertex.stl";
    std::string bytes = binaryStlHeader(1);
    const float values[12] = {0, 0, 1, 0, 0, 0, 1, 0, 0, std::numeric_limits<float>::quiet_NaN(),
                              1, 0};
    for (float value : values) {
      char raw[4];
      std::memcpy(raw, &value, 4);
      bytes.append(raw, 4);
    }
    bytes.append(2, '\0');
    test::writeText(path, bytes);
    CHECK_THAT(errorOf(path), Catch::Contains(path) && Catch::Contains("not a finite number"));
  }
  SECTION("non-positive scale") {
    test::writeBinaryStl(kOut + "/tetra_bad_scale.stl", cornerTetrahedron());
    CHECK_THAT(errorOf(kOut + "/tetra_bad_scale.stl", 0.0),
               Catch::Contains("tetra_bad_scale.stl") && Catch::Contains("positive"));
  }
}

TEST_CASE("Randomly damaged OBJ meshes either load or give an error naming the file",
          "[mesh][errors]") {
  const std::string original =
      tw::test::readTextFile(std::string(TW_SOURCE_DIR) + "/samples/cells/meshes/gusset.obj");
  const std::string path = kOut + "/damaged_mesh.obj";
  std::mt19937 random(259);  // fixed seed: the same damage on every run
  int accepted = 0;
  int rejected = 0;
  for (int trial = 0; trial < 500; ++trial) {
    const std::string text = tw::test::damaged(original, tw::test::kObjDamage, random);
    CAPTURE(trial, text);
    test::writeText(path, text);
    try {
      const TriangleMesh mesh = loadMesh(path, 0.001);
      ++accepted;
      // The guarantees of mesh_loader.hpp: triangles, finite vertices, every
      // index naming a vertex, no triangle without area.
      REQUIRE_FALSE(mesh.triangles.empty());
      for (const Eigen::Vector3d& vertex : mesh.vertices) CHECK(vertex.allFinite());
      const int count = static_cast<int>(mesh.vertices.size());
      for (const std::array<int, 3>& triangle : mesh.triangles) {
        for (const int index : triangle) {
          REQUIRE(index >= 0);
          REQUIRE(index < count);
        }
        const Eigen::Vector3d& a = mesh.vertices[triangle[0]];
        CHECK((mesh.vertices[triangle[1]] - a).cross(mesh.vertices[triangle[2]] - a).norm() > 0.0);
      }
    } catch (const InputError& error) {
      ++rejected;
      // The importer reports no line; the error names the file.
      CHECK(error.file() == path);
    }
  }
  // Both outcomes occur, so the loop exercised the error paths and the loader.
  CHECK(accepted > 0);
  CHECK(rejected > 0);
}

}  // namespace
}  // namespace tw::collision
