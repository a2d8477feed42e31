// zcorr method: AGA Report No. 8 (1992, second printing 1994), gross
// characterization methods 1 and 2.
//
// Both use the SGERG-88 virial correlations and mixing rules
// (methods/sgerg88.hpp, data/sgerg88_data.hpp) and differ from SGERG-88 in
// their inputs and reference conditions:
//  - method 1: volumetric gross heating value HV, real-gas relative density
//    Gr and x_CO2;
//  - method 2: Gr, x_N2 and x_CO2 (H_CH follows from the molar mass of the
//    equivalent hydrocarbon, H_CH = (M_CH - G1) / G2);
//  - reference conditions: HV combustion at Th, HV volume and Gr at
//    (Td, pd); the Report's defaults are 60 degF and 14.73 psia, and they are
//    user-selectable (as in the Report);
//  - air: M_air = 28.9625 kg/kmol and B_air(T), so rho_air = M_air pd /
//    (Z_air R Td) with Z_air = 1 + B_air pd / (R Td).
// Characterization: fixed-point iteration on the reference-state Z of the
// gas, Z = 1 + B_mix(Td) pd / (R Td), from Z = 1, bounded.
//
// Not recalled, and handled as follows:
//  - the Report's conversion of the molar heating value from Th to the
//    25 degC basis of the correlations: method 1 uses the project's
//    approximation H(25 degC) = H(Th) [1 + alpha (Th - 298.15 K)] (see
//    data/sgerg88_data.hpp) and flags every result flag::doubtful_data;
//  - the treatment of H2 and CO: hydrogen-bearing inputs are refused with
//    Code::coefficients_missing (the CH-H2 third virial terms are unknown, as
//    for SGERG-88); no CO is assumed.
// Ranges: the Report's normal range of the gross methods (32-130 degF,
// 0-1200 psia, HV 477-1150 Btu/ft3, Gr 0.554-0.87, x_N2 <= 0.50,
// x_CO2 <= 0.30); outside it a state is refused unless allowed, then flagged.
//
// Does not throw, does not allocate, does no I/O. Every result carries a Status.
#pragma once

#include "methods/sgerg88.hpp"

namespace zcorr::aga8_gross {

using sgerg88::CharacterizationOptions;
using sgerg88::Mixture;
using sgerg88::State;

struct ReferenceConditions {
  double T_h_K = data::T_ref_K;      // combustion reference temperature of HV
  double T_d_K = data::T_ref_K;      // temperature of the HV volume and of Gr
  double p_d_kPa = data::p_ref_kPa;  // pressure of the HV volume and of Gr
};

template <class S>
struct Method1Input {
  S HV_MJ_per_m3{};  // volumetric gross heating value (Btu/ft3 x 0.0372589458)
  S Gr{};
  S x_CO2{};
  S x_H2{};
};

template <class S>
struct Method2Input {
  S Gr{};
  S x_N2{};
  S x_CO2{};
  S x_H2{};
};

namespace detail {

using sgerg88::detail::inside;

template <class S>
[[nodiscard]] inline S z_air(const S& T, const S& p_kPa) noexcept {
  return S(1) + sgerg88::detail::poly(data::B_air, T) * p_kPa / (S(data::R) * T);
}

template <class S>
[[nodiscard]] inline S rho_air(const ReferenceConditions& rc) noexcept {
  const S T(rc.T_d_K), p(rc.p_d_kPa);
  return S(data::M_air) * p / (z_air(T, p) * S(data::R) * T);
}

[[nodiscard]] inline bool reference_ok(const ReferenceConditions& rc) noexcept {
  return std::isfinite(rc.T_h_K) && std::isfinite(rc.T_d_K) && std::isfinite(rc.p_d_kPa) && rc.T_h_K > 200.0 &&
         rc.T_h_K < 400.0 && rc.T_d_K > 200.0 && rc.T_d_K < 400.0 && rc.p_d_kPa > 50.0 && rc.p_d_kPa < 150.0;
}

template <class S>
[[nodiscard]] inline S h_factor(const ReferenceConditions& rc) noexcept {
  return S(1) + S(data::hv_temperature_coefficient_per_K) * (S(rc.T_h_K) - S(298.15));
}

// HV at the reference conditions that a characterized gas implies.
template <class S>
[[nodiscard]] inline S hv_of(const Mixture<S>& m, const ReferenceConditions& rc) noexcept {
  const S V = m.Z_ref * S(data::R) * S(rc.T_d_K) / S(rc.p_d_kPa);
  return m.x[0] * m.H_CH_MJ_per_kmol / h_factor<S>(rc) / V;
}

template <class S>
[[nodiscard]] RangeClass classify(const S& HV, const S& Gr, const Mixture<S>& m) noexcept {
  const auto& r = data::normal_range;
  const bool ok = inside(r.HV_MJ_per_m3, HV) && inside(r.Gr, Gr) && inside(r.x_N2, m.x[1] < S(0) ? S(0) : m.x[1]) && inside(r.x_CO2, m.x[2]) &&
                  inside(r.x_H2, m.x[3]) && inside(r.x_CO, m.x[4]);
  return ok ? RangeClass::normal : RangeClass::outside;
}

}  // namespace detail

// Gross method 1: (HV, Gr, x_CO2). Status as for sgerg88::prepare; results
// carry flag::doubtful_data (heating-value temperature conversion, above).
template <class S>
[[nodiscard]] Mixture<S> prepare_method1(const Method1Input<S>& in, const ReferenceConditions& rc = {},
                                         const CharacterizationOptions& opt = {}) noexcept {
  Mixture<S> m;
  if (!sgerg88::detail::finite_all({in.HV_MJ_per_m3, in.Gr, in.x_CO2, in.x_H2}) || !(in.HV_MJ_per_m3 > S(0)) ||
      !(in.Gr > S(0)) || in.x_CO2 < S(0) || !(in.x_CO2 < S(1)) || in.x_H2 < S(0) || !(in.x_H2 < S(1)) ||
      !detail::reference_ok(rc)) {
    m.status = make_status(Code::invalid_input);
    return m;
  }
  if (in.x_H2 > S(0) && !sgerg88::data::hydrogen_terms.known) {
    m.status = make_status(Code::coefficients_missing);
    return m;
  }
  m = sgerg88::detail::characterize_hd(in.HV_MJ_per_m3, in.Gr, in.x_CO2, in.x_H2, S(rc.T_d_K), S(rc.p_d_kPa),
                                       detail::rho_air<S>(rc), detail::h_factor<S>(rc), opt);
  if (!m.status.ok()) return m;
  if (m.x[1] < S(-sgerg88::data::x_N2_negative_tolerance)) {
    m.status = make_status(Code::invalid_input);
    return m;
  }
  m.status.range = detail::classify(in.HV_MJ_per_m3, in.Gr, m);
  m.status.flags |= flag::doubtful_data;
  return m;
}

// Gross method 2: (Gr, x_N2, x_CO2).
template <class S>
[[nodiscard]] Mixture<S> prepare_method2(const Method2Input<S>& in, const ReferenceConditions& rc = {},
                                         const CharacterizationOptions& opt = {}) noexcept {
  namespace sd = sgerg88::data;
  Mixture<S> m;
  if (!sgerg88::detail::finite_all({in.Gr, in.x_N2, in.x_CO2, in.x_H2}) || !(in.Gr > S(0)) || in.x_N2 < S(0) ||
      in.x_CO2 < S(0) || in.x_H2 < S(0) || !(in.x_N2 + in.x_CO2 + in.x_H2 < S(1)) || !detail::reference_ok(rc)) {
    m.status = make_status(Code::invalid_input);
    return m;
  }
  if (in.x_H2 > S(0) && !sd::hydrogen_terms.known) {
    m.status = make_status(Code::coefficients_missing);
    return m;
  }
  const S R(sd::R), T(rc.T_d_K), p(rc.p_d_kPa);
  const S rho_a = detail::rho_air<S>(rc);
  const S x2 = in.x_N2, x3 = in.x_CO2, x4 = in.x_H2, x5 = S(sd::r_CO_H2) * x4;
  const S x1 = S(1) - x2 - x3 - x4 - x5;
  if (!(x1 > S(0))) { m.status = make_status(Code::invalid_input); return m; }
  m.x = {x1, x2, x3, x4, x5};
  S Z(1);
  const int cap = opt.max_iter < 1 ? 1 : opt.max_iter;
  for (int it = 1; it <= cap; ++it) {
    m.iterations = it;
    const S V = Z * R * T / p;
    const S M = in.Gr * rho_a * V;
    const S M_CH = (M - x2 * S(sd::M_N2) - x3 * S(sd::M_CO2) - x4 * S(sd::M_H2) - x5 * S(sd::M_CO)) / x1;
    const S H = (M_CH - S(sd::G1)) / S(sd::G2);
    if (!num::isfinite_(H) || !(H > S(0))) { m.status = make_status(Code::invalid_input); return m; }
    m.H_CH_MJ_per_kmol = H;
    m.M_CH_kg_per_kmol = M_CH;
    m.M_kg_per_kmol = M;
    sgerg88::detail::hydrocarbon_polys(m);
    const S Zn = S(1) + sgerg88::detail::b_mix(m, T) * p / (R * T);
    if (!num::isfinite_(Zn)) { m.status = make_status(Code::invalid_input); return m; }
    const S change = num::abs_(S(Zn - Z));
    Z = Zn;
    m.Z_ref = Z;
    if (change <= S(opt.tol)) {
      m.status.range = detail::classify(detail::hv_of(m, rc), in.Gr, m);
      return m;
    }
  }
  m.status = make_status(Code::no_convergence);
  m.status.flags |= flag::iteration_cap;
  return m;
}

// Z at (T, p) for a gas prepared by method 1 or 2, with the gross methods'
// state range (32-130 degF, 0-1200 psia).
template <class S>
[[nodiscard]] State<S> z_factor(const Mixture<S>& m, const S& T_K, const S& p_Pa, const SolveOptions& opt = {}) noexcept {
  State<S> s;
  if (!m.status.ok()) { s.status = m.status; return s; }
  if (auto a = sgerg88::detail::check_state_args(T_K, p_Pa); !a.ok()) { s.status = a; return s; }
  const S p_kPa = p_Pa / S(1000);
  const RangeClass st = (detail::inside(data::normal_range.T_K, T_K) && detail::inside(data::normal_range.p_kPa, p_kPa))
                            ? RangeClass::normal
                            : RangeClass::outside;
  if (!sgerg88::detail::range_gate(s, m.status.range, st, opt)) return s;
  const Status keep = s.status;
  s = sgerg88::detail::solve(m, T_K, p_kPa, opt);
  s.status.range = keep.range;
  s.status.flags |= keep.flags | m.status.flags;
  return s;
}

}  // namespace zcorr::aga8_gross
