// zcorr input layer: small text helpers (trimming, strict number parsing).
#pragma once

#include <string>
#include <string_view>
#include <vector>

namespace zcorr::io {

[[nodiscard]] std::string_view trim(std::string_view s) noexcept;
[[nodiscard]] std::vector<std::string_view> split(std::string_view s, char sep);

// Parses the whole of `text` as a finite decimal number; throws InputError
// naming `field` otherwise (empty, trailing garbage, NaN, infinity).
[[nodiscard]] double parse_number(std::string_view text, std::string_view field);

// Shortest decimal text that reads back as the same double.
[[nodiscard]] std::string format_number(double v);
// Fixed number of significant digits.
[[nodiscard]] std::string format_sig(double v, int digits);

// Whether `s` is valid UTF-8 (no overlong forms, no surrogates, at most U+10FFFF).
[[nodiscard]] bool valid_utf8(std::string_view s) noexcept;

// `s` made fit for a one-line message: control characters, DEL and bytes
// that are not valid UTF-8 written as \n, \r, \t or \xNN; cut after
// `max_bytes` bytes of the input with " ... (N bytes)" appended.
inline constexpr std::size_t shown_value_bytes = 120;
[[nodiscard]] std::string printable(std::string_view s, std::size_t max_bytes = shown_value_bytes);

}  // namespace zcorr::io
