#include "io/text.hpp"

#include <charconv>
#include <cmath>
#include <cstdint>
#include <cstdio>

#include "io/input_error.hpp"

namespace zcorr::io {

std::string_view trim(std::string_view s) noexcept {
  auto ws = [](char c) { return c == ' ' || c == '\t' || c == '\r' || c == '\n'; };
  while (!s.empty() && ws(s.front())) s.remove_prefix(1);
  while (!s.empty() && ws(s.back())) s.remove_suffix(1);
  return s;
}

std::vector<std::string_view> split(std::string_view s, char sep) {
  std::vector<std::string_view> out;
  std::size_t start = 0;
  for (;;) {
    auto pos = s.find(sep, start);
    if (pos == std::string_view::npos) {
      out.push_back(s.substr(start));
      return out;
    }
    out.push_back(s.substr(start, pos - start));
    start = pos + 1;
  }
}

double parse_number(std::string_view text, std::string_view field) {
  auto t = trim(text);
  if (t.empty()) throw InputError(std::string(field), std::string(text), "a number is required");
  if (t.front() == '+') t.remove_prefix(1);
  double v = 0.0;
  auto [ptr, ec] = std::from_chars(t.data(), t.data() + t.size(), v);
  if (ec != std::errc() || ptr != t.data() + t.size())
    throw InputError(std::string(field), std::string(text), "expected a decimal number such as 0.95 or 1.2e-3");
  if (!std::isfinite(v)) throw InputError(std::string(field), std::string(text), "the value must be finite (not NaN or infinity)");
  return v;
}

std::string format_number(double v) {
  char buf[64];
  auto [ptr, ec] = std::to_chars(buf, buf + sizeof buf, v);
  if (ec != std::errc()) return "nan";
  return std::string(buf, ptr);
}

std::string format_sig(double v, int digits) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", digits, v);
  return buf;
}

namespace {

// The length of the valid UTF-8 sequence at s[i], or 0 when there is none.
std::size_t utf8_length(std::string_view s, std::size_t i) noexcept {
  const auto c = static_cast<unsigned char>(s[i]);
  if (c < 0x80) return 1;
  const std::size_t n = (c >> 5) == 6 ? 2 : (c >> 4) == 14 ? 3 : (c >> 3) == 30 ? 4 : 0;
  if (n == 0 || i + n > s.size()) return 0;
  std::uint32_t cp = n == 2 ? (c & 0x1fu) : n == 3 ? (c & 0x0fu) : (c & 0x07u);
  for (std::size_t k = 1; k < n; ++k) {
    const auto d = static_cast<unsigned char>(s[i + k]);
    if ((d & 0xc0) != 0x80) return 0;
    cp = (cp << 6) | (d & 0x3fu);
  }
  const bool overlong = (n == 2 && cp < 0x80) || (n == 3 && cp < 0x800) || (n == 4 && cp < 0x10000);
  if (overlong || cp > 0x10ffff || (cp >= 0xd800 && cp <= 0xdfff)) return 0;
  return n;
}

}  // namespace

bool valid_utf8(std::string_view s) noexcept {
  for (std::size_t i = 0; i < s.size();) {
    const std::size_t n = utf8_length(s, i);
    if (n == 0) return false;
    i += n;
  }
  return true;
}

std::string printable(std::string_view s, std::size_t max_bytes) {
  static constexpr char hex[] = "0123456789abcdef";
  std::string out;
  std::size_t i = 0;
  while (i < s.size() && i < max_bytes) {
    const auto c = static_cast<unsigned char>(s[i]);
    const std::size_t n = utf8_length(s, i);
    if (n > 1) {
      out.append(s.substr(i, n));
      i += n;
      continue;
    }
    if (n == 1 && c >= 0x20 && c != 0x7f) out += static_cast<char>(c);
    else if (c == '\n') out += "\\n";
    else if (c == '\r') out += "\\r";
    else if (c == '\t') out += "\\t";
    else {
      out += "\\x";
      out += hex[c >> 4];
      out += hex[c & 15];
    }
    ++i;
  }
  if (i < s.size()) out += " ... (" + std::to_string(s.size()) + " bytes)";
  return out;
}

}  // namespace zcorr::io
