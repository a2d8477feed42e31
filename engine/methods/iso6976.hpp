// zcorr method: ISO 6976:2016, Natural gas - Calculation of calorific values,
// density, relative density and Wobbe indices from composition (third edition).
//
// What is implemented (equations as written out in the component data set's
// README, which follows the standard's clauses as recalled, not as read):
//   M            = sum x_j M_j                                  (Table 1 data)
//   Hs, Hi       = sum x_j Hs_j(t1), Hi_j = Hs_j - (n_H,j/2) L(t1)   (Table 3 data; ideal gas)
//   Z(t2, p2)    = 1 - (p2/p0) (sum x_j s_j(t2))^2, p0 = 101.325 kPa (Table 2 data; the virial
//                  expansion truncated after B, with B_mix from the summation factors)
//   V            = Z R T2 / p2,  R = 8.3144621 J/(mol K)
//   Hs_v         = Hs p2 / (Z R T2)    (real gas, per m^3 at t2, p2)
//   rho          = M p2 / (Z R T2)
//   G            = M / M_air,  d = G Z_air(t2, p2) / Z(t2, p2)
//   W            = Hs_v / sqrt(d)      (gross Ws, net Wi)
//   mass basis   = molar value / M
// Z_air at p2 other than p0 is scaled the same way as the mixture,
// Z_air(t2, p2) = 1 - (p2/p0)(1 - Z_air(t2, p0)), so that d compares gas and
// air at the same state (our reading of "relative density at t2, p2").
//
// Metering pressure: the summation-factor method is a low-pressure one. We accept
// p2 in [90 kPa, 110 kPa] (a window around 101.325 kPa that covers 14.696 and
// 14.73 psia; the window is our choice, the standard's own statement of the
// pressure range is only known from memory, low) and refuse other pressures with
// Code::out_of_range. A mixture whose Z(t2, p2) falls below 0.9 is computed but
// flagged (range outside, flag extrapolated): the truncated virial form is
// meant for gases close to ideal (common practice).
//
// Data and their confidence: engine/data/iso6976_data.hpp (generated from the
// project's copy of the ISO 6976:2016 component data set). Status flag
// doubtful_data is set when a component present in the mixture (x_j > 0) has a
// Z/s row (metering side) or a gross-calorific-value row (at t1) below
// medium-high confidence; doubtful_components() lists them for provenance
// output. The constants L(t) of water (medium-low; net values only) and Z_air
// (medium; relative density and Wobbe index only) are below medium-high too.
// They would flag every result, so they do not set the flag; doubtful_constants()
// reports them and output that shows net values, d or W must say so.
//
// Hydrogen and helium: their s are effective values (-0.0051 and 0, low
// confidence), fitted to the mixtures' cross terms, not sqrt(1 - Z). A gas rich
// in them therefore does not reproduce their pure-component Z: pure hydrogen
// comes out 0.99997 against the tabulated 1.0006. The data set found hydrogen
// blends up to 0.30 within 7e-5 of GERG-2008. Both rows set doubtful_data.
//
// The US customary route (GPA 2172 with GPA 2145 data at 60 F / 14.696 psia) is
// NOT implemented: its tables are not known here reliably. For US base
// conditions use MeteringRef::t15_55C with p2 = 14.73 or 14.696 psia (ISO 6976
// data at 60 F, pressure scaled as above).
//
// Templated on the scalar. In multiprecision the same double-valued table
// entries are used: that checks the arithmetic, not the data.
// Does not throw, does not allocate, does no I/O; every loop runs over the 21
// components.
#pragma once

#include <array>
#include <cstddef>
#include <limits>
#include <string_view>

#include "core/components.hpp"
#include "core/composition.hpp"
#include "core/scalar.hpp"
#include "core/status.hpp"
#include "core/units.hpp"
#include "data/iso6976_data.hpp"

namespace zcorr::iso6976 {

using data::Confidence;

enum class CombustionRef { t0C, t15C, t15_55C, t20C, t25C };
enum class MeteringRef { t0C, t15C, t15_55C, t20C };

inline constexpr std::array<CombustionRef, 5> all_combustion_refs{CombustionRef::t0C, CombustionRef::t15C, CombustionRef::t15_55C,
                                                                  CombustionRef::t20C, CombustionRef::t25C};
inline constexpr std::array<MeteringRef, 4> all_metering_refs{MeteringRef::t0C, MeteringRef::t15C, MeteringRef::t15_55C,
                                                              MeteringRef::t20C};

// Accepted metering pressure window (see the header comment).
inline constexpr double p2_min_Pa = 90.0e3;
inline constexpr double p2_max_Pa = 110.0e3;
// Below this mixture Z the result is flagged (common practice, see above).
inline constexpr double Z_flag_below = 0.9;

[[nodiscard]] constexpr std::size_t ref_index(CombustionRef t) noexcept { return static_cast<std::size_t>(t); }
[[nodiscard]] constexpr std::size_t ref_index(MeteringRef t) noexcept { return static_cast<std::size_t>(t); }
[[nodiscard]] constexpr bool valid(CombustionRef t) noexcept { return ref_index(t) < data::n_combustion_T; }
[[nodiscard]] constexpr bool valid(MeteringRef t) noexcept { return ref_index(t) < data::n_metering_T; }

// 15.55 C stands for 60 F exactly: (60 + 459.67)/1.8 K = 288.7055... K.
[[nodiscard]] constexpr double temperature_K(MeteringRef t) noexcept {
  switch (t) {
    case MeteringRef::t0C: return units::zero_celsius_K;
    case MeteringRef::t15C: return units::zero_celsius_K + 15.0;
    case MeteringRef::t15_55C: return units::fahrenheit_to_K(60.0);
    case MeteringRef::t20C: return units::zero_celsius_K + 20.0;
  }
  return 0.0;
}
[[nodiscard]] constexpr double temperature_K(CombustionRef t) noexcept {
  switch (t) {
    case CombustionRef::t0C: return units::zero_celsius_K;
    case CombustionRef::t15C: return units::zero_celsius_K + 15.0;
    case CombustionRef::t15_55C: return units::fahrenheit_to_K(60.0);
    case CombustionRef::t20C: return units::zero_celsius_K + 20.0;
    case CombustionRef::t25C: return units::zero_celsius_K + 25.0;
  }
  return 0.0;
}
// Labels as used on the command line and in case files ("0", "15", "15.55", "20", "25").
[[nodiscard]] constexpr std::string_view label(CombustionRef t) noexcept {
  constexpr std::array<std::string_view, 5> n{"0", "15", "15.55", "20", "25"};
  return valid(t) ? n[ref_index(t)] : std::string_view{};
}
[[nodiscard]] constexpr std::string_view label(MeteringRef t) noexcept {
  constexpr std::array<std::string_view, 4> n{"0", "15", "15.55", "20"};
  return valid(t) ? n[ref_index(t)] : std::string_view{};
}

template <class S>
struct Properties {
  S M_g_per_mol;     // molar mass
  S Z;               // compression factor at t2, p2
  S G_ideal;         // ideal-gas relative density M / M_air
  S d;               // real-gas relative density at t2, p2
  S rho_kg_per_m3;   // density at t2, p2
  S Hs_kJ_per_mol;   // gross, molar, ideal gas, at t1
  S Hi_kJ_per_mol;   // net, molar, ideal gas, at t1
  S Hs_MJ_per_kg;    // gross, mass basis
  S Hi_MJ_per_kg;    // net, mass basis
  S Hs_MJ_per_m3;    // gross, real gas, per m^3 at t2, p2
  S Hi_MJ_per_m3;    // net, real gas, per m^3 at t2, p2
  S Ws_MJ_per_m3;    // gross Wobbe index
  S Wi_MJ_per_m3;    // net Wobbe index
  Status status;     // flags doubtful_data when a present component's row is below medium-high confidence
};

// Confidence of one component's rows as used for (t1, t2).
struct RowConfidence {
  Confidence zs;  // Z and s
  Confidence hs;  // gross calorific value at t1
};
[[nodiscard]] constexpr RowConfidence row_confidence(Component c, CombustionRef t1) noexcept {
  const auto& r = data::components[index(c)];
  return {r.zs_confidence, t1 == CombustionRef::t25C ? r.hs25_confidence : r.hs_other_confidence};
}
[[nodiscard]] constexpr bool doubtful(Confidence c) noexcept { return c < Confidence::medium_high; }

struct DoubtfulRow {
  Component component;
  Confidence zs;
  Confidence hs;
  bool zs_doubtful;
  bool hs_doubtful;
};
struct DoubtfulRows {
  std::array<DoubtfulRow, max_components> rows{};
  std::size_t count = 0;
};

// Present components (x_j > 0) whose Z/s row or gross-calorific row at t1 is
// below medium-high confidence, in canonical order.
template <class S>
[[nodiscard]] DoubtfulRows doubtful_components(const Fractions<S>& x, CombustionRef t1) noexcept {
  DoubtfulRows out;
  if (!valid(t1)) return out;
  for (std::size_t i = 0; i < max_components; ++i) {
    if (!(x[i] > S(0))) continue;
    const auto c = static_cast<Component>(i);
    const auto rc = row_confidence(c, t1);
    const bool z = doubtful(rc.zs), h = doubtful(rc.hs);
    if (z || h) out.rows[out.count++] = DoubtfulRow{c, rc.zs, rc.hs, z, h};
  }
  return out;
}

// The same list for a (t1, t2) pair: a Z/s row has one confidence for every
// metering temperature, so t2 does not change it (kept for callers that have both).
template <class S>
[[nodiscard]] DoubtfulRows doubtful_components(const Fractions<S>& x, CombustionRef t1, MeteringRef /*t2*/) noexcept {
  return doubtful_components(x, t1);
}

// Constants below medium-high that a result at (t1, t2) uses.
struct DoubtfulConstants {
  bool L_water;  // enthalpy of vaporization of water at t1: net values
  Confidence L_water_confidence;
  bool Z_air;    // compression factor of air at t2: relative density, Wobbe indices
  Confidence Z_air_confidence;
};
[[nodiscard]] constexpr DoubtfulConstants doubtful_constants(CombustionRef t1) noexcept {
  const Confidence lc = valid(t1) ? data::L_water_confidence[ref_index(t1)] : Confidence::low;
  return {doubtful(lc), lc, doubtful(data::Z_air_confidence), data::Z_air_confidence};
}

namespace detail {
template <class S>
void fill_nan(Properties<S>& r) noexcept {
  const S n = std::numeric_limits<S>::quiet_NaN();
  r.M_g_per_mol = r.Z = r.G_ideal = r.d = r.rho_kg_per_m3 = n;
  r.Hs_kJ_per_mol = r.Hi_kJ_per_mol = r.Hs_MJ_per_kg = r.Hi_MJ_per_kg = n;
  r.Hs_MJ_per_m3 = r.Hi_MJ_per_m3 = r.Ws_MJ_per_m3 = r.Wi_MJ_per_m3 = n;
}
}  // namespace detail

// Properties of a gas of mole fractions x (canonical order) at combustion
// reference temperature t1 and metering reference conditions t2, p2.
// Refused (every value NaN, status says why): a bad composition
// (check_fractions, default tolerance), an invalid reference enum, p2 not
// finite or <= 0 (invalid_pressure), p2 outside [p2_min_Pa, p2_max_Pa]
// (out_of_range). Fractions are used as given (not normalised); a sum within
// the tolerance but not exactly 1 carries flag::sum_not_unity.
// Does not throw, does not allocate.
template <class S>
[[nodiscard]] Properties<S> properties(const Fractions<S>& x, CombustionRef t1, MeteringRef t2, S p2_Pa = S(101325)) noexcept {
  Properties<S> r{};
  detail::fill_nan(r);
  if (!valid(t1) || !valid(t2)) {
    r.status = make_status(Code::invalid_input);
    return r;
  }
  Status st = check_fractions(x);
  if (!st.ok()) {
    r.status = st;
    return r;
  }
  if (!num::isfinite_(p2_Pa) || !(p2_Pa > S(0))) {
    r.status = make_status(Code::invalid_pressure);
    return r;
  }
  if (p2_Pa < S(p2_min_Pa) || p2_Pa > S(p2_max_Pa)) {
    r.status = make_status(Code::out_of_range);
    r.status.range = RangeClass::outside;
    return r;
  }
  const std::size_t i1 = ref_index(t1), i2 = ref_index(t2);
  const S L = num::c<S>(data::L_water_kJ_per_mol[i1]);
  S M(0), sum_s(0), Hs(0), Hi(0);
  for (std::size_t j = 0; j < max_components; ++j) {
    if (x[j] == S(0)) continue;
    const auto& row = data::components[j];
    const S hs_j = num::c<S>(row.Hs_kJ_per_mol[i1]);
    M += x[j] * num::c<S>(row.M_g_per_mol);
    sum_s += x[j] * num::c<S>(row.s[i2]);
    Hs += x[j] * hs_j;
    Hi += x[j] * (hs_j - S(row.n_H) / S(2) * L);
    const auto rc = row_confidence(static_cast<Component>(j), t1);
    if (doubtful(rc.zs) || doubtful(rc.hs)) st.flags |= flag::doubtful_data;
  }
  const S p0 = num::c<S>(data::p0_Pa);
  const S R = num::c<S>(data::R_J_per_mol_K);
  const S T2 = num::c<S>(temperature_K(t2));
  const S pr = p2_Pa / p0;
  const S Z = S(1) - pr * sum_s * sum_s;
  const S Z_air = S(1) - pr * (S(1) - num::c<S>(data::Z_air[i2]));
  const S M_air = num::c<S>(data::M_air_g_per_mol);
  const S n_per_m3 = p2_Pa / (Z * R * T2);  // real-gas molar density at t2, p2, mol/m^3

  r.M_g_per_mol = M;
  r.Z = Z;
  r.G_ideal = M / M_air;
  r.d = r.G_ideal * Z_air / Z;
  r.rho_kg_per_m3 = M * n_per_m3 / S(1000);
  r.Hs_kJ_per_mol = Hs;
  r.Hi_kJ_per_mol = Hi;
  r.Hs_MJ_per_kg = Hs / M;
  r.Hi_MJ_per_kg = Hi / M;
  r.Hs_MJ_per_m3 = Hs * n_per_m3 / S(1000);
  r.Hi_MJ_per_m3 = Hi * n_per_m3 / S(1000);
  const S sd = num::sqrt_(r.d);
  r.Ws_MJ_per_m3 = r.Hs_MJ_per_m3 / sd;
  r.Wi_MJ_per_m3 = r.Hi_MJ_per_m3 / sd;
  st.range = RangeClass::normal;
  if (Z < S(Z_flag_below)) {
    st.range = RangeClass::outside;
    st.flags |= flag::extrapolated;
  }
  r.status = st;
  return r;
}

}  // namespace zcorr::iso6976
