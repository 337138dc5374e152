#pragma once

#include <fstream>
#include <stdexcept>
#include <string>

namespace tw::planner::test {

/// Writes `text` to TW_TEST_OUTPUT_DIR/name and returns the path.
inline std::string writeTestFile(const std::string& name, const std::string& text) {
  const std::string path = std::string(TW_TEST_OUTPUT_DIR) + "/" + name;
  std::ofstream file(path, std::ios::binary);
  file << text;
  if (!file) throw std::runtime_error("cannot write test file " + path);
  return path;
}

/// The 1-based line of the first occurrence of `needle` in `text`.
inline int lineOf(const std::string& text, const std::string& needle) {
  const std::size_t at = text.find(needle);
  if (at == std::string::npos) throw std::runtime_error("test text lacks: " + needle);
  int line = 1;
  for (std::size_t i = 0; i < at; ++i) line += text[i] == '\n';
  return line;
}

/// `text` with the first `from` replaced by `to` (which must be present).
inline std::string replaced(std::string text, const std::string& from, const std::string& to) {
  const std::size_t at = text.find(from);
  if (at == std::string::npos) throw std::runtime_error("test text lacks: " + from);
  return text.replace(at, from.size(), to);
}

inline std::string sourcePath(const std::string& relative) {
  return std::string(TW_SOURCE_DIR) + "/" + relative;
}

}  // namespace tw::planner::test
