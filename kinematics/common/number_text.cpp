#include "kinematics/common/number_text.hpp"

#include <array>
#include <charconv>
#include <cmath>
#include <system_error>

namespace tw {

std::optional<double> parseNumber(std::string_view text) {
  const auto is_space = [](char c) { return c == ' ' || c == '\t' || c == '\r' || c == '\n'; };
  while (!text.empty() && is_space(text.front())) text.remove_prefix(1);
  while (!text.empty() && is_space(text.back())) text.remove_suffix(1);
  if (text.empty()) return std::nullopt;
  // from_chars rejects a leading '+', which people do write in files.
  if (text.front() == '+') text.remove_prefix(1);
  double value = 0.0;
  const auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), value);
  if (error != std::errc() || end != text.data() + text.size() || !std::isfinite(value)) {
    return std::nullopt;
  }
  return value;
}

namespace {

std::string toText(double value, std::chars_format format, int precision) {
  // Enough for the largest finite double in fixed notation with 17 decimals.
  std::array<char, 340> buffer{};
  const std::to_chars_result result =
      std::to_chars(buffer.data(), buffer.data() + buffer.size(), value, format, precision);
  std::string text(buffer.data(), result.ptr);
  if (!text.empty() && text.front() == '-' &&
      text.find_first_not_of("-0.") == std::string::npos) {
    text.erase(0, 1);
  }
  return text;
}

}  // namespace

std::string formatFixed(double value, int decimals) {
  return toText(value, std::chars_format::fixed, decimals);
}

std::string formatSignificant(double value, int digits) {
  return toText(value, std::chars_format::general, digits);
}

}  // namespace tw
