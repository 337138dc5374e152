#include "kinematics/common/angles.hpp"
#include "planner/cell/frame_tree.hpp"

#include <Eigen/Geometry>
#include <catch2/catch.hpp>
#include <random>

#include "kinematics/common/input_error.hpp"

namespace tw::planner {
namespace {

// Products of a few rotations and translations of ~1 m: rounding stays near 1e-15.
constexpr double kExact = 1e-12;

Eigen::Isometry3d pose(const Eigen::Vector3d& xyz, double angle, const Eigen::Vector3d& axis) {
  Eigen::Isometry3d X = Eigen::Isometry3d::Identity();
  X.translation() = xyz;
  X.linear() = Eigen::AngleAxisd(angle, axis.normalized()).toRotationMatrix();
  return X;
}

int errorLine(const std::vector<FrameDefinition>& definitions) {
  try {
    FrameTree tree(definitions, "cell.xml");
  } catch (const InputError& error) {
    CHECK(error.file() == "cell.xml");
    return error.line();
  }
  FAIL("expected an InputError");
  return 0;
}

TEST_CASE("Frames compose from parent to child and invert", "[planner][frames]") {
  const Eigen::Isometry3d X_WT = pose({1.0, 0.0, 0.0}, kPi / 2, Eigen::Vector3d::UnitZ());
  const Eigen::Isometry3d X_TF = pose({0.1, 0.2, 0.4}, 0.3, Eigen::Vector3d(1, 1, 0));
  // Defined child first: the order in the file must not matter.
  const FrameTree tree({{"fixture", "table", X_TF, 3}, {"table", "world", X_WT, 2}}, "cell.xml");

  SECTION("a point given in the fixture frame lands at X_WT·X_TF·p in the world") {
    const Eigen::Vector3d p_FQ(0.05, -0.02, 0.01);
    // Hand composition: rotate by 90° about z then shift 1 m along x (common practice, no source).
    const Eigen::Vector3d p_TQ = X_TF * p_FQ;
    const Eigen::Vector3d expected(1.0 - p_TQ.y(), p_TQ.x(), p_TQ.z());
    CHECK((tree.X_W("fixture") * p_FQ - expected).norm() < kExact);
  }
  SECTION("relative poses are the inverse of each other") {
    const Eigen::Isometry3d X_FT = tree.relative("fixture", "table");
    CHECK((X_FT.matrix() - X_TF.inverse().matrix()).norm() < kExact);
    CHECK(
        ((tree.relative("table", "fixture") * X_FT).matrix() - Eigen::Matrix4d::Identity()).norm() <
        kExact);
    CHECK((tree.relative("world", "fixture").matrix() - (X_WT * X_TF).matrix()).norm() < kExact);
  }
  SECTION("names are sorted and include world") {
    CHECK(tree.names() == std::vector<std::string>{"fixture", "table", "world"});
    CHECK(tree.parent("fixture") == "table");
  }
}

TEST_CASE("Moving a fixture frame carries the points given in it", "[planner][frames]") {
  FrameTree tree({{"table", "world", pose({1.0, 0.0, 0.4}, 0.0, Eigen::Vector3d::UnitZ()), 1},
                  {"fixture", "table", pose({0.2, 0.1, 0.0}, 0.0, Eigen::Vector3d::UnitZ()), 2}},
                 "cell.xml");
  const Eigen::Vector3d p_FQ(0.1, 0.0, 0.05);
  // Before the move: plain translation sums (common practice, no source).
  CHECK((tree.X_W("fixture") * p_FQ - Eigen::Vector3d(1.3, 0.1, 0.45)).norm() < kExact);

  SECTION("a known move of the fixture (translate, then rotate 30° about z)") {
    const Eigen::Isometry3d X_TF_moved = pose({0.25, 0.05, 0.0}, kPi / 6, Eigen::Vector3d::UnitZ());
    tree.setPoseInParent("fixture", X_TF_moved);
    // Rz(30°)·(0.1, 0, 0.05) = (0.1·cos30°, 0.1·sin30°, 0.05), then + (1.25, 0.05, 0.4).
    const Eigen::Vector3d expected(1.25 + 0.1 * std::cos(kPi / 6), 0.05 + 0.1 * std::sin(kPi / 6),
                                   0.45);
    CHECK((tree.X_W("fixture") * p_FQ - expected).norm() < kExact);
  }
  SECTION("moving the parent moves the child too") {
    tree.setPoseInParent("table", pose({1.0, 0.5, 0.4}, 0.0, Eigen::Vector3d::UnitZ()));
    CHECK((tree.X_W("fixture") * p_FQ - Eigen::Vector3d(1.3, 0.6, 0.45)).norm() < kExact);
  }
  SECTION("world cannot be moved and unknown frames are reported") {
    CHECK_THROWS_AS(tree.setPoseInParent("world", Eigen::Isometry3d::Identity()), InputError);
    CHECK_THROWS_WITH(tree.X_W("missing"), Catch::Contains("unknown frame 'missing'"));
  }
}

TEST_CASE("Random frame chains compose like the explicit product", "[planner][frames]") {
  std::mt19937 random(20261201);
  std::uniform_real_distribution<double> unit(-1.0, 1.0);
  for (int trial = 0; trial < 50; ++trial) {
    std::vector<FrameDefinition> definitions;
    Eigen::Isometry3d product = Eigen::Isometry3d::Identity();
    std::string parent = "world";
    for (int depth = 0; depth < 4; ++depth) {
      const Eigen::Isometry3d X =
          pose({unit(random), unit(random), unit(random)}, kPi * unit(random),
               Eigen::Vector3d(unit(random), unit(random), unit(random) + 2.0));
      const std::string name = "f" + std::to_string(depth);
      definitions.push_back({name, parent, X, depth + 1});
      product = product * X;
      parent = name;
    }
    CAPTURE(trial, product.matrix());
    const FrameTree tree(definitions, "random.xml");
    CHECK((tree.X_W("f3").matrix() - product.matrix()).norm() < kExact);
  }
}

TEST_CASE("Bad frame trees are located errors", "[planner][frames][errors]") {
  const Eigen::Isometry3d I = Eigen::Isometry3d::Identity();
  CHECK(errorLine({{"a", "world", I, 4}, {"a", "world", I, 9}}) == 9);
  CHECK(errorLine({{"a", "nowhere", I, 5}}) == 5);
  CHECK(errorLine({{"world", "world", I, 6}}) == 6);
  CHECK(errorLine({{"", "world", I, 7}}) == 7);
  SECTION("a cycle names its frames and the line of the first frame on it") {
    const std::vector<FrameDefinition> cycle = {
        {"ok", "world", I, 2}, {"a", "c", I, 3}, {"b", "a", I, 4}, {"c", "b", I, 5}};
    CHECK(errorLine(cycle) == 3);
    CHECK_THROWS_WITH(FrameTree(cycle, "cell.xml"), Catch::Contains("cycle: a -> c -> b -> a"));
    CHECK(errorLine({{"self", "self", I, 8}}) == 8);
  }
}

}  // namespace
}  // namespace tw::planner
