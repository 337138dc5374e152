#include "postproc/fixed_number.hpp"

#include <array>
#include <charconv>

namespace tw::postproc {

std::string formatFixed(double value, int decimals) {
  // Enough for 1e300 in fixed notation plus 17 decimals.
  std::array<char, 340> buffer{};
  const std::to_chars_result result = std::to_chars(
      buffer.data(), buffer.data() + buffer.size(), value, std::chars_format::fixed, decimals);
  std::string text(buffer.data(), result.ptr);
  if (!text.empty() && text.front() == '-' &&
      text.find_first_not_of("-0.") == std::string::npos) {
    text.erase(0, 1);
  }
  return text;
}

}  // namespace tw::postproc
