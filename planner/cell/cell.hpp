#pragma once

#include <string>
#include <vector>

#include "kinematics/arm_model.hpp"
#include "planner/cell/cell_body.hpp"
#include "planner/cell/frame_tree.hpp"
#include "planner/cell/tool.hpp"

namespace tw::planner {

/// A workcell as loaded from a cell file: the arm and where it stands, its
/// tools, the frame tree, the fixed bodies and the home position. SI units.
/// Plain data; share it read-only between threads.
struct Cell {
  std::string name;
  std::string source;  ///< the cell file
  kinematics::ArmModel arm;
  /// Frame in `frames` that the arm base B coincides with: X_WB = frames.X_W(arm_frame).
  std::string arm_frame;
  FrameTree frames;
  std::vector<Tool> tools;       ///< in file order, unique names
  std::vector<CellBody> bodies;  ///< in file order, unique names
  /// Home joint position [rad] or [m], one value per arm joint, within limits.
  kinematics::JointVector home;

  /// The tool called `name`, or nullptr.
  const Tool* findTool(const std::string& name) const;
};

}  // namespace tw::planner
