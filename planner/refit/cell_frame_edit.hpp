#pragma once

#include <Eigen/Geometry>
#include <string>

namespace tw::planner {

/// The text of a cell file with the pose of one `<frame>` replaced and every
/// other byte kept: only the frame's `xyz` attribute and its orientation
/// attribute change (values rewritten in place, or appended to the start tag
/// when the frame had none). The orientation keeps the form the file used:
/// `quaternion="w x y z"` (9 decimals, w ≥ 0) when the frame had one, else
/// `rpy="r p y"` [deg, 6 decimals]; `xyz` is written in mm with 4 decimals
/// (0.1 µm). Numbers are locale-independent.
///
/// `X_PF` is the new pose of frame `frame` in its parent [m]. Throws
/// tw::InputError naming `source` (and the line, where there is one) when
/// the text is not well-formed XML, has no `<frame name="...">` of that name
/// under `<frames>`, or its start tag cannot be found in the text.
std::string cellTextWithFramePose(const std::string& cell_text, const std::string& source,
                                  const std::string& frame, const Eigen::Isometry3d& X_PF);

}  // namespace tw::planner
