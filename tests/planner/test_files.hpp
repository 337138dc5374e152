#pragma once

#include <catch2/catch.hpp>
#include <fstream>
#include <functional>
#include <sstream>
#include <stdexcept>
#include <string>

#include "kinematics/common/input_error.hpp"

namespace tw::planner::test {

/// Writes `text` to TW_TEST_OUTPUT_DIR/name and returns the path.
inline std::string writeTestFile(const std::string& name, const std::string& text) {
  const std::string path = std::string(TW_TEST_OUTPUT_DIR) + "/" + name;
  std::ofstream file(path, std::ios::binary);
  file << text;
  if (!file) throw std::runtime_error("cannot write test file " + path);
  return path;
}

inline std::string readText(const std::string& path) {
  std::ifstream input(path, std::ios::binary);
  if (!input) throw std::runtime_error("cannot read " + path);
  std::ostringstream text;
  text << input.rdbuf();
  return text.str();
}

/// The text of the sample welding cell with its arm and mesh files named by
/// absolute path, so that a copy loads from anywhere.
inline std::string sampleCellText() {
  std::string text = readText(std::string(TW_SOURCE_DIR) + "/samples/cells/bracket_weld_cell.xml");
  const auto make_absolute = [&text](const std::string& from, const std::string& to) {
    const std::size_t at = text.find(from);
    if (at == std::string::npos) throw std::runtime_error("the sample cell lacks " + from);
    text.replace(at, from.size(), to);
  };
  make_absolute("file=\"../arms/weld_arm_1400.xml\"",
                std::string("file=\"") + TW_SOURCE_DIR + "/samples/arms/weld_arm_1400.xml\"");
  make_absolute("file=\"meshes/gusset.obj\"",
                std::string("file=\"") + TW_SOURCE_DIR + "/samples/cells/meshes/gusset.obj\"");
  return text;
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

/// One malformed-input case: `text` with `from` replaced by `to` must fail
/// to load with an InputError naming the file, the line holding `at` and a
/// message containing `message`.
struct BadInput {
  const char* what;
  std::string from;
  std::string to;
  std::string at;
  const char* message;
};

/// Writes each case's text to `file_name` and checks the error `load` raises.
inline void checkBadInputs(const std::vector<BadInput>& cases,
                           const std::function<std::string()>& valid_text,
                           const std::string& file_name,
                           const std::function<void(const std::string&)>& load) {
  REQUIRE_FALSE(cases.empty());
  for (const BadInput& c : cases) {
    CAPTURE(c.what);
    const std::string text = replaced(valid_text(), c.from, c.to);
    const std::string path = writeTestFile(file_name, text);
    try {
      load(path);
      FAIL("expected an InputError");
    } catch (const InputError& error) {
      CHECK(error.file() == path);
      CHECK(error.line() == lineOf(text, c.at));
      CHECK_THAT(error.message(), Catch::Contains(c.message));
    }
  }
}

inline std::string sourcePath(const std::string& relative) {
  return std::string(TW_SOURCE_DIR) + "/" + relative;
}

}  // namespace tw::planner::test
