#include "record/canonical.hpp"

#include <openssl/evp.h>

#include <bit>
#include <cmath>
#include <cstring>
#include <stdexcept>
#include <string>

namespace zcorr::record {
namespace {

void put_u16(std::vector<std::uint8_t>& out, std::size_t v) {
  if (v > 0xFFFF) throw std::length_error("canonical encoding: name longer than 65535 bytes");
  out.push_back(static_cast<std::uint8_t>(v >> 8));
  out.push_back(static_cast<std::uint8_t>(v));
}
void put_u32(std::vector<std::uint8_t>& out, std::size_t v) {
  if (v > 0xFFFFFFFFu) throw std::length_error("canonical encoding: value longer than 4 GiB");
  for (int s = 24; s >= 0; s -= 8) out.push_back(static_cast<std::uint8_t>(v >> s));
}
void put_u64(std::vector<std::uint8_t>& out, std::uint64_t v) {
  for (int s = 56; s >= 0; s -= 8) out.push_back(static_cast<std::uint8_t>(v >> s));
}
void put_bytes(std::vector<std::uint8_t>& out, const void* p, std::size_t n) {
  const std::size_t at = out.size();
  out.resize(at + n);
  if (n != 0) std::memcpy(out.data() + at, p, n);
}
void put_name(std::vector<std::uint8_t>& out, std::string_view s) {
  put_u16(out, s.size());
  put_bytes(out, s.data(), s.size());
}

// "zcorr.record.vK" 0x00 for every version K.
const std::array<std::string, latest_encoding + 1>& magics() {
  static const auto m = [] {
    std::array<std::string, latest_encoding + 1> a;
    for (int k = 1; k <= latest_encoding; ++k) a[static_cast<std::size_t>(k)] = "zcorr.record.v" + std::to_string(k) + std::string(1, '\0');
    return a;
  }();
  return m;
}

}  // namespace

Value real(double v) noexcept {
  if (std::isnan(v)) return Null{};
  if (v == 0.0) return 0.0;  // folds -0.0
  return v;
}

Value opt_real(bool present, double v) noexcept { return present ? real(v) : Value{Null{}}; }

void canonical_bytes(Table table, int encoding, std::span<const Value> values, std::vector<std::uint8_t>& out) {
  const auto& info = table_info(table);
  if (encoding < 1 || encoding > latest_encoding) throw std::logic_error("canonical encoding: no version " + std::to_string(encoding));
  if (values.size() != column_count(table, encoding)) throw std::logic_error("canonical encoding: wrong number of values");
  const std::string& magic = magics()[static_cast<std::size_t>(encoding)];
  out.clear();
  put_bytes(out, magic.data(), magic.size());
  put_name(out, info.name);
  put_u16(out, values.size());
  for (std::size_t i = 0; i < values.size(); ++i) {
    put_name(out, info.columns[i]);
    const Value& v = values[i];
    switch (v.index()) {
      case 0: out.push_back(0x00); break;
      case 1: out.push_back(0x01); put_u64(out, static_cast<std::uint64_t>(std::get<std::int64_t>(v))); break;
      case 2: {
        double d = std::get<double>(v);
        if (d == 0.0) d = 0.0;
        out.push_back(0x02);
        put_u64(out, std::bit_cast<std::uint64_t>(d));
        break;
      }
      case 3: {
        const auto& s = std::get<std::string>(v);
        out.push_back(0x03);
        put_u32(out, s.size());
        put_bytes(out, s.data(), s.size());
        break;
      }
      default: {
        const auto& b = std::get<Blob>(v);
        out.push_back(0x04);
        put_u32(out, b.size());
        put_bytes(out, b.data(), b.size());
        break;
      }
    }
  }
}

Hasher::Hasher() {
  md_ = EVP_MD_fetch(nullptr, "SHA256", nullptr);
  ctx_ = EVP_MD_CTX_new();
  if (md_ == nullptr || ctx_ == nullptr) throw std::runtime_error("OpenSSL: SHA-256 is not available");
}

Hasher::~Hasher() {
  EVP_MD_CTX_free(static_cast<EVP_MD_CTX*>(ctx_));
  EVP_MD_free(static_cast<EVP_MD*>(md_));
}

Digest Hasher::chain(const Digest& prev, std::span<const std::uint8_t> bytes) {
  auto* c = static_cast<EVP_MD_CTX*>(ctx_);
  Digest d{};
  unsigned int n = 0;
  if (EVP_DigestInit_ex(c, static_cast<EVP_MD*>(md_), nullptr) != 1 || EVP_DigestUpdate(c, prev.data(), prev.size()) != 1 ||
      EVP_DigestUpdate(c, bytes.data(), bytes.size()) != 1 || EVP_DigestFinal_ex(c, d.data(), &n) != 1 || n != d.size())
    throw std::runtime_error("OpenSSL: SHA-256 failed");
  return d;
}

std::string to_hex(std::span<const std::uint8_t> bytes) {
  static constexpr char digits[] = "0123456789abcdef";
  std::string s;
  s.reserve(bytes.size() * 2);
  for (auto b : bytes) {
    s.push_back(digits[b >> 4]);
    s.push_back(digits[b & 15]);
  }
  return s;
}

}  // namespace zcorr::record
