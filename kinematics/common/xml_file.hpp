#pragma once

#include <Eigen/Core>
#include <initializer_list>
#include <optional>
#include <string>

#include <tinyxml2.h>

namespace tw {

/// A parsed XML input file with strict, located accessors. Every accessor
/// that finds a problem throws tw::InputError naming the file, the line of
/// the element, the element and what was expected. Shared by every loader
/// of the project's XML formats (arm, cell, job), hence in the lowest layer.
///
/// Not copyable; the elements it hands out live as long as the XmlFile.
class XmlFile {
 public:
  /// Reads and parses `path`. Throws InputError when the file is missing,
  /// unreadable or not well-formed XML (with the parser's line).
  explicit XmlFile(std::string path);
  XmlFile(const XmlFile&) = delete;
  XmlFile& operator=(const XmlFile&) = delete;

  const std::string& path() const { return path_; }
  /// Folder of the file, for resolving relative references ("" → ".").
  std::string directory() const;

  /// The root element; throws unless it is named `expected_name`.
  const tinyxml2::XMLElement& root(const char* expected_name) const;

  [[noreturn]] void fail(const tinyxml2::XMLElement& at, const std::string& message) const;

  /// Rejects attributes and child elements not in the given lists.
  void allowOnly(const tinyxml2::XMLElement& element,
                 std::initializer_list<const char*> attributes,
                 std::initializer_list<const char*> children = {}) const;

  std::string text(const tinyxml2::XMLElement& element, const char* attribute) const;
  std::optional<std::string> optionalText(const tinyxml2::XMLElement& element,
                                          const char* attribute) const;

  /// A finite decimal number.
  double number(const tinyxml2::XMLElement& element, const char* attribute) const;
  std::optional<double> optionalNumber(const tinyxml2::XMLElement& element,
                                       const char* attribute) const;

  /// Three finite numbers separated by spaces, e.g. xyz="0 0 450".
  Eigen::Vector3d triple(const tinyxml2::XMLElement& element, const char* attribute) const;
  std::optional<Eigen::Vector3d> optionalTriple(const tinyxml2::XMLElement& element,
                                                const char* attribute) const;

  /// An attribute that must equal one of `allowed`; returns its index.
  int choice(const tinyxml2::XMLElement& element, const char* attribute,
             std::initializer_list<const char*> allowed) const;

  /// The single child named `name`; throws when it is missing or repeated.
  const tinyxml2::XMLElement& child(const tinyxml2::XMLElement& element, const char* name) const;
  /// The child named `name` if present; throws when it is repeated.
  const tinyxml2::XMLElement* optionalChild(const tinyxml2::XMLElement& element,
                                            const char* name) const;

 private:
  std::string path_;
  tinyxml2::XMLDocument document_;
};

}  // namespace tw
