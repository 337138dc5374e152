#include "planner/toolpath/weld_tool_poses.hpp"

#include <cmath>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"
#include "planner/toolpath/tool_frame.hpp"

namespace tw::planner {
namespace {

// Below this a projected direction has no meaning (sin of about 0.06°).
constexpr double kMinProjected = 1e-3;

Eigen::Vector3d perpendicularTo(const Eigen::Vector3d& v, const Eigen::Vector3d& unit) {
  return v - v.dot(unit) * unit;
}

}  // namespace

Eigen::Isometry3d weldToolPose(const SeamSample& sample, const WeldParameters& weld,
                               const std::string& source) {
  const Eigen::Vector3d& t = sample.tangent;
  const Eigen::Vector3d n1_raw = perpendicularTo(sample.normal, t);
  if (n1_raw.norm() < kMinProjected) {
    throw InputError(source, sample.line,
                     "the surface normal lies along the seam; expected it across the seam");
  }
  const Eigen::Vector3d n1 = n1_raw.normalized();

  // u: in the first face, across the seam, towards the open side.
  Eigen::Vector3d u = n1.cross(t);
  double default_work_angle = 0.5 * kPi;
  std::optional<Eigen::Vector3d> n2;
  if (sample.second_normal) {
    const Eigen::Vector3d n2_raw = perpendicularTo(*sample.second_normal, t);
    const Eigen::Vector3d u_raw = perpendicularTo(n2_raw, n1);
    if (n2_raw.norm() < kMinProjected || u_raw.norm() < kMinProjected) {
      throw InputError(source, sample.line,
                       "the second normal is parallel to the seam or to the first normal; "
                       "expected two faces meeting at the seam");
    }
    n2 = n2_raw.normalized();
    u = u_raw.normalized();
    const Eigen::Vector3d bisector = (n1 + *n2).normalized();
    default_work_angle = std::atan2(bisector.dot(n1), bisector.dot(u));
  }
  const double work_angle = weld.work_angle.value_or(default_work_angle);

  // From the work towards the torch, in the plane perpendicular to t.
  const Eigen::Vector3d back = std::cos(work_angle) * u + std::sin(work_angle) * n1;
  if (n2 && back.dot(*n2) <= 0.0) {
    throw InputError(source, sample.line,
                     "the work angle points the torch into the second face; expected an angle "
                     "smaller than the opening between the two faces");
  }
  const double lean = weld.tilt == TravelTilt::kPush ? weld.travel_angle : -weld.travel_angle;
  const Eigen::Vector3d z = -std::cos(lean) * back + std::sin(lean) * t;
  // x follows from t as long as the lean stays below 90°.
  const std::optional<Eigen::Isometry3d> X_XT =
      toolFrameAlong(sample.p_XP, z, t);
  if (!X_XT) throw InputError(source, sample.line, "the travel angle leaves no travel direction");
  return *X_XT;
}

}  // namespace tw::planner
