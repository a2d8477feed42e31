// zcorr interval log: the canonical byte encoding of a record and its hash.
//
// Canonical bytes of a record in the encoding of version K ("zcorr.record.vK";
// the versions and the columns each covers are in tables.hpp):
//   "zcorr.record.vK" 0x00        (K in decimal: "zcorr.record.v1", "zcorr.record.v2", ...)
//   u16 length + table name (ASCII)
//   u16 number of columns
//   for every column of the table's list (tables.hpp) introduced at a version
//   <= K, in that order:
//     u16 length + column name (ASCII)
//     one tag byte and the value:
//       0x00 NULL
//       0x01 INTEGER: 8 bytes, two's complement, big-endian
//       0x02 REAL:    8 bytes, IEEE 754 binary64 bits, big-endian
//                     (-0.0 is stored as +0.0, NaN as NULL, before encoding)
//       0x03 TEXT:    u32 length + UTF-8 bytes
//       0x04 BLOB:    u32 length + bytes
// All lengths big-endian. Version 1 is the encoding of the logs written before
// schema 4, byte for byte. The record's hash is
//   hash = SHA-256(prev_hash || canonical bytes)
// with prev_hash the hash of the record before it in the chain (32 zero bytes
// for the first record). The values are exactly those stored in the STRICT
// tables, so the verifier rebuilds the bytes from what it reads.
#pragma once

#include <array>
#include <cstdint>
#include <span>
#include <string>
#include <string_view>
#include <variant>
#include <vector>

#include "record/tables.hpp"

namespace zcorr::record {

struct Null {
  bool operator==(const Null&) const = default;
};
using Blob = std::vector<std::uint8_t>;
using Value = std::variant<Null, std::int64_t, double, std::string, Blob>;

using Digest = std::array<std::uint8_t, 32>;
inline constexpr Digest zero_digest{};

// A REAL value as it must be stored: NaN becomes NULL, -0.0 becomes +0.0.
[[nodiscard]] Value real(double v) noexcept;
// An optional REAL: NULL when absent or NaN.
[[nodiscard]] Value opt_real(bool present, double v) noexcept;

// Writes the canonical bytes of one record of `table` in the encoding of
// version `encoding` (1..latest_encoding) to `out` (cleared first).
// values.size() must equal column_count(table, encoding).
void canonical_bytes(Table table, int encoding, std::span<const Value> values, std::vector<std::uint8_t>& out);

// SHA-256 (OpenSSL libcrypto). One object is reused for many records.
class Hasher {
 public:
  Hasher();
  ~Hasher();
  Hasher(const Hasher&) = delete;
  Hasher& operator=(const Hasher&) = delete;
  [[nodiscard]] Digest chain(const Digest& prev, std::span<const std::uint8_t> bytes);

 private:
  void* ctx_;  // EVP_MD_CTX
  void* md_;   // EVP_MD
};

[[nodiscard]] std::string to_hex(std::span<const std::uint8_t> bytes);

}  // namespace zcorr::record
