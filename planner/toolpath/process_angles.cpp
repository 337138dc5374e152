#include "planner/toolpath/process_angles.hpp"

#include <Eigen/Geometry>
#include <cmath>

namespace tw::planner {

double measuredWorkAngle(const Eigen::Vector3d& tool_z, const Eigen::Vector3d& tangent,
                         const Eigen::Vector3d& face_normal) {
  const Eigen::Vector3d away = -(tool_z - tool_z.dot(tangent) * tangent);
  const Eigen::Vector3d normal = face_normal - face_normal.dot(tangent) * tangent;
  // atan2 of the out-of-face and in-face parts stays accurate near 0° and 90°.
  const double out_of_face = away.dot(normal.normalized());
  const double in_face = (away - out_of_face * normal.normalized()).norm();
  return std::atan2(out_of_face, in_face);
}

double measuredTravelAngle(const Eigen::Vector3d& tool_z, const Eigen::Vector3d& tangent) {
  const double along = tool_z.dot(tangent);
  return std::atan2(along, (tool_z - along * tangent).norm());
}

double rawAngleToNormal(const Eigen::Vector3d& tool_z, const Eigen::Vector3d& face_normal) {
  const Eigen::Vector3d away = -tool_z;
  return std::atan2(away.cross(face_normal).norm(), away.dot(face_normal));
}

}  // namespace tw::planner
