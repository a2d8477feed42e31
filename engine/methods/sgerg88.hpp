// zcorr method: SGERG-88, ISO 12213-3:2006 "Natural gas - Calculation of
// compression factor - Part 3: Calculation using physical properties"
// (second edition), Annex B; the method of GERG Technical Monograph TM5
// (Jaeschke, Humphreys et al., 1991).
//
// The gas is described by its superior calorific value Hs (MJ/m3, combustion
// at 25 degC, volume at 0 degC and 101.325 kPa), its real-gas relative
// density d (0 degC, 101.325 kPa) and its CO2 and H2 mole fractions. It is
// reduced to five components: 1 = the equivalent hydrocarbon CH (molar
// heating value H_CH, molar mass M_CH = G1 + G2 H_CH), 2 = N2, 3 = CO2,
// 4 = H2, 5 = CO (x5 = 0.0964 x4). Then
//   B_mix(T) = sum_ij x_i x_j B_ij(T),  C_mix(T) = sum_ijk x_i x_j x_k C_ijk(T),
//   Z = 1 + B_mix rho + C_mix rho^2,  p = rho R T Z,
// and the gas root is the smallest positive root of the cubic
//   C rho^3 + B rho^2 + rho - p/(R T) = 0.
// Coefficients and ranges: engine/data/sgerg88_data.hpp (with confidence and
// the known gaps). Hydrogen-bearing gases are refused with
// Code::coefficients_missing while the CH-H2 third virial terms are unknown.
//
// Characterization: fixed-point iteration on the reference-state compression
// factor Z_n, starting from Z_n = 1 (V_n = Z_n R T_n / p_n; H_m = Hs V_n;
// M = d rho_air,n V_n; x1 H_CH = H_m - x4 H_H2 - x5 H_CO; x1 from the molar
// mass balance with M_CH = G1 + G2 H_CH; x2 = 1 - x1 - x3 - x4 - x5;
// Z_n = 1 + B_mix(T_n) p_n / (R T_n)). The standard prescribes its own
// iteration scheme (details not recalled); any scheme that converges solves
// the same equations and reaches the same solution. Bounded by
// CharacterizationOptions::max_iter.
//
// Units follow the standard: T in K, p in kPa, rho in kmol/m3 (= mol/L),
// B in m3/kmol, C in m6/kmol2; results are converted at the edges
// (B_cm3_per_mol = 1000 B, C_cm6_per_mol2 = 1e6 C).
//
// Does not throw, does not allocate, does no I/O. Every result carries a Status.
#pragma once

#include <array>
#include <cmath>
#include <initializer_list>
#include <type_traits>

#include "core/scalar.hpp"
#include "core/solve_options.hpp"
#include "core/status.hpp"
#include "data/sgerg88_data.hpp"

namespace zcorr::sgerg88 {

// Inputs at the standard's reference conditions.
template <class S>
struct GrossInput {
  S Hs_MJ_per_m3{};  // superior calorific value, 25 degC combustion, 0 degC / 101.325 kPa metering
  S d{};             // real-gas relative density at 0 degC / 101.325 kPa
  S x_CO2{};
  S x_H2{};
};

struct CharacterizationOptions {
  int max_iter = 40;
  double tol = 1e-13;  // on the change of Z_n between passes
};

// The characterized gas: what prepare() computes once.
template <class S>
struct Mixture {
  std::array<S, 5> x{};   // CH, N2, CO2, H2, CO
  S H_CH_MJ_per_kmol{};   // molar heating value of the equivalent hydrocarbon (25 degC)
  S M_CH_kg_per_kmol{};   // its molar mass, G1 + G2 H_CH
  S M_kg_per_kmol{};      // molar mass of the gas
  S Z_ref{};              // compression factor at the reference state of the inputs
  // B11(T) and C111(T) at this H_CH: a0 + a1 T + a2 T^2.
  std::array<S, 3> b11{}, c111{};
  Status status{};        // code, and the range class of the inputs
  int iterations = 0;
};

template <class S>
struct Virial {
  S B{};  // m3/kmol
  S C{};  // m6/kmol2
};

// Result of a (T, p) evaluation.
template <class S>
struct State {
  S Z{};
  S rho_mol_per_L{};
  S B_cm3_per_mol{};
  S C_cm6_per_mol2{};
  S Z_virial2{};  // 1 + B rho + C rho^2 at the solved density (equal to Z for this method)
  Status status{};
  int iterations = 0;
};

namespace detail {

template <class S>
[[nodiscard]] inline S poly(const data::Poly2& p, const S& T) noexcept {
  return S(p.a0) + T * (S(p.a1) + T * S(p.a2));
}

template <class S>
[[nodiscard]] inline S cbrt_(const S& v) noexcept {
  if constexpr (std::is_floating_point_v<S>) {
    return std::cbrt(v);
  } else {
    if (v == S(0)) return S(0);
    const S a = num::abs_(v);
    const S r = num::pow_(a, S(1) / S(3));
    return v < S(0) ? S(-r) : r;
  }
}

template <class S>
[[nodiscard]] inline bool finite_all(std::initializer_list<S> v) noexcept {
  for (const auto& e : v)
    if (!num::isfinite_(e)) return false;
  return true;
}

[[nodiscard]] constexpr RangeClass worse(RangeClass a, RangeClass b) noexcept {
  return static_cast<std::uint8_t>(a) > static_cast<std::uint8_t>(b) ? a : b;
}

template <class S>
[[nodiscard]] inline bool inside(const data::Interval& r, const S& v) noexcept {
  return v >= S(r.lo) && v <= S(r.hi);
}

// B11, C111 polynomials in T at a given H_CH.
template <class S>
inline void hydrocarbon_polys(Mixture<S>& m) noexcept {
  const S H = m.H_CH_MJ_per_kmol;
  const S H2 = H * H;
  m.b11[0] = S(data::B11[0].a0) + S(data::B11[1].a0) * H + S(data::B11[2].a0) * H2;
  m.b11[1] = S(data::B11[0].a1) + S(data::B11[1].a1) * H + S(data::B11[2].a1) * H2;
  m.b11[2] = S(data::B11[0].a2) + S(data::B11[1].a2) * H + S(data::B11[2].a2) * H2;
  m.c111[0] = S(data::C111[0].a0) + S(data::C111[1].a0) * H + S(data::C111[2].a0) * H2;
  m.c111[1] = S(data::C111[0].a1) + S(data::C111[1].a1) * H + S(data::C111[2].a1) * H2;
  m.c111[2] = S(data::C111[0].a2) + S(data::C111[1].a2) * H + S(data::C111[2].a2) * H2;
}

// Mixture second virial coefficient only (what the characterization needs).
template <class S>
[[nodiscard]] inline S b_mix(const Mixture<S>& m, const S& T) noexcept {
  const auto& x = m.x;
  const S B11 = m.b11[0] + T * (m.b11[1] + T * m.b11[2]);
  const S B22 = poly(data::B22, T);
  const S B33 = poly(data::B33, T);
  const S dT = S(data::z12_T) - T;
  const S B12 = (S(data::z12_c0) + S(data::z12_c1) * dT * dT) * (B11 + B22) / S(2);
  const S B13 = S(data::z13) * num::sqrt_(S(B11 * B33));
  S B = x[0] * x[0] * B11 + S(2) * x[0] * x[1] * B12 + S(2) * x[0] * x[2] * B13 + x[1] * x[1] * B22 +
        S(2) * x[1] * x[2] * poly(data::B23, T) + x[2] * x[2] * B33;
  if (x[3] != S(0) || x[4] != S(0)) {
    B += S(2) * x[0] * x[3] * poly(data::B14, T) + S(2) * x[0] * x[4] * poly(data::B15, T) +
         x[3] * x[3] * poly(data::B44, T) + x[4] * x[4] * poly(data::B55, T);
  }
  return B;
}

}  // namespace detail

// Mixture virial coefficients at T (K) for a characterized gas.
template <class S>
[[nodiscard]] Virial<S> virial(const Mixture<S>& m, const S& T) noexcept {
  using namespace detail;
  const auto& x = m.x;
  Virial<S> v;
  v.B = b_mix(m, T);
  const S C111 = m.c111[0] + T * (m.c111[1] + T * m.c111[2]);
  const S C222 = poly(data::C222, T);
  const S C333 = poly(data::C333, T);
  const S r1 = cbrt_(C111), r2 = cbrt_(C222), r3 = cbrt_(C333);
  const S y12 = S(data::y12_c0) + S(data::y12_c1) * (T - S(data::y12_T));
  const S C112 = y12 * r1 * r1 * r2;
  const S C122 = y12 * r1 * r2 * r2;
  const S C113 = S(data::y13) * r1 * r1 * r3;
  const S C133 = S(data::y13) * r1 * r3 * r3;
  const S C123 = S(data::y123) * r1 * r2 * r3;
  const S x1 = x[0], x2 = x[1], x3 = x[2];
  S C = x1 * x1 * x1 * C111 + S(3) * x1 * x1 * x2 * C112 + S(3) * x1 * x1 * x3 * C113 + S(3) * x1 * x2 * x2 * C122 +
        S(6) * x1 * x2 * x3 * C123 + S(3) * x1 * x3 * x3 * C133 + x2 * x2 * x2 * C222 +
        S(3) * x2 * x2 * x3 * poly(data::C223, T) + S(3) * x2 * x3 * x3 * poly(data::C233, T) + x3 * x3 * x3 * C333;
  if (x[3] != S(0) || x[4] != S(0)) {
    // Only reachable when data::hydrogen_terms.known (prepare refuses hydrogen otherwise).
    const S x4 = x[3], x5 = x[4];
    C += x4 * x4 * x4 * poly(data::C444, T) + S(3) * x1 * x1 * x5 * poly(data::C115, T);
    if constexpr (data::hydrogen_terms.known) {
      C += S(3) * x1 * x1 * x4 * poly(data::hydrogen_terms.C114, T) + S(3) * x1 * x4 * x4 * poly(data::hydrogen_terms.C144, T);
    }
  }
  v.C = C;
  return v;
}

namespace detail {

// The shared characterization from a volumetric heating value and a relative
// density: Hv (MJ/m3) at the reference state (T_ref K, p_ref kPa), H_factor
// converting the molar heating value to the 25 degC basis of the
// correlations, d relative to air of density rho_air (kg/m3) at the same
// state, x3 = x_CO2, x4 = x_H2.
template <class S>
[[nodiscard]] Mixture<S> characterize_hd(const S& Hv, const S& d, const S& x3, const S& x4, const S& T_ref,
                                         const S& p_ref, const S& rho_air, const S& H_factor,
                                         const CharacterizationOptions& opt) noexcept {
  Mixture<S> m;
  const S R(data::R);
  const S x5 = S(data::r_CO_H2) * x4;
  m.x[2] = x3;
  m.x[3] = x4;
  m.x[4] = x5;
  S Zn(1);
  const int cap = opt.max_iter < 1 ? 1 : opt.max_iter;
  for (int it = 1; it <= cap; ++it) {
    m.iterations = it;
    const S Vn = Zn * R * T_ref / p_ref;   // m3/kmol
    const S Hm = Hv * Vn * H_factor;       // MJ/kmol, 25 degC basis
    const S M = d * rho_air * Vn;          // kg/kmol
    const S A = Hm - x4 * S(data::H_H2) - x5 * S(data::H_CO);  // = x1 H_CH
    const S x1 = (M - S(data::G2) * A - (S(1) - x3 - x4 - x5) * S(data::M_N2) - x3 * S(data::M_CO2) -
                  x4 * S(data::M_H2) - x5 * S(data::M_CO)) /
                 (S(data::G1) - S(data::M_N2));
    if (!finite_all({x1, A}) || !(x1 > S(0)) || !(A > S(0))) { m.status = make_status(Code::invalid_input); return m; }
    m.x[0] = x1;
    m.x[1] = S(1) - x1 - x3 - x4 - x5;
    m.H_CH_MJ_per_kmol = A / x1;
    m.M_CH_kg_per_kmol = S(data::G1) + S(data::G2) * m.H_CH_MJ_per_kmol;
    m.M_kg_per_kmol = M;
    hydrocarbon_polys(m);
    const S Zn_new = S(1) + b_mix(m, T_ref) * p_ref / (R * T_ref);
    if (!num::isfinite_(Zn_new)) { m.status = make_status(Code::invalid_input); return m; }
    const S change = num::abs_(S(Zn_new - Zn));
    Zn = Zn_new;
    m.Z_ref = Zn;
    if (change <= S(opt.tol)) return m;
  }
  m.status = make_status(Code::no_convergence);
  m.status.flags |= flag::iteration_cap;
  return m;
}

// Solves the cubic for the gas root at (T K, p kPa) and fills the state.
template <class S>
[[nodiscard]] State<S> solve(const Mixture<S>& m, const S& T, const S& p_kPa, const SolveOptions& opt) noexcept {
  State<S> s;
  const Virial<S> v = virial(m, T);
  s.B_cm3_per_mol = v.B * S(1000);
  s.C_cm6_per_mol2 = v.C * S(1000000);
  const S R(data::R);
  const S B = v.B, C = v.C;
  if (!finite_all({B, C})) { s.status.code = Code::invalid_input; return s; }
  if (p_kPa == S(0)) {
    s.Z = S(1);
    s.rho_mol_per_L = S(0);
    s.Z_virial2 = S(1);
    return s;
  }
  const S q = p_kPa / (R * T);
  if (q < S(1e-100)) {
    // The ideal-gas limit: B q and C q^2 are below 1e-90 relative, so Z = 1
    // to every digit; solving would divide an underflowed density by itself.
    s.Z = S(1);
    s.rho_mol_per_L = q;
    s.Z_virial2 = S(1);
    return s;
  }
  auto f = [&](const S& r) { return ((C * r + B) * r + S(1)) * r - q; };
  auto fp = [&](const S& r) { return (S(3) * C * r + S(2) * B) * r + S(1); };
  // First positive stationary point of f (a local maximum, as f'(0) = 1):
  // the gas root must lie before it.
  bool have_hi = false;
  S hi(0);
  if (C != S(0)) {
    const S disc = B * B - S(3) * C;
    if (disc >= S(0)) {
      const S sq = num::sqrt_(disc);
      const S ra = (-B - sq) / (S(3) * C), rb = (-B + sq) / (S(3) * C);
      if (ra > S(0)) { hi = ra; have_hi = true; }
      if (rb > S(0) && (!have_hi || rb < hi)) { hi = rb; have_hi = true; }
    }
  } else if (B < S(0)) {
    hi = S(-1) / (S(2) * B);
    have_hi = true;
  }
  if (have_hi) {
    if (f(hi) < S(0)) { s.status.code = Code::no_gas_root; return s; }
  } else {
    hi = q;
    for (int k = 0; k < 200 && f(hi) < S(0); ++k) hi *= S(2);
    if (f(hi) < S(0)) { s.status.code = Code::no_gas_root; return s; }
  }
  S lo(0);
  // Start from the second-virial density, kept inside the bracket.
  S r = q / (S(1) + B * q);
  if (!(r > lo && r < hi)) r = (lo + hi) / S(2);
  const int cap = opt.max_iter < 1 ? 1 : opt.max_iter;
  bool converged = false;
  for (int it = 1; it <= cap; ++it) {
    s.iterations = it;
    const S fv = f(r);
    if (fv == S(0)) { converged = true; break; }
    if (fv < S(0)) lo = r; else hi = r;
    S rn = r - fv / fp(r);
    if (!(rn >= lo && rn <= hi)) rn = (lo + hi) / S(2);  // Newton left the bracket: bisect
    const S change = num::abs_(S(rn - r));
    r = rn;
    if (change <= S(opt.rel_tol) * r) { converged = true; break; }
  }
  s.rho_mol_per_L = r;
  s.Z = q / r;
  s.Z_virial2 = S(1) + B * r + C * r * r;
  if (!num::isfinite_(s.Z) || !(s.Z > S(0)) || !num::isfinite_(s.rho_mol_per_L)) {  // never a non-finite result with ok
    s.status.code = Code::no_convergence;
    return s;
  }
  if (!converged) {
    s.status.code = Code::no_convergence;
    s.status.flags |= flag::iteration_cap;
  }
  return s;
}

// Applies the range rules: the worse of the gas's and the state's class;
// outside is refused unless allowed, then flagged.
template <class S>
[[nodiscard]] inline bool range_gate(State<S>& s, RangeClass gas, RangeClass state, const SolveOptions& opt) noexcept {
  s.status.range = worse(gas, state);
  if (s.status.range == RangeClass::outside) {
    if (!opt.allow_outside_range) {
      s.status.code = Code::out_of_range;
      return false;
    }
    s.status.flags |= flag::extrapolated;
  }
  return true;
}

template <class S>
[[nodiscard]] inline Status check_state_args(const S& T_K, const S& p_Pa) noexcept {
  if (!num::isfinite_(T_K) || !(T_K > S(0))) return make_status(Code::invalid_temperature);
  if (!num::isfinite_(p_Pa) || p_Pa < S(0)) return make_status(Code::invalid_pressure);
  return Status{};
}

}  // namespace detail

// Range class of a gas described by its gross inputs and characterization.
template <class S>
[[nodiscard]] RangeClass classify_gas(const GrossInput<S>& in, const Mixture<S>& m) noexcept {
  using detail::inside;
  auto in_range = [&](const data::Ranges& r) {
    return inside(r.Hs_MJ_per_m3, in.Hs_MJ_per_m3) && inside(r.d, in.d) && inside(r.x_CO2, in.x_CO2) &&
           inside(r.x_N2, m.x[1] < S(0) ? S(0) : m.x[1]) && inside(r.x_H2, in.x_H2) && inside(r.x_CO, m.x[4]);
  };
  if (in_range(data::normal_range)) return RangeClass::normal;
  if (in_range(data::expanded_range)) return RangeClass::expanded;
  return RangeClass::outside;
}

// Characterizes a gas from (Hs, d, x_CO2, x_H2). The status is ok (with the
// range class of the inputs; outside-range gases are characterized, and
// refused or flagged at evaluation) or says why the gas cannot be served:
// invalid_input (non-finite, non-physical or mutually inconsistent inputs,
// e.g. a negative derived N2 fraction), coefficients_missing (hydrogen),
// no_convergence.
template <class S>
[[nodiscard]] Mixture<S> prepare(const GrossInput<S>& in, const CharacterizationOptions& opt = {}) noexcept {
  Mixture<S> m;
  if (!detail::finite_all({in.Hs_MJ_per_m3, in.d, in.x_CO2, in.x_H2}) || !(in.Hs_MJ_per_m3 > S(0)) ||
      !(in.d > S(0)) || in.x_CO2 < S(0) || !(in.x_CO2 < S(1)) || in.x_H2 < S(0) || !(in.x_H2 < S(1))) {
    m.status = make_status(Code::invalid_input);
    return m;
  }
  if (in.x_H2 > S(0) && !data::hydrogen_terms.known) {
    m.status = make_status(Code::coefficients_missing);
    return m;
  }
  m = detail::characterize_hd(in.Hs_MJ_per_m3, in.d, in.x_CO2, in.x_H2, S(data::T_n_K), S(data::p_n_kPa),
                              S(data::rho_air_n), S(1), opt);
  if (!m.status.ok()) return m;
  if (m.x[1] < S(-data::x_N2_negative_tolerance)) {  // more heating value than the density allows: no such gas
    m.status = make_status(Code::invalid_input);
    return m;
  }
  m.status.range = classify_gas(in, m);
  return m;
}

// Z, density and the virial coefficients at (T, p) for a prepared gas.
template <class S>
[[nodiscard]] State<S> z_factor(const Mixture<S>& m, const S& T_K, const S& p_Pa, const SolveOptions& opt = {}) noexcept {
  State<S> s;
  if (!m.status.ok()) { s.status = m.status; return s; }
  if (auto a = detail::check_state_args(T_K, p_Pa); !a.ok()) { s.status = a; return s; }
  const S p_MPa = p_Pa / S(1000000);
  const RangeClass st = (detail::inside(data::normal_range.T_K, T_K) && detail::inside(data::normal_range.p_MPa, p_MPa))
                            ? RangeClass::normal
                            : RangeClass::outside;
  if (!detail::range_gate(s, m.status.range, st, opt)) return s;
  const Status keep = s.status;
  s = detail::solve(m, T_K, S(p_Pa / S(1000)), opt);
  s.status.range = keep.range;
  s.status.flags |= keep.flags | m.status.flags;
  return s;
}

// The gross inputs a characterized gas reproduces (the round trip of the
// characterization): Hs (MJ/m3, 25 degC / 0 degC) and d (0 degC).
template <class S>
struct GrossBack {
  S Hs_MJ_per_m3{};
  S d{};
};
template <class S>
[[nodiscard]] GrossBack<S> gross_of(const Mixture<S>& m) noexcept {
  const S Vn = m.Z_ref * S(data::R) * S(data::T_n_K) / S(data::p_n_kPa);
  const S Hm = m.x[0] * m.H_CH_MJ_per_kmol + m.x[3] * S(data::H_H2) + m.x[4] * S(data::H_CO);
  const S M = m.x[0] * m.M_CH_kg_per_kmol + m.x[1] * S(data::M_N2) + m.x[2] * S(data::M_CO2) + m.x[3] * S(data::M_H2) +
              m.x[4] * S(data::M_CO);
  return {Hm / Vn, M / (S(data::rho_air_n) * Vn)};
}

}  // namespace zcorr::sgerg88
