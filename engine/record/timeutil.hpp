// zcorr interval log: UTC timestamps as Unix seconds, and the civil calendar
// (proleptic Gregorian, days_from_civil / civil_from_days; common practice).
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <string_view>

namespace zcorr::record {

// Parses "2026-03-01T06:00:00Z", "2026-03-01 06:00:00" (UTC), an explicit
// offset "2026-03-01T07:00:00+01:00", or a plain integer of Unix seconds.
// nullopt when the text is none of these.
[[nodiscard]] std::optional<std::int64_t> parse_time_utc(std::string_view text) noexcept;

// "2026-03-01T06:00:00Z"
[[nodiscard]] std::string format_time_utc(std::int64_t t_s);
// "2026-03-01" of the local clock (t + offset)
[[nodiscard]] std::string format_date(std::int64_t t_s, int utc_offset_min);

[[nodiscard]] constexpr std::int64_t floor_div(std::int64_t a, std::int64_t b) noexcept {
  return a >= 0 ? a / b : -((-a + b - 1) / b);
}

// Start of the local clock hour containing t.
[[nodiscard]] constexpr std::int64_t hour_start(std::int64_t t, int utc_offset_min) noexcept {
  const std::int64_t off = std::int64_t{utc_offset_min} * 60;
  return floor_div(t + off, 3600) * 3600 - off;
}
// Start of the contract day (beginning at contract_hour local) containing t.
[[nodiscard]] constexpr std::int64_t contract_day_start(std::int64_t t, int utc_offset_min, int contract_hour) noexcept {
  const std::int64_t shift = std::int64_t{utc_offset_min} * 60 - std::int64_t{contract_hour} * 3600;
  return floor_div(t + shift, 86400) * 86400 - shift;
}

}  // namespace zcorr::record
