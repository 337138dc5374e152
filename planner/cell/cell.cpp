#include "planner/cell/cell.hpp"

namespace tw::planner {

const char* toString(CellBody::Role role) {
  switch (role) {
    case CellBody::Role::kFixture:
      return "fixture";
    case CellBody::Role::kWorkpiece:
      return "workpiece";
    case CellBody::Role::kObstacle:
      return "obstacle";
  }
  return "unknown";
}

const Tool* Cell::findTool(const std::string& name) const {
  for (const Tool& tool : tools) {
    if (tool.name == name) return &tool;
  }
  return nullptr;
}

}  // namespace tw::planner
