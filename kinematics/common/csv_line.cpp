#include "kinematics/common/csv_line.hpp"

namespace tw {
namespace {
constexpr std::string_view kBlanks = " \t\r";
}  // namespace

std::vector<std::string> csvFields(std::string_view line) {
  std::vector<std::string> fields;
  std::size_t begin = 0;
  while (true) {
    const std::size_t comma = line.find(',', begin);
    const std::string_view field =
        line.substr(begin, comma == std::string_view::npos ? std::string_view::npos : comma - begin);
    const std::size_t first = field.find_first_not_of(kBlanks);
    const std::size_t last = field.find_last_not_of(kBlanks);
    fields.emplace_back(first == std::string_view::npos ? std::string_view()
                                                        : field.substr(first, last - first + 1));
    if (comma == std::string_view::npos) return fields;
    begin = comma + 1;
  }
}

bool isCsvCommentOrBlank(std::string_view line) {
  const std::size_t first = line.find_first_not_of(kBlanks);
  return first == std::string_view::npos || line[first] == '#';
}

}  // namespace tw
