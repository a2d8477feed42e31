// zcorr engine core: unit factors, all exact by definition.
//
// Sources: NIST Special Publication 811 (2008 edition), Appendix B.8-B.9
// ("Factors for units listed alphabetically"); the international yard and
// pound agreement (1959): 1 ft = 0.3048 m, 1 lb = 0.45359237 kg; standard
// acceleration of gravity 9.80665 m/s^2 (3rd CGPM, 1901); International Table
// British thermal unit 1 Btu_IT = 1055.05585262 J (NIST SP 811 B.8).
// Does not throw, does not allocate, does no I/O.
#pragma once

namespace zcorr::units {

// Pressure, in Pa.
inline constexpr double Pa = 1.0;
inline constexpr double kPa = 1.0e3;
inline constexpr double MPa = 1.0e6;
inline constexpr double bar = 1.0e5;  // NIST SP 811: 1 bar = 1e5 Pa exactly
// 1 psi = 1 lbf/in^2 = 0.45359237 kg * 9.80665 m/s^2 / (0.0254 m)^2 (exact;
// NIST SP 811 gives 6.894757E+03).
inline constexpr double psi = 0.45359237 * 9.80665 / (0.0254 * 0.0254);
inline constexpr double standard_atmosphere_Pa = 101325.0;  // NIST SP 811: 1 atm = 101 325 Pa

// Temperature.
inline constexpr double zero_celsius_K = 273.15;          // by definition of the Celsius scale
inline constexpr double rankine_per_kelvin = 1.8;        // 1 degR = 5/9 K exactly
inline constexpr double zero_fahrenheit_R = 459.67;      // t/degF = T/degR - 459.67 exactly

[[nodiscard]] constexpr double celsius_to_K(double t) noexcept { return t + zero_celsius_K; }
[[nodiscard]] constexpr double fahrenheit_to_K(double t) noexcept { return (t + zero_fahrenheit_R) / rankine_per_kelvin; }
[[nodiscard]] constexpr double rankine_to_K(double t) noexcept { return t / rankine_per_kelvin; }
[[nodiscard]] constexpr double K_to_celsius(double T) noexcept { return T - zero_celsius_K; }
[[nodiscard]] constexpr double K_to_fahrenheit(double T) noexcept { return T * rankine_per_kelvin - zero_fahrenheit_R; }

// Volume, in m^3.
inline constexpr double m3 = 1.0;
inline constexpr double ft3 = 0.3048 * 0.3048 * 0.3048;  // 0.028316846592 m^3 exactly
inline constexpr double Mcf = 1000.0 * ft3;               // thousand cubic feet (trade usage)
inline constexpr double L = 1.0e-3;

// Energy, in J.
inline constexpr double J = 1.0;
inline constexpr double MJ = 1.0e6;
inline constexpr double kWh = 3.6e6;               // 1 kW * 3600 s, exact
inline constexpr double Btu = 1055.05585262;       // Btu_IT, NIST SP 811 B.8, exact
inline constexpr double MMBtu = 1.0e6 * Btu;        // trade usage: one million Btu
// therm = 100 000 Btu_IT (common practice in gas billing; NIST SP 811 also lists
// the EC therm 1.05506E+08 J and the US therm 1.054804E+08 J, which differ by
// up to 2e-4; zcorr's therm is the Btu_IT multiple).
inline constexpr double therm = 1.0e5 * Btu;

}  // namespace zcorr::units
