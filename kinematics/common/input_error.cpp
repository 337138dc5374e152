#include "kinematics/common/input_error.hpp"

namespace tw {
namespace {

std::string located(const std::string& file, int line, const std::string& message) {
  std::string text;
  if (!file.empty()) {
    text += file;
    if (line > 0) text += ":" + std::to_string(line);
    text += ": ";
  }
  return text + message;
}

}  // namespace

InputError::InputError(std::string file, int line, const std::string& message)
    : std::runtime_error(located(file, line, message)),
      file_(std::move(file)),
      line_(line),
      message_(message) {}

InputError::InputError(const std::string& message) : InputError("", 0, message) {}

}  // namespace tw
