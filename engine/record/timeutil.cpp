#include "record/timeutil.hpp"

#include <charconv>
#include <cstdio>

namespace zcorr::record {
namespace {

constexpr std::int64_t days_from_civil(std::int64_t y, unsigned m, unsigned d) noexcept {
  y -= m <= 2;
  const std::int64_t era = (y >= 0 ? y : y - 399) / 400;
  const auto yoe = static_cast<unsigned>(y - era * 400);
  const unsigned doy = (153 * (m + (m > 2 ? -3 : 9)) + 2) / 5 + d - 1;
  const unsigned doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
  return era * 146097 + static_cast<std::int64_t>(doe) - 719468;
}

void civil_from_days(std::int64_t z, int& y, unsigned& m, unsigned& d) noexcept {
  z += 719468;
  const std::int64_t era = (z >= 0 ? z : z - 146096) / 146097;
  const auto doe = static_cast<unsigned>(z - era * 146097);
  const unsigned yoe = (doe - doe / 1460 + doe / 36524 - doe / 146096) / 365;
  const unsigned doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
  const unsigned mp = (5 * doy + 2) / 153;
  d = doy - (153 * mp + 2) / 5 + 1;
  m = mp < 10 ? mp + 3 : mp - 9;
  y = static_cast<int>(static_cast<std::int64_t>(yoe) + era * 400 + (m <= 2));
}

bool digits(std::string_view s, std::size_t pos, std::size_t n, unsigned& out) noexcept {
  if (pos + n > s.size()) return false;
  out = 0;
  for (std::size_t i = pos; i < pos + n; ++i) {
    if (s[i] < '0' || s[i] > '9') return false;
    out = out * 10 + static_cast<unsigned>(s[i] - '0');
  }
  return true;
}

}  // namespace

std::optional<std::int64_t> parse_time_utc(std::string_view s) noexcept {
  while (!s.empty() && (s.front() == ' ' || s.front() == '\t')) s.remove_prefix(1);
  while (!s.empty() && (s.back() == ' ' || s.back() == '\t')) s.remove_suffix(1);
  if (s.empty()) return std::nullopt;
  if (s.find('-', 1) == std::string_view::npos) {  // Unix seconds
    std::int64_t v = 0;
    auto [p, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
    if (ec != std::errc() || p != s.data() + s.size()) return std::nullopt;
    return v;
  }
  unsigned Y, M, D, h, mi, sec;
  if (s.size() < 19 || !digits(s, 0, 4, Y) || s[4] != '-' || !digits(s, 5, 2, M) || s[7] != '-' || !digits(s, 8, 2, D) ||
      (s[10] != 'T' && s[10] != ' ') || !digits(s, 11, 2, h) || s[13] != ':' || !digits(s, 14, 2, mi) || s[16] != ':' ||
      !digits(s, 17, 2, sec))
    return std::nullopt;
  if (M < 1 || M > 12 || D < 1 || D > 31 || h > 23 || mi > 59 || sec > 59) return std::nullopt;
  // Day must exist in its month.
  static constexpr unsigned mdays[] = {31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
  const bool leap = (Y % 4 == 0 && Y % 100 != 0) || Y % 400 == 0;
  if (D > mdays[M - 1] || (M == 2 && D == 29 && !leap)) return std::nullopt;
  std::int64_t t = days_from_civil(Y, M, D) * 86400 + h * 3600 + mi * 60 + sec;
  auto rest = s.substr(19);
  if (rest.empty() || rest == "Z") return t;
  unsigned oh, om;
  if (rest.size() == 6 && (rest[0] == '+' || rest[0] == '-') && digits(rest, 1, 2, oh) && rest[3] == ':' && digits(rest, 4, 2, om) &&
      oh <= 14 && om <= 59) {
    const std::int64_t off = (std::int64_t{oh} * 60 + om) * 60;
    return rest[0] == '+' ? t - off : t + off;
  }
  return std::nullopt;
}

std::string format_time_utc(std::int64_t t) {
  const std::int64_t days = floor_div(t, 86400);
  const std::int64_t sod = t - days * 86400;
  int y;
  unsigned m, d;
  civil_from_days(days, y, m, d);
  char buf[40];
  std::snprintf(buf, sizeof buf, "%04d-%02u-%02uT%02d:%02d:%02dZ", y, m, d, static_cast<int>(sod / 3600),
                static_cast<int>(sod / 60 % 60), static_cast<int>(sod % 60));
  return buf;
}

std::string format_date(std::int64_t t, int utc_offset_min) {
  const std::int64_t days = floor_div(t + std::int64_t{utc_offset_min} * 60, 86400);
  int y;
  unsigned m, d;
  civil_from_days(days, y, m, d);
  char buf[24];
  std::snprintf(buf, sizeof buf, "%04d-%02u-%02u", y, m, d);
  return buf;
}

}  // namespace zcorr::record
