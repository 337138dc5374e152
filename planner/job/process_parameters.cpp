#include "planner/job/process_parameters.hpp"

namespace tw::planner {

const char* toString(ProcessKind kind) {
  switch (kind) {
    case ProcessKind::kWeld:
      return "weld";
    case ProcessKind::kPaint:
      return "paint";
    case ProcessKind::kDispense:
      return "dispense";
  }
  return "unknown";
}

const char* toString(TravelTilt tilt) {
  switch (tilt) {
    case TravelTilt::kPush:
      return "push";
    case TravelTilt::kDrag:
      return "drag";
  }
  return "unknown";
}

std::optional<double> contactLength(const ProcessParameters& parameters) {
  if (const auto* weld = std::get_if<WeldParameters>(&parameters)) {
    return weld->contact_tip_distance;
  }
  if (const auto* dispense = std::get_if<DispenseParameters>(&parameters)) {
    return dispense->stand_off;
  }
  return std::nullopt;
}

ProcessKind kindOf(const ProcessParameters& parameters) {
  switch (parameters.index()) {
    case 0:
      return ProcessKind::kWeld;
    case 1:
      return ProcessKind::kPaint;
    default:
      return ProcessKind::kDispense;
  }
}

}  // namespace tw::planner
