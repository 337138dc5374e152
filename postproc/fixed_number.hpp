#pragma once

#include <string>

namespace tw::postproc {

/// `value` with exactly `decimals` digits after the point ("-12.500"), in the
/// C locale whatever the process locale, and without a minus sign on a value
/// that rounds to zero, so that equal programs give byte-identical files.
/// Precondition: value is finite, 0 <= decimals <= 17.
std::string formatFixed(double value, int decimals);

}  // namespace tw::postproc
