#include "planner/report_text.hpp"

#include <array>
#include <charconv>

namespace tw::planner {

namespace {
std::string toText(double value, std::chars_format format, int precision) {
  if (value == 0.0) value = 0.0;  // turns -0 into 0
  std::array<char, 64> buffer{};
  const std::to_chars_result result =
      std::to_chars(buffer.data(), buffer.data() + buffer.size(), value, format, precision);
  std::string text(buffer.data(), result.ptr);
  if (text.find_first_not_of("-0.") == std::string::npos && text.front() == '-') text.erase(0, 1);
  return text;
}
}  // namespace

std::string formatDecimal(double value, int decimals) {
  return toText(value, std::chars_format::fixed, decimals);
}

std::string formatJoints(const kinematics::JointVector& q) {
  std::string text = "(";
  for (int j = 0; j < q.size(); ++j) {
    if (j > 0) text += ", ";
    text += toText(q[j], std::chars_format::general, 17);
  }
  return text + ")";
}

std::string describeState(const collision::CollisionWorld& world,
                          const collision::StateResult& state) {
  return world.bodyName(state.body_a) + " against " + world.bodyName(state.body_b) + " (" +
         collision::toString(state.status) + ")";
}

}  // namespace tw::planner
