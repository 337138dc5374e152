#include "planner/refit/cell_frame_edit.hpp"

#include <tinyxml2.h>

#include <algorithm>
#include <cctype>
#include <optional>
#include <stdexcept>
#include <vector>

#include "kinematics/common/angles.hpp"
#include "kinematics/common/input_error.hpp"
#include "kinematics/common/number_text.hpp"
#include "kinematics/common/rotations.hpp"

namespace tw::planner {
namespace {

constexpr double kMToMm = 1000.0;
constexpr double kRadToDeg = 180.0 / kPi;
constexpr int kMmDecimals = 4;
constexpr int kDegDecimals = 6;
constexpr int kQuaternionDecimals = 9;

/// One attribute of a start tag: where its name begins and where its value
/// (inside the quotes) begins and ends, as offsets into the whole text.
struct AttributeSpan {
  std::string name;
  std::size_t value_begin = 0;
  std::size_t value_end = 0;
};

struct StartTag {
  std::vector<AttributeSpan> attributes;
  std::size_t attributes_end = 0;  ///< just after the last attribute's closing quote
};

bool isSpace(char c) { return std::isspace(static_cast<unsigned char>(c)) != 0; }

/// The attributes of the start tag whose name ends at `at`; nullopt when the
/// text there is not a complete start tag.
std::optional<StartTag> readStartTag(const std::string& text, std::size_t at) {
  StartTag tag;
  tag.attributes_end = at;
  while (true) {
    while (at < text.size() && isSpace(text[at])) ++at;
    if (at >= text.size()) return std::nullopt;
    if (text[at] == '>' || text[at] == '/') return tag;
    const std::size_t name_begin = at;
    while (at < text.size() && text[at] != '=' && !isSpace(text[at])) ++at;
    AttributeSpan attribute;
    attribute.name = text.substr(name_begin, at - name_begin);
    while (at < text.size() && (isSpace(text[at]) || text[at] == '=')) ++at;
    if (at >= text.size() || (text[at] != '"' && text[at] != '\'')) return std::nullopt;
    const std::size_t close = text.find(text[at], at + 1);
    if (close == std::string::npos) return std::nullopt;
    attribute.value_begin = at + 1;
    attribute.value_end = close;
    tag.attributes.push_back(attribute);
    at = close + 1;
    tag.attributes_end = at;
  }
}

const AttributeSpan* findAttribute(const StartTag& tag, const std::string& name) {
  for (const AttributeSpan& attribute : tag.attributes) {
    if (attribute.name == name) return &attribute;
  }
  return nullptr;
}

std::string numbers(const Eigen::VectorXd& values, double scale, int decimals) {
  std::string text;
  for (Eigen::Index i = 0; i < values.size(); ++i) {
    text += (i > 0 ? " " : "") + formatFixed(values[i] * scale, decimals);
  }
  return text;
}

/// Offset of line `line` (1-based) in `text`.
std::size_t lineOffset(const std::string& text, int line) {
  std::size_t offset = 0;
  for (int l = 1; l < line && offset != std::string::npos; ++l) {
    offset = text.find('\n', offset);
    if (offset != std::string::npos) ++offset;
  }
  return offset == std::string::npos ? text.size() : offset;
}

int frameLine(const std::string& cell_text, const std::string& source, const std::string& frame) {
  tinyxml2::XMLDocument document;
  if (document.Parse(cell_text.c_str(), cell_text.size()) != tinyxml2::XML_SUCCESS) {
    throw InputError(source, document.ErrorLineNum(),
                     std::string("not well-formed XML: ") + document.ErrorStr());
  }
  const tinyxml2::XMLElement* root = document.RootElement();
  const tinyxml2::XMLElement* frames = root ? root->FirstChildElement("frames") : nullptr;
  for (const tinyxml2::XMLElement* element = frames ? frames->FirstChildElement("frame") : nullptr;
       element != nullptr; element = element->NextSiblingElement("frame")) {
    const char* name = element->Attribute("name");
    if (name != nullptr && frame == name) return element->GetLineNum();
  }
  throw InputError(
      source, 0, "no <frame name=\"" + frame + "\"> under <frames>; expected the frame to update");
}

}  // namespace

std::string cellTextWithFramePose(const std::string& cell_text, const std::string& source,
                                  const std::string& frame, const Eigen::Isometry3d& X_PF) {
  const int line = frameLine(cell_text, source, frame);
  std::optional<StartTag> tag;
  const std::string opening = "<frame";
  for (std::size_t at = cell_text.find(opening, lineOffset(cell_text, line));
       at != std::string::npos && !tag; at = cell_text.find(opening, at + 1)) {
    const std::size_t name_end = at + opening.size();
    if (name_end >= cell_text.size() || !isSpace(cell_text[name_end])) continue;
    std::optional<StartTag> candidate = readStartTag(cell_text, name_end);
    if (!candidate) break;
    const AttributeSpan* name = findAttribute(*candidate, "name");
    if (name != nullptr &&
        cell_text.compare(name->value_begin, name->value_end - name->value_begin, frame) == 0) {
      tag = candidate;
    }
  }
  if (!tag) {
    throw InputError(source, line,
                     "cannot find the start tag of <frame name=\"" + frame +
                         "\"> in the text to rewrite its pose");
  }

  const std::string xyz = numbers(X_PF.translation(), kMToMm, kMmDecimals);
  const bool as_quaternion = findAttribute(*tag, "quaternion") != nullptr;
  const std::string orientation_name = as_quaternion ? "quaternion" : "rpy";
  std::string orientation;
  if (as_quaternion) {
    const Eigen::Quaterniond q = canonicalQuaternion(X_PF);
    orientation = numbers(Eigen::Vector4d(q.w(), q.x(), q.y(), q.z()), 1.0, kQuaternionDecimals);
  } else {
    orientation = numbers(rollPitchYaw(X_PF.linear()), kRadToDeg, kDegDecimals);
  }

  // Replacements sorted from the back of the text, so earlier offsets stay valid.
  struct Edit {
    std::size_t begin, end;
    std::string text;
  };
  std::vector<Edit> edits;
  std::string appended;
  for (const auto& [name, value] :
       {std::pair{std::string("xyz"), xyz}, std::pair{orientation_name, orientation}}) {
    if (const AttributeSpan* attribute = findAttribute(*tag, name)) {
      edits.push_back(Edit{attribute->value_begin, attribute->value_end, value});
    } else {
      appended += " " + name + "=\"" + value + "\"";
    }
  }
  std::string result = cell_text;
  if (!appended.empty()) result.insert(tag->attributes_end, appended);
  std::sort(edits.begin(), edits.end(),
            [](const Edit& a, const Edit& b) { return a.begin > b.begin; });
  for (const Edit& edit : edits) result.replace(edit.begin, edit.end - edit.begin, edit.text);
  tinyxml2::XMLDocument check;
  if (check.Parse(result.c_str(), result.size()) != tinyxml2::XML_SUCCESS) {
    throw std::logic_error("rewriting the pose of frame '" + frame + "' broke the XML of " +
                           source);
  }
  return result;
}

}  // namespace tw::planner
