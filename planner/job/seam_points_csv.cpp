#include "planner/job/seam_points_csv.hpp"

#include <array>
#include <fstream>
#include <map>

#include "kinematics/common/csv_line.hpp"
#include "kinematics/common/input_error.hpp"
#include "kinematics/common/number_text.hpp"

namespace tw::planner {
namespace {

constexpr double kMmToM = 0.001;
// Below this a normal carries no direction; CAD normals are O(1).
constexpr double kMinNormalLength = 1e-9;
// Points closer than this are the same point written twice [m] (1e-6 mm).
constexpr double kSamePoint = 1e-9;

enum Column { kX, kY, kZ, kNx, kNy, kNz, kN2x, kN2y, kN2z, kSpeed, kColumnCount };
constexpr std::array<const char*, kColumnCount> kColumnNames = {
    "x_mm", "y_mm", "z_mm", "nx", "ny", "nz", "n2x", "n2y", "n2z", "speed_mm_s"};

std::string allColumnNames() {
  std::string names;
  for (const char* name : kColumnNames) names += std::string(names.empty() ? "" : ", ") + name;
  return names;
}

/// Column index for each Column, or -1 when the file has no such column.
std::array<int, kColumnCount> readHeader(const std::string& line, const std::string& source,
                                         int line_number) {
  std::array<int, kColumnCount> index;
  index.fill(-1);
  const std::vector<std::string> fields = csvFields(line);
  for (std::size_t i = 0; i < fields.size(); ++i) {
    const std::string& name = fields[i];
    int column = -1;
    for (int c = 0; c < kColumnCount; ++c) {
      if (name == kColumnNames[c]) column = c;
    }
    if (column < 0) {
      throw InputError(
          source, line_number,
          "unknown column '" + name + "' in the header; expected names from: " + allColumnNames());
    }
    if (index[column] >= 0) {
      throw InputError(source, line_number, "column '" + name + "' appears twice in the header");
    }
    index[column] = static_cast<int>(i);
  }
  for (int c = kX; c <= kNz; ++c) {
    if (index[c] < 0) {
      throw InputError(source, line_number,
                       std::string("the header lacks the required column '") + kColumnNames[c] +
                           "' (required: x_mm, y_mm, z_mm, nx, ny, nz)");
    }
  }
  const int second = (index[kN2x] >= 0) + (index[kN2y] >= 0) + (index[kN2z] >= 0);
  if (second != 0 && second != 3) {
    throw InputError(source, line_number, "the second normal needs all of n2x, n2y, n2z");
  }
  return index;
}

Eigen::Vector3d unitNormal(const Eigen::Vector3d& n, const char* which, const std::string& source,
                           int line_number) {
  if (n.norm() < kMinNormalLength) {
    throw InputError(source, line_number,
                     std::string("the ") + which + " has zero length; expected a direction");
  }
  return n.normalized();
}

}  // namespace

SeamPointList parseSeamPointsCsv(std::istream& input, const std::string& source) {
  SeamPointList list;
  list.source = source;
  std::string line;
  int line_number = 0;
  std::optional<std::array<int, kColumnCount>> header;
  std::size_t field_count = 0;
  while (std::getline(input, line)) {
    ++line_number;
    if (isCsvCommentOrBlank(line)) continue;
    if (!header) {
      header = readHeader(line, source, line_number);
      field_count = csvFields(line).size();
      continue;
    }
    const std::vector<std::string> fields = csvFields(line);
    if (fields.size() != field_count) {
      throw InputError(source, line_number,
                       "expected " + std::to_string(field_count) +
                           " comma-separated fields (as in "
                           "the header), found " +
                           std::to_string(fields.size()));
    }
    std::array<double, kColumnCount> value{};
    for (int c = 0; c < kColumnCount; ++c) {
      if ((*header)[c] < 0) continue;
      const std::string& text = fields[(*header)[c]];
      const std::optional<double> number = parseNumber(text);
      if (!number) {
        throw InputError(source, line_number,
                         std::string("column '") + kColumnNames[c] + "': \"" + text +
                             "\" is not a finite number");
      }
      value[c] = *number;
    }
    SeamPoint point;
    point.line = line_number;
    point.p_XP = kMmToM * Eigen::Vector3d(value[kX], value[kY], value[kZ]);
    point.normal = unitNormal(Eigen::Vector3d(value[kNx], value[kNy], value[kNz]),
                              "surface normal (nx, ny, nz)", source, line_number);
    if ((*header)[kN2x] >= 0) {
      point.second_normal = unitNormal(Eigen::Vector3d(value[kN2x], value[kN2y], value[kN2z]),
                                       "second normal (n2x, n2y, n2z)", source, line_number);
    }
    if ((*header)[kSpeed] >= 0) {
      if (value[kSpeed] <= 0.0) {
        throw InputError(source, line_number, "speed_mm_s must be greater than 0");
      }
      point.speed = kMmToM * value[kSpeed];
    }
    if (!list.points.empty() && (point.p_XP - list.points.back().p_XP).norm() < kSamePoint) {
      throw InputError(source, line_number,
                       "this point repeats the one on line " +
                           std::to_string(list.points.back().line) +
                           "; consecutive points must differ");
    }
    list.points.push_back(point);
  }
  if (!header) throw InputError(source, line_number, "no header row; expected column names");
  if (list.points.size() < 2) {
    throw InputError(source, line_number,
                     "a seam needs at least 2 points, found " + std::to_string(list.points.size()));
  }
  return list;
}

SeamPointList loadSeamPointsCsv(const std::string& path) {
  std::ifstream input(path);
  if (!input) throw InputError(path, 0, "cannot open the seam point list (missing or unreadable)");
  return parseSeamPointsCsv(input, path);
}

}  // namespace tw::planner
