#include "record/seal.hpp"

#include <openssl/evp.h>
#include <openssl/hmac.h>

#include <fstream>
#include <iterator>
#include <stdexcept>

#include "io/input_error.hpp"

namespace zcorr::record {

std::vector<std::uint8_t> load_seal_key(const std::filesystem::path& file, std::string_view field) {
  std::ifstream f(file, std::ios::binary);
  if (!f) throw io::InputError(std::string(field), file.string(), "a readable key file (at least 32 bytes, e.g. head -c 32 /dev/urandom)");
  std::vector<std::uint8_t> key((std::istreambuf_iterator<char>(f)), std::istreambuf_iterator<char>());
  if (key.size() < min_seal_key_bytes)
    throw io::InputError(std::string(field), file.string() + " (" + std::to_string(key.size()) + " bytes)",
                         "a key file of at least 32 bytes (e.g. head -c 32 /dev/urandom > FILE)");
  return key;
}

std::string seal_key_id(std::span<const std::uint8_t> key) {
  std::vector<std::uint8_t> msg{'z', 'c', 'o', 'r', 'r', '.', 's', 'e', 'a', 'l', '.', 'k', 'e', 'y', 0};
  msg.insert(msg.end(), key.begin(), key.end());
  Digest d{};
  unsigned int n = 0;
  if (EVP_Digest(msg.data(), msg.size(), d.data(), &n, EVP_sha256(), nullptr) != 1 || n != d.size())
    throw std::runtime_error("zcorr seal: SHA-256 failed");
  return to_hex(std::span<const std::uint8_t>(d).first(8));
}

Digest seal_mac(std::span<const std::uint8_t> key, std::int64_t sealed_seq, const Digest& sealed_hash) {
  std::vector<std::uint8_t> msg{'z', 'c', 'o', 'r', 'r', '.', 's', 'e', 'a', 'l', '.', 'v', '1', 0};
  const auto u = static_cast<std::uint64_t>(sealed_seq);
  for (int i = 7; i >= 0; --i) msg.push_back(static_cast<std::uint8_t>(u >> (8 * i)));
  msg.insert(msg.end(), sealed_hash.begin(), sealed_hash.end());
  Digest d{};
  unsigned int n = 0;
  if (!HMAC(EVP_sha256(), key.data(), static_cast<int>(key.size()), msg.data(), msg.size(), d.data(), &n) || n != d.size())
    throw std::runtime_error("zcorr seal: HMAC-SHA-256 failed");
  return d;
}

}  // namespace zcorr::record
