// zcorr input layer: quantities with units, as text ("725 psig", "5 MPa",
// "60 degF"). Ambiguous or unknown units are rejected with InputError.
//
// Pressure: Pa, kPa, MPa (absolute unless marked), bar and psi only with an
// explicit a/g mark (bara, barg, psia, psig; also "bar(a)", "psi(g)"): a bare
// "psi" or "bar" is ambiguous in field use and refused. Gauge pressures need
// the atmospheric pressure.
// Temperature: K, degC / °C / C, degF / °F / F, degR / °R / R.
// Volume: m3 (m^3, m³), L, ft3 (cf), Mcf.   Energy: J, kJ, MJ, GJ, kWh, MWh, Btu, MMBtu, therm, Dth.
#pragma once

#include <optional>
#include <string>
#include <string_view>

namespace zcorr::io {

struct NumberWithUnit {
  double value;
  std::string unit;  // trimmed, may be empty
};
[[nodiscard]] NumberWithUnit split_unit(std::string_view text, std::string_view field);

// Returns the absolute pressure in Pa.
[[nodiscard]] double parse_pressure_Pa(std::string_view text, std::string_view field,
                                       std::optional<double> atmospheric_Pa = std::nullopt);
// Returns the thermodynamic temperature in K (> 0).
[[nodiscard]] double parse_temperature_K(std::string_view text, std::string_view field);
// Returns m^3 (>= 0 not enforced: volume increments may be signed corrections).
// The largest metered volume accepted anywhere, in magnitude: 1e15 m3, some
// 250 years of the world's gas production (about 4e12 m3 a year, common
// practice), so that no conversion of it can overflow.
inline constexpr double max_volume_m3 = 1e15;
[[nodiscard]] double parse_volume_m3(std::string_view text, std::string_view field);
// Returns J.
[[nodiscard]] double parse_energy_J(std::string_view text, std::string_view field);

// Factor of a bare unit name to SI (for output unit options). nullopt if unknown.
[[nodiscard]] std::optional<double> volume_unit_m3(std::string_view unit) noexcept;
[[nodiscard]] std::optional<double> energy_unit_J(std::string_view unit) noexcept;

// Base conditions a contract can name: base_T from 200 K to 400 K, base_p from
// 10 kPa to 1 MPa absolute (our own bounds, wide around every preset's
// 0-20 degC / 60 degF and 101-102 kPa: common practice). Throw InputError
// naming `field` otherwise (non-finite values included).
void check_base_T(double T_K, std::string_view field);
void check_base_p(double p_Pa, std::string_view field);

}  // namespace zcorr::io
