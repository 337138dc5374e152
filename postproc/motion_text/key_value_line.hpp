#pragma once

#include <string>
#include <string_view>
#include <vector>

namespace tw::postproc {

struct KeyValueField {
  std::string key;
  std::string value;  ///< unescaped text of a quoted value
  bool quoted = false;
  int column = 1;  ///< 1-based byte column of the key, for messages
};

/// One line of the motion text: a keyword, then `key=value` fields separated
/// by single or repeated spaces. A value is either bare (no space, no '"') or
/// a double-quoted text in which `\"` and `\\` stand for '"' and '\'.
struct KeyValueLine {
  std::string keyword;
  std::vector<KeyValueField> fields;
};

/// Parses `text` (one line without its line end); throws tw::InputError
/// naming `file` and `line` on a malformed keyword, key, value or quote,
/// or a key given twice.
KeyValueLine parseKeyValueLine(std::string_view text, const std::string& file, int line);

/// `text` in double quotes with '"' and '\' escaped, for writing a value.
std::string quoteText(const std::string& text);

}  // namespace tw::postproc
