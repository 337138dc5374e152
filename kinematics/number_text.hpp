#pragma once

#include <optional>
#include <string_view>

namespace tw::kinematics {

/// Parses a decimal number written in the C locale ("-12.5", "1e-3"), with
/// optional surrounding spaces and nothing else. Returns nullopt for empty
/// text, trailing characters, or a value that is not finite (inf, nan,
/// overflow). Locale-independent, so files read the same everywhere.
std::optional<double> parseNumber(std::string_view text);

}  // namespace tw::kinematics
