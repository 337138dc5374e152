#include "postproc/report/report_geometry.hpp"

#include "collision/mesh_loader.hpp"
#include "collision/tessellation.hpp"

namespace tw::postproc {
namespace {

// Divisions around a primitive's axis: enough for a recognisable outline in
// a drawing, few enough to keep the page small.
constexpr int kDrawingSegments = 16;

}  // namespace

ReportCell reportCellOf(const planner::Cell& cell, const planner::Program& program) {
  ReportCell report;
  for (const planner::ProgramRecord& record : program.records) {
    if (const planner::MotionRecord* motion = std::get_if<planner::MotionRecord>(&record)) {
      report.X_CR.emplace(motion->frame, cell.frames.X_W(motion->frame));
    }
  }
  report.X_CB = cell.frames.X_W(cell.arm_frame);
  for (const planner::CellBody& body : cell.bodies) {
    postproc::ReportBody drawn;
    drawn.name = body.name;
    const Eigen::Isometry3d& X_WF = cell.frames.X_W(body.frame);
    for (const kinematics::LinkShape& shape : body.shapes) {
      const collision::TriangleMesh mesh = shape.kind == kinematics::LinkShape::Kind::kMesh
                                               ? collision::loadMesh(shape.mesh_path, shape.mesh_scale)
                                               : collision::tessellateShape(shape, kDrawingSegments);
      // Primitives are tessellated about their own frame; loaded meshes are
      // in their file's frame; both are posed by X_LS in the body's frame.
      const Eigen::Isometry3d X_WS = X_WF * shape.X_LS;
      for (const std::array<int, 3>& triangle : mesh.triangles) {
        drawn.triangles_C.push_back({X_WS * mesh.vertices[triangle[0]], X_WS * mesh.vertices[triangle[1]],
                                     X_WS * mesh.vertices[triangle[2]]});
      }
    }
    report.bodies.push_back(std::move(drawn));
  }
  return report;
}

}  // namespace tw::postproc
