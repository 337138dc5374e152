#include "planner/cell/cell_collision_world.hpp"

#include <algorithm>

#include "kinematics/common/input_error.hpp"

namespace tw::planner {

collision::WorldDescription cellWorldDescription(const Cell& cell, const Tool& tool,
                                                 const CellCollisionOptions& options) {
  collision::WorldDescription description;
  description.X_WB = cell.frames.X_W(cell.arm_frame);
  description.clearance_margin = options.clearance_margin;
  description.self_margin = options.self_margin;
  for (const CellBody& body : cell.bodies) {
    collision::CellBody out;
    out.name = body.name;
    out.role = body.role == CellBody::Role::kWorkpiece ? collision::BodyRole::kWorkpiece
                                                       : collision::BodyRole::kObstacle;
    out.shapes = body.shapes;
    if (body.frame != FrameTree::kWorld) {
      out.fixture = body.frame;
      const bool known = std::any_of(
          description.fixtures.begin(), description.fixtures.end(),
          [&](const collision::FixtureFrame& fixture) { return fixture.name == body.frame; });
      if (!known) description.fixtures.push_back({body.frame, cell.frames.X_W(body.frame)});
    }
    description.bodies.push_back(std::move(out));
  }
  collision::ToolDescription tool_description;
  tool_description.name = tool.name;
  tool_description.shapes = tool.shapes;
  tool_description.X_FT = tool.X_FT;
  if (options.contact_length) {
    tool_description.tip_contact = collision::TipContact{*options.contact_length, tool.tip_allowance};
  }
  description.tool = std::move(tool_description);
  return description;
}

collision::CollisionWorld buildCellCollisionWorld(const Cell& cell, const Tool& tool,
                                                  const CellCollisionOptions& options) {
  try {
    return collision::CollisionWorld(cell.arm, cellWorldDescription(cell, tool, options));
  } catch (const InputError& error) {
    throw InputError(cell.source, 0, error.message());
  }
}

}  // namespace tw::planner
