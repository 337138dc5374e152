#pragma once

#include <stdexcept>
#include <string>

namespace tw {

/// The project's error for bad input: a file that cannot be read, a value that
/// is missing, malformed or out of range, a broken precondition on user data.
/// It lives in the lowest layer so that every module throws the same type.
///
/// what() reads "file:line: message"; the line is omitted when it is 0
/// (unknown or not applicable) and the file when it is empty.
class InputError : public std::runtime_error {
 public:
  InputError(std::string file, int line, const std::string& message);
  explicit InputError(const std::string& message);

  const std::string& file() const { return file_; }
  int line() const { return line_; }
  /// The message without the file and line prefix.
  const std::string& message() const { return message_; }

 private:
  std::string file_;
  int line_ = 0;
  std::string message_;
};

}  // namespace tw
