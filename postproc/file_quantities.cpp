#include "postproc/file_quantities.hpp"

#include <cmath>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/number_text.hpp"

namespace tw::postproc {

std::string QuantityFormat::format(double si_value) const {
  return formatFixed(si_value * scale, decimals);
}

const QuantityFormat& FileQuantities::joint(kinematics::JointType type) const {
  return type == kinematics::JointType::kRevolute ? angle : length;
}

FileQuantities fileQuantities(const planner::FileUnits& units) {
  const bool mm = units.length == planner::LengthUnit::kMillimetre;
  const bool deg = units.angle == planner::AngleUnit::kDegree;
  const std::string length_unit = toString(units.length);
  FileQuantities quantities;
  quantities.length = {mm ? 1000.0 : 1.0, length_unit, mm ? 3 : 6};
  quantities.angle = {deg ? 180.0 / kPi : 1.0, toString(units.angle), deg ? 4 : 6};
  quantities.time = {1.0, "s", 4};
  quantities.speed = {quantities.length.scale, length_unit + "/s", mm ? 3 : 6};
  quantities.quaternion = {1.0, "", 9};
  quantities.fraction = {1.0, "", 4};
  return quantities;
}

}  // namespace tw::postproc
