#include "io/units_parse.hpp"

#include <array>
#include <cmath>
#include <utility>

#include "core/units.hpp"
#include "io/input_error.hpp"
#include "io/text.hpp"

namespace zcorr::io {
namespace {

constexpr std::string_view degree_sign = "\xC2\xB0";  // UTF-8 for the degree sign
constexpr std::string_view superscript3 = "\xC2\xB3";  // UTF-8 for superscript three

bool number_char(char c) {
  return (c >= '0' && c <= '9') || c == '.' || c == '-' || c == '+' || c == 'e' || c == 'E';
}

std::string without_spaces(std::string_view s) {
  std::string out;
  for (char c : s)
    if (c != ' ') out.push_back(c);
  return out;
}

}  // namespace

NumberWithUnit split_unit(std::string_view text, std::string_view field) {
  auto t = trim(text);
  // The number ends where a character that cannot belong to it appears.
  // An 'e' followed by a letter other than a digit/sign belongs to the unit.
  std::size_t n = 0;
  while (n < t.size() && number_char(t[n])) {
    if ((t[n] == 'e' || t[n] == 'E') &&
        !(n + 1 < t.size() && ((t[n + 1] >= '0' && t[n + 1] <= '9') || t[n + 1] == '-' || t[n + 1] == '+')))
      break;
    ++n;
  }
  if (n == 0) {
    auto lower = std::string(t.substr(0, 3));
    for (auto& ch : lower) ch = static_cast<char>(ch | 0x20);
    if (lower == "nan" || lower == "inf")
      throw InputError(std::string(field), std::string(text), "the value must be finite (not NaN or infinity)");
    throw InputError(std::string(field), std::string(text), "expected a number followed by its unit, e.g. \"15 degC\" or \"5 MPa\"");
  }
  NumberWithUnit r{parse_number(t.substr(0, n), field), std::string(trim(t.substr(n)))};
  return r;
}

double parse_pressure_Pa(std::string_view text, std::string_view field, std::optional<double> atmospheric_Pa) {
  auto nu = split_unit(text, field);
  std::string u = without_spaces(nu.unit);
  const std::string allowed =
      "give a pressure with its unit: Pa, kPa, MPa (absolute), kPag/MPag (gauge), bara/barg, psia/psig";
  if (u.empty()) throw InputError(std::string(field), std::string(text), allowed + " (no unit given)");
  enum class Ref { unmarked, absolute, gauge };
  Ref ref = Ref::unmarked;
  auto strip = [&](std::string_view suffix, Ref r) {
    if (u.size() > suffix.size() && u.compare(u.size() - suffix.size(), suffix.size(), suffix) == 0) {
      u.resize(u.size() - suffix.size());
      ref = r;
      return true;
    }
    return false;
  };
  if (!strip("(a)", Ref::absolute) && !strip("(g)", Ref::gauge) && !strip("abs", Ref::absolute) &&
      !strip("gauge", Ref::gauge)) {
    // Single-letter marks: "psia", "barg", "kPag", "MPaa".
    if (u == "psia" || u == "bara" || u == "kPaa" || u == "MPaa" || u == "Paa") strip("a", Ref::absolute);
    else if (u == "psig" || u == "barg" || u == "kPag" || u == "MPag" || u == "Pag") strip("g", Ref::gauge);
  }
  double factor = 0.0;
  bool needs_mark = false;
  if (u == "Pa") factor = units::Pa;
  else if (u == "kPa") factor = units::kPa;
  else if (u == "MPa") factor = units::MPa;
  else if (u == "bar") { factor = units::bar; needs_mark = true; }
  else if (u == "psi") { factor = units::psi; needs_mark = true; }
  else throw InputError(std::string(field), std::string(text), allowed + " (unknown unit '" + nu.unit + "')");
  if (needs_mark && ref == Ref::unmarked)
    throw InputError(std::string(field), std::string(text),
                     "'" + u + "' is ambiguous: write " + u + "a (absolute) or " + u + "g (gauge)");
  double p = nu.value * factor;
  if (ref == Ref::gauge) {
    if (!atmospheric_Pa)
      throw InputError(std::string(field), std::string(text),
                       "a gauge pressure needs the atmospheric pressure (give --atm, e.g. --atm \"14.4 psia\")");
    p += *atmospheric_Pa;
  }
  if (!(p >= 0.0))
    throw InputError(std::string(field), std::string(text), "the absolute pressure must be >= 0 Pa");
  if (!std::isfinite(p)) throw InputError(std::string(field), std::string(text), "a finite pressure (this one overflows in Pa)");
  return p;
}

double parse_temperature_K(std::string_view text, std::string_view field) {
  auto nu = split_unit(text, field);
  std::string u = without_spaces(nu.unit);
  if (u.rfind(degree_sign, 0) == 0) u = "deg" + u.substr(degree_sign.size());
  double T = 0.0;
  if (u == "K") T = nu.value;
  else if (u == "degC" || u == "C") T = units::celsius_to_K(nu.value);
  else if (u == "degF" || u == "F") T = units::fahrenheit_to_K(nu.value);
  else if (u == "degR" || u == "R") T = units::rankine_to_K(nu.value);
  else
    throw InputError(std::string(field), std::string(text),
                     u.empty() ? "give a temperature with its unit: K, degC, degF or degR"
                               : "unknown temperature unit '" + nu.unit + "'; use K, degC, degF or degR");
  if (!(T > 0.0)) throw InputError(std::string(field), std::string(text), "the temperature must be above 0 K");
  if (!std::isfinite(T)) throw InputError(std::string(field), std::string(text), "a finite temperature (this one overflows in K)");
  return T;
}

std::optional<double> volume_unit_m3(std::string_view unit) noexcept {
  std::string u(unit);
  if (u == "m3" || u == "m^3" || u == std::string("m") + std::string(superscript3)) return units::m3;
  if (u == "L") return units::L;
  if (u == "ft3" || u == "ft^3" || u == "cf" || u == std::string("ft") + std::string(superscript3)) return units::ft3;
  if (u == "Mcf") return units::Mcf;
  return std::nullopt;
}

std::optional<double> energy_unit_J(std::string_view unit) noexcept {
  static constexpr std::array<std::pair<std::string_view, double>, 10> table{{
      {"J", units::J}, {"kJ", 1e3}, {"MJ", units::MJ}, {"GJ", 1e9}, {"kWh", units::kWh}, {"MWh", 1e3 * units::kWh},
      {"Btu", units::Btu}, {"MMBtu", units::MMBtu}, {"therm", units::therm}, {"Dth", 10.0 * units::therm}}};
  for (const auto& [name, f] : table)
    if (name == unit) return f;
  return std::nullopt;
}

double parse_volume_m3(std::string_view text, std::string_view field) {
  auto nu = split_unit(text, field);
  auto f = volume_unit_m3(without_spaces(nu.unit));
  if (!f) throw InputError(std::string(field), std::string(text), "give a volume with its unit: m3, L, ft3 or Mcf");
  const double v = nu.value * *f;
  if (!(std::fabs(v) <= max_volume_m3))
    throw InputError(std::string(field), std::string(text), "a volume of at most 1e15 m3 in magnitude (a physically possible metered volume)");
  return v;
}

double parse_energy_J(std::string_view text, std::string_view field) {
  auto nu = split_unit(text, field);
  auto f = energy_unit_J(without_spaces(nu.unit));
  if (!f)
    throw InputError(std::string(field), std::string(text),
                     "give an energy with its unit: J, kJ, MJ, GJ, kWh, MWh, Btu, MMBtu, therm or Dth");
  const double e = nu.value * *f;
  if (!std::isfinite(e)) throw InputError(std::string(field), std::string(text), "a finite energy (this one overflows in J)");
  return e;
}

void check_base_T(double T_K, std::string_view field) {
  if (!(std::isfinite(T_K) && T_K >= 200.0 && T_K <= 400.0))
    throw InputError(std::string(field), format_sig(T_K, 8) + " K", "a base temperature from 200 K to 400 K");
}

void check_base_p(double p_Pa, std::string_view field) {
  if (!(std::isfinite(p_Pa) && p_Pa >= 1e4 && p_Pa <= 1e6))
    throw InputError(std::string(field), format_sig(p_Pa, 8) + " Pa", "an absolute base pressure from 10 kPa to 1 MPa");
}

}  // namespace zcorr::io
