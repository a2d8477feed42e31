// zcorr interval log: seals, an HMAC-SHA-256 of the chain head under a key
// the log never holds (schema/006_seals.sql, schema/README.md "Seals").
//
// The key file holds at least 32 bytes, all of them the key (e.g.
// `head -c 32 /dev/urandom > point.key`). Who holds it can check that no
// record up to the last seal was removed, re-hashed or forged; who does not
// can still verify the chain, as before.
#pragma once

#include <cstdint>
#include <filesystem>
#include <span>
#include <string>
#include <vector>

#include "record/canonical.hpp"

namespace zcorr::record {

inline constexpr std::size_t min_seal_key_bytes = 32;

// Reads a key file; throws io::InputError naming `field` when it cannot be
// read or holds fewer than min_seal_key_bytes bytes.
[[nodiscard]] std::vector<std::uint8_t> load_seal_key(const std::filesystem::path& file, std::string_view field);

// 16 hex digits of SHA-256("zcorr.seal.key" 0x00 || key): names the key in
// the log without revealing it.
[[nodiscard]] std::string seal_key_id(std::span<const std::uint8_t> key);

// HMAC-SHA-256(key, "zcorr.seal.v1" 0x00 || sealed_seq (8 bytes big-endian) || hash of record sealed_seq).
[[nodiscard]] Digest seal_mac(std::span<const std::uint8_t> key, std::int64_t sealed_seq, const Digest& sealed_hash);

}  // namespace zcorr::record
