#include "planner/program/sha256.hpp"

#include <array>
#include <fstream>

#include "kinematics/common/input_error.hpp"

namespace tw::planner {

Sha256::Sha256() { sha256_init(&context_); }

void Sha256::update(std::string_view bytes) {
  sha256_update(&context_, bytes.size(), reinterpret_cast<const std::uint8_t*>(bytes.data()));
}

std::array<std::uint8_t, 32> Sha256::finish() {
  std::array<std::uint8_t, 32> digest{};
  sha256_digest(&context_, digest.size(), digest.data());
  return digest;
}

namespace {

std::string hexDigest(Sha256& hash) {
  const std::array<std::uint8_t, 32> digest = hash.finish();
  constexpr char kHex[] = "0123456789abcdef";
  std::string text;
  text.reserve(64);
  for (const std::uint8_t byte : digest) {
    text += kHex[byte >> 4];
    text += kHex[byte & 0x0f];
  }
  return text;
}

}  // namespace

std::string sha256Hex(std::string_view bytes) {
  Sha256 hash;
  hash.update(bytes);
  return hexDigest(hash);
}

std::string sha256OfFile(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(path, 0, "cannot open the input file to hash it");
  Sha256 hash;
  std::array<char, 65536> buffer{};
  while (in) {
    in.read(buffer.data(), static_cast<std::streamsize>(buffer.size()));
    hash.update(std::string_view(buffer.data(), static_cast<std::size_t>(in.gcount())));
  }
  if (!in.eof()) throw InputError(path, 0, "reading the input file to hash it failed");
  return hexDigest(hash);
}

}  // namespace tw::planner
