#pragma once

#include <array>
#include <cstdint>
#include <string>
#include <string_view>

#include <nettle/sha2.h>

namespace tw::planner {

/// SHA-256 (FIPS 180-4 §6.2) through Debian's nettle library, fed in pieces.
/// Used for the integrity line of motion text files and for the hashes of
/// input files. Not thread safe; one object per message.
class Sha256 {
 public:
  Sha256();
  void update(std::string_view bytes);
  /// The 32-byte digest; the object must not be updated afterwards.
  std::array<std::uint8_t, 32> finish();

 private:
  sha256_ctx context_;
};

/// SHA-256 of `bytes` as 64 lower-case hex digits.
std::string sha256Hex(std::string_view bytes);

/// SHA-256 of the file at `path`, read in binary, as 64 lower-case hex
/// digits (for InputFileHash); throws tw::InputError naming the file when it
/// cannot be read.
std::string sha256OfFile(const std::string& path);

}  // namespace tw::planner
