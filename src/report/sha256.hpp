// SHA-256 message digest, used to fingerprint the station file in the evaluation record.
// Method: FIPS PUB 180-4 (Secure Hash Standard, NIST 2015), section 6.2; our own implementation.
#pragma once

#include <array>
#include <cstdint>
#include <string>
#include <string_view>

namespace standoff::report {

// Incremental SHA-256 (FIPS 180-4 §6.2): feed bytes with update(), then take digest() once.
class Sha256 {
 public:
  Sha256();
  void update(std::string_view bytes);
  // The 32-byte digest. Finalises the state; further update() calls are an error (std::logic_error).
  std::array<std::uint8_t, 32> digest();

 private:
  void compress(const std::uint8_t* block);  // one 512-bit block, FIPS 180-4 §6.2.2

  std::array<std::uint32_t, 8> h_;
  std::array<std::uint8_t, 64> buffer_{};
  std::size_t buffered_ = 0;
  std::uint64_t length_bytes_ = 0;
  bool finished_ = false;
};

// Lower-case hexadecimal SHA-256 of `bytes` (64 characters).
std::string sha256_hex(std::string_view bytes);

}  // namespace standoff::report
