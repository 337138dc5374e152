#pragma once

#include <optional>
#include <string>
#include <string_view>

namespace tw {

/// Parses a decimal number written in the C locale ("-12.5", "1e-3"), with
/// optional surrounding spaces and nothing else. Returns nullopt for empty
/// text, trailing characters, or a value that is not finite (inf, nan,
/// overflow). Locale-independent, so files read the same everywhere.
std::optional<double> parseNumber(std::string_view text);

/// `value` with exactly `decimals` digits after the point ("-12.500"), in the
/// C locale whatever the process locale, and without a minus sign on a value
/// that rounds to zero, so that equal programs give byte-identical files.
/// Any finite value is written in full (up to 309 digits before the point);
/// inf and nan are written as "inf", "-inf" and "nan". Precondition:
/// 0 <= decimals <= 17.
std::string formatFixed(double value, int decimals);

/// `value` with `digits` significant digits in the shortest of fixed or
/// scientific notation (printf's %g), C locale, never "-0"; 17 digits give a
/// double back exactly, for values pasted into regression tests.
std::string formatSignificant(double value, int digits);

}  // namespace tw
