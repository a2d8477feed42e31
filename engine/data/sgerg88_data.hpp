// zcorr engine data: SGERG-88 (ISO 12213-3:2006, Annex B) and the AGA Report
// No. 8 (1992, second printing 1994) gross characterization methods 1 and 2.
//
// Source of every number: the project's transcription of the published
// tables (ISO 12213-3:2006 Annex B; GERG Technical Monograph TM5, Jaeschke,
// Humphreys et al., 1991, Fortschritt-Berichte VDI Reihe 6 Nr. 266, 1992;
// AGA Report No. 8, 1994, gross methods). The values were transcribed from
// knowledge of those tables, not read from the documents; each entry keeps
// the confidence label of the transcription. They were checked numerically
// against an independent GERG-2008 evaluation (B11 of methane and of typical
// hydrocarbon mixtures within 0.3 cm3/mol; pure N2, CO2, H2 B within
// 0.15/1.4/0.15 cm3/mol; the constants mutually consistent to 2e-7).
//
// Known gaps (refused by the method, never filled by a stand-in):
//  - C114 (CH-CH-H2) and C144 (CH-H2-H2) were not recalled. Without them Z
//    is about 2 % low for 10 % H2 at 273 K / 12 MPa, so every hydrogen-bearing
//    input is refused with Code::coefficients_missing. `hydrogen_terms` below
//    is where the published coefficients go to lift that limit.
//  - The CO polynomial is stored as C115 (CH-CH-CO); it may instead be the
//    pure-CO C555 (confidence low). It only enters with hydrogen (x_CO =
//    0.0964 x_H2), so it is unused while hydrogen is refused.
//  - B24, B25, B34, B35, B45 and the C_ijk with H2 or CO not listed here are
//    taken as zero (medium-low).
//  - AGA8 gross methods: the Report's conversion of the molar heating value
//    from its reference temperature to the 25 degC basis of the correlations
//    was not recalled; see `hv_temperature_coefficient_per_K`.
//
// Units (as in the standard): T in K, p in kPa, R in kJ/(kmol K), molar
// density in kmol/m3, B in m3/kmol, C in m6/kmol2, molar heating values in
// MJ/kmol (= kJ/mol), molar masses in kg/kmol.
//
// Component numbering of the method: 1 = CH (equivalent hydrocarbon),
// 2 = N2, 3 = CO2, 4 = H2, 5 = CO.
//
// Does not throw, does not allocate, does no I/O.
#pragma once

#include <array>

namespace zcorr::sgerg88::data {

// X(T) = a0 + a1 T + a2 T^2 (T in K).
struct Poly2 {
  double a0, a1, a2;
};

// ---- constants (ISO 12213-3 Annex B) --------------------------------------
inline constexpr double R = 8.31451;             // kJ/(kmol K), medium-high
inline constexpr double T_n_K = 273.15;          // metering reference temperature, high
inline constexpr double p_n_kPa = 101.325;       // metering reference pressure, high
inline constexpr double t_combustion_C = 25.0;   // combustion reference of Hs and H_i, high
inline constexpr double rho_air_n = 1.292923;    // kg/m3, dry air at T_n, p_n, medium-high
inline constexpr double M_N2 = 28.0135;          // kg/kmol, medium-high
inline constexpr double M_CO2 = 44.010;          // kg/kmol, medium-high
inline constexpr double M_H2 = 2.0159;           // kg/kmol, medium-high
inline constexpr double M_CO = 28.010;           // kg/kmol, medium-high
inline constexpr double H_H2 = 285.83;           // MJ/kmol at 25 degC, medium-high
inline constexpr double H_CO = 282.98;           // MJ/kmol at 25 degC, medium-high
inline constexpr double G1 = -2.709328;          // kg/kmol; M_CH = G1 + G2 H_CH, medium-high
inline constexpr double G2 = 0.021062199;        // kg/MJ, medium-high
inline constexpr double r_CO_H2 = 0.0964;        // x_CO = r_CO_H2 x_H2, high

// ---- equivalent hydrocarbon: B11(T, H) and C111(T, H) ---------------------
// X(T, H) = sum_k (a0_k + a1_k T + a2_k T^2) H^k, k = 0, 1, 2 (H = H_CH).
inline constexpr std::array<Poly2, 3> B11{{
    {-0.425468, 0.2865e-2, -0.462073e-5},       // H^0, medium-high
    {0.877118e-3, -0.556281e-5, 0.881510e-8},   // H^1, medium-high
    {-0.824747e-6, 0.431436e-8, -0.608319e-11}  // H^2, medium-high
}};
inline constexpr std::array<Poly2, 3> C111{{
    {-0.302488, 0.195861e-2, -0.316302e-5},     // H^0, medium-high
    {0.646422e-3, -0.422876e-5, 0.688157e-8},   // H^1, medium-high
    {-0.332805e-6, 0.223160e-8, -0.367713e-11}  // H^2, medium-high
}};

// ---- second virial coefficients, m3/kmol ----------------------------------
inline constexpr Poly2 B22{-0.1446, 0.74091e-3, -0.91195e-6};            // N2-N2, high
inline constexpr Poly2 B23{-0.339693, 0.161176e-2, -0.204429e-5};        // N2-CO2, medium-high
inline constexpr Poly2 B33{-0.86834, 0.40376e-2, -0.51657e-5};           // CO2-CO2, high
inline constexpr Poly2 B44{-0.110596e-2, 0.813385e-4, -0.98722e-7};      // H2-H2, medium
inline constexpr Poly2 B14{-0.521280e-1, 0.271570e-3, -0.25e-6};         // CH-H2, medium
inline constexpr Poly2 B15{-0.687290e-1, -0.239381e-5, 0.518195e-6};     // CH-CO, medium-low
inline constexpr Poly2 B55{-0.130820, 0.602540e-3, -0.644300e-6};        // CO-CO, medium

// ---- third virial coefficients, m6/kmol2 ----------------------------------
inline constexpr Poly2 C222{0.784980e-2, -0.398950e-4, 0.611870e-7};     // N2, high
inline constexpr Poly2 C223{0.552066e-2, -0.168609e-4, 0.157169e-7};     // N2-N2-CO2, medium-high
inline constexpr Poly2 C233{0.358783e-2, 0.806674e-5, -0.325798e-7};     // N2-CO2-CO2, medium-high
inline constexpr Poly2 C333{0.205130e-2, 0.348880e-4, -0.837030e-7};     // CO2, high
inline constexpr Poly2 C444{0.104711e-2, -0.364887e-5, 0.467095e-8};     // H2, medium
inline constexpr Poly2 C115{0.736748e-2, -0.276578e-4, 0.343051e-7};     // CH-CH-CO (or C555), low

// The CH-H2 third virial terms. Not known: the method refuses hydrogen.
// To lift the limit, enter the published C114(T) and C144(T) (m6/kmol2)
// from ISO 12213-3 Annex B, set known = true, and add the reference states
// of hydrogen-bearing gases to the tests (see tests/sgerg88_test.cpp).
struct HydrogenTerms {
  bool known;
  Poly2 C114;  // CH-CH-H2
  Poly2 C144;  // CH-H2-H2
};
inline constexpr HydrogenTerms hydrogen_terms{false, {0.0, 0.0, 0.0}, {0.0, 0.0, 0.0}};

// ---- interaction parameters (all high) ------------------------------------
// B12 = [z12_c0 + z12_c1 (z12_T - T)^2] (B11 + B22) / 2
inline constexpr double z12_c0 = 0.72, z12_c1 = 1.875e-5, z12_T = 320.0;
// B13 = z13 sqrt(B11 B33)
inline constexpr double z13 = -0.865;
// C112 = y12 (C111^2 C222)^(1/3), C122 = y12 (C111 C222^2)^(1/3),
// y12 = y12_c0 + y12_c1 (T - y12_T)
inline constexpr double y12_c0 = 0.92, y12_c1 = 0.0013, y12_T = 270.0;
// C113 = y13 (C111^2 C333)^(1/3), C133 = y13 (C111 C333^2)^(1/3)
inline constexpr double y13 = 0.92;
// C123 = y123 (C111 C222 C333)^(1/3)
inline constexpr double y123 = 1.10;

// The derived N2 fraction of a gas with little or no nitrogen can come out
// slightly negative, because M_CH = G1 + G2 H_CH is a correlation (it gives
// 16.048 kg/kmol for methane, 16.043 exact): pure methane with ISO 6976:2016
// inputs gives x2 = -0.0004. zcorr's own rule (not from the standard): a
// derived x2 down to -x_N2_negative_tolerance is used as computed and
// classed as x_N2 = 0; below that the inputs are refused as inconsistent.
inline constexpr double x_N2_negative_tolerance = 0.01;

// ---- ranges of application (ISO 12213-3; confidence medium to low) -------
struct Interval {
  double lo, hi;
};
struct Ranges {
  Interval p_MPa, T_K, Hs_MJ_per_m3, d, x_CO2, x_N2, x_H2, x_CO;
};
// Pipeline-quality ("normal") and wider ("expanded") ranges.
inline constexpr Ranges normal_range{{0, 12}, {263, 338}, {30, 45}, {0.55, 0.80}, {0, 0.20}, {0, 0.20}, {0, 0.10}, {0, 0.03}};
inline constexpr Ranges expanded_range{{0, 12}, {263, 338}, {20, 48}, {0.55, 0.90}, {0, 0.30}, {0, 0.50}, {0, 0.10}, {0, 0.03}};

}  // namespace zcorr::sgerg88::data

namespace zcorr::aga8_gross::data {

// AGA Report No. 8 (1994) gross methods 1 and 2: they share the SGERG-88
// correlations above and add these items (confidence as noted).
inline constexpr double R = 8.31451;           // kJ/(kmol K), medium-high
inline constexpr double M_air = 28.9625;       // kg/kmol, medium
// B_air(T) = a0 + a1 T + a2 T^2, m3/kmol; Z_air = 1 + B_air p / (R T) (medium;
// reproduces the ISO 6976 Z_air at 0, 15 and 20 degC to 1e-5).
inline constexpr sgerg88::data::Poly2 B_air{-0.12527, 5.91e-4, -6.62e-7};

// Default reference conditions of the Report (user-selectable there):
// heating-value combustion temperature, and the temperature and pressure of
// the heating-value volume and of the relative density: 60 degF, 14.73 psia
// (medium).
inline constexpr double T_ref_K = (60.0 + 459.67) / 1.8;               // 288.705556 K
inline constexpr double p_ref_kPa = 14.73 * 0.45359237 * 9.80665 / (0.0254 * 0.0254) / 1000.0;  // 101.559775 kPa

// Conversion of the molar heating value from the combustion reference
// temperature Th to the 25 degC basis of the correlations:
//   H(25 degC) = H(Th) [1 + alpha (Th - 298.15 K)].
// NOT the Report's relation (not recalled): alpha is the project's own
// approximation from the temperature dependence of the ideal gross molar
// calorific value of methane in ISO 6976:2016 (891.46 kJ/mol at 15.55 degC,
// interpolated, and 890.58 kJ/mol at 25 degC; project ISO 6976 data):
//   alpha = (890.58 / 891.46 - 1) / (288.705556 - 298.15) = 1.0452e-4 / K.
// For ethane the same ratio gives 0.93e-4 / K; the spread (0.1e-4 / K) moves
// H_CH by about 0.01 % at 60 degF, below 1e-5 in Z. Results of gross method 1
// carry flag::doubtful_data for this reason.
inline constexpr double hv_temperature_coefficient_per_K = (890.58 / 891.46 - 1.0) / (288.7055555555556 - 298.15);

// Normal ranges of the gross methods (medium-low; N2, CO2, H2, CO low).
struct Ranges {
  sgerg88::data::Interval T_K, p_kPa, HV_MJ_per_m3, Gr, x_N2, x_CO2, x_H2, x_CO;
};
inline constexpr double btu_per_ft3_in_MJ_per_m3 = 1055.05585262 / (0.3048 * 0.3048 * 0.3048) / 1.0e6;  // exact, 0.0372589458
inline constexpr Ranges normal_range{
    {(32.0 + 459.67) / 1.8, (130.0 + 459.67) / 1.8},                       // 32-130 degF
    {0.0, 1200.0 * 0.45359237 * 9.80665 / (0.0254 * 0.0254) / 1000.0},    // 0-1200 psia
    {477.0 * btu_per_ft3_in_MJ_per_m3, 1150.0 * btu_per_ft3_in_MJ_per_m3},  // 477-1150 Btu/ft3
    {0.554, 0.87},
    {0.0, 0.50},
    {0.0, 0.30},
    {0.0, 0.10},
    {0.0, 0.03}};

}  // namespace zcorr::aga8_gross::data
