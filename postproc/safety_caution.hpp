#pragma once

#include <string>
#include <vector>

#include "planner/program/program.hpp"

namespace tw::postproc {

/// Reduced-speed limit at the TCP [m/s]: 250 mm/s (ISO 10218-1, §5.6 in the
/// 2011 edition, clause number from memory).
inline constexpr double kReducedSpeedLimit = 0.250;

/// The caution every generated program carries, one line of text per entry
/// without any comment prefix: verify in simulation, first run at reduced
/// speed, collision freedom only for the cell model, the integrator's risk
/// assessment and local codes take precedence. When motions of `program`
/// are faster than kReducedSpeedLimit, a further line says how many and
/// that they cannot be verified at reduced speed without scaling.
std::vector<std::string> safetyCaution(const planner::Program& program);

}  // namespace tw::postproc
