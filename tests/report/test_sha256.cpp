// SHA-256 against the NIST example vectors and, for every length from 0 to 200 bytes (each
// padding case), against the system's independent sha256sum (GNU coreutils) when present.
#include <catch2/catch.hpp>

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <string>

#include "report/sha256.hpp"

using standoff::report::Sha256;
using standoff::report::sha256_hex;

TEST_CASE("SHA-256 matches the FIPS 180-4 example vectors", "[report][sha256]") {
  // Source: NIST, "Cryptographic Standards and Guidelines: Examples with Intermediate Values",
  // SHA256.pdf (one-block "abc" and two-block 448-bit message), and the empty-message digest
  // quoted with FIPS 180-4 test vectors (NIST CAVP SHAVS, SHA256ShortMsg.rsp, Len = 0).
  struct Case {
    std::string message;
    const char* digest;
  };
  const auto c = GENERATE(values<Case>({
      {"abc", "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"},
      {"", "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855"},
      {"abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq",
       "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1"},
  }));
  CHECK(sha256_hex(c.message) == c.digest);  // exact: a digest is either right or wrong
}

TEST_CASE("SHA-256 of one million 'a' (FIPS 180-2 Appendix B.3 long-message example)", "[report][sha256]") {
  // Source: FIPS 180-2, Appendix B.3 (also in NIST's SHA256.pdf examples).
  Sha256 h;
  const std::string chunk(1000, 'a');
  for (int k = 0; k < 1000; ++k) h.update(chunk);  // fed in pieces: exercises the incremental path
  const auto d = h.digest();
  static constexpr char kHex[] = "0123456789abcdef";
  std::string hex;
  for (const auto b : d) {
    hex += kHex[b >> 4];
    hex += kHex[b & 15];
  }
  CHECK(hex == "cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0");
}

TEST_CASE("SHA-256 agrees with coreutils sha256sum at every padding boundary", "[report][sha256]") {
  // Independent reference: GNU coreutils sha256sum. Lengths 0..200 cover 55/56/63/64/119/120 bytes,
  // where the padding spills into an extra block.
  if (std::system("command -v sha256sum >/dev/null 2>&1") != 0) {
    WARN("sha256sum not installed; comparison skipped");
    return;
  }
  const auto path = std::filesystem::temp_directory_path() / ("standoff-sha-" + std::to_string(::getpid()));
  std::string message;
  for (int len = 0; len <= 200; ++len) {
    { std::ofstream(path, std::ios::binary) << message; }
    std::FILE* p = ::popen(("sha256sum '" + path.string() + "'").c_str(), "r");
    REQUIRE(p != nullptr);
    std::array<char, 65> buf{};
    REQUIRE(std::fread(buf.data(), 1, 64, p) == 64);
    ::pclose(p);
    INFO("length " << len);
    CHECK(sha256_hex(message) == std::string(buf.data(), 64));
    message += static_cast<char>((len * 37 + 11) & 0xff);  // all byte values, including NUL and high bytes
  }
  std::filesystem::remove(path);
}
