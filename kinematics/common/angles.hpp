#pragma once

namespace tw {

/// π as a double: the project's one definition (EIGEN_PI is a long double,
/// which would change the rounding of expressions it enters).
inline constexpr double kPi = 3.14159265358979323846;

}  // namespace tw
