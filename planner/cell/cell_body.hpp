#pragma once

#include <string>
#include <vector>

#include "kinematics/link_geometry.hpp"

namespace tw::planner {

/// A fixed body of the cell, as data: the collision module turns these into
/// its world. Shapes are posed in the body's frame (X_LS is read as X_FS,
/// F = `frame`), so moving the frame moves the body.
struct CellBody {
  enum class Role { kFixture, kWorkpiece, kObstacle };
  std::string name;
  Role role = Role::kObstacle;
  std::string frame;
  std::vector<kinematics::LinkShape> shapes;
  int line = 0;  ///< line of the body's element in the cell file
};

const char* toString(CellBody::Role role);

}  // namespace tw::planner
