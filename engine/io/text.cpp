#include "io/text.hpp"

#include <charconv>
#include <cmath>
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

}  // namespace zcorr::io
