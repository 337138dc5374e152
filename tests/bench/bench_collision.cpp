// Collision world speed on one core: full state checks (FK, body pose
// updates, arm and tool against the cell, self pairs) of an arm with about
// 12,000 triangles of link and tool meshes against a cell of about 50,000
// triangles in five objects, clearance queries and segment checks, over
// random states. The geometry is invented and generated here.
//
// Bar (../shared/DESIGN.md): at least 50,000 state checks per second. The
// state benchmark also reports its speed against a reference measured in
// the same run: every arm–cell piece pair tested with fcl::collide directly
// (no broad phase, no margin), and the share of time spent in FK, in pose
// updates plus broad phase, and in the narrow phase.

#include <benchmark/benchmark.h>

#include <fcl/narrowphase/collision.h>

#include <ctime>
#include <filesystem>
#include <random>

#include "collision/collision_world.hpp"
#include "collision/fcl_geometry.hpp"
#include "collision/mesh_loader.hpp"
#include "collision/tessellation.hpp"
#include "kinematics/arm_loader.hpp"
#include "kinematics/forward_kinematics.hpp"
#include "tests/collision/mesh_files.hpp"

namespace tw::collision {
namespace {

using kinematics::LinkShape;

constexpr int kStateCount = 2048;

LinkShape capsuleAt(double radius, double length, const Eigen::Isometry3d& X_WS) {
  LinkShape shape;
  shape.kind = LinkShape::Kind::kCapsule;
  shape.radius = radius;
  shape.length = length;
  shape.X_LS = X_WS;
  return shape;
}

Eigen::Isometry3d placed(double x, double y, double z, const Eigen::Vector3d& axis = {0, 0, 1}) {
  Eigen::Isometry3d X = Eigen::Isometry3d::Identity();
  X.linear() = Eigen::Quaterniond::FromTwoVectors(Eigen::Vector3d::UnitZ(), axis).toRotationMatrix();
  X.translation() = Eigen::Vector3d(x, y, z);
  return X;
}

/// The demo arm, the generated meshes and the world built from them.
struct BenchCell {
  BenchCell()
      : folder(std::filesystem::temp_directory_path() / "tracewright_collision_bench"),
        arm(meshArm()),
        description(cellDescription()),
        world(arm, description) {
    std::mt19937 random(7);
    for (int i = 0; i < kStateCount; ++i) {
      kinematics::JointVector q(arm.jointCount());
      for (int j = 0; j < arm.jointCount(); ++j) {
        q[j] = std::uniform_real_distribution<double>(arm.lowerLimits()[j],
                                                      arm.upperLimits()[j])(random);
      }
      states.push_back(q);
    }
  }

  /// Writes the shape as a binary STL in mm and returns a mesh shape for it.
  LinkShape meshed(const LinkShape& shape, int segments, const std::string& name,
                   int& triangles) {
    std::filesystem::create_directories(folder);
    const TriangleMesh mesh = tessellateShape(shape, segments);
    triangles += static_cast<int>(mesh.triangles.size());
    const std::string path = (folder / (name + ".stl")).string();
    test::writeBinaryStl(path, mesh);
    LinkShape result;
    result.kind = LinkShape::Kind::kMesh;
    result.mesh_path = path;
    result.mesh_scale = 0.001;
    result.X_LS = shape.X_LS;
    return result;
  }

  /// The sample arm's kinematics with link geometry of the bench's own,
  /// shaped so that links two apart do not overlap at the elbow or wrist in
  /// every pose (the sample's simpler shapes do), then meshed.
  kinematics::ArmModel meshArm() {
    const kinematics::ArmModel sample = kinematics::loadArmDescription(
        std::string(TW_SOURCE_DIR) + "/samples/arms/weld_arm_1400.xml");
    kinematics::ArmDescription description;
    description.name = sample.name();
    description.joints = sample.joints();
    description.X_LF = sample.flangeInLastLink();
    description.ortho_parallel = sample.orthoParallel();
    description.links = sample.links();
    const auto primitive = [](LinkShape::Kind kind, double radius, double length,
                              const Eigen::Isometry3d& X_LS) {
      LinkShape shape;
      shape.kind = kind;
      shape.radius = radius;
      shape.length = length;
      shape.X_LS = X_LS;
      return shape;
    };
    LinkShape shoulder;
    shoulder.kind = LinkShape::Kind::kBox;
    shoulder.box_size = Eigen::Vector3d(0.36, 0.33, 0.26);
    shoulder.X_LS = placed(0.07, 0, 0.30);
    const std::vector<std::pair<LinkShape, int>> shapes = {
        {primitive(LinkShape::Kind::kCylinder, 0.2, 0.3, placed(0, 0, 0.15)), 44},
        {shoulder, 0},
        {primitive(LinkShape::Kind::kCapsule, 0.08, 0.61, placed(0, 0, 0.305)), 44},
        {primitive(LinkShape::Kind::kCapsule, 0.09, 0.2, placed(0.06, 0, 0, {1, 0, 0})), 44},
        {primitive(LinkShape::Kind::kCapsule, 0.07, 0.32, placed(0, 0, 0.34)), 44},
        {primitive(LinkShape::Kind::kSphere, 0.07, 0.0, placed(0, 0, 0)), 44},
        {primitive(LinkShape::Kind::kCylinder, 0.045, 0.04, placed(0, 0, 0.075)), 44},
    };
    for (std::size_t link = 0; link < description.links.size(); ++link) {
      description.links[link].shapes = {meshed(shapes[link].first, std::max(3, shapes[link].second),
                                               "link" + std::to_string(link), arm_triangles)};
    }
    return kinematics::ArmModel(std::move(description));
  }

  WorldDescription cellDescription() {
    WorldDescription description;
    ToolDescription torch;
    torch.name = "torch";
    LinkShape body;
    body.kind = LinkShape::Kind::kCylinder;
    body.radius = 0.015;
    body.length = 0.3;
    body.X_LS = placed(0, 0, 0.15);
    torch.shapes = {meshed(body, 32, "torch", arm_triangles)};
    torch.X_FT = placed(0, 0, 0.315);
    description.tool = torch;

    description.fixtures.push_back({"turntable", placed(0.9, -0.6, 0.3)});
    const auto add = [&](const std::string& name, BodyRole role, const std::string& fixture,
                         const LinkShape& shape, int segments) {
      description.bodies.push_back(
          {name, role, fixture, {meshed(shape, segments, name, cell_triangles)}});
    };
    add("rail", BodyRole::kObstacle, "", capsuleAt(0.15, 1.2, placed(1.0, 0, 0.3, {0, 1, 0})), 80);
    add("column", BodyRole::kObstacle, "", capsuleAt(0.12, 1.5, placed(-0.6, 0.9, 0.75)), 72);
    add("fence", BodyRole::kObstacle, "", capsuleAt(0.1, 2.0, placed(0, -1.3, 1.0, {1, 0, 0})), 64);
    add("beam", BodyRole::kObstacle, "", capsuleAt(0.1, 2.0, placed(-0.5, 0, 2.2, {0, 1, 0})), 64);
    LinkShape part;
    part.kind = LinkShape::Kind::kSphere;
    part.radius = 0.25;
    part.X_LS = placed(0, 0, 0.3);
    add("part", BodyRole::kWorkpiece, "turntable", part, 100);
    return description;
  }

  std::filesystem::path folder;
  int arm_triangles = 0;
  int cell_triangles = 0;
  kinematics::ArmModel arm;
  WorldDescription description;
  CollisionWorld world;
  std::vector<kinematics::JointVector> states;
};

BenchCell& cell() {
  static BenchCell instance;
  return instance;
}

double threadSeconds() {
  timespec now{};
  clock_gettime(CLOCK_THREAD_CPUTIME_ID, &now);
  return static_cast<double>(now.tv_sec) + 1e-9 * static_cast<double>(now.tv_nsec);
}

/// CPU time of this thread per state, so that other work on the shared
/// machine does not count.
template <typename Query>
double secondsPerState(Query query) {
  const double start = threadSeconds();
  for (const kinematics::JointVector& q : cell().states) query(q);
  return (threadSeconds() - start) / kStateCount;
}

/// The reference: FK, then every arm and tool piece against every cell piece
/// with fcl::collide, no broad phase and no margin.
struct DirectPairs {
  DirectPairs() {
    const BenchCell& c = cell();
    const auto object = [](const LinkShape& shape) {
      return std::make_unique<fcl::CollisionObjectd>(
          makeMeshGeometry(loadMesh(shape.mesh_path, shape.mesh_scale)));
    };
    for (std::size_t link = 1; link < c.arm.links().size(); ++link) {
      for (const LinkShape& shape : c.arm.links()[link].shapes) {
        moving.push_back(object(shape));
        moving_link.push_back(static_cast<int>(link));
        moving_pose.push_back(shape.X_LS);
      }
    }
    const std::string torch = (c.folder / "torch.stl").string();
    LinkShape torch_shape;
    torch_shape.mesh_path = torch;
    moving.push_back(object(torch_shape));
    moving_link.push_back(c.arm.jointCount());
    moving_pose.push_back(c.arm.flangeInLastLink() * placed(0, 0, 0.15));
    for (const char* name : {"rail", "column", "fence", "beam", "part"}) {
      LinkShape shape;
      shape.mesh_path = (c.folder / (std::string(name) + ".stl")).string();
      fixed.push_back(object(shape));
    }
    const WorldDescription& description = c.description;
    for (std::size_t i = 0; i < fixed.size(); ++i) {
      const CellBody& body = description.bodies[i];
      const Eigen::Isometry3d X_WP =
          body.fixture.empty() ? Eigen::Isometry3d::Identity() : description.fixtures[0].X_WX;
      fixed[i]->setTransform(X_WP * body.shapes[0].X_LS);
      fixed[i]->computeAABB();
    }
  }

  bool collides(const kinematics::JointVector& q) {
    kinematics::computeLinkPoses(cell().arm, q, poses);
    for (std::size_t i = 0; i < moving.size(); ++i) {
      moving[i]->setTransform(poses.X_BL[moving_link[i]] * moving_pose[i]);
    }
    for (const auto& a : moving) {
      for (const auto& b : fixed) {
        fcl::CollisionRequestd request;
        fcl::CollisionResultd result;
        if (fcl::collide(a.get(), b.get(), request, result) > 0) return true;
      }
    }
    return false;
  }

  std::vector<std::unique_ptr<fcl::CollisionObjectd>> moving;
  std::vector<int> moving_link;
  std::vector<Eigen::Isometry3d> moving_pose;
  std::vector<std::unique_ptr<fcl::CollisionObjectd>> fixed;
  kinematics::LinkPoses poses;
};

void BM_state_check(benchmark::State& state) {
  BenchCell& c = cell();
  CollisionWorkspace workspace(c.world);
  int free = 0;
  for (const kinematics::JointVector& q : c.states) free += c.world.checkState(q, workspace).valid();

  std::size_t i = 0;
  for (auto _ : state) {
    benchmark::DoNotOptimize(c.world.checkState(c.states[i], workspace));
    i = (i + 1) % c.states.size();
  }
  state.SetItemsProcessed(state.iterations());

  // Same-run reference and phase shares, each over all states once.
  static DirectPairs direct;
  kinematics::LinkPoses poses;
  const double full = secondsPerState([&](const auto& q) { c.world.checkState(q, workspace); });
  const double fk = secondsPerState([&](const auto& q) { kinematics::computeLinkPoses(c.arm, q, poses); });
  const double broad =
      secondsPerState([&](const auto& q) { c.world.countCandidatePairs(q, workspace); });
  const double reference = secondsPerState([&](const auto& q) { direct.collides(q); });
  state.counters["checks_per_s"] = 1.0 / full;
  state.counters["speedup_vs_direct_pairs"] = reference / full;
  state.counters["share_fk"] = fk / full;
  state.counters["share_pose_and_broad"] = (broad - fk) / full;
  state.counters["share_narrow"] = (full - broad) / full;
  state.counters["free_fraction"] = static_cast<double>(free) / kStateCount;
  state.counters["arm_triangles"] = c.arm_triangles;
  state.counters["cell_triangles"] = c.cell_triangles;
}
BENCHMARK(BM_state_check)->Unit(benchmark::kMicrosecond);

void BM_clearance(benchmark::State& state) {
  BenchCell& c = cell();
  CollisionWorkspace workspace(c.world);
  std::size_t i = 0;
  for (auto _ : state) {
    benchmark::DoNotOptimize(c.world.clearance(c.states[i], workspace));
    i = (i + 1) % c.states.size();
  }
  state.SetItemsProcessed(state.iterations());
  const double check = secondsPerState([&](const auto& q) { c.world.checkState(q, workspace); });
  const double clearance = secondsPerState([&](const auto& q) { c.world.clearance(q, workspace); });
  state.counters["clearance_per_s"] = 1.0 / clearance;
  state.counters["cost_vs_state_check"] = clearance / check;
}
BENCHMARK(BM_clearance)->Unit(benchmark::kMicrosecond);

void BM_segment_check(benchmark::State& state) {
  BenchCell& c = cell();
  CollisionWorkspace workspace(c.world);
  // Segments between consecutive free random states, 0.3 rad per joint at most
  // from their start, like the steps of a transit planner.
  std::vector<std::pair<kinematics::JointVector, kinematics::JointVector>> segments;
  std::mt19937 random(11);
  std::uniform_real_distribution<double> step(-0.3, 0.3);
  for (const kinematics::JointVector& q : c.states) {
    if (!c.world.checkState(q, workspace).valid()) continue;
    kinematics::JointVector end = q;
    for (int j = 0; j < end.size(); ++j) end[j] += step(random);
    segments.emplace_back(q, end);
  }
  std::size_t i = 0;
  long states_checked = 0;
  long valid = 0;
  for (auto _ : state) {
    const SegmentResult result =
        c.world.checkSegment(segments[i].first, segments[i].second, workspace);
    states_checked += result.states_checked;
    valid += result.valid();
    i = (i + 1) % segments.size();
  }
  state.SetItemsProcessed(state.iterations());
  state.counters["states_per_segment"] =
      static_cast<double>(states_checked) / static_cast<double>(state.iterations());
  state.counters["valid_fraction"] =
      static_cast<double>(valid) / static_cast<double>(state.iterations());
}
BENCHMARK(BM_segment_check)->Unit(benchmark::kMicrosecond);

}  // namespace
}  // namespace tw::collision

BENCHMARK_MAIN();
