#include <catch2/catch.hpp>
#include <fstream>
#include <string>

#include "kinematics/common/input_error.hpp"
#include "planner/program/sha256.hpp"

using tw::planner::Sha256;
using tw::planner::sha256Hex;
using tw::planner::sha256OfFile;

TEST_CASE("SHA-256 reproduces the published test vectors", "[sha256]") {
  // FIPS 180-4 examples (NIST CSRC "SHA256.pdf", one-block and two-block
  // messages); the empty-message digest is the widely published value.
  CHECK(sha256Hex("abc") == "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  CHECK(sha256Hex("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq") ==
        "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
  CHECK(sha256Hex("") == "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
}

TEST_CASE("SHA-256 of one million 'a' fed in uneven pieces", "[sha256]") {
  // FIPS 180-2 Appendix B.3 (one million repetitions of 'a'); pieces of 997
  // bytes cross every block boundary at a different offset.
  Sha256 hash;
  const std::string piece(997, 'a');
  std::size_t left = 1000000;
  while (left > 0) {
    const std::size_t now = std::min(left, piece.size());
    hash.update(std::string_view(piece).substr(0, now));
    left -= now;
  }
  const std::array<std::uint8_t, 32> digest = hash.finish();
  CHECK(digest[0] == 0xcd);
  CHECK(digest[1] == 0xc7);
  CHECK(digest[31] == 0xd0);
  CHECK(sha256Hex(std::string(1000000, 'a')) ==
        "cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0");
}

TEST_CASE("SHA-256 pads messages of 55, 56 and 64 bytes correctly", "[sha256]") {
  // Cross-checked with GNU coreutils sha256sum (reference implementation):
  // 55 bytes fit the length in the same block, 56 need a second one.
  CHECK(sha256Hex(std::string(55, 'a')) ==
        "9f4390f8d30c2dd92ec9f095b65e2b9ae9b0a925a5258e241c9f1e910f734318");
  CHECK(sha256Hex(std::string(56, 'a')) ==
        "b35439a4ac6f0948b6d6f9e3c6af0f5f590ce20f1bde7090ef7970686ec6738a");
  CHECK(sha256Hex(std::string(64, 'a')) ==
        "ffe054fe7ae0cb6dc65c3af9b61d5209f439851db43d0ba5997337df154668eb");
}

TEST_CASE("SHA-256 of a file equals SHA-256 of its bytes", "[sha256]") {
  const std::string path = std::string(TW_TEST_OUTPUT_DIR) + "/sha256_input.txt";
  // 200,000 bytes: more than one read buffer of sha256OfFile.
  std::string content;
  for (int i = 0; i < 200000; ++i) content += static_cast<char>('a' + i % 26);
  {
    std::ofstream out(path, std::ios::binary | std::ios::trunc);
    out << content;
  }
  CHECK(sha256OfFile(path) == sha256Hex(content));
  CHECK_THROWS_AS(sha256OfFile(path + ".missing"), tw::InputError);
}
