#pragma once

// Seeded random damage for the parser fuzz tests: a valid input file with a
// few bytes replaced, inserted or deleted. Random damage of a known-good file
// is common practice for testing parsers (no source); the alphabets below
// hold the characters each format gives meaning to, so that most damage
// reaches past the first syntax check into the loaders' value checks.

#include <cstddef>
#include <fstream>
#include <random>
#include <sstream>
#include <stdexcept>
#include <string>

namespace tw::test {

/// XML: markup, quotes, digits, signs, exponents, blanks and the letters of nan/inf.
inline const std::string kXmlDamage = "<>=\"/!?-+.e0123456789 \nnaif_xyz";
/// CSV: separators, digits, signs, exponents, comments, blanks and line breaks.
inline const std::string kCsvDamage = ",.-+e0123456789 \t\n\r#nai_R";
/// OBJ meshes: vertex and face keywords, index separators, numbers, comments.
inline const std::string kObjDamage = "vf/.-+e0123456789 \n#naix";
/// Templates: section and comment marks, placeholder brackets, decimals, text.
inline const std::string kTemplateDamage = "@#[];%0123456789 \n\r-_jnxqz";

/// A draw in [0, n) straight from the generator: std::mt19937's output is
/// fixed by the standard, std::uniform_int_distribution's mapping is not, so
/// a seed gives the same damage with every standard library. The modulo bias
/// (below 1e-6 for the sizes used here) does not matter for damage.
inline std::size_t draw(std::mt19937& random, std::size_t n) { return random() % n; }

/// `text` with 1 to 4 bytes replaced, inserted or deleted at random places;
/// new bytes are drawn from `alphabet`.
inline std::string damaged(std::string text, const std::string& alphabet, std::mt19937& random) {
  for (std::size_t edits = 1 + draw(random, 4); edits > 0 && !text.empty(); --edits) {
    const std::size_t at = draw(random, text.size());
    const char c = alphabet[draw(random, alphabet.size())];
    switch (draw(random, 3)) {
      case 0:
        text[at] = c;
        break;
      case 1:
        text.insert(at, 1, c);
        break;
      default:
        text.erase(at, 1);
    }
  }
  return text;
}

/// The whole content of the file at `path`; throws when it cannot be read.
inline std::string readTextFile(const std::string& path) {
  std::ifstream file(path, std::ios::binary);
  if (!file) throw std::runtime_error("cannot open " + path);
  std::ostringstream text;
  text << file.rdbuf();
  return text.str();
}

}  // namespace tw::test
