// zcorr input layer: ISO 6976 reference temperatures from text.
//
// Accepts a bare Celsius label ("0", "15", "15.55", "20", "25") or a
// temperature with its unit ("25 degC", "60 degF", "288.15 K"), matched to the
// standard's reference temperatures within 0.01 K (so "15.55 degC" and
// "60 degF" both mean the 60 F reference). Anything else throws InputError
// naming the field and the accepted values. Header-only; may throw (io layer).
#pragma once

#include <cmath>
#include <string>
#include <string_view>

#include "io/input_error.hpp"
#include "io/text.hpp"
#include "io/units_parse.hpp"
#include "methods/iso6976.hpp"

namespace zcorr::io {

namespace iso6976_refs_detail {
// Temperature in K of the text, or NaN when it is neither a bare number nor a temperature.
inline double kelvin_of(std::string_view text, std::string_view field) {
  const auto t = trim(text);
  bool bare = !t.empty();
  for (char ch : t)
    if (!((ch >= '0' && ch <= '9') || ch == '.' || ch == '-' || ch == '+')) bare = false;
  if (bare) return parse_number(t, field) + units::zero_celsius_K;
  return parse_temperature_K(t, field);
}
inline constexpr double match_tol_K = 0.01;
}  // namespace iso6976_refs_detail

[[nodiscard]] inline iso6976::CombustionRef parse_combustion_ref(std::string_view text, std::string_view field) {
  const double T = iso6976_refs_detail::kelvin_of(text, field);
  for (auto t : iso6976::all_combustion_refs)
    if (std::abs(T - iso6976::temperature_K(t)) <= iso6976_refs_detail::match_tol_K) return t;
  throw InputError(std::string(field), std::string(text),
                   "ISO 6976 combustion reference temperatures are 0, 15, 15.55 (60 degF), 20 and 25 degC");
}

[[nodiscard]] inline iso6976::MeteringRef parse_metering_ref(std::string_view text, std::string_view field) {
  const double T = iso6976_refs_detail::kelvin_of(text, field);
  for (auto t : iso6976::all_metering_refs)
    if (std::abs(T - iso6976::temperature_K(t)) <= iso6976_refs_detail::match_tol_K) return t;
  throw InputError(std::string(field), std::string(text),
                   "ISO 6976 metering reference temperatures are 0, 15, 15.55 (60 degF) and 20 degC");
}

}  // namespace zcorr::io
