#include "kinematics/common/xml_file.hpp"

#include <cstring>
#include <sstream>

#include "kinematics/common/input_error.hpp"
#include "kinematics/common/number_text.hpp"

namespace tw {
namespace {

std::string joined(std::initializer_list<const char*> names) {
  std::string text;
  for (const char* name : names) {
    if (!text.empty()) text += ", ";
    text += name;
  }
  return text.empty() ? "none" : text;
}

bool contains(std::initializer_list<const char*> names, const char* name) {
  for (const char* candidate : names) {
    if (std::strcmp(candidate, name) == 0) return true;
  }
  return false;
}

}  // namespace

XmlFile::XmlFile(std::string path) : path_(std::move(path)) {
  const tinyxml2::XMLError status = document_.LoadFile(path_.c_str());
  if (status == tinyxml2::XML_ERROR_FILE_NOT_FOUND ||
      status == tinyxml2::XML_ERROR_FILE_COULD_NOT_BE_OPENED) {
    throw InputError(path_, 0, "cannot open the file (missing or unreadable)");
  }
  if (status == tinyxml2::XML_ERROR_EMPTY_DOCUMENT) {
    throw InputError(path_, 0, "the file is empty; expected an XML document");
  }
  if (status != tinyxml2::XML_SUCCESS) {
    throw InputError(path_, document_.ErrorLineNum(),
                     std::string("not well-formed XML: ") + document_.ErrorStr());
  }
}

std::string XmlFile::directory() const {
  const std::size_t slash = path_.find_last_of('/');
  return slash == std::string::npos ? "." : path_.substr(0, slash == 0 ? 1 : slash);
}

const tinyxml2::XMLElement& XmlFile::root(const char* expected_name) const {
  const tinyxml2::XMLElement* element = document_.RootElement();
  if (element == nullptr) throw InputError(path_, 0, "no root element");
  if (std::strcmp(element->Name(), expected_name) != 0) {
    fail(*element, std::string("expected the root element <") + expected_name + ">, found <" +
                       element->Name() + ">");
  }
  return *element;
}

void XmlFile::fail(const tinyxml2::XMLElement& at, const std::string& message) const {
  throw InputError(path_, at.GetLineNum(), "<" + std::string(at.Name()) + ">: " + message);
}

void XmlFile::allowOnly(const tinyxml2::XMLElement& element,
                        std::initializer_list<const char*> attributes,
                        std::initializer_list<const char*> children) const {
  for (const tinyxml2::XMLAttribute* a = element.FirstAttribute(); a != nullptr; a = a->Next()) {
    if (!contains(attributes, a->Name())) {
      fail(element, std::string("unknown attribute '") + a->Name() + "'; expected one of: " +
                        joined(attributes));
    }
  }
  for (const tinyxml2::XMLElement* c = element.FirstChildElement(); c != nullptr;
       c = c->NextSiblingElement()) {
    if (!contains(children, c->Name())) {
      fail(*c, std::string("unknown element inside <") + element.Name() + ">; expected one of: " +
                   joined(children));
    }
  }
}

std::optional<std::string> XmlFile::optionalText(const tinyxml2::XMLElement& element,
                                                 const char* attribute) const {
  const char* value = element.Attribute(attribute);
  if (value == nullptr) return std::nullopt;
  return std::string(value);
}

std::string XmlFile::text(const tinyxml2::XMLElement& element, const char* attribute) const {
  std::optional<std::string> value = optionalText(element, attribute);
  if (!value) fail(element, std::string("missing attribute '") + attribute + "'");
  if (value->empty()) fail(element, std::string("attribute '") + attribute + "' is empty");
  return *value;
}

std::optional<double> XmlFile::optionalNumber(const tinyxml2::XMLElement& element,
                                              const char* attribute) const {
  std::optional<std::string> value = optionalText(element, attribute);
  if (!value) return std::nullopt;
  std::optional<double> number = parseNumber(*value);
  if (!number) {
    fail(element, std::string("attribute '") + attribute + "' = \"" + *value +
                      "\" is not a finite number");
  }
  return number;
}

double XmlFile::number(const tinyxml2::XMLElement& element, const char* attribute) const {
  std::optional<double> value = optionalNumber(element, attribute);
  if (!value) fail(element, std::string("missing attribute '") + attribute + "' (a number)");
  return *value;
}

std::optional<Eigen::Vector3d> XmlFile::optionalTriple(const tinyxml2::XMLElement& element,
                                                       const char* attribute) const {
  std::optional<std::string> value = optionalText(element, attribute);
  if (!value) return std::nullopt;
  std::istringstream words(*value);
  Eigen::Vector3d result;
  std::string word;
  int count = 0;
  while (words >> word) {
    std::optional<double> number = parseNumber(word);
    if (!number || count == 3) {
      count = -1;
      break;
    }
    result[count++] = *number;
  }
  if (count != 3) {
    fail(element, std::string("attribute '") + attribute + "' = \"" + *value +
                      "\" must be three finite numbers separated by spaces");
  }
  return result;
}

Eigen::Vector3d XmlFile::triple(const tinyxml2::XMLElement& element, const char* attribute) const {
  std::optional<Eigen::Vector3d> value = optionalTriple(element, attribute);
  if (!value) fail(element, std::string("missing attribute '") + attribute + "' (three numbers)");
  return *value;
}

int XmlFile::choice(const tinyxml2::XMLElement& element, const char* attribute,
                    std::initializer_list<const char*> allowed) const {
  const std::string value = text(element, attribute);
  int index = 0;
  for (const char* candidate : allowed) {
    if (value == candidate) return index;
    ++index;
  }
  fail(element, std::string("attribute '") + attribute + "' = \"" + value +
                    "\"; expected one of: " + joined(allowed));
}

const tinyxml2::XMLElement* XmlFile::optionalChild(const tinyxml2::XMLElement& element,
                                                   const char* name) const {
  const tinyxml2::XMLElement* first = element.FirstChildElement(name);
  if (first != nullptr && first->NextSiblingElement(name) != nullptr) {
    fail(*first->NextSiblingElement(name),
         std::string("<") + name + "> may appear only once inside <" + element.Name() + ">");
  }
  return first;
}

const tinyxml2::XMLElement& XmlFile::child(const tinyxml2::XMLElement& element,
                                           const char* name) const {
  const tinyxml2::XMLElement* found = optionalChild(element, name);
  if (found == nullptr) fail(element, std::string("missing element <") + name + ">");
  return *found;
}

}  // namespace tw
