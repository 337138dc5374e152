#pragma once

#include <string>
#include <string_view>
#include <vector>

namespace tw {

/// The comma-separated fields of one line of a CSV point list (seam points,
/// reference points), each with surrounding blanks (space, tab, CR) removed;
/// a line with k commas has k + 1 fields. No quoting: the project's lists
/// hold names and numbers only.
std::vector<std::string> csvFields(std::string_view line);

/// True for a line that holds only blanks, or whose first non-blank
/// character is '#' (a comment).
bool isCsvCommentOrBlank(std::string_view line);

}  // namespace tw
