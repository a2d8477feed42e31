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

}  // namespace zcorr::io
