// zcorr method: phase equilibrium on the GERG-2008 equation of state --
// fugacity coefficients, the tangent-plane-distance stability test, the
// two-phase (p, T) flash, pure-fluid saturation and the hydrocarbon dew point.
//
// Sources:
//  * Fugacity coefficients from the composition derivatives of n alpha_r:
//    O. Kunz, W. Wagner, J. Chem. Eng. Data 57 (2012) 3032-3091, the derivatives of the
//    reduced residual Helmholtz energy with respect to the mole numbers (their section 7
//    and appendix tables; section and table numbers from memory), the same forms as
//    ISO 20765-2:
//      ln phi_i = d(n alpha_r)/dn_i - ln Z,
//      d(n alpha_r)/dn_i = alpha_r + n (d alpha_r/dn_i),
//      n (d alpha_r/dn_i) = delta alpha_r_delta [1 - (1/rho_r) n (d rho_r/dn_i)]
//                         + tau alpha_r_tau (1/T_r) n (d T_r/dn_i)
//                         + alpha_r_xi - sum_k x_k alpha_r_xk,
//      n (d Y_r/dn_i) = dY_r/dx_i - sum_k x_k dY_r/dx_k (x_k treated as independent),
//      alpha_r_xi = alpha_r_oi + sum_{k != i} x_k F_ik alpha_r_ik.
//  * Stability: M. L. Michelsen, Fluid Phase Equilib. 9 (1982) 1-19 (tangent-plane
//    distance tm(W) = 1 + sum W_i (ln W_i + ln phi_i(W) - d_i - 1), d_i = ln z_i + ln phi_i(z);
//    successive substitution with dominant-eigenvalue acceleration, then Newton in
//    alpha_i = 2 sqrt(W_i)); trial phases from Wilson K-factors (G. M. Wilson 1968):
//      ln K_i = ln(pc_i/p) + 5.373 (1 + omega_i)(1 - Tc_i/T).
//  * Flash: Rachford-Rice equation (Rachford & Rice 1952) with successive substitution on
//    ln K_i = ln phi_i(liquid) - ln phi_i(vapour) (Michelsen & Mollerup, Thermodynamic
//    Models: Fundamentals & Computational Aspects, 2nd ed. 2007; chapter from memory: the
//    flash chapter).
//  * Pure-fluid saturation: equal fugacities (equal Gibbs energies) of the two roots of the
//    isotherm, i.e. Maxwell's equal-area rule.
//
// Component data for the Wilson K-factors: Tc_i is the GERG-2008 reducing temperature of
// the pure fluid (Kunz & Wagner 2012, Table A5, engine/data/gerg2008_data.hpp); pc_i is the
// pressure of the GERG-2008 pure-fluid equation at its own (Tc_i, rhoc_i), computed here;
// the acentric factors (wilson_omega below) are from memory (common handbook values,
// B. E. Poling, J. M. Prausnitz, J. P. O'Connell, The Properties of Gases and Liquids,
// 5th ed., Appendix A, rounded). They only start the iterations: the converged results
// depend on GERG-2008 alone.
//
// Limits (said where they apply): the stability test, like every tangent-plane test from
// finitely many trial phases, proves instability (a negative tm*) but not stability; its
// trials are the Wilson vapour-like and liquid-like ones and one rich in the heaviest
// component. The flash runs accelerated successive substitution, then (when not converged
// after flash_ss_before_newton steps) Newton on the Gibbs energy in the vapour mole numbers
// (Michelsen & Mollerup, flash chapter, from memory: H_ij = [z_i/(x_i y_i) delta_ij - 1 +
// (1 - beta) Phi^V_ij + beta Phi^L_ij] / (beta (1 - beta)), Phi_ij = n dln phi_i/dn_j, here by
// forward differences of ln phi, each component moved in the phase that holds less of it)
// with a line search on the Gibbs energy (where its change is below rounding, on the
// gradient); close to a mixture critical point it may still stop with no_convergence. The dew-point search
// follows the liquid-like trial down an isobar and stops where the feed itself turns
// liquid, so it gives the upper (hydrocarbon) dew point and not bubble points or
// liquid-liquid splits at cryogenic temperatures; the envelope is not traced through the
// critical point. Water is not treated (prepare_dry removes it).
//
// Every function here does not throw, does not allocate and does no I/O; all loops are
// bounded by table sizes or by the iteration limits in PhaseOptions.
#pragma once

#include <array>
#include <cstddef>
#include <cstdint>

#include "core/components.hpp"
#include "core/composition.hpp"
#include "core/scalar.hpp"
#include "core/solve_options.hpp"
#include "core/status.hpp"
#include "methods/gerg2008.hpp"

namespace zcorr::gerg2008::phase {

// Acentric factors for the Wilson start (from memory; see the header comment), canonical order.
inline constexpr std::array<double, max_components> wilson_omega{
    0.011,   // methane
    0.037,   // nitrogen
    0.225,   // carbon_dioxide
    0.099,   // ethane
    0.152,   // propane
    0.200,   // n_butane
    0.184,   // isobutane
    0.252,   // n_pentane
    0.227,   // isopentane
    0.301,   // n_hexane
    0.350,   // n_heptane
    0.398,   // n_octane
    0.445,   // n_nonane
    0.489,   // n_decane
    -0.216,  // hydrogen
    0.022,   // oxygen
    0.048,   // carbon_monoxide
    0.344,   // water
    0.100,   // hydrogen_sulfide
    -0.390,  // helium
    0.000,   // argon
};

// Hydrocarbons (methane .. n-decane): the components a hydrocarbon dew point is about.
[[nodiscard]] constexpr bool is_hydrocarbon(std::size_t i) noexcept {
  return i <= index(Component::n_decane) && i != index(Component::nitrogen) && i != index(Component::carbon_dioxide);
}

// Iteration limits and tolerances (data, as SolveOptions).
struct PhaseOptions {
  SolveOptions solve{};          // density solves
  int max_ssi = 300;             // successive-substitution steps per trial phase
  int ssi_before_newton = 25;    // switch to Newton when not converged by then
  int max_newton = 40;           // Newton steps per trial phase
  double tol = 1e-11;            // on max |ln W_new - ln W| / the Newton gradient
  double trivial_tol = 1e-4;     // max |ln(w_i/z_i)| below which a trial is the feed itself
  double tpd_negative = -1e-10;  // tm below this is negative (unstable)
  int max_flash = 400;           // flash iterations
  int flash_ss_before_newton = 40;  // successive substitution steps before the flash's Newton stage
  int max_flash_newton = 30;     // Newton steps of the flash
  double flash_tol = 1e-10;      // on max |delta ln K| (ln phi carries ~1e-11 of rounding in double)
  int max_boundary = 80;         // iterations of a dew/saturation solve
};

// Which density root a phase takes.
enum class Root : std::uint8_t {
  gas,     // the gas-branch root
  liquid,  // the liquid-branch root
  stable,  // the root of lower Gibbs energy (either)
};

// ---------------------------------------------------------------------------
// density roots

template <class S>
struct Roots {
  bool gas = false, liquid = false, capped = false;
  S delta_gas{}, delta_liq{};
  int iterations = 0;
};

// Reduced Gibbs energy (up to terms equal for every root of one composition and T).
template <class S>
[[nodiscard]] S root_gibbs(const Prepared<S>& p, const TauCache<S>& c, const S& delta) noexcept {
  const auto r = residual(p, c, delta);
  return num::log_(delta) + r.a + r.d1;
}

// Every root the equation offers at reduced pressure P (= delta Z): the gas-branch root
// (below the first point where dp/drho <= 0) and the liquid-branch root (above the last
// such point below delta_search_max). Above T_r a safeguarded Newton from the virial
// guess gives the single root first (as gerg2008::state); the scan is the fallback.
template <class S>
Roots<S> density_roots(const Prepared<S>& p, const TauCache<S>& c, const S& P, const SolveOptions& opt) noexcept {
  Roots<S> out;
  if (!(P > S(0))) return out;
  if (c.T_K >= p.Tr_K) {
    const auto v = reduced_virial(p, c);
    const S disc = S(1) + S(4) * v.B * P;
    S delta = disc > S(0) ? S(S(2) * P / (S(1) + num::sqrt_(disc))) : P;
    if (!(delta > S(0)) || delta >= S(delta_search_max)) delta = P < S(delta_search_max) ? P : S(delta_search_max / 2);
    Residual<S> r;
    const auto rr = detail::solve_delta(p, c, P, S(0), S(delta_search_max), delta, opt, r);
    out.iterations += rr.iterations;
    if (rr.found) {
      out.gas = true;
      out.delta_gas = delta;
      return out;
    }
  }
  const S h(detail::scan_step);
  const int n = detail::scan_points;
  S prev(0);
  bool bracket = false;
  for (int k = 1; k <= n; ++k) {
    const S d = h * S(k);
    ++out.iterations;
    const auto r = residual(p, c, d);
    const S f = d * (S(1) + r.d1) - P;
    const S fp = S(1) + S(2) * r.d1 + r.d2;
    if (f >= S(0)) { bracket = true; break; }
    if (!(fp > S(0))) break;
    prev = d;
  }
  S dg(0);
  if (bracket) {
    if (detail::refine_root(p, c, P, prev, S(prev + h), dg, opt, out.iterations)) {
      out.gas = true;
      out.delta_gas = dg;
    } else {
      out.capped = true;
    }
  }
  // Liquid branch: down from delta_search_max in coarse steps of 5 scan steps (the liquid
  // branch is steep and monotonic), the last coarse interval again in fine steps.
  S upper(delta_search_max), lower(0);
  bool lb = false;
  int k0 = 0;  // fine index where the fine scan starts
  for (int kc = 0; kc * 5 < n; ++kc) {
    const S d = S(delta_search_max) - h * S(5 * kc);
    if ((out.gas && d <= dg + h) || d <= h) break;
    ++out.iterations;
    const auto r = residual(p, c, d);
    const S f = d * (S(1) + r.d1) - P;
    const S fp = S(1) + S(2) * r.d1 + r.d2;
    if (!(fp > S(0)) || f < S(0)) break;
    k0 = 5 * kc;
  }
  for (int k = k0; k < n; ++k) {
    const S d = S(delta_search_max) - h * S(k);
    if (out.gas && d <= dg + h) break;
    if (d <= h) break;
    ++out.iterations;
    const auto r = residual(p, c, d);
    const S f = d * (S(1) + r.d1) - P;
    const S fp = S(1) + S(2) * r.d1 + r.d2;
    if (!(fp > S(0))) break;
    if (f < S(0)) {
      if (k == 0) break;
      lb = true;
      lower = d;
      break;
    }
    upper = d;
  }
  if (lb) {
    S dl;
    if (detail::refine_root(p, c, P, lower, upper, dl, opt, out.iterations)) {
      if (!out.gas || num::abs_(S(dl - dg)) > S(1e-9) * dl) {
        out.liquid = true;
        out.delta_liq = dl;
      }
    } else {
      out.capped = true;
    }
  }
  return out;
}

// Newton from a known nearby root (warm start); true when it converged to a root with
// dp/drho > 0 within 10 % of delta0.
template <class S>
bool refine_near(const Prepared<S>& p, const TauCache<S>& c, const S& P, const S& delta0, S& delta,
                 const SolveOptions& opt, int& iterations) noexcept {
  delta = delta0;
  const int max_iter = opt.max_iter > 0 ? opt.max_iter : 1;
  for (int it = 0; it < max_iter; ++it) {
    ++iterations;
    const auto r = residual(p, c, delta);
    const S f = delta * (S(1) + r.d1) - P;
    const S fp = S(1) + S(2) * r.d1 + r.d2;
    if (!num::isfinite_(f) || !(fp > S(0))) return false;
    const S next = delta - f / fp;
    if (!(next > S(0)) || num::abs_(S(next - delta0)) > S(0.5) * delta0) return false;
    if (num::abs_(S(next - delta)) <= S(opt.rel_tol) * next) {
      delta = next;
      const auto r2 = residual(p, c, delta);
      return S(1) + S(2) * r2.d1 + r2.d2 > S(0);
    }
    delta = next;
  }
  return false;
}

// ---------------------------------------------------------------------------
// fugacity coefficients

namespace detail {

// Local index of every global t value and density shape of a prepared composition.
struct LocalMaps {
  std::array<std::uint16_t, gerg2008::detail::n_t> t{};
  std::array<std::uint16_t, gerg2008::detail::n_shapes> shape{};
};

template <class S>
LocalMaps local_maps(const Prepared<S>& p) noexcept {
  LocalMaps m;
  m.t.fill(0xFFFF);
  m.shape.fill(0xFFFF);
  for (std::size_t k = 0; k < p.n_t; ++k) m.t[p.t_index[k]] = static_cast<std::uint16_t>(k);
  for (std::size_t k = 0; k < p.n_shapes; ++k) m.shape[p.shape_index[k]] = static_cast<std::uint16_t>(k);
  return m;
}

// Values delta^d E_g(delta) of the local density shapes.
template <class S>
void shape_values(const Prepared<S>& p, const S& delta, std::array<S, gerg2008::detail::n_shapes>& sv) noexcept {
  std::array<S, data::max_d + 1> dp{};
  dp[0] = S(1);
  for (std::size_t k = 1; k < dp.size(); ++k) dp[k] = dp[k - 1] * delta;
  std::array<S, gerg2008::detail::n_groups> E{};
  for (std::size_t g = 0; g < p.n_groups; ++g) {
    const auto& eg = data::exp_groups[p.group_index[g]];
    if (eg.kind == 0) {
      E[g] = S(1);
    } else if (eg.kind == 1) {
      E[g] = num::exp_(S(-dp[static_cast<std::size_t>(eg.c)]));
    } else {
      const S eta(eg.eta), eps(eg.epsilon), beta(eg.beta), gam(eg.gamma);
      const S u = delta - eps;
      E[g] = num::exp_(S(-eta * u * u - beta * (delta - gam)));
    }
  }
  for (std::size_t s = 0; s < p.n_shapes; ++s) sv[s] = dp[static_cast<std::size_t>(p.shape_d[s])] * E[p.shape_group[s]];
}

// d f / d x_i and d f / d x_j of f = x_i x_j (x_i + x_j) / (beta^2 x_i + x_j).
template <class S>
void pair_factor_derivs(const S& xi, const S& xj, const S& beta, S& dfi, S& dfj) noexcept {
  const S b2 = beta * beta;
  const S D = b2 * xi + xj, s = xi + xj;
  dfi = xj * s / D + xi * xj / D - xi * xj * s * b2 / (D * D);
  dfj = xi * s / D + xi * xj / D - xi * xj * s / (D * D);
}

}  // namespace detail

// The composition derivatives of the reducing functions, x_k treated as independent
// (Kunz & Wagner 2012, derivative forms of the reducing functions): dT_r/dx_i and dv_r/dx_i (v_r = 1/rho_r), active i only.
template <class S>
struct ReducingDerivs {
  Fractions<S> dTr{};
  Fractions<S> dvr{};
};

template <class S>
[[nodiscard]] ReducingDerivs<S> reducing_derivs(const Prepared<S>& p) noexcept {
  ReducingDerivs<S> d;
  const auto& x = p.x;
  for (std::size_t a = 0; a < p.n_active; ++a) {
    const std::size_t i = p.active[a];
    const auto& f = data::pure_fluids[i];
    d.dTr[i] = S(2) * x[i] * S(f.Tc_K);
    d.dvr[i] = S(2) * x[i] / (S(f.rhoc_mol_per_dm3) * S(1000));
  }
  for (const auto& pr : data::binary_pairs) {
    const S xi = x[pr.i], xj = x[pr.j];
    if (!(xi > S(0)) || !(xj > S(0))) continue;
    const auto& fi = data::pure_fluids[pr.i];
    const auto& fj = data::pure_fluids[pr.j];
    S dfi, dfj;
    detail::pair_factor_derivs(xi, xj, S(pr.beta_T), dfi, dfj);
    const S cT = S(2) * S(pr.beta_T) * S(pr.gamma_T) * num::sqrt_(S(S(fi.Tc_K) * S(fj.Tc_K)));
    d.dTr[pr.i] += cT * dfi;
    d.dTr[pr.j] += cT * dfj;
    detail::pair_factor_derivs(xi, xj, S(pr.beta_v), dfi, dfj);
    const S third = S(1) / S(3);
    const S s = num::pow_(S(S(1) / (S(fi.rhoc_mol_per_dm3) * S(1000))), third) +
                num::pow_(S(S(1) / (S(fj.rhoc_mol_per_dm3) * S(1000))), third);
    const S cv = S(2) * S(pr.beta_v) * S(pr.gamma_v) * s * s * s / S(8);
    d.dvr[pr.i] += cv * dfi;
    d.dvr[pr.j] += cv * dfj;
  }
  return d;
}

// d(n alpha_r)/dn_i at constant T, V and n_j (active i; others left 0), with alpha_r and
// its delta, tau derivatives r already evaluated at (delta, tau of c).
template <class S>
void dnalphar_dn(const Prepared<S>& p, const TauCache<S>& c, const S& delta, const Residual<S>& r,
                 Fractions<S>& out) noexcept {
  out = Fractions<S>{};
  const auto maps = detail::local_maps(p);
  std::array<S, gerg2008::detail::n_shapes> sv{};
  detail::shape_values(p, delta, sv);
  auto term_value = [&](double n, std::uint16_t combo) {
    const auto& cb = data::combos[combo];
    return S(n) * c.tau_pow[maps.t[cb.t_index]] * sv[maps.shape[cb.shape_index]];
  };
  // alpha_r of each pure fluid and of each departure function in use.
  Fractions<S> a_pure{};
  for (std::size_t a = 0; a < p.n_active; ++a) {
    const std::size_t i = p.active[a];
    const auto& f = data::pure_fluids[i];
    S v(0);
    for (std::size_t k = f.first_term; k < static_cast<std::size_t>(f.first_term) + f.term_count; ++k)
      v += term_value(data::pure_terms[k].n, data::pure_terms[k].combo);
    a_pure[i] = v;
  }
  std::array<S, gerg2008::detail::n_functions> a_dep{};
  std::array<bool, gerg2008::detail::n_functions> have{};
  Fractions<S> ax = a_pure;  // alpha_r_xi
  for (const auto& pr : data::binary_pairs) {
    const S xi = p.x[pr.i], xj = p.x[pr.j];
    if (!(xi > S(0)) || !(xj > S(0)) || pr.departure < 0 || pr.F == 0.0) continue;
    const auto fn = static_cast<std::size_t>(pr.departure);
    if (!have[fn]) {
      const auto& df = data::departure_functions[fn];
      S v(0);
      for (std::size_t k = df.first_term; k < static_cast<std::size_t>(df.first_term) + df.term_count; ++k)
        v += term_value(data::departure_terms[k].n, data::departure_terms[k].combo);
      a_dep[fn] = v;
      have[fn] = true;
    }
    ax[pr.i] += xj * S(pr.F) * a_dep[fn];
    ax[pr.j] += xi * S(pr.F) * a_dep[fn];
  }
  const auto rd = reducing_derivs(p);
  S sum_ax(0), sum_T(0), sum_v(0);
  for (std::size_t a = 0; a < p.n_active; ++a) {
    const std::size_t i = p.active[a];
    sum_ax += p.x[i] * ax[i];
    sum_T += p.x[i] * rd.dTr[i];
    sum_v += p.x[i] * rd.dvr[i];
  }
  const S vr = S(1) / p.rhor_mol_per_m3;
  for (std::size_t a = 0; a < p.n_active; ++a) {
    const std::size_t i = p.active[a];
    const S n_dvr = rd.dvr[i] - sum_v;  // n dv_r/dn_i
    const S n_dTr = rd.dTr[i] - sum_T;  // n dT_r/dn_i
    // (1/rho_r) n drho_r/dn_i = -(1/v_r) n dv_r/dn_i
    out[i] = r.a + r.d1 * (S(1) + n_dvr / vr) + r.t1 * n_dTr / p.Tr_K + ax[i] - sum_ax;
  }
}

// One phase of a given composition at (T, p): its root, Z and ln phi_i.
template <class S>
struct PhaseState {
  Prepared<S> prep{};
  TauCache<S> cache{};
  S delta{};
  S Z{};
  S ln_phi_mix{};     // alpha_r + Z - 1 - ln Z
  Fractions<S> ln_phi{};
  bool liquid = false;  // the root is the liquid-branch one
  bool valid = false;
  Status status{};
  int iterations = 0;
};

// ln phi of composition w at (T, p) on the requested root. With warm == true and st
// holding an earlier evaluation, the density starts from st.delta (scanned again if that
// fails). Composition must pass check_fractions.
template <class S>
Status evaluate_phase(const Fractions<S>& w, const S& T_K, const S& p_Pa, Root root, PhaseState<S>& st,
                      const SolveOptions& opt, bool warm = false) noexcept {
  const bool had = warm && st.valid;
  const S delta_prev = st.delta;
  const bool liquid_prev = st.liquid;
  st.valid = false;
  Status ps = prepare(w, st.prep);
  if (!ps.ok()) { st.status = ps; return ps; }
  fill_temperature_cache(st.prep, T_K, st.cache);
  const S P = p_Pa / (st.prep.rhor_mol_per_m3 * R<S>() * T_K);
  S delta(0);
  bool liquid = false, found = false;
  if (had) {
    S d;
    if (refine_near(st.prep, st.cache, P, delta_prev, d, opt, st.iterations)) {
      delta = d;
      liquid = liquid_prev;
      found = true;
    }
  }
  if (!found) {
    const auto rt = density_roots(st.prep, st.cache, P, opt);
    st.iterations += rt.iterations;
    bool use_liq = false;
    if (root == Root::gas) {
      if (!rt.gas) { st.status = make_status(rt.capped ? Code::no_convergence : Code::no_gas_root); return st.status; }
    } else if (root == Root::liquid) {
      if (!rt.liquid) {
        if (!rt.gas) { st.status = make_status(Code::no_convergence); return st.status; }
        // One root only (supercritical-like isotherm): it serves as the liquid one.
      } else {
        use_liq = true;
      }
    } else {
      if (rt.gas && rt.liquid)
        use_liq = root_gibbs(st.prep, st.cache, rt.delta_liq) < root_gibbs(st.prep, st.cache, rt.delta_gas);
      else if (rt.liquid)
        use_liq = true;
      else if (!rt.gas) { st.status = make_status(Code::no_convergence); return st.status; }
    }
    delta = use_liq ? rt.delta_liq : rt.delta_gas;
    liquid = use_liq;
  }
  const auto r = residual(st.prep, st.cache, delta);
  st.delta = delta;
  st.liquid = liquid;
  st.Z = P / delta;
  const S lnZ = num::log_(st.Z);
  st.ln_phi_mix = r.a + st.Z - S(1) - lnZ;
  Fractions<S> dn{};
  dnalphar_dn(st.prep, st.cache, delta, r, dn);
  st.ln_phi = Fractions<S>{};
  bool finite = num::isfinite_(st.Z);
  for (std::size_t a = 0; a < st.prep.n_active; ++a) {
    const std::size_t i = st.prep.active[a];
    st.ln_phi[i] = dn[i] - lnZ;
    finite = finite && num::isfinite_(st.ln_phi[i]);
  }
  if (!finite) { st.status = make_status(Code::no_convergence); return st.status; }
  st.valid = true;
  st.status = Status{};
  return st.status;
}


// The hydrocarbon basis of an analysis: water removed and the rest normalised. The
// hydrocarbon dew point is a property of the water-free gas; the water dew point is a
// separate gas-quality quantity (common practice) that this code does not assess (GERG-2008
// is not made for aqueous phases). Returns the status of prepare(); invalid_composition
// when nothing is left.
template <class S>
Status prepare_dry(const Fractions<S>& x, Prepared<S>& out) noexcept {
  Status st = check_fractions(x);
  if (!st.ok()) { out = Prepared<S>{}; out.status = st; return st; }
  Fractions<S> d = x;
  d[index(Component::water)] = S(0);
  const S sum = fraction_sum(d);
  if (!(sum > S(0))) {
    out = Prepared<S>{};
    out.status = make_status(Code::invalid_composition, static_cast<std::uint8_t>(index(Component::water)));
    return out.status;
  }
  for (auto& v : d) v /= sum;
  (void)prepare(d, out);
  out.status.flags |= st.flags;
  return out.status;
}

// ---------------------------------------------------------------------------
// Wilson K-factors

// Pressure of the GERG-2008 pure-fluid equation of component i at its reducing point
// (Tc_i, rhoc_i), Pa: the pc used in the Wilson start.
template <class S>
[[nodiscard]] S pure_reducing_pressure_Pa(std::size_t i) noexcept {
  Fractions<S> x{};
  x[i] = S(1);
  Prepared<S> p;
  if (!prepare(x, p).ok()) return S(0);
  const auto r = alphar(p, S(1), S(1));
  return p.rhor_mol_per_m3 * R<S>() * p.Tr_K * (S(1) + r.d1);
}

template <class S>
struct WilsonData {
  Fractions<S> Tc{}, pc{}, omega{};
};

template <class S>
[[nodiscard]] WilsonData<S> wilson_data(const Prepared<S>& p) noexcept {
  WilsonData<S> w;
  for (std::size_t a = 0; a < p.n_active; ++a) {
    const std::size_t i = p.active[a];
    w.Tc[i] = S(data::pure_fluids[i].Tc_K);
    w.pc[i] = pure_reducing_pressure_Pa<S>(i);
    w.omega[i] = S(wilson_omega[i]);
  }
  return w;
}

// ln K_i = ln(pc_i / p) + 5.373 (1 + omega_i)(1 - Tc_i / T) (Wilson 1968).
template <class S>
[[nodiscard]] S wilson_lnK(const WilsonData<S>& w, std::size_t i, const S& T_K, const S& p_Pa) noexcept {
  return num::log_(S(w.pc[i] / p_Pa)) + S(5.373) * (S(1) + w.omega[i]) * (S(1) - w.Tc[i] / T_K);
}

// ---------------------------------------------------------------------------
// stability test

// Outcome of one trial phase.
template <class S>
struct TrialResult {
  bool trivial = false;    // converged onto the feed itself
  bool converged = false;  // at a stationary point of tm
  bool negative = false;   // some evaluated tm* < 0 (proof of instability)
  S tpd{};                 // tm(w) = sum w_i (ln w_i + ln phi_i(w) - d_i) at the last point
  S sum_W{};
  Fractions<S> w{};        // normalised trial composition (last point)
  Status status{};
  int iterations = 0;
};

namespace detail {

// Solves (H + mu I) x = b for a symmetric H of size n (row-major, max_components^2) by
// Cholesky, raising mu until it is positive definite. Returns false when it never is.
template <class S>
bool solve_spd(const std::array<S, max_components * max_components>& H, std::size_t n,
               const std::array<S, max_components>& b, std::array<S, max_components>& x) noexcept {
  S mu(0);
  for (int attempt = 0; attempt < 40; ++attempt) {
    std::array<S, max_components * max_components> L{};
    bool ok = true;
    for (std::size_t i = 0; i < n && ok; ++i) {
      for (std::size_t j = 0; j <= i; ++j) {
        S s = H[i * max_components + j] + (i == j ? mu : S(0));
        for (std::size_t k = 0; k < j; ++k) s -= L[i * max_components + k] * L[j * max_components + k];
        if (i == j) {
          if (!(s > S(0))) { ok = false; break; }
          L[i * max_components + i] = num::sqrt_(s);
        } else {
          L[i * max_components + j] = s / L[j * max_components + j];
        }
      }
    }
    if (ok) {
      std::array<S, max_components> y{};
      for (std::size_t i = 0; i < n; ++i) {
        S s = b[i];
        for (std::size_t k = 0; k < i; ++k) s -= L[i * max_components + k] * y[k];
        y[i] = s / L[i * max_components + i];
      }
      for (std::size_t ii = n; ii-- > 0;) {
        S s = y[ii];
        for (std::size_t k = ii + 1; k < n; ++k) s -= L[k * max_components + ii] * x[k];
        x[ii] = s / L[ii * max_components + ii];
      }
      return true;
    }
    mu = mu > S(0) ? S(mu * S(4)) : S(1e-3);
  }
  return false;
}

template <class S>
[[nodiscard]] S fd_step() noexcept {
  // Forward-difference step for the Newton Hessian: ~sqrt(epsilon) of the scalar.
  return S(1) + S(1e-30) != S(1) ? S(1e-20) : S(1e-7);
}

}  // namespace detail

// Runs one trial phase from W0 (unnormalised, active components of the feed only).
// d_i = ln z_i + ln phi_i(z). work is scratch space.
template <class S>
TrialResult<S> run_trial(const Prepared<S>& feed, const Fractions<S>& d, Fractions<S> W, const S& T_K, const S& p_Pa,
                         const PhaseOptions& opt, PhaseState<S>& work, bool stop_at_negative = false) noexcept {
  TrialResult<S> out;
  const std::size_t n = feed.n_active;
  const auto& act = feed.active;
  Fractions<S> lnW{}, g{}, step{}, step_prev{};
  bool have_prev = false;
  auto eval = [&](const Fractions<S>& Wv, bool warm, S& tm_star, S& sumW) -> bool {
    sumW = S(0);
    for (std::size_t a = 0; a < n; ++a) sumW += Wv[act[a]];
    Fractions<S> w{};
    for (std::size_t a = 0; a < n; ++a) w[act[a]] = Wv[act[a]] / sumW;
    const Status s = evaluate_phase(w, T_K, p_Pa, Root::stable, work, opt.solve, warm);
    out.iterations += 1;
    if (!s.ok()) { out.status = s; return false; }
    tm_star = S(1);
    S tpd(0);
    for (std::size_t a = 0; a < n; ++a) {
      const std::size_t i = act[a];
      const S lw = num::log_(Wv[i]);
      g[i] = lw + work.ln_phi[i] - d[i];
      tm_star += Wv[i] * (g[i] - S(1));
      tpd += w[i] * (num::log_(w[i]) + work.ln_phi[i] - d[i]);
    }
    out.w = w;
    out.tpd = tpd;
    out.sum_W = sumW;
    if (tm_star < S(opt.tpd_negative)) out.negative = true;
    S dev(0);
    for (std::size_t a = 0; a < n; ++a) {
      const std::size_t i = act[a];
      const S e = num::abs_(S(num::log_(S(w[i] / feed.x[i]))));
      if (e > dev) dev = e;
    }
    if (dev < S(opt.trivial_tol)) out.trivial = true;
    return true;
  };
  S tm(0), sumW(0);
  // successive substitution with acceleration
  int k = 0;
  for (; k < opt.max_ssi; ++k) {
    if (!eval(W, k > 0, tm, sumW)) return out;
    if (out.trivial) { out.tpd = S(0); return out; }
    if (stop_at_negative && out.negative) return out;
    S err(0);
    for (std::size_t a = 0; a < n; ++a) {
      const std::size_t i = act[a];
      lnW[i] = num::log_(W[i]);
      step[i] = -g[i];  // ln W_new - ln W = d - ln phi - ln W
      const S e = num::abs_(step[i]);
      if (e > err) err = e;
    }
    if (err < S(opt.tol)) { out.converged = true; return out; }
    if (k + 1 >= opt.ssi_before_newton) break;
    S acc(0);
    if (have_prev && (k + 1) % 5 == 0) {
      S num_(0), den(0);
      for (std::size_t a = 0; a < n; ++a) {
        const std::size_t i = act[a];
        num_ += step[i] * step[i];
        den += step_prev[i] * step[i];
      }
      if (den > S(0)) {
        const S lam = num_ / den;
        if (lam > S(0) && lam < S(0.95)) acc = lam / (S(1) - lam);
      }
    }
    for (std::size_t a = 0; a < n; ++a) {
      const std::size_t i = act[a];
      const S lw = lnW[i] + step[i] * (S(1) + acc);
      W[i] = num::exp_(lw < S(600) ? lw : S(600));
      step_prev[i] = step[i];
    }
    have_prev = true;
  }
  // Newton in alpha_i = 2 sqrt(W_i) (Michelsen 1982), Hessian by forward differences of ln phi.
  const S h = detail::fd_step<S>();
  for (int it = 0; it < opt.max_newton; ++it) {
    // gradient at W (eval already done for W)
    std::array<S, max_components> G{}, dx{};
    S gmax(0);
    for (std::size_t a = 0; a < n; ++a) {
      const std::size_t i = act[a];
      G[a] = num::sqrt_(W[i]) * g[i];
      const S e = num::abs_(g[i]);
      if (e > gmax) gmax = e;
    }
    if (gmax < S(opt.tol)) { out.converged = true; return out; }
    const Fractions<S> lnphi0 = work.ln_phi, g0 = g;
    const PhaseState<S> base = work;
    std::array<S, max_components * max_components> H{};
    for (std::size_t b = 0; b < n; ++b) {
      const std::size_t j = act[b];
      Fractions<S> Wp = W;
      Wp[j] = W[j] * (S(1) + h);
      S t2, s2;
      work = base;
      if (!eval(Wp, true, t2, s2)) return out;
      for (std::size_t a = 0; a < n; ++a) {
        const std::size_t i = act[a];
        H[a * max_components + b] = num::sqrt_(S(W[i] * W[j])) * (work.ln_phi[i] - lnphi0[i]) / (W[j] * h);
      }
    }
    for (std::size_t a = 0; a < n; ++a) {
      for (std::size_t b = 0; b < a; ++b) {
        const S m = (H[a * max_components + b] + H[b * max_components + a]) / S(2);
        H[a * max_components + b] = m;
        H[b * max_components + a] = m;
      }
      H[a * max_components + a] += S(1) + g0[act[a]] / S(2);
    }
    std::array<S, max_components> rhs{};
    for (std::size_t a = 0; a < n; ++a) rhs[a] = -G[a];
    if (!detail::solve_spd(H, n, rhs, dx)) { out.status = make_status(Code::no_convergence); return out; }
    // line search on tm*
    S s(1);
    bool accepted = false;
    Fractions<S> Wn{};
    for (int ls = 0; ls < 30; ++ls) {
      bool pos = true;
      for (std::size_t a = 0; a < n; ++a) {
        const std::size_t i = act[a];
        const S al = S(2) * num::sqrt_(W[i]) + s * dx[a];
        if (!(al > S(0))) { pos = false; break; }
        Wn[i] = al * al / S(4);
      }
      if (pos) {
        work = base;
        S t2, s2;
        if (!eval(Wn, true, t2, s2)) return out;
        if (out.trivial) { out.tpd = S(0); return out; }
        if (t2 <= tm + S(1e-14) * (S(1) + num::abs_(tm))) {
          tm = t2;
          accepted = true;
          break;
        }
      }
      s = s / S(2);
    }
    if (!accepted) {
      // No descent: the point is stationary to the resolution of the Hessian.
      work = base;
      S t2, s2;
      if (!eval(W, true, t2, s2)) return out;
      out.converged = gmax < S(1e3) * S(opt.tol);
      if (!out.converged && !out.negative) out.status = make_status(Code::no_convergence);
      return out;
    }
    W = Wn;
    if (stop_at_negative && out.negative) return out;
  }
  if (!out.negative) {
    out.status = make_status(Code::no_convergence);
    out.status.flags |= flag::iteration_cap;
  }
  return out;
}

template <class S>
struct Stability {
  bool unstable = false;
  S tpd_min{};             // smallest tm (reduced TPD, divided by R T) at the trial phases' end points
  Fractions<S> trial{};    // trial composition at tpd_min (the feed itself when trivial)
  bool trial_liquid_like = false;
  S Z_feed{};              // Z of the feed on its root of lower Gibbs energy
  bool feed_liquid = false;  // that root is the liquid-branch one
  Status status{};
  int iterations = 0;
};

// Tangent-plane-distance test of composition z at (T, p): vapour-like (W = z K) and
// liquid-like (W = z / K) trial phases from Wilson K-factors, then (when neither shows
// instability) a trial rich in the heaviest component. status.ok() means the answer
// (stable / unstable) is proven: unstable by a negative tm*, stable by every trial ending
// at the feed or at a stationary point of tm >= 0. With stop_at_negative the test
// returns at the first negative tm* (enough to call the state two-phase).
template <class S>
[[nodiscard]] Stability<S> stability(const Prepared<S>& feed, const S& T_K, const S& p_Pa, const PhaseOptions& opt = {},
                                     bool stop_at_negative = false) noexcept {
  Stability<S> out;
  out.status = feed.status;
  if (!feed.status.ok()) return out;
  if (!num::isfinite_(T_K) || !(T_K > S(0))) { out.status = make_status(Code::invalid_temperature); return out; }
  if (!num::isfinite_(p_Pa) || !(p_Pa > S(0))) { out.status = make_status(Code::invalid_pressure); return out; }
  out.trial = feed.x;
  PhaseState<S> work;
  if (const Status s = evaluate_phase(feed.x, T_K, p_Pa, Root::stable, work, opt.solve); !s.ok()) {
    out.status = s;
    return out;
  }
  out.Z_feed = work.Z;
  out.feed_liquid = work.liquid;
  if (feed.n_active < 2) return out;  // a pure fluid: its phase is the root of lower Gibbs energy
  Fractions<S> d{};
  for (std::size_t a = 0; a < feed.n_active; ++a) {
    const std::size_t i = feed.active[a];
    d[i] = num::log_(feed.x[i]) + work.ln_phi[i];
  }
  const auto wd = wilson_data(feed);
  bool all_proven = true;
  bool first = true;
  auto consider = [&](const TrialResult<S>& tr, bool liquid_like) {
    out.iterations += tr.iterations;
    if (!tr.status.ok() && !tr.negative) all_proven = false;
    if (tr.trivial) return;
    if (!tr.converged && !tr.negative) return;
    if (first || tr.tpd < out.tpd_min) {
      out.tpd_min = tr.tpd;
      out.trial = tr.w;
      out.trial_liquid_like = liquid_like;
      first = false;
    }
    if (tr.negative || tr.tpd < S(opt.tpd_negative)) out.unstable = true;
  };
  for (int kind = 0; kind < 3; ++kind) {
    if (kind == 2 && out.unstable) break;
    Fractions<S> W{};
    if (kind < 2) {
      for (std::size_t a = 0; a < feed.n_active; ++a) {
        const std::size_t i = feed.active[a];
        S lk = wilson_lnK(wd, i, T_K, p_Pa);
        if (lk > S(50)) lk = S(50);
        if (lk < S(-50)) lk = S(-50);
        W[i] = feed.x[i] * num::exp_(kind == 0 ? lk : S(-lk));
      }
    } else {
      std::size_t heavy = feed.active[0];
      for (std::size_t a = 0; a < feed.n_active; ++a)
        if (data::pure_fluids[feed.active[a]].Tc_K > data::pure_fluids[heavy].Tc_K) heavy = feed.active[a];
      for (std::size_t a = 0; a < feed.n_active; ++a) W[feed.active[a]] = S(1e-3) * feed.x[feed.active[a]];
      W[heavy] += S(0.999);
    }
    const auto tr = run_trial(feed, d, W, T_K, p_Pa, opt, work, stop_at_negative);
    consider(tr, kind != 0);
    if (stop_at_negative && out.unstable) break;
  }
  if (first) out.tpd_min = S(0);
  if (!out.unstable && !all_proven) {
    out.status = make_status(Code::no_convergence);
    out.status.flags |= flag::iteration_cap;
  }
  return out;
}

// ---------------------------------------------------------------------------
// two-phase flash

template <class S>
struct Flash {
  S beta{};               // vapour mole fraction
  Fractions<S> x{};       // liquid composition
  Fractions<S> y{};       // vapour composition
  S Z_liquid{}, Z_vapour{};
  S balance{};            // max_i |z_i - beta y_i - (1 - beta) x_i|
  bool two_phase = false; // a solution with 0 < beta < 1
  Status status{};
  int iterations = 0;
};

// Rachford-Rice: sum z_i (K_i - 1) / (1 + beta (K_i - 1)) = 0 between its asymptotes.
template <class S>
bool rachford_rice(const Prepared<S>& feed, const Fractions<S>& K, S& beta, int max_iter) noexcept {
  S kmin(0), kmax(0);
  bool first = true;
  for (std::size_t a = 0; a < feed.n_active; ++a) {
    const S k = K[feed.active[a]];
    if (first || k < kmin) kmin = k;
    if (first || k > kmax) kmax = k;
    first = false;
  }
  if (!(kmax > S(1)) || !(kmin < S(1))) return false;
  S lo = S(1) / (S(1) - kmax), hi = S(1) / (S(1) - kmin);
  S b = (beta > lo && beta < hi) ? beta : S((lo + hi) / S(2));
  for (int it = 0; it < max_iter; ++it) {
    S f(0), fp(0);
    for (std::size_t a = 0; a < feed.n_active; ++a) {
      const std::size_t i = feed.active[a];
      const S km = K[i] - S(1);
      const S den = S(1) + b * km;
      f += feed.x[i] * km / den;
      fp -= feed.x[i] * km * km / (den * den);
    }
    if (f > S(0)) lo = b;
    else hi = b;
    S next = b - f / fp;
    if (!(next > lo && next < hi)) next = (lo + hi) / S(2);
    if (num::abs_(S(next - b)) <= S(1e-15) * (S(1) + num::abs_(b)) || hi - lo <= S(1e-15) * (S(1) + num::abs_(b))) {
      beta = next;
      return true;
    }
    b = next;
  }
  beta = b;
  return false;
}

namespace detail {

// The flash's Newton stage (see the header): from the split (beta, x, y) with liq and vap
// evaluated at x and y, Newton steps on the vapour mole numbers v_i = beta y_i (feed of one
// mole), each with a line search that keeps 0 < v_i < z_i and lowers the Gibbs energy
// G = sum v_i ln(y_i phi_i^V) + l_i ln(x_i phi_i^L) (where G's change is below its rounding,
// the step must shrink the gradient instead). Converged when max |g_i| < flash_tol,
// g_i = ln(y_i phi_i^V) - ln(x_i phi_i^L); then lnK_i = ln phi_i^L - ln phi_i^V (x, y, liq,
// vap at the solution). Returns false when it does not converge.
template <class S>
bool flash_newton(const Prepared<S>& feed, const S& T_K, const S& p_Pa, const PhaseOptions& opt, S& beta, Fractions<S>& x,
                  Fractions<S>& y, PhaseState<S>& liq, PhaseState<S>& vap, Fractions<S>& lnK, int& iterations) noexcept {
  const std::size_t n = feed.n_active;
  const auto& act = feed.active;
  const S h = fd_step<S>();
  auto gibbs = [&](const PhaseState<S>& L, const PhaseState<S>& V, const Fractions<S>& xx, const Fractions<S>& yy, const S& b) {
    S G(0);
    for (std::size_t a = 0; a < n; ++a) {
      const std::size_t i = act[a];
      G += b * yy[i] * (num::log_(yy[i]) + V.ln_phi[i]) + (S(1) - b) * xx[i] * (num::log_(xx[i]) + L.ln_phi[i]);
    }
    return G;
  };
  // Phi_ij = n dln phi_i / dn_j of a phase of composition w (one mole), by forward differences.
  auto phi_matrix = [&](const Fractions<S>& w, const PhaseState<S>& at, std::array<S, max_components * max_components>& M) -> bool {
    for (std::size_t b = 0; b < n; ++b) {
      const std::size_t j = act[b];
      const S d = h;  // absolute (one mole of phase): ln phi is smooth in n_j down to n_j = 0, and a step
                      // relative to a trace n_j would drown in the rounding of ln phi
      Fractions<S> wp = w;
      wp[j] += d;
      for (std::size_t a = 0; a < n; ++a) wp[act[a]] /= (S(1) + d);
      PhaseState<S> st = at;
      if (!evaluate_phase(wp, T_K, p_Pa, Root::stable, st, opt.solve, true).ok()) return false;
      for (std::size_t a = 0; a < n; ++a) M[a * max_components + b] = (st.ln_phi[act[a]] - at.ln_phi[act[a]]) / d;
    }
    return true;
  };
  S G = gibbs(liq, vap, x, y, beta);
  for (int it = 0; it < opt.max_flash_newton; ++it) {
    ++iterations;
    std::array<S, max_components> g{}, dv{};
    S gmax(0);
    for (std::size_t a = 0; a < n; ++a) {
      const std::size_t i = act[a];
      g[a] = num::log_(y[i]) + vap.ln_phi[i] - num::log_(x[i]) - liq.ln_phi[i];
      if (num::abs_(g[a]) > gmax) gmax = num::abs_(g[a]);
    }
    if (gmax < S(opt.flash_tol)) {
      for (std::size_t a = 0; a < n; ++a) lnK[act[a]] = liq.ln_phi[act[a]] - vap.ln_phi[act[a]];
      return true;
    }
    std::array<S, max_components * max_components> PV{}, PL{}, H{};
    if (!phi_matrix(y, vap, PV) || !phi_matrix(x, liq, PL)) return false;
    const S bl = beta * (S(1) - beta);
    for (std::size_t a = 0; a < n; ++a) {
      const std::size_t i = act[a];
      for (std::size_t b = 0; b < n; ++b) {
        const S pv = (PV[a * max_components + b] + PV[b * max_components + a]) / S(2);
        const S pl = (PL[a * max_components + b] + PL[b * max_components + a]) / S(2);
        H[a * max_components + b] = ((a == b ? S(feed.x[i] / (x[i] * y[i])) : S(0)) - S(1) + (S(1) - beta) * pv + beta * pl) / bl;
      }
    }
    std::array<S, max_components> rhs{};
    for (std::size_t a = 0; a < n; ++a) rhs[a] = -g[a];
    if (!solve_spd(H, n, rhs, dv)) return false;
    // line search on G, 0 < v_i < z_i
    S s(1);
    bool accepted = false;
    for (int ls = 0; ls < 30 && !accepted; ++ls, s = s / S(2)) {
      // Each component moves in the amount of the phase that holds less of it (v_i or l_i =
      // z_i - v_i): a trace in one phase keeps its digits.
      Fractions<S> v{}, l{}, xn{}, yn{};
      S V(0), Lm(0);
      bool inside = true;
      for (std::size_t a = 0; a < n && inside; ++a) {
        const std::size_t i = act[a];
        const S v0 = beta * y[i], l0 = (S(1) - beta) * x[i];
        if (l0 < v0) {
          l[i] = l0 - s * dv[a];
          v[i] = feed.x[i] - l[i];
        } else {
          v[i] = v0 + s * dv[a];
          l[i] = feed.x[i] - v[i];
        }
        inside = v[i] > S(0) && l[i] > S(0);
        V += v[i];
        Lm += l[i];
      }
      if (!inside) continue;
      for (std::size_t a = 0; a < n; ++a) {
        const std::size_t i = act[a];
        yn[i] = v[i] / V;
        xn[i] = l[i] / Lm;
      }
      V = V / (V + Lm);
      PhaseState<S> Ln = liq, Vn = vap;
      if (!evaluate_phase(xn, T_K, p_Pa, Root::stable, Ln, opt.solve, true).ok()) continue;
      if (!evaluate_phase(yn, T_K, p_Pa, Root::stable, Vn, opt.solve, true).ok()) continue;
      const S Gn = gibbs(Ln, Vn, xn, yn, V);
      // Near the solution the change of G falls below its rounding: there the step must
      // shrink the gradient instead (the trace components' directions barely move G).
      S gn(0);
      for (std::size_t a = 0; a < n; ++a) {
        const std::size_t i = act[a];
        const S e = num::abs_(S(num::log_(yn[i]) + Vn.ln_phi[i] - num::log_(xn[i]) - Ln.ln_phi[i]));
        if (e > gn) gn = e;
      }
      const S noise = S(1e-13) * (S(1) + num::abs_(G));
      if (Gn < G - noise || (Gn <= G + noise && gn < gmax)) {
        G = Gn;
        beta = V;
        x = xn;
        y = yn;
        liq = Ln;
        vap = Vn;
        accepted = true;
      }
    }
    if (!accepted) return false;
  }
  return false;
}

}  // namespace detail

// (p, T) flash of the feed, started from the stability test's trial composition (call it
// where stability() found the state unstable).
template <class S>
[[nodiscard]] Flash<S> flash(const Prepared<S>& feed, const S& T_K, const S& p_Pa, const Stability<S>& stab,
                             const PhaseOptions& opt = {}) noexcept {
  Flash<S> out;
  out.status = feed.status;
  if (!feed.status.ok()) return out;
  if (!stab.unstable) { out.status = make_status(Code::invalid_input); return out; }
  Fractions<S> lnK{}, step{}, step_prev{}, K{};
  for (std::size_t a = 0; a < feed.n_active; ++a) {
    const std::size_t i = feed.active[a];
    const S r = num::log_(S(feed.x[i] / stab.trial[i]));
    lnK[i] = stab.trial_liquid_like ? r : S(-r);
  }
  PhaseState<S> liq, vap;
  S beta = stab.trial_liquid_like ? S(0.9) : S(0.1);
  bool have_prev = false, warm = false;
  for (int it = 0; it < opt.max_flash; ++it) {
    out.iterations = it + 1;
    for (std::size_t a = 0; a < feed.n_active; ++a) K[feed.active[a]] = num::exp_(lnK[feed.active[a]]);
    if (!rachford_rice(feed, K, beta, 200)) { out.status = make_status(Code::no_convergence); return out; }
    Fractions<S> x{}, y{};
    S sx(0), sy(0);
    for (std::size_t a = 0; a < feed.n_active; ++a) {
      const std::size_t i = feed.active[a];
      x[i] = feed.x[i] / (S(1) + beta * (K[i] - S(1)));
      y[i] = K[i] * x[i];
      sx += x[i];
      sy += y[i];
    }
    for (std::size_t a = 0; a < feed.n_active; ++a) {
      x[feed.active[a]] /= sx;
      y[feed.active[a]] /= sy;
    }
    if (const Status s = evaluate_phase(x, T_K, p_Pa, Root::stable, liq, opt.solve, warm); !s.ok()) { out.status = s; return out; }
    if (const Status s = evaluate_phase(y, T_K, p_Pa, Root::stable, vap, opt.solve, warm); !s.ok()) { out.status = s; return out; }
    warm = true;
    S err(0), trivial(0);
    for (std::size_t a = 0; a < feed.n_active; ++a) {
      const std::size_t i = feed.active[a];
      step[i] = liq.ln_phi[i] - vap.ln_phi[i] - lnK[i];
      const S e = num::abs_(step[i]);
      if (e > err) err = e;
      const S t = num::abs_(lnK[i]);
      if (t > trivial) trivial = t;
    }
    if (trivial < S(opt.trivial_tol)) { out.status = make_status(Code::no_convergence); return out; }  // collapsed
    if (err < S(opt.flash_tol)) {
      // Final split from the converged K (x, y unnormalised so that the balance is exact).
      for (std::size_t a = 0; a < feed.n_active; ++a) K[feed.active[a]] = num::exp_(lnK[feed.active[a]]);
      rachford_rice(feed, K, beta, 200);
      out.beta = beta;
      S bal(0), tx(0), ty(0);
      for (std::size_t a = 0; a < feed.n_active; ++a) {
        const std::size_t i = feed.active[a];
        out.x[i] = feed.x[i] / (S(1) + beta * (K[i] - S(1)));
        out.y[i] = K[i] * out.x[i];
        tx += out.x[i];
        ty += out.y[i];
      }
      // The sums differ from 1 by the Rachford-Rice residual (amplified near beta = 0 or 1);
      // normalised, the balance error is that residual times the small phase's fraction.
      for (std::size_t a = 0; a < feed.n_active; ++a) {
        const std::size_t i = feed.active[a];
        out.x[i] /= tx;
        out.y[i] /= ty;
        const S e = num::abs_(S(feed.x[i] - beta * out.y[i] - (S(1) - beta) * out.x[i]));
        if (e > bal) bal = e;
      }
      out.balance = bal;
      out.Z_liquid = liq.Z;
      out.Z_vapour = vap.Z;
      out.two_phase = beta > S(0) && beta < S(1);
      out.status = Status{};
      return out;
    }
    if (it + 1 >= opt.flash_ss_before_newton) {
      // Newton stage from the current split; on success lnK holds the converged K.
      if (!detail::flash_newton(feed, T_K, p_Pa, opt, beta, x, y, liq, vap, lnK, out.iterations)) {
        out.status = make_status(Code::no_convergence);
        return out;
      }
      for (std::size_t a = 0; a < feed.n_active; ++a) K[feed.active[a]] = num::exp_(lnK[feed.active[a]]);
      rachford_rice(feed, K, beta, 200);
      out.beta = beta;
      S bal(0), tx(0), ty(0);
      for (std::size_t a = 0; a < feed.n_active; ++a) {
        const std::size_t i = feed.active[a];
        out.x[i] = feed.x[i] / (S(1) + beta * (K[i] - S(1)));
        out.y[i] = K[i] * out.x[i];
        tx += out.x[i];
        ty += out.y[i];
      }
      for (std::size_t a = 0; a < feed.n_active; ++a) {
        const std::size_t i = feed.active[a];
        out.x[i] /= tx;
        out.y[i] /= ty;
        const S e = num::abs_(S(feed.x[i] - beta * out.y[i] - (S(1) - beta) * out.x[i]));
        if (e > bal) bal = e;
      }
      out.balance = bal;
      out.Z_liquid = liq.Z;
      out.Z_vapour = vap.Z;
      out.two_phase = beta > S(0) && beta < S(1);
      out.status = Status{};
      return out;
    }
    S acc(0);
    if (have_prev && (it + 1) % 5 == 0) {
      S nn(0), dd(0);
      for (std::size_t a = 0; a < feed.n_active; ++a) {
        const std::size_t i = feed.active[a];
        nn += step[i] * step[i];
        dd += step_prev[i] * step[i];
      }
      if (dd > S(0)) {
        const S lam = nn / dd;
        if (lam > S(0) && lam < S(0.95)) acc = lam / (S(1) - lam);
      }
    }
    for (std::size_t a = 0; a < feed.n_active; ++a) {
      const std::size_t i = feed.active[a];
      lnK[i] += step[i] * (S(1) + acc);
      step_prev[i] = step[i];
    }
    have_prev = true;
  }
  out.status = make_status(Code::no_convergence);
  out.status.flags |= flag::iteration_cap;
  return out;
}


// ---------------------------------------------------------------------------
// pure-fluid saturation (equal fugacities of the two roots: Maxwell's rule)

template <class S>
struct Saturation {
  S T_K{}, p_Pa{};
  S rho_vap_mol_per_m3{}, rho_liq_mol_per_m3{};
  Status status{};
  int iterations = 0;
};

// Saturation pressure of a pure fluid (one active component) at T. Newton on
// ln phi_V - ln phi_L = 0 with d/dp = (v_V - v_L)/(R T), kept inside a bracket.
// no_gas_root when T is at or above the critical temperature of the equation (the two
// roots do not both exist at any pressure).
template <class S>
[[nodiscard]] Saturation<S> saturation_pressure(const Prepared<S>& pure, const S& T_K, const PhaseOptions& opt = {}) noexcept {
  Saturation<S> out;
  out.T_K = T_K;
  out.status = pure.status;
  if (!pure.status.ok()) return out;
  if (pure.n_active != 1) { out.status = make_status(Code::invalid_composition); return out; }
  if (!num::isfinite_(T_K) || !(T_K > S(0))) { out.status = make_status(Code::invalid_temperature); return out; }
  const std::size_t i = pure.active[0];
  TauCache<S> c;
  fill_temperature_cache(pure, T_K, c);
  const S RT = R<S>() * T_K;
  const S pc = pure_reducing_pressure_Pa<S>(i);
  S p = pc * num::exp_(S(S(5.373) * (S(1) + S(wilson_omega[i])) * (S(1) - S(data::pure_fluids[i].Tc_K) / T_K)));
  if (!(p > S(0)) || !(p < pc)) p = pc / S(2);
  S lo(0), hi(0);  // lo: gas stable (or no liquid root); hi: liquid stable (or no gas root)
  bool have_lo = false, have_hi = false;
  for (int it = 0; it < opt.max_boundary * 2; ++it) {
    out.iterations = it + 1;
    const S P = p / (pure.rhor_mol_per_m3 * RT);
    const auto rt = density_roots(pure, c, P, opt.solve);
    S next;
    if (rt.gas && rt.liquid) {
      const auto rg = residual(pure, c, rt.delta_gas), rl = residual(pure, c, rt.delta_liq);
      // ln f / p-independent parts: g/RT = ln delta + alpha_r + Z (+ terms equal for both roots)
      const S dg = (num::log_(rt.delta_gas) + rg.a + rg.d1) - (num::log_(rt.delta_liq) + rl.a + rl.d1);
      const S vV = S(1) / (rt.delta_gas * pure.rhor_mol_per_m3), vL = S(1) / (rt.delta_liq * pure.rhor_mol_per_m3);
      if (dg < S(0)) { lo = p; have_lo = true; } else { hi = p; have_hi = true; }
      if (num::abs_(dg) < S(1e-14) || (have_lo && have_hi && hi - lo <= S(1e-15) * hi)) {
        out.p_Pa = p;
        out.rho_vap_mol_per_m3 = S(1) / vV;
        out.rho_liq_mol_per_m3 = S(1) / vL;
        out.status = Status{};
        return out;
      }
      next = p - dg * RT / (vV - vL);
    } else if (rt.gas) {
      lo = p; have_lo = true;  // no liquid root yet: pressure below the liquid spinodal
      next = have_hi ? S((lo + hi) / S(2)) : S(p * S(1.5));
    } else if (rt.liquid) {
      hi = p; have_hi = true;  // no gas root: above the gas spinodal
      next = have_lo ? S((lo + hi) / S(2)) : S(p / S(1.5));
    } else {
      out.status = make_status(Code::no_convergence);
      return out;
    }
    if (have_lo && have_hi && !(next > lo && next < hi)) next = (lo + hi) / S(2);
    if (have_lo && have_hi && (hi - lo) <= S(1e-9) * hi && !(rt.gas && rt.liquid)) {
      out.status = make_status(Code::no_gas_root);  // the roots never coexist: supercritical
      return out;
    }
    if (!(next > S(0)) || next > S(10) * pc) { out.status = make_status(Code::no_gas_root); return out; }
    p = next;
  }
  out.status = make_status(Code::no_convergence);
  out.status.flags |= flag::iteration_cap;
  return out;
}

// Saturation temperature of a pure fluid at p: secant on ln p_sat against 1/T inside a
// bracket [T_low, T_high] (T_high: no saturation state or p_sat > p).
template <class S>
[[nodiscard]] Saturation<S> saturation_temperature(const Prepared<S>& pure, const S& p_Pa, const PhaseOptions& opt = {}) noexcept {
  Saturation<S> out;
  out.p_Pa = p_Pa;
  out.status = pure.status;
  if (!pure.status.ok()) return out;
  if (pure.n_active != 1) { out.status = make_status(Code::invalid_composition); return out; }
  if (!num::isfinite_(p_Pa) || !(p_Pa > S(0))) { out.status = make_status(Code::invalid_pressure); return out; }
  const std::size_t i = pure.active[0];
  const S Tc(data::pure_fluids[i].Tc_K);
  const S pc = pure_reducing_pressure_Pa<S>(i);
  if (p_Pa >= pc) { out.status = make_status(Code::no_gas_root); return out; }
  // Wilson-type estimate, then bracket
  S T = Tc / (S(1) - num::log_(S(p_Pa / pc)) / (S(5.373) * (S(1) + S(wilson_omega[i]))));
  S lo(extended_T_min_K), hi = Tc;
  S T_prev(0), f_prev(0);
  bool have_prev = false;
  for (int it = 0; it < opt.max_boundary; ++it) {
    out.iterations += 1;
    if (!(T > lo && T < hi)) T = (lo + hi) / S(2);
    const auto sat = saturation_pressure(pure, T, opt);
    if (!sat.status.ok()) {
      hi = T;  // at or above the equation's critical temperature
      have_prev = false;
      T = (lo + hi) / S(2);
      continue;
    }
    const S f = num::log_(S(sat.p_Pa / p_Pa));
    if (f < S(0)) lo = T; else hi = T;
    if (num::abs_(f) < S(1e-13) || hi - lo < S(1e-13) * T) {
      out = sat;
      out.iterations = it + 1;
      return out;
    }
    S next;
    if (have_prev && f != f_prev) {
      const S x0 = S(1) / T_prev, x1 = S(1) / T;
      const S x2 = x1 - f * (x1 - x0) / (f - f_prev);
      next = S(1) / x2;
    } else {
      next = f < S(0) ? S(T + S(1)) : S(T - S(1));
    }
    T_prev = T;
    f_prev = f;
    have_prev = true;
    T = next;
  }
  out.status = make_status(Code::no_convergence);
  out.status.flags |= flag::iteration_cap;
  return out;
}

// ---------------------------------------------------------------------------
// hydrocarbon dew point, cricondentherm and cricondenbar

enum class DewOutcome : std::uint8_t {
  found,             // T_K is the highest dew temperature at that pressure
  none_at_pressure,  // no dew point at that pressure (above the cricondenbar, or no liquid forms)
  no_hydrocarbon,    // the gas has no hydrocarbon component
  failed,            // see status
};

[[nodiscard]] constexpr const char* dew_outcome_name(DewOutcome o) noexcept {
  switch (o) {
    case DewOutcome::found: return "found";
    case DewOutcome::none_at_pressure: return "none_at_pressure";
    case DewOutcome::no_hydrocarbon: return "no_hydrocarbon";
    case DewOutcome::failed: return "failed";
  }
  return "unknown";
}

template <class S>
struct DewPoint {
  S T_K{};
  S p_Pa{};
  Fractions<S> liquid{};  // incipient liquid at the dew point
  DewOutcome outcome = DewOutcome::failed;
  Status status{};
  int iterations = 0;     // trial-phase evaluations
};

// Search controls of the dew-point scan (data, bounded).
struct DewOptions {
  double scan_step_K = 3.0;     // isobar scan step, downwards from the start temperature
  double start_margin_K = 30.0; // start above the Wilson dew-point estimate
  double T_low_K = extended_T_min_K;
  double T_high_K = extended_T_max_K;
  double tol_K = 1e-7;
  double trial_tol = 1e-8;      // on ln W of the trial phases in the search
};

namespace detail {

template <class S>
bool feed_terms(const Prepared<S>& feed, const S& T_K, const S& p_Pa, Fractions<S>& d, PhaseState<S>& work,
                const SolveOptions& opt) noexcept {
  if (!evaluate_phase(feed.x, T_K, p_Pa, Root::stable, work, opt).ok()) return false;
  for (std::size_t a = 0; a < feed.n_active; ++a) {
    const std::size_t i = feed.active[a];
    d[i] = num::log_(feed.x[i]) + work.ln_phi[i];
  }
  return true;
}

// The liquid-like trial at (T, p) from W (when given) or from Wilson (then the heavy-end
// trial when that ends at the feed). valid: a non-trivial stationary point, tpd its value.
template <class S>
struct LiquidTrial {
  bool valid = false;
  S tpd{};
  bool denser = false;  // the trial phase is denser than the feed (a dew point, not a bubble point)
  bool feed_liquid = false;  // the feed itself takes the liquid-branch root
  Fractions<S> W{};  // unnormalised stationary point
  Fractions<S> w{};
  int iterations = 0;
};

template <class S>
LiquidTrial<S> liquid_trial(const Prepared<S>& feed, const WilsonData<S>& wd, const S& T_K, const S& p_Pa,
                            const Fractions<S>* warm, const PhaseOptions& opt, PhaseState<S>& work) noexcept {
  LiquidTrial<S> out;
  Fractions<S> d{};
  if (!feed_terms(feed, T_K, p_Pa, d, work, opt.solve)) return out;
  const S Z_feed = work.Z;
  out.feed_liquid = work.liquid;
  for (int kind = 0; kind < 3; ++kind) {
    Fractions<S> W{};
    if (kind == 0) {
      if (warm == nullptr) continue;
      W = *warm;
    } else if (kind == 1) {
      for (std::size_t a = 0; a < feed.n_active; ++a) {
        const std::size_t i = feed.active[a];
        S lk = wilson_lnK(wd, i, T_K, p_Pa);
        if (lk > S(50)) lk = S(50);
        if (lk < S(-50)) lk = S(-50);
        W[i] = feed.x[i] * num::exp_(S(-lk));
      }
    } else {
      std::size_t heavy = feed.active[0];
      for (std::size_t a = 0; a < feed.n_active; ++a)
        if (data::pure_fluids[feed.active[a]].Tc_K > data::pure_fluids[heavy].Tc_K) heavy = feed.active[a];
      for (std::size_t a = 0; a < feed.n_active; ++a) W[feed.active[a]] = S(1e-3) * feed.x[feed.active[a]];
      W[heavy] += S(0.999);
    }
    const auto tr = run_trial(feed, d, W, T_K, p_Pa, opt, work, false);
    out.iterations += tr.iterations;
    if (tr.trivial || !tr.converged) continue;
    out.valid = true;
    out.tpd = tr.tpd;
    out.w = tr.w;
    out.denser = work.Z < Z_feed;
    for (std::size_t a = 0; a < feed.n_active; ++a) out.W[feed.active[a]] = tr.w[feed.active[a]] * tr.sum_W;
    return out;
  }
  return out;
}

// Wilson dew-point estimate at p: sum z_i / K_i(T) = 1 (bisection in T).
template <class S>
S wilson_dew_T(const Prepared<S>& feed, const WilsonData<S>& wd, const S& p_Pa, const DewOptions& dopt) noexcept {
  S lo(dopt.T_low_K), hi(dopt.T_high_K);
  for (int it = 0; it < 60; ++it) {
    const S T = (lo + hi) / S(2);
    S sum(0);
    for (std::size_t a = 0; a < feed.n_active; ++a) {
      const std::size_t i = feed.active[a];
      S lk = wilson_lnK(wd, i, T, p_Pa);
      if (lk > S(50)) lk = S(50);
      if (lk < S(-50)) lk = S(-50);
      sum += feed.x[i] * num::exp_(S(-lk));
    }
    if (sum > S(1)) lo = T; else hi = T;  // sum z/K falls as T rises
  }
  return (lo + hi) / S(2);
}

}  // namespace detail

[[nodiscard]] inline bool has_hydrocarbon_active(const std::array<std::uint8_t, max_components>& act, std::size_t n) noexcept {
  for (std::size_t a = 0; a < n; ++a)
    if (is_hydrocarbon(act[a])) return true;
  return false;
}

// The highest dew temperature of the gas at p (the upper, hydrocarbon dew point of the
// isobar): scan down from above the Wilson estimate (or from T_start_K when given) with the
// liquid-like trial phase until its tangent-plane distance turns negative, with a
// golden-section search of its minimum where the scan passes close (near the cricondenbar
// the isobar's two-phase window is narrower than the step), then regula falsi on
// tpd(T) = 0 between the last stable and the first unstable temperature.
// Call with the prepared hydrocarbon basis (prepare_dry). A pure fluid (any of the 21)
// gives its saturation temperature; a mixture without a hydrocarbon gives no_hydrocarbon.
template <class S>
[[nodiscard]] DewPoint<S> dew_temperature(const Prepared<S>& feed, const S& p_Pa, const PhaseOptions& opt_in = {},
                                          const DewOptions& dopt = {}, const S* T_start_K = nullptr) noexcept {
  // The tangent-plane distance at a stationary point is quadratic in the error of ln W, so
  // the trial phases need not be converged as tightly as opt_in.tol for tpd to 1e-14.
  PhaseOptions opt = opt_in;
  if (opt.tol < dopt.trial_tol) opt.tol = dopt.trial_tol;
  DewPoint<S> out;
  out.p_Pa = p_Pa;
  out.status = feed.status;
  if (!feed.status.ok()) return out;
  if (!num::isfinite_(p_Pa) || !(p_Pa > S(0))) { out.status = make_status(Code::invalid_pressure); return out; }
  if (feed.n_active > 1 && !has_hydrocarbon_active(feed.active, feed.n_active)) {
    out.outcome = DewOutcome::no_hydrocarbon;
    out.status = make_status(Code::invalid_composition);
    return out;
  }
  if (feed.n_active == 1) {
    const auto sat = saturation_temperature(feed, p_Pa, opt);
    out.iterations = sat.iterations;
    if (sat.status.code == Code::no_gas_root) { out.outcome = DewOutcome::none_at_pressure; out.status = Status{}; return out; }
    out.status = sat.status;
    if (!sat.status.ok()) return out;
    out.T_K = sat.T_K;
    out.liquid = feed.x;
    out.outcome = DewOutcome::found;
    return out;
  }
  const auto wd = wilson_data(feed);
  PhaseState<S> work;
  S T_top = T_start_K != nullptr ? *T_start_K : S(detail::wilson_dew_T(feed, wd, p_Pa, dopt) + S(dopt.start_margin_K));
  if (T_top > S(dopt.T_high_K)) T_top = S(dopt.T_high_K);
  // the start must be stable
  for (int k = 0; k < 30; ++k) {
    const auto st = stability(feed, T_top, p_Pa, opt, true);
    out.iterations += st.iterations;
    if (st.status.ok() && !st.unstable) break;
    if (T_top >= S(dopt.T_high_K)) { out.status = make_status(Code::out_of_range); return out; }
    T_top += S(dopt.start_margin_K);
    if (T_top > S(dopt.T_high_K)) T_top = S(dopt.T_high_K);
  }
  // scan down
  const S h(dopt.scan_step_K);
  Fractions<S> Wlast{};
  bool have_W = false;
  S T_hi = T_top, T_lo(0);
  S tpd_hi(1), tpd_lo(0);
  bool hi_valid = false, bracket = false;
  S best_T(0), best_tpd(0);
  bool have_best = false;
  detail::LiquidTrial<S> lo_trial;
  // March down: fixed steps until two stationary points give the slope of tpd(T), then
  // secant predictions of the crossing (10 % beyond it), steps kept in [h/10, 3h].
  const int n_steps = 4 * static_cast<int>((static_cast<double>(T_top) - dopt.T_low_K) / dopt.scan_step_K) + 4;
  S T_prev = T_top, Tk = T_top, step = h;
  bool have_slope_point = false;
  S T_a(0), tpd_a(0);
  for (int k = 0; k <= n_steps; ++k) {
    if (k > 0) {
      if (hi_valid && have_slope_point && tpd_hi > S(0) && T_a > T_prev && tpd_a > tpd_hi) {
        const S slope = (tpd_a - tpd_hi) / (T_a - T_prev);
        step = S(1.1) * tpd_hi / slope + S(0.01);
        if (step < h / S(10)) step = h / S(10);
        if (step > S(3) * h) step = S(3) * h;
      } else {
        step = hi_valid ? h : S(S(3) * h);  // no stationary point: far from the dew line
      }
      if (hi_valid) { T_a = T_prev; tpd_a = tpd_hi; have_slope_point = true; }
      else have_slope_point = false;
      Tk = T_prev - step;
    }
    if (Tk < S(dopt.T_low_K)) break;
    const auto lt = detail::liquid_trial(feed, wd, Tk, p_Pa, have_W ? &Wlast : nullptr, opt, work);
    out.iterations += lt.iterations;
    // The feed has become a liquid: below here the isobar is past the dew line (a split
    // found there is a bubble point or a liquid-liquid one, not a hydrocarbon dew point).
    if (lt.feed_liquid) break;
    if (lt.valid) {
      Wlast = lt.W;
      have_W = true;
      if (lt.tpd < S(0) && !lt.denser) break;  // a bubble point: the isobar passes above the dew line
      if (lt.tpd < S(0)) {
        T_lo = Tk;
        tpd_lo = lt.tpd;
        lo_trial = lt;
        T_hi = T_prev;
        bracket = true;
        break;
      }
      if (!have_best || lt.tpd < best_tpd) { best_T = Tk; best_tpd = lt.tpd; have_best = true; }
      hi_valid = true;
      tpd_hi = lt.tpd;
    } else {
      hi_valid = false;
    }
    T_prev = Tk;
  }
  if (!bracket && have_best) {
    // golden-section search of the minimum of tpd(T) around the closest approach
    const S gr = (num::sqrt_(S(5)) - S(1)) / S(2);
    S a = best_T - S(3) * h, b = best_T + h;
    Fractions<S> Wg = Wlast;
    auto f = [&](const S& T, detail::LiquidTrial<S>& lt) {
      lt = detail::liquid_trial(feed, wd, T, p_Pa, &Wg, opt, work);
      out.iterations += lt.iterations;
      if (lt.valid) Wg = lt.W;
      return lt.valid ? lt.tpd : S(1e30);
    };
    detail::LiquidTrial<S> l1, l2;
    S x1 = b - gr * (b - a), x2 = a + gr * (b - a);
    S f1 = f(x1, l1), f2 = f(x2, l2);
    for (int it = 0; it < 60 && b - a > S(1e-6); ++it) {
      if ((f1 < S(0) && !l1.denser) || (f2 < S(0) && !l2.denser)) { f1 = f2 = S(1); break; }
      if (f1 < S(0) || f2 < S(0)) break;
      if (f1 < f2) { b = x2; x2 = x1; f2 = f1; l2 = l1; x1 = b - gr * (b - a); f1 = f(x1, l1); }
      else { a = x1; x1 = x2; f1 = f2; l1 = l2; x2 = a + gr * (b - a); f2 = f(x2, l2); }
    }
    const bool use1 = f1 < S(0) && (!(f2 < S(0)) || x1 > x2);
    const bool use2 = f2 < S(0) && !use1;
    if (use1 || use2) {
      // the upper crossing lies between the negative point and the start of the window
      T_lo = use1 ? x1 : x2;
      tpd_lo = use1 ? f1 : f2;
      lo_trial = use1 ? l1 : l2;
      T_hi = b;
      hi_valid = false;
      bracket = true;
    }
  }
  if (!bracket) {
    out.outcome = DewOutcome::none_at_pressure;
    out.status = Status{};
    return out;
  }
  // regula falsi (Illinois) on tpd(T) = 0, warm from the unstable side
  Fractions<S> Wlo = lo_trial.W;
  out.liquid = lo_trial.w;
  bool side_lo = false, side_hi = false;
  for (int it = 0; it < opt.max_boundary; ++it) {
    if (T_hi - T_lo <= S(dopt.tol_K)) break;
    S T;
    if (hi_valid && tpd_hi > S(0)) {
      T = T_lo + (T_hi - T_lo) * (S(0) - tpd_lo) / (tpd_hi - tpd_lo);
      if (!(T > T_lo && T < T_hi)) T = (T_lo + T_hi) / S(2);
    } else {
      T = (T_lo + T_hi) / S(2);
    }
    const auto lt = detail::liquid_trial(feed, wd, T, p_Pa, &Wlo, opt, work);
    out.iterations += lt.iterations;
    if (lt.valid && lt.tpd < S(0)) {
      T_lo = T;
      tpd_lo = lt.tpd;
      Wlo = lt.W;
      out.liquid = lt.w;
      if (side_lo && hi_valid) tpd_hi /= S(2);
      side_lo = true;
      side_hi = false;
    } else {
      T_hi = T;
      hi_valid = lt.valid;
      if (lt.valid) {
        tpd_hi = lt.tpd;
        if (side_hi) tpd_lo /= S(2);
      }
      side_hi = true;
      side_lo = false;
      if (lt.valid && lt.tpd == S(0)) { T_lo = T; break; }
    }
    if (lt.valid && num::abs_(lt.tpd) < S(1e-14)) { T_lo = T_hi = T; break; }
  }
  out.T_K = (T_lo + T_hi) / S(2);
  out.outcome = DewOutcome::found;
  out.status = Status{};
  return out;
}

template <class S>
struct EnvelopeBounds {
  S cricondentherm_T_K{}, cricondentherm_p_Pa{};
  S cricondenbar_T_K{}, cricondenbar_p_Pa{};
  bool found = false;
  Status status{};
  int iterations = 0;
};

// The cricondentherm (highest dew temperature over all pressures) and the cricondenbar
// (highest pressure with a dew point) of the gas, by dew points along a pressure grid,
// bisection on p for the last pressure with a dew point, and a golden-section search of
// the maximum dew temperature. Call with the prepared hydrocarbon basis (prepare_dry).
template <class S>
[[nodiscard]] EnvelopeBounds<S> envelope_bounds(const Prepared<S>& feed, const PhaseOptions& opt = {},
                                                const DewOptions& dopt = {}) noexcept {
  EnvelopeBounds<S> out;
  out.status = feed.status;
  if (!feed.status.ok()) return out;
  if (feed.n_active < 2 || !has_hydrocarbon_active(feed.active, feed.n_active)) {
    out.status = make_status(Code::invalid_composition);  // a mixture with a hydrocarbon is needed
    return out;
  }
  // pressure grid, up the dew line
  constexpr std::array<double, 16> grid{0.1e6, 0.5e6, 1e6, 2e6, 3e6, 4e6, 5e6, 6e6, 7e6, 8e6, 9e6, 10e6, 12e6, 15e6, 20e6, 30e6};
  std::size_t last = grid.size();
  S best_T(0);
  std::size_t best = grid.size();
  S hint(0);
  bool have_hint = false;
  std::size_t k = 0;
  for (; k < grid.size(); ++k) {
    S start = hint + S(10);
    const auto dp = dew_temperature(feed, S(grid[k]), opt, dopt, have_hint ? &start : nullptr);
    out.iterations += dp.iterations;
    if (dp.outcome != DewOutcome::found) {
      if (dp.outcome != DewOutcome::none_at_pressure) { out.status = dp.status; return out; }
      break;
    }
    last = k;
    hint = dp.T_K;
    have_hint = true;
    if (best == grid.size() || dp.T_K > best_T) { best_T = dp.T_K; best = k; }
  }
  if (last == grid.size()) { out.status = Status{}; return out; }  // no dew point on the grid
  if (k == grid.size()) { out.status = make_status(Code::out_of_range); return out; }  // dew points beyond 30 MPa
  // cricondenbar: bisection on p between grid[last] (dew point) and grid[k] (none)
  S plo(grid[last]), phi(grid[k]);
  S Tccb = hint;
  for (int it = 0; it < 45 && phi - plo > S(1e-7) * phi; ++it) {
    const S pm = (plo + phi) / S(2);
    S start = Tccb + S(10);
    const auto dp = dew_temperature(feed, pm, opt, dopt, &start);
    out.iterations += dp.iterations;
    if (dp.outcome == DewOutcome::found) { plo = pm; Tccb = dp.T_K; }
    else if (dp.outcome == DewOutcome::none_at_pressure) phi = pm;
    else { out.status = dp.status; return out; }
  }
  out.cricondenbar_p_Pa = plo;
  out.cricondenbar_T_K = Tccb;
  // cricondentherm: golden section of T_dew(p) on the grid interval around the best point
  S a = best == 0 ? S(grid[0] / 2) : S(grid[best - 1]);
  S b = best + 1 <= last ? S(grid[best + 1]) : plo;
  const S gr = (num::sqrt_(S(5)) - S(1)) / S(2);
  S T_hint = best_T;
  auto Tdew = [&](const S& p) {
    S start = T_hint + S(5);
    const auto dp = dew_temperature(feed, p, opt, dopt, &start);
    out.iterations += dp.iterations;
    if (dp.outcome != DewOutcome::found) return S(0);
    return dp.T_K;
  };
  S x1 = b - gr * (b - a), x2 = a + gr * (b - a);
  S f1 = Tdew(x1), f2 = Tdew(x2);
  for (int it = 0; it < 40 && b - a > S(1e-6) * b; ++it) {
    if (f1 > f2) { b = x2; x2 = x1; f2 = f1; x1 = b - gr * (b - a); f1 = Tdew(x1); }
    else { a = x1; x1 = x2; f1 = f2; x2 = a + gr * (b - a); f2 = Tdew(x2); }
  }
  if (f1 > f2) { out.cricondentherm_T_K = f1; out.cricondentherm_p_Pa = x1; }
  else { out.cricondentherm_T_K = f2; out.cricondentherm_p_Pa = x2; }
  if (best_T > out.cricondentherm_T_K) { out.cricondentherm_T_K = best_T; out.cricondentherm_p_Pa = S(grid[best]); }
  out.found = true;
  out.status = Status{};
  return out;
}


template <class S>
struct Cricondentherm {
  S T_K{}, p_Pa{};
  bool found = false;  // false with status ok: no dew point on the pressure grid
  Status status{};
  int iterations = 0;
};

// The cricondentherm alone (the quantity the per-state check compares with): dew
// temperatures on a pressure grid up to the first pressure without one, then a
// golden-section search of the maximum (to tol_p relative in pressure; the dew temperature
// is flat there, so T is good to far better than that).
template <class S>
[[nodiscard]] Cricondentherm<S> cricondentherm(const Prepared<S>& feed, const PhaseOptions& opt = {},
                                               const DewOptions& dopt = {}, double tol_p = 1e-3) noexcept {
  Cricondentherm<S> out;
  out.status = feed.status;
  if (!feed.status.ok()) return out;
  if (feed.n_active < 2 || !has_hydrocarbon_active(feed.active, feed.n_active)) {
    out.status = make_status(Code::invalid_composition);
    return out;
  }
  constexpr std::array<double, 14> grid{0.1e6, 0.5e6, 1e6, 2e6, 3e6, 4e6, 5e6, 6e6, 8e6, 10e6, 12e6, 15e6, 20e6, 30e6};
  std::size_t best = grid.size(), last = grid.size();
  S best_T(0), hint(0);
  bool have_hint = false;
  std::size_t k = 0;
  for (; k < grid.size(); ++k) {
    S start = hint + S(10);
    const auto dp = dew_temperature(feed, S(grid[k]), opt, dopt, have_hint ? &start : nullptr);
    out.iterations += dp.iterations;
    if (dp.outcome != DewOutcome::found) {
      if (dp.outcome != DewOutcome::none_at_pressure) { out.status = dp.status; return out; }
      break;
    }
    last = k;
    hint = dp.T_K;
    have_hint = true;
    if (best == grid.size() || dp.T_K > best_T) { best_T = dp.T_K; best = k; }
    if (k > best + 1) break;  // past the maximum: the dew temperature falls towards the cricondenbar
  }
  if (best == grid.size()) { out.status = Status{}; return out; }
  if (k == grid.size()) { out.status = make_status(Code::out_of_range); return out; }
  S a = best == 0 ? S(grid[0] / 2) : S(grid[best - 1]);
  S b = best + 1 <= last ? S(grid[best + 1]) : S(grid[best]);
  const S gr = (num::sqrt_(S(5)) - S(1)) / S(2);
  auto Tdew = [&](const S& p) {
    S start = best_T + S(5);
    const auto dp = dew_temperature(feed, p, opt, dopt, &start);
    out.iterations += dp.iterations;
    return dp.outcome == DewOutcome::found ? dp.T_K : S(0);
  };
  S x1 = b - gr * (b - a), x2 = a + gr * (b - a);
  S f1 = Tdew(x1), f2 = Tdew(x2);
  for (int it = 0; it < 60 && b - a > S(tol_p) * b; ++it) {
    if (f1 > f2) { b = x2; x2 = x1; f2 = f1; x1 = b - gr * (b - a); f1 = Tdew(x1); }
    else { a = x1; x1 = x2; f1 = f2; x2 = a + gr * (b - a); f2 = Tdew(x2); }
  }
  out.T_K = f1 > f2 ? f1 : f2;
  out.p_Pa = f1 > f2 ? x1 : x2;
  if (best_T > out.T_K) { out.T_K = best_T; out.p_Pa = S(grid[best]); }
  out.found = true;
  out.status = Status{};
  return out;
}

}  // namespace zcorr::gerg2008::phase
