#include "planner/refit/reference_points_csv.hpp"

#include <array>
#include <fstream>
#include <optional>
#include <set>

#include "kinematics/common/csv_line.hpp"
#include "kinematics/common/input_error.hpp"
#include "kinematics/common/number_text.hpp"

namespace tw::planner {
namespace {

constexpr double kMmToM = 0.001;
constexpr int kMinPoints = 3;

enum Column { kName, kNx, kNy, kNz, kMx, kMy, kMz, kColumnCount };
constexpr std::array<const char*, kColumnCount> kColumnNames = {
    "point",         "nominal_x_mm",  "nominal_y_mm", "nominal_z_mm",
    "measured_x_mm", "measured_y_mm", "measured_z_mm"};

std::array<std::size_t, kColumnCount> headerColumns(const std::vector<std::string>& header,
                                                    const std::string& source, int line) {
  std::array<std::optional<std::size_t>, kColumnCount> found;
  for (std::size_t i = 0; i < header.size(); ++i) {
    int column = -1;
    for (int c = 0; c < kColumnCount; ++c) {
      if (header[i] == kColumnNames[c]) column = c;
    }
    if (column < 0) {
      throw InputError(source, line,
                       "unknown column '" + header[i] +
                           "'; expected exactly the columns point, nominal_x_mm, nominal_y_mm, "
                           "nominal_z_mm, measured_x_mm, measured_y_mm, measured_z_mm");
    }
    if (found[column]) {
      throw InputError(source, line, "column '" + header[i] + "' appears twice in the header");
    }
    found[column] = i;
  }
  std::array<std::size_t, kColumnCount> index{};
  for (int c = 0; c < kColumnCount; ++c) {
    if (!found[c]) {
      throw InputError(source, line,
                       std::string("the header lacks the column '") + kColumnNames[c] + "'");
    }
    index[c] = *found[c];
  }
  return index;
}

}  // namespace

ReferencePointList parseReferencePointsCsv(std::istream& input, const std::string& source) {
  ReferencePointList list;
  list.source = source;
  std::optional<std::array<std::size_t, kColumnCount>> columns;
  std::size_t field_count = 0;
  std::set<std::string> names;
  std::string text;
  int line = 0;
  while (std::getline(input, text)) {
    ++line;
    if (isCsvCommentOrBlank(text)) continue;
    const std::vector<std::string> fields = csvFields(text);
    if (!columns) {
      columns = headerColumns(fields, source, line);
      field_count = fields.size();
      continue;
    }
    if (fields.size() != field_count) {
      throw InputError(source, line,
                       "expected " + std::to_string(field_count) +
                           " comma-separated fields as in the header, found " +
                           std::to_string(fields.size()));
    }
    ReferencePoint point;
    point.line = line;
    point.name = fields[(*columns)[kName]];
    if (point.name.empty()) throw InputError(source, line, "the point name is empty");
    if (!names.insert(point.name).second) {
      throw InputError(source, line, "point '" + point.name + "' is listed twice");
    }
    std::array<double, kColumnCount> value{};
    for (int c = kNx; c < kColumnCount; ++c) {
      const std::optional<double> number = parseNumber(fields[(*columns)[c]]);
      if (!number) {
        throw InputError(source, line,
                         std::string("column '") + kColumnNames[c] + "': \"" +
                             fields[(*columns)[c]] + "\" is not a finite number");
      }
      value[c] = *number;
    }
    point.p_N = kMmToM * Eigen::Vector3d(value[kNx], value[kNy], value[kNz]);
    point.p_M = kMmToM * Eigen::Vector3d(value[kMx], value[kMy], value[kMz]);
    list.points.push_back(point);
  }
  if (!columns) throw InputError(source, line, "no header row; expected the column names");
  if (static_cast<int>(list.points.size()) < kMinPoints) {
    throw InputError(source, line,
                     "a refit needs at least 3 reference points (4 or more to check the fit), "
                     "found " +
                         std::to_string(list.points.size()));
  }
  return list;
}

ReferencePointList loadReferencePointsCsv(const std::string& path) {
  std::ifstream input(path);
  if (!input) {
    throw InputError(path, 0, "cannot open the reference point list (missing or unreadable)");
  }
  return parseReferencePointsCsv(input, path);
}

}  // namespace tw::planner
