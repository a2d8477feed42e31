// zcorr method: the GERG-2008 wide-range equation of state for natural gases
// and other mixtures of the 21 components.
//
// Implements O. Kunz, W. Wagner, J. Chem. Eng. Data 57 (2012) 3032-3091
// (the equation of ISO 20765-2 and AGA Report No. 8 Part 2):
//   alpha(delta, tau, x) = alpha0(rho, T, x) + alpha_r(delta, tau, x),
//   alpha_r = sum_i x_i alpha_r_oi(delta, tau) + sum_{i<j} x_i x_j F_ij alpha_r_ij(delta, tau),
//   delta = rho / rho_r(x), tau = T_r(x) / T,
// with the pure-fluid equations (Table A5 data), the reducing functions for
// T_r and rho_r (Table A8: beta_v, gamma_v, beta_T, gamma_T) and the
// binary-specific and generalized departure functions (Tables A6, A7).
// Coefficients: engine/data/gerg2008_data.hpp (source cited there).
// R = 8.314472 J/(mol K) (Kunz & Wagner 2012), R* = 8.314510 J/(mol K) in the
// ideal-gas part. Internal units: T in K, rho in mol/m^3, p in Pa.
//
// Ranges (Kunz & Wagner 2012, abstract): normal range 90-450 K up to 35 MPa,
// extended range 60-700 K up to 70 MPa, whole composition range of the 21
// components. Outside the extended range a state is refused (out_of_range)
// unless SolveOptions::allow_outside_range, when it is computed and flagged
// extrapolated.
//
// Shape of the computation:
//  * prepare(x, Prepared&) does everything that depends on the composition only:
//    the reducing functions, and it gathers all residual terms (of every pure
//    fluid and every departure function) that share a temperature exponent t and
//    a density shape delta^d * exp(...) into one coefficient K (combination list).
//  * fill_tau_cache() does the per-temperature work once per state: tau^t for
//    each distinct t, and the tau sums per density shape (with their tau
//    derivatives).
//  * residual() evaluates alpha_r and its derivatives at one delta from the
//    cache: a few exponentials per distinct exponential group plus one
//    multiply-add per density shape. The density solve calls it per iterate.
//
// Every function here does not throw, does not allocate and does no I/O; all
// loops are bounded by table sizes or by SolveOptions::max_iter.
#pragma once

#include <array>
#include <cstddef>
#include <cstdint>

#include "core/components.hpp"
#include "core/composition.hpp"
#include "core/scalar.hpp"
#include "core/solve_options.hpp"
#include "core/status.hpp"
#include "data/gerg2008_data.hpp"

namespace zcorr::gerg2008 {

static_assert(data::pure_fluids.size() == max_components, "GERG-2008 covers the 21 canonical components");
static_assert(data::max_c <= data::max_d, "delta powers table also serves exp(-delta^c)");

namespace detail {
// The data tables list the components in canonical order; check by name.
constexpr bool names_match() {
  for (std::size_t i = 0; i < max_components; ++i)
    if (data::pure_fluids[i].name != component_table[i].name) return false;
  return true;
}
static_assert(names_match(), "gerg2008_data.hpp must follow the canonical component order");

inline constexpr std::size_t n_t = data::t_values.size();
inline constexpr std::size_t n_shapes = data::shapes.size();
inline constexpr std::size_t n_groups = data::exp_groups.size();
inline constexpr std::size_t n_combos = data::combos.size();
inline constexpr std::size_t n_functions = data::departure_functions.size();

template <class S> inline S sinh_(const S& v) { using std::sinh; return sinh(v); }
template <class S> inline S cosh_(const S& v) { using std::cosh; return cosh(v); }
}  // namespace detail

// Gas constant of GERG-2008, J/(mol K).
template <class S> inline S R() { return S(data::R_J_per_mol_K); }

// Range limits (Kunz & Wagner 2012, abstract).
inline constexpr double normal_T_min_K = 90.0, normal_T_max_K = 450.0, normal_p_max_Pa = 35.0e6;
inline constexpr double extended_T_min_K = 60.0, extended_T_max_K = 700.0, extended_p_max_Pa = 70.0e6;

// Largest reduced density the density solve looks at (the reference data set
// scanned roots up to 3.6; liquids of the 21 fluids stay below about 3.5).
inline constexpr double delta_search_max = 5.0;

// Everything that depends on the composition only. Fixed capacity; filled by prepare().
template <class S>
struct Prepared {
  Fractions<S> x{};                      // mole fractions used (normalised to sum 1)
  std::array<std::uint8_t, max_components> active{};  // indices of components with x > 0
  std::size_t n_active = 0;
  S Tr_K{};                              // reducing temperature T_r(x)
  S rhor_mol_per_m3{};                   // reducing density rho_r(x)
  S M_g_per_mol{};                       // molar mass of the mixture
  // Residual terms gathered per (t, shape); indices are local to the lists below.
  struct Combo {
    std::uint16_t t;      // into t_index / t_value
    std::uint16_t shape;  // into shape_index
    S K;
  };
  std::array<Combo, detail::n_combos> combos{};
  std::size_t n_combos = 0;
  std::array<std::uint16_t, detail::n_t> t_index{};  // into data::t_values
  std::array<S, detail::n_t> t_value{};
  std::size_t n_t = 0;
  std::array<std::uint16_t, detail::n_shapes> shape_index{};  // into data::shapes
  std::array<std::uint8_t, detail::n_shapes> shape_group{};   // local group index
  std::array<int, detail::n_shapes> shape_d{};
  std::size_t n_shapes = 0;
  std::array<std::uint8_t, detail::n_groups> group_index{};   // into data::exp_groups
  std::size_t n_groups = 0;
  Status status{};  // of the composition (flags such as sum_not_unity are carried into every state)
};

// Per-temperature work, reused across the density iterations of one state.
template <class S>
struct TauCache {
  S T_K{};
  S tau{};
  std::array<S, detail::n_t> tau_pow{};         // tau^t
  std::array<S, detail::n_shapes> c0{};         // sum K tau^t
  std::array<S, detail::n_shapes> c1{};         // sum K t tau^t
  std::array<S, detail::n_shapes> c2{};         // sum K t (t-1) tau^t
};

// alpha_r and its reduced derivatives at one (delta, tau).
template <class S>
struct Residual {
  S a{};   // alpha_r
  S d1{};  // delta d(alpha_r)/d(delta)
  S d2{};  // delta^2 d2(alpha_r)/d(delta)^2
  S t1{};  // tau d(alpha_r)/d(tau)
  S t2{};  // tau^2 d2(alpha_r)/d(tau)^2
  S dt{};  // delta tau d2(alpha_r)/d(delta)d(tau)
};

// Everything a state reports. Units are in the names; NaN-free when status.ok().
template <class S>
struct Properties {
  S Z{};
  S rho_mol_per_m3{};
  S rho_kg_per_m3{};
  S M_g_per_mol{};
  S B_m3_per_mol{};       // second virial coefficient B(T)
  S C_m6_per_mol2{};      // third virial coefficient C(T)
  S Z_virial2{};          // 1 + B rho + C rho^2 at the solved density
  S dZdp_per_Pa{};        // (dZ/dp) at constant T
  S dZdT_per_K{};         // (dZ/dT) at constant p
  S w_m_per_s{};          // speed of sound
  S kappa{};              // isentropic exponent -(v/p)(dp/dv)_s
  S mu_JT_K_per_Pa{};     // Joule-Thomson coefficient (dT/dp)_h
  S cp_J_per_mol_K{};
  S cv_J_per_mol_K{};
  S dpdrho_T{};           // (dp/drho)_T, J/mol
  S dpdT_rho{};           // (dp/dT)_rho, Pa/K
  Status status{};
  int iterations = 0;  // evaluations of alpha_r in the density solve (scan points included)
};

// ---------------------------------------------------------------------------
// prepare

// Computes the composition-dependent part. x: mole fractions in canonical
// order (must pass check_fractions; a sum off 1 within its tolerance is
// normalised and flagged sum_not_unity). Returns the status also stored in out.
template <class S>
Status prepare(const Fractions<S>& x_in, Prepared<S>& out) noexcept {
  out = Prepared<S>{};
  Status st = check_fractions(x_in);
  if (!st.ok()) {
    out.status = st;
    return st;
  }
  const S sum = fraction_sum(x_in);
  if (!(sum > S(0))) {
    out.status = make_status(Code::invalid_composition);
    return out.status;
  }
  for (std::size_t i = 0; i < max_components; ++i) {
    out.x[i] = x_in[i] / sum;
    if (x_in[i] > S(0)) out.active[out.n_active++] = static_cast<std::uint8_t>(i);
  }
  const auto& x = out.x;

  // Reducing functions (Kunz & Wagner 2012, eqs. 7.9 and 7.10) and molar mass.
  std::array<S, max_components> sqrtTc{}, cbrt_inv_rhoc{};
  S Tr(0), vr(0), M(0);
  for (std::size_t a = 0; a < out.n_active; ++a) {
    const std::size_t i = out.active[a];
    const auto& f = data::pure_fluids[i];
    const S Tc(f.Tc_K), rhoc = S(f.rhoc_mol_per_dm3) * S(1000);
    sqrtTc[i] = num::sqrt_(Tc);
    cbrt_inv_rhoc[i] = num::pow_(S(1) / rhoc, S(1) / S(3));
    Tr += x[i] * x[i] * Tc;
    vr += x[i] * x[i] / rhoc;
    M += x[i] * S(f.M_g_per_mol);
  }
  std::array<S, detail::n_functions> weight{};
  std::array<bool, detail::n_functions> used{};
  for (const auto& pr : data::binary_pairs) {
    const S xi = x[pr.i], xj = x[pr.j];
    if (!(xi > S(0)) || !(xj > S(0))) continue;
    const S bT(pr.beta_T), bv(pr.beta_v);
    const S fT = S(2) * xi * xj * bT * S(pr.gamma_T) * (xi + xj) / (bT * bT * xi + xj);
    const S fv = S(2) * xi * xj * bv * S(pr.gamma_v) * (xi + xj) / (bv * bv * xi + xj);
    const S s = cbrt_inv_rhoc[pr.i] + cbrt_inv_rhoc[pr.j];
    Tr += fT * sqrtTc[pr.i] * sqrtTc[pr.j];
    vr += fv * s * s * s / S(8);
    if (pr.departure >= 0 && pr.F != 0.0) {
      const auto k = static_cast<std::size_t>(pr.departure);
      weight[k] += S(pr.F) * xi * xj;
      used[k] = true;
    }
  }
  out.Tr_K = Tr;
  out.rhor_mol_per_m3 = S(1) / vr;
  out.M_g_per_mol = M;

  // Gather the residual terms per (t, shape) combination.
  std::array<S, detail::n_combos> K{};
  std::array<bool, detail::n_combos> touched{};
  for (std::size_t a = 0; a < out.n_active; ++a) {
    const std::size_t i = out.active[a];
    const auto& f = data::pure_fluids[i];
    for (std::size_t k = f.first_term; k < static_cast<std::size_t>(f.first_term) + f.term_count; ++k) {
      const auto& term = data::pure_terms[k];
      K[term.combo] += x[i] * S(term.n);
      touched[term.combo] = true;
    }
  }
  for (std::size_t fn = 0; fn < detail::n_functions; ++fn) {
    if (!used[fn]) continue;
    const auto& df = data::departure_functions[fn];
    for (std::size_t k = df.first_term; k < static_cast<std::size_t>(df.first_term) + df.term_count; ++k) {
      const auto& term = data::departure_terms[k];
      K[term.combo] += weight[fn] * S(term.n);
      touched[term.combo] = true;
    }
  }
  // Compact into local lists.
  constexpr std::uint16_t none = 0xFFFF;
  std::array<std::uint16_t, detail::n_t> t_local;
  std::array<std::uint16_t, detail::n_shapes> s_local;
  std::array<std::uint16_t, detail::n_groups> g_local;
  t_local.fill(none);
  s_local.fill(none);
  g_local.fill(none);
  for (std::size_t c = 0; c < detail::n_combos; ++c) {
    if (!touched[c]) continue;
    const auto& cb = data::combos[c];
    if (t_local[cb.t_index] == none) {
      t_local[cb.t_index] = static_cast<std::uint16_t>(out.n_t);
      out.t_index[out.n_t] = cb.t_index;
      out.t_value[out.n_t] = S(data::t_values[cb.t_index]);
      ++out.n_t;
    }
    if (s_local[cb.shape_index] == none) {
      const auto& sh = data::shapes[cb.shape_index];
      if (g_local[sh.group] == none) {
        g_local[sh.group] = static_cast<std::uint16_t>(out.n_groups);
        out.group_index[out.n_groups++] = sh.group;
      }
      s_local[cb.shape_index] = static_cast<std::uint16_t>(out.n_shapes);
      out.shape_index[out.n_shapes] = cb.shape_index;
      out.shape_group[out.n_shapes] = static_cast<std::uint8_t>(g_local[sh.group]);
      out.shape_d[out.n_shapes] = sh.d;
      ++out.n_shapes;
    }
    out.combos[out.n_combos++] = {t_local[cb.t_index], s_local[cb.shape_index], K[c]};
  }
  out.status = st;
  out.status.range = RangeClass::normal;  // every composition of the 21 components is in range
  return out.status;
}

// ---------------------------------------------------------------------------
// per-temperature cache and residual evaluation

template <class S>
void fill_tau_cache(const Prepared<S>& p, const S& tau, TauCache<S>& c) noexcept {
  c.tau = tau;
  const S ln_tau = num::log_(tau);
  for (std::size_t k = 0; k < p.n_t; ++k) c.tau_pow[k] = num::exp_(p.t_value[k] * ln_tau);
  for (std::size_t s = 0; s < p.n_shapes; ++s) {
    c.c0[s] = S(0);
    c.c1[s] = S(0);
    c.c2[s] = S(0);
  }
  for (std::size_t k = 0; k < p.n_combos; ++k) {
    const auto& cb = p.combos[k];
    const S& t = p.t_value[cb.t];
    const S v = cb.K * c.tau_pow[cb.t];
    c.c0[cb.shape] += v;
    c.c1[cb.shape] += v * t;
    c.c2[cb.shape] += v * t * (t - S(1));
  }
}

template <class S>
void fill_temperature_cache(const Prepared<S>& p, const S& T_K, TauCache<S>& c) noexcept {
  fill_tau_cache(p, S(p.Tr_K / T_K), c);
  c.T_K = T_K;
}

// alpha_r and its derivatives at reduced density delta (>= 0).
template <class S>
[[nodiscard]] Residual<S> residual(const Prepared<S>& p, const TauCache<S>& c, const S& delta) noexcept {
  std::array<S, data::max_d + 1> dp{};
  dp[0] = S(1);
  for (std::size_t k = 1; k < dp.size(); ++k) dp[k] = dp[k - 1] * delta;
  std::array<S, detail::n_groups> E{}, q1{}, q2{};
  for (std::size_t g = 0; g < p.n_groups; ++g) {
    const auto& eg = data::exp_groups[p.group_index[g]];
    if (eg.kind == 0) {
      E[g] = S(1);
      q1[g] = S(0);
      q2[g] = S(0);
    } else if (eg.kind == 1) {
      const S dc = dp[static_cast<std::size_t>(eg.c)];
      const S cc(eg.c);
      E[g] = num::exp_(S(-dc));
      q1[g] = -cc * dc;
      q2[g] = -cc * (cc - S(1)) * dc;
    } else {
      const S eta(eg.eta), eps(eg.epsilon), beta(eg.beta), gam(eg.gamma);
      const S u = delta - eps;
      E[g] = num::exp_(S(-eta * u * u - beta * (delta - gam)));
      q1[g] = delta * (S(-2) * eta * u - beta);
      q2[g] = S(-2) * eta * delta * delta;
    }
  }
  Residual<S> r;
  for (std::size_t s = 0; s < p.n_shapes; ++s) {
    const std::size_t g = p.shape_group[s];
    const int d = p.shape_d[s];
    const S base = dp[static_cast<std::size_t>(d)] * E[g];
    const S dd(d);
    const S g1 = dd + q1[g];
    const S h = g1 * g1 - dd + q2[g];
    const S b0 = c.c0[s] * base, b1 = c.c1[s] * base;
    r.a += b0;
    r.d1 += b0 * g1;
    r.d2 += b0 * h;
    r.t1 += b1;
    r.t2 += c.c2[s] * base;
    r.dt += b1 * g1;
  }
  return r;
}

// alpha_r at (tau, delta) directly (builds a cache; for checks and tests).
template <class S>
[[nodiscard]] Residual<S> alphar(const Prepared<S>& p, const S& tau, const S& delta) noexcept {
  TauCache<S> c;
  fill_tau_cache(p, tau, c);
  return residual(p, c, delta);
}

// tau^2 d2(alpha0)/d(tau)^2 of the mixture at T (ideal-gas part; tau = T_r/T,
// which equals tau_i^2 d2/d(tau_i)^2 summed with x_i since tau_i is proportional to tau).
template <class S>
[[nodiscard]] S ideal_tau2(const Prepared<S>& p, const S& T_K) noexcept {
  const S ratio = S(data::Rstar_J_per_mol_K) / S(data::R_J_per_mol_K);
  S sum(0);
  for (std::size_t a = 0; a < p.n_active; ++a) {
    const std::size_t i = p.active[a];
    const auto& ig = data::ideal_gas[i];
    const S ti = S(data::pure_fluids[i].Tc_K) / T_K;
    S v = S(ig.n3);
    auto sinh_term = [&](double n, double vv) {
      if (n == 0.0 || vv == 0.0) return;
      const S y = S(vv) * ti;
      const S q = y / detail::sinh_(y);
      v += S(n) * q * q;
    };
    auto cosh_term = [&](double n, double vv) {
      if (n == 0.0 || vv == 0.0) return;
      const S y = S(vv) * ti;
      const S q = y / detail::cosh_(y);
      v += S(n) * q * q;
    };
    sinh_term(ig.n4, ig.v4);
    cosh_term(ig.n5, ig.v5);
    sinh_term(ig.n6, ig.v6);
    cosh_term(ig.n7, ig.v7);
    sum += p.x[i] * v;
  }
  return -ratio * sum;
}

// alpha0 of the mixture at (T, rho): the full ideal-gas part including the
// x_i ln x_i terms, with n0_1, n0_2 of the reference state h0 = s0 = 0 at
// 298.15 K, 101.325 kPa (see the data header). For checks of absolute
// Helmholtz-energy derivatives; no reported property depends on n0_1, n0_2.
template <class S>
[[nodiscard]] S ideal_alpha0(const Prepared<S>& p, const S& T_K, const S& rho_mol_per_m3) noexcept {
  const S ratio = S(data::Rstar_J_per_mol_K) / S(data::R_J_per_mol_K);
  S sum(0);
  for (std::size_t a = 0; a < p.n_active; ++a) {
    const std::size_t i = p.active[a];
    const auto& ig = data::ideal_gas[i];
    const auto& f = data::pure_fluids[i];
    const S ti = S(f.Tc_K) / T_K;
    S v = S(ig.n1_refstate) + S(ig.n2_refstate) * ti + S(ig.n3) * num::log_(ti);
    auto ln_sinh = [&](double n, double vv) {
      if (n == 0.0 || vv == 0.0) return;
      v += S(n) * num::log_(num::abs_(detail::sinh_(S(S(vv) * ti))));
    };
    auto ln_cosh = [&](double n, double vv) {
      if (n == 0.0 || vv == 0.0) return;
      v -= S(n) * num::log_(detail::cosh_(S(S(vv) * ti)));
    };
    ln_sinh(ig.n4, ig.v4);
    ln_cosh(ig.n5, ig.v5);
    ln_sinh(ig.n6, ig.v6);
    ln_cosh(ig.n7, ig.v7);
    const S rhoc = S(f.rhoc_mol_per_dm3) * S(1000);
    sum += p.x[i] * (num::log_(S(rho_mol_per_m3 / rhoc)) + ratio * v + num::log_(p.x[i]));
  }
  return sum;
}

// Second and third virial coefficients (reduced, i.e. times rho_r and rho_r^2)
// and tau dB/dtau, from the limit delta -> 0 of the cached sums.
template <class S>
struct ReducedVirial {
  S B{};      // lim d(alpha_r)/d(delta)
  S B_tau{};  // tau d/dtau of B
  S C{};      // lim d2(alpha_r)/d(delta)^2
};

template <class S>
[[nodiscard]] ReducedVirial<S> reduced_virial(const Prepared<S>& p, const TauCache<S>& c) noexcept {
  ReducedVirial<S> v;
  for (std::size_t s = 0; s < p.n_shapes; ++s) {
    const int d = p.shape_d[s];
    if (d > 2) continue;
    const auto& eg = data::exp_groups[p.group_index[p.shape_group[s]]];
    S E0(1), L0(0);  // E(0) and d ln E / d delta at 0
    if (eg.kind == 1) {
      L0 = eg.c == 1 ? S(-1) : S(0);  // exp(-delta^c): E(0) = 1
    } else if (eg.kind == 2) {
      const S eta(eg.eta), eps(eg.epsilon), beta(eg.beta), gam(eg.gamma);
      E0 = num::exp_(S(-eta * eps * eps + beta * gam));
      L0 = S(2) * eta * eps - beta;
    }
    if (d == 1) {
      v.B += c.c0[s] * E0;
      v.B_tau += c.c1[s] * E0;
      v.C += S(2) * c.c0[s] * E0 * L0;
    } else {
      v.C += S(2) * c.c0[s] * E0;
    }
  }
  return v;
}

// Pressure at (T, rho), Pa. For checks; the solve works in reduced form.
template <class S>
[[nodiscard]] S pressure_Pa(const Prepared<S>& p, const S& T_K, const S& rho_mol_per_m3) noexcept {
  TauCache<S> c;
  fill_temperature_cache(p, T_K, c);
  const auto r = residual(p, c, S(rho_mol_per_m3 / p.rhor_mol_per_m3));
  return rho_mol_per_m3 * R<S>() * T_K * (S(1) + r.d1);
}

// ---------------------------------------------------------------------------
// range and input checks

[[nodiscard]] inline RangeClass classify(double T_K, double p_Pa) noexcept {
  if (T_K >= normal_T_min_K && T_K <= normal_T_max_K && p_Pa <= normal_p_max_Pa) return RangeClass::normal;
  if (T_K >= extended_T_min_K && T_K <= extended_T_max_K && p_Pa <= extended_p_max_Pa) return RangeClass::expanded;
  return RangeClass::outside;
}

// ---------------------------------------------------------------------------
// properties at a known density

template <class S>
void fill_properties(const Prepared<S>& p, const TauCache<S>& c, const S& delta, const Residual<S>& r,
                     Properties<S>& out) noexcept {
  const S Rg = R<S>();
  const S T = c.T_K;
  const S rho = delta * p.rhor_mol_per_m3;
  const S M_kg = p.M_g_per_mol / S(1000);
  const auto v = reduced_virial(p, c);
  const S one(1);
  const S f_rho = one + S(2) * r.d1 + r.d2;  // (dp/drho)_T / (R T)
  const S f_T = one + r.d1 - r.dt;           // (dp/dT)_rho / (rho R)
  out.rho_mol_per_m3 = rho;
  out.rho_kg_per_m3 = rho * M_kg;
  out.M_g_per_mol = p.M_g_per_mol;
  out.B_m3_per_mol = v.B / p.rhor_mol_per_m3;
  out.C_m6_per_mol2 = v.C / (p.rhor_mol_per_m3 * p.rhor_mol_per_m3);
  out.Z_virial2 = one + out.B_m3_per_mol * rho + out.C_m6_per_mol2 * rho * rho;
  out.dpdrho_T = Rg * T * f_rho;
  out.dpdT_rho = rho * Rg * f_T;
  const S Z = one + r.d1;
  out.cv_J_per_mol_K = -Rg * (ideal_tau2(p, T) + r.t2);
  out.cp_J_per_mol_K = out.cv_J_per_mol_K + Rg * f_T * f_T / f_rho;
  const S gamma = out.cp_J_per_mol_K / out.cv_J_per_mol_K;
  out.w_m_per_s = num::sqrt_(S(gamma * out.dpdrho_T / M_kg));
  out.kappa = gamma * f_rho / Z;
  out.dZdT_per_K = (Z / T) * (f_T / f_rho - one);
  if (delta > S(0)) {
    out.dZdp_per_Pa = (r.d1 + r.d2) / (rho * Rg * T * f_rho);
    out.mu_JT_K_per_Pa = (f_T / f_rho - one) / (rho * out.cp_J_per_mol_K);
  } else {
    // Limits rho -> 0: dZ/dp = B/(R T); mu_JT = (T dB/dT - B)/cp0, T dB/dT = -tau dB/dtau.
    out.dZdp_per_Pa = out.B_m3_per_mol / (Rg * T);
    out.mu_JT_K_per_Pa = (-v.B_tau / p.rhor_mol_per_m3 - out.B_m3_per_mol) / out.cp_J_per_mol_K;
  }
}

// All properties at (T, rho) with the Z of the equation (no density solve).
template <class S>
[[nodiscard]] Properties<S> properties_at_density(const Prepared<S>& p, const S& T_K, const S& rho_mol_per_m3) noexcept {
  Properties<S> out;
  out.status = p.status;
  if (!p.status.ok()) return out;
  if (!num::isfinite_(T_K) || !(T_K > S(0))) { out.status = make_status(Code::invalid_temperature); return out; }
  if (!num::isfinite_(rho_mol_per_m3) || rho_mol_per_m3 < S(0)) { out.status = make_status(Code::invalid_input); return out; }
  TauCache<S> c;
  fill_temperature_cache(p, T_K, c);
  const S delta = rho_mol_per_m3 / p.rhor_mol_per_m3;
  const auto r = residual(p, c, delta);
  out.Z = S(1) + r.d1;
  fill_properties(p, c, delta, r, out);
  return out;
}

// ---------------------------------------------------------------------------
// density solve

namespace detail {

struct RootResult {
  bool found = false;      // converged to a root with dp/drho > 0
  bool spinodal = false;   // the bracket closed on a maximum of p below the target (no root there)
  bool capped = false;     // iteration cap reached
  int iterations = 0;
};

// Safeguarded Newton for delta (1 + delta alpha_r_delta) = P (reduced pressure)
// on [lo, hi], starting at delta0. Bracket rule: a point with f < 0 and
// df/ddelta > 0 lies left of the gas root (lo); a point with f >= 0 or
// df/ddelta <= 0 lies right of it (hi). Newton steps leaving the bracket, or
// more than doubling delta, are replaced by bisection.
template <class S>
RootResult solve_delta(const Prepared<S>& p, const TauCache<S>& c, const S& P, S lo, S hi, S& delta,
                       const SolveOptions& opt, Residual<S>& r_last) noexcept {
  RootResult res;
  const S tol(opt.rel_tol);
  const int max_iter = opt.max_iter > 0 ? opt.max_iter : 1;
  for (int it = 1; it <= max_iter; ++it) {
    res.iterations = it;
    const auto r = residual(p, c, delta);
    r_last = r;
    const S f = delta * (S(1) + r.d1) - P;
    const S fp = S(1) + S(2) * r.d1 + r.d2;
    if (!num::isfinite_(f) || !num::isfinite_(fp)) {
      hi = delta;
    } else if (f >= S(0) || !(fp > S(0))) {
      hi = delta;
    } else {
      lo = delta;
    }
    S next = delta;
    bool newton = false;
    if (num::isfinite_(f) && fp > S(0)) {
      next = delta - f / fp;
      newton = next > lo && next < hi && next <= S(2) * delta + S(1e-300);
      if (newton && num::abs_(S(next - delta)) <= tol * next) {
        delta = next;
        res.found = true;
        return res;
      }
    }
    if (!newton) next = (lo + hi) / S(2);
    if (hi - lo <= tol * hi) {
      // The bracket has closed without a Newton-converged root.
      if (num::isfinite_(f) && fp > S(0) && num::abs_(f) <= S(64) * tol * P) {
        res.found = true;
      } else {
        res.spinodal = true;
      }
      return res;
    }
    delta = next;
  }
  res.capped = true;
  return res;
}

struct PhaseScan {
  bool gas = false;            // a root on the gas branch (below the first point with dp/drho <= 0)
  bool liquid_stable = false;  // a liquid-branch root with lower Gibbs energy exists
  bool capped = false;
  int iterations = 0;
};

template <class S>
struct PhaseScanResult : PhaseScan {
  S delta_gas{};
};

// Scan step in reduced density and the refinement of a bracketed root.
inline constexpr double scan_step = 0.02;
inline constexpr int scan_points = static_cast<int>(delta_search_max / scan_step);

// Root of f on [a, b] where f is increasing (f(a) < 0 <= f(b)): Newton kept
// inside the bracket, bisection otherwise.
template <class S>
bool refine_root(const Prepared<S>& p, const TauCache<S>& c, const S& P, S a, S b, S& delta, const SolveOptions& opt,
                 int& iterations) noexcept {
  delta = (a + b) / S(2);
  const int max_iter = opt.max_iter > 0 ? opt.max_iter : 1;
  for (int it = 0; it < max_iter; ++it) {
    ++iterations;
    const auto r = residual(p, c, delta);
    const S f = delta * (S(1) + r.d1) - P;
    const S fp = S(1) + S(2) * r.d1 + r.d2;
    if (f < S(0)) a = delta;
    else b = delta;
    S next = fp > S(0) ? S(delta - f / fp) : S((a + b) / S(2));
    if (!(next > a && next < b)) next = (a + b) / S(2);
    if (num::abs_(S(next - delta)) <= S(opt.rel_tol) * next || b - a <= S(opt.rel_tol) * b) {
      delta = next;
      return true;
    }
    delta = next;
  }
  return false;
}

// Below the reducing temperature the pure-fluid equations have loops (some of
// them spurious) inside the two-phase region. The gas root is taken on the gas
// branch only (below the first point where dp/drho <= 0), the liquid root on the
// liquid branch only (above the last such point below delta_search_max), and
// the phase of lower Gibbs energy (g/RT = ln delta + alpha_r + Z + terms equal for
// both) is the stable one. Scan resolution: scan_step in delta.
template <class S>
PhaseScanResult<S> scan_phases(const Prepared<S>& p, const TauCache<S>& c, const S& P, const SolveOptions& opt) noexcept {
  PhaseScanResult<S> out;
  const S h(scan_step);
  S prev(0);
  bool bracket = false;
  for (int k = 1; k <= scan_points; ++k) {
    const S d = h * S(k);
    ++out.iterations;
    const auto r = residual(p, c, d);
    const S f = d * (S(1) + r.d1) - P;
    const S fp = S(1) + S(2) * r.d1 + r.d2;
    if (f >= S(0)) { bracket = true; break; }  // the gas root lies in (prev, d]
    if (!(fp > S(0))) break;                     // end of the gas branch below p: no gas root
    prev = d;
    if (k == scan_points) break;
  }
  if (!bracket) return out;
  S dg;
  if (!refine_root(p, c, P, prev, S(prev + h), dg, opt, out.iterations)) {
    out.capped = true;
    out.delta_gas = dg;
    return out;
  }
  out.gas = true;
  out.delta_gas = dg;
  // Liquid branch: scan down from delta_search_max while dp/drho > 0 and f > 0.
  S upper(delta_search_max);
  bool liquid_bracket = false;
  S lower(0);
  for (int k = 0; k < scan_points; ++k) {
    const S d = S(delta_search_max) - h * S(k);
    if (d <= dg + h) break;
    ++out.iterations;
    const auto r = residual(p, c, d);
    const S f = d * (S(1) + r.d1) - P;
    const S fp = S(1) + S(2) * r.d1 + r.d2;
    if (!(fp > S(0))) break;               // liquid branch ends above p: no liquid root
    if (f < S(0)) {
      if (k == 0) break;                   // root beyond the search range
      liquid_bracket = true;
      lower = d;
      break;
    }
    upper = d;
  }
  if (!liquid_bracket) return out;
  S dl;
  if (!refine_root(p, c, P, lower, upper, dl, opt, out.iterations)) return out;
  const auto rg = residual(p, c, dg), rl = residual(p, c, dl);
  const S g_gas = num::log_(dg) + rg.a + rg.d1, g_liq = num::log_(dl) + rl.a + rl.d1;
  out.liquid_stable = g_liq < g_gas;
  return out;
}

}  // namespace detail

// Z, density and (optionally) the derived properties at (T, p). Finds the
// gas-phase (or supercritical) root. Statuses:
//   invalid_temperature / invalid_pressure / the composition's status: bad input;
//   out_of_range: outside the extended range and not allowed;
//   no_gas_root: p lies above the end (spinodal) of the gas branch of the equation;
//   two_phase: a gas root exists but a denser root of the same composition has the
//     lower Gibbs energy (the gas state is metastable: liquid or two-phase region);
//   no_convergence: iteration cap reached (last iterate returned, flag iteration_cap).
// Note: this function does not test mixtures for phase stability; a mixture state below
// its hydrocarbon dew point may return a metastable gas root. The stability test is in
// methods/gerg2008_phase.hpp and runs on every line state in eval/phase_check.hpp.
template <class S>
[[nodiscard]] Properties<S> state(const Prepared<S>& p, const S& T_K, const S& p_Pa, const SolveOptions& opt = {},
                                  bool derived = true) noexcept {
  Properties<S> out;
  out.status = p.status;
  if (!p.status.ok()) return out;
  if (!num::isfinite_(T_K) || !(T_K > S(0))) { out.status = make_status(Code::invalid_temperature); return out; }
  if (!num::isfinite_(p_Pa) || p_Pa < S(0)) { out.status = make_status(Code::invalid_pressure); return out; }
  const RangeClass rc = classify(static_cast<double>(T_K), static_cast<double>(p_Pa));
  out.status.range = rc;
  if (rc == RangeClass::outside) {
    if (!opt.allow_outside_range) { out.status.code = Code::out_of_range; return out; }
    out.status.flags |= flag::extrapolated;
  }

  TauCache<S> c;
  fill_temperature_cache(p, T_K, c);
  const S Rg = R<S>();
  const S P = p_Pa / (p.rhor_mol_per_m3 * Rg * T_K);  // reduced pressure: delta Z
  S delta(0);
  Residual<S> r;
  if (P > S(0)) {
    // Fast path (T >= T_r): safeguarded Newton from the virial equation truncated
    // after B (ideal gas when that has no root). At these temperatures the root
    // found is the first root of the gas branch (checked against a fine scan for
    // random natural-gas-like and CO2/ethane/hydrogen-rich mixtures in
    // tests/gerg2008_test.cpp, Gerg2008Solver).
    detail::RootResult rr;
    if (T_K >= p.Tr_K) {
      const auto v = reduced_virial(p, c);
      const S disc = S(1) + S(4) * v.B * P;
      delta = disc > S(0) ? S(S(2) * P / (S(1) + num::sqrt_(disc))) : P;
      if (!(delta > S(0)) || delta >= S(delta_search_max)) delta = P < S(delta_search_max) ? P : S(delta_search_max / 2);
      rr = detail::solve_delta(p, c, P, S(0), S(delta_search_max), delta, opt, r);
      out.iterations = rr.iterations;
    }
    if (!rr.found) {
      // Slow path (below T_r, or the fast path failed): scan the gas and liquid branches.
      const auto sc = detail::scan_phases(p, c, P, opt);
      out.iterations += sc.iterations;
      if (sc.capped) {
        out.status.code = Code::no_convergence;
        out.status.flags |= flag::iteration_cap;
        delta = sc.delta_gas > S(0) ? sc.delta_gas : delta;
      } else if (!sc.gas) {
        out.status.code = Code::no_gas_root;
        return out;
      } else if (sc.liquid_stable) {
        out.status.code = Code::two_phase;
        return out;
      } else {
        delta = sc.delta_gas;
      }
    }
  }
  const S rho = delta * p.rhor_mol_per_m3;
  if (derived) {
    r = residual(p, c, delta);
    fill_properties(p, c, delta, r, out);
  } else {
    const auto v = reduced_virial(p, c);
    out.rho_mol_per_m3 = rho;
    out.rho_kg_per_m3 = rho * p.M_g_per_mol / S(1000);
    out.M_g_per_mol = p.M_g_per_mol;
    out.B_m3_per_mol = v.B / p.rhor_mol_per_m3;
    out.C_m6_per_mol2 = v.C / (p.rhor_mol_per_m3 * p.rhor_mol_per_m3);
    out.Z_virial2 = S(1) + out.B_m3_per_mol * rho + out.C_m6_per_mol2 * rho * rho;
  }
  // Z = p / (rho R T) from the solved density (equals 1 + delta alpha_r_delta at the root).
  out.Z = P > S(0) ? S(P / delta) : S(1);
  if (out.status.ok() && (!num::isfinite_(out.Z) || !(out.Z > S(0)) || !num::isfinite_(rho)))
    out.status.code = Code::no_convergence;  // far outside every range the equation can overflow
  return out;
}

// The common result shape: Z and density in mol/L.
template <class S>
[[nodiscard]] ZResult<S> z_factor(const Prepared<S>& p, const S& T_K, const S& p_Pa, const SolveOptions& opt = {}) noexcept {
  const auto s = state(p, T_K, p_Pa, opt, false);
  ZResult<S> z;
  z.Z = s.Z;
  z.rho_mol_per_L = s.rho_mol_per_m3 / S(1000);
  z.status = s.status;
  z.iterations = s.iterations;
  return z;
}

}  // namespace zcorr::gerg2008
