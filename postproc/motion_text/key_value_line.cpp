#include "postproc/motion_text/key_value_line.hpp"

#include <set>

#include "kinematics/common/input_error.hpp"

namespace tw::postproc {
namespace {

bool isNameChar(char c, bool allow_dash) {
  return (c >= 'a' && c <= 'z') || (c >= '0' && c <= '9') || c == '_' || (allow_dash && c == '-');
}

}  // namespace

KeyValueLine parseKeyValueLine(std::string_view text, const std::string& file, int line) {
  const auto fail = [&](std::size_t at, const std::string& message) {
    throw InputError(file, line, "column " + std::to_string(at + 1) + ": " + message);
  };
  KeyValueLine result;
  std::size_t at = 0;
  while (at < text.size() && isNameChar(text[at], true)) ++at;
  if (at == 0) fail(0, "expected a keyword of lower-case letters, digits, '_' or '-'");
  result.keyword = std::string(text.substr(0, at));
  std::set<std::string> keys;
  while (at < text.size()) {
    if (text[at] != ' ') fail(at, "expected a space before the next key=value field");
    while (at < text.size() && text[at] == ' ') ++at;
    if (at == text.size()) break;
    KeyValueField field;
    field.column = static_cast<int>(at) + 1;
    const std::size_t key_start = at;
    while (at < text.size() && isNameChar(text[at], false)) ++at;
    if (at == key_start || at == text.size() || text[at] != '=') {
      fail(key_start, "expected key=value with a key of lower-case letters, digits or '_'");
    }
    field.key = std::string(text.substr(key_start, at - key_start));
    if (!keys.insert(field.key).second) fail(key_start, "the key '" + field.key + "' is given twice");
    ++at;  // '='
    if (at < text.size() && text[at] == '"') {
      field.quoted = true;
      ++at;
      bool closed = false;
      while (at < text.size()) {
        const char c = text[at++];
        if (c == '"') {
          closed = true;
          break;
        }
        if (c == '\\') {
          if (at == text.size() || (text[at] != '"' && text[at] != '\\')) {
            fail(at - 1, "expected \\\" or \\\\ after a backslash in quoted text");
          }
          field.value += text[at++];
        } else {
          field.value += c;
        }
      }
      if (!closed) fail(key_start, "the quoted value of '" + field.key + "' has no closing quote");
    } else {
      const std::size_t value_start = at;
      while (at < text.size() && text[at] != ' ') {
        if (text[at] == '"') fail(at, "a bare value may not contain '\"'");
        ++at;
      }
      if (at == value_start) fail(value_start, "the key '" + field.key + "' has an empty value");
      field.value = std::string(text.substr(value_start, at - value_start));
    }
    result.fields.push_back(std::move(field));
  }
  return result;
}

std::string quoteText(const std::string& text) {
  std::string quoted = "\"";
  for (const char c : text) {
    if (c == '"' || c == '\\') quoted += '\\';
    quoted += c;
  }
  return quoted + '"';
}

}  // namespace tw::postproc
