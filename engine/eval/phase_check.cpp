// zcorr evaluation layer: the GERG-2008 phase check with a cached cricondentherm.
#include "eval/phase_check.hpp"

#include <cmath>
#include <limits>

namespace zcorr {

namespace ph = gerg2008::phase;

Status PhaseCheck::prepare(const Fractions<double>& x) noexcept {
  constexpr double nan = std::numeric_limits<double>::quiet_NaN();
  if (initialised_ && x == x_cur_) return status_cur_;  // the same analysis: everything cached stays
  if (!initialised_) {
    node_ref_.fill(nan);
    initialised_ = true;
  }
  x_cur_ = x;
  // Hints for the node searches: the previous analysis's dew temperatures, if it was close.
  bool close = applies_;
  for (std::size_t i = 0; i < max_components && close; ++i)
    close = std::abs(x[i] - x_prev_[i]) <= 0.1 * std::max(x[i], x_prev_[i]) + 1e-6;
  hints_ok_ = close;
  if (!close) {
    node_ref_.fill(nan);
    have_liquid_ = false;
  }
  x_prev_ = x;
  full_tests_ = 0;
  nodes_computed_ = 0;
  cct_tried_ = false;
  cct_ = {};
  node_T_.fill(nan);
  node_exact_.fill(false);
  shift_.fill(nan);
  applies_ = false;
  dry_ready_ = false;
  ref_is_current_ = ref_close_ = false;
  // The water-free basis as prepare_dry makes it; its GERG-2008 preparation waits until needed.
  status_cur_ = check_fractions(x);
  if (!status_cur_.ok()) return status_cur_;
  dx_ = x;
  dx_[index(Component::water)] = 0.0;
  const double sum = fraction_sum(dx_);
  if (!(sum > 0.0)) return status_cur_ = make_status(Code::invalid_composition, static_cast<std::uint8_t>(index(Component::water)));
  dn_ = 0;
  for (std::size_t i = 0; i < max_components; ++i) {
    dx_[i] /= sum;
    if (dx_[i] > 0.0) dactive_[dn_++] = static_cast<std::uint8_t>(i);
  }
  // A pure fluid keeps the density solver's own two-phase rule; a mixture needs a hydrocarbon.
  applies_ = dn_ >= 2 && ph::has_hydrocarbon_active(dactive_, dn_);
  if (!applies_) return status_cur_;
  if (!have_all_wilson_) {  // the pure-fluid reducing pressures, once per object
    gerg2008::Prepared<double> all{};
    all.n_active = max_components;
    for (std::size_t i = 0; i < max_components; ++i) all.active[i] = static_cast<std::uint8_t>(i);
    all_wilson_ = ph::wilson_data(all);
    have_all_wilson_ = true;
  }
  wilson_ = all_wilson_;
  // The reference analysis: this one, unless it is close to the one in use.
  ref_close_ = have_ref_;
  for (std::size_t i = 0; i < max_components && ref_close_; ++i) {
    const double r = ref_dry_.x[i], v = dx_[i];
    ref_close_ = (r == 0.0) == (v == 0.0) && std::abs(v - r) <= ref_close_rel * r;
  }
  if (!ref_close_ && ensure_dry()) {
    ref_dry_ = dry_;
    ref_x_ = x;
    ref_T_.fill(nan);
    ref_W_.fill(nan);
    have_ref_ = true;
    ref_close_ = true;
  }
  ref_is_current_ = ref_x_ == x;
  return status_cur_;
}

bool PhaseCheck::ensure_dry() noexcept {
  if (!applies_) return false;
  if (!dry_ready_) {
    dry_ready_ = true;
    if (!ph::prepare_dry(x_cur_, dry_).ok()) applies_ = false;
  }
  return applies_;
}

double PhaseCheck::ref_node(std::size_t k) noexcept {
  if (!std::isnan(ref_T_[k])) return ref_T_[k];
  const double p = static_cast<double>(k) * ref_step_Pa;
  constexpr auto per = static_cast<std::size_t>(ref_step_Pa / node_step_Pa + 0.5);  // fine nodes per point
  if (k == 0) {
    ref_T_[k] = -1.0;  // p = 0: no condensed phase
  } else if (ref_is_current_ && k * per < n_nodes) {
    ref_T_[k] = node(k * per, true);  // the reference analysis itself: its own node, shared
  } else {
    const auto d = ph::dew_temperature(ref_dry_, p);
    ref_T_[k] = d.outcome == ph::DewOutcome::found ? d.T_K : d.outcome == ph::DewOutcome::none_at_pressure ? -1.0 : -2.0;
  }
  if (ref_T_[k] > 0.0) ref_W_[k] = ph::detail::wilson_dew_T(ref_dry_, wilson_, p, ph::DewOptions{});
  return ref_T_[k];
}

// The rise of the Wilson dew temperature at reference point k from the reference analysis to
// this one: two Newton steps on sum z_i / K_i(T) = 1 from the reference's root.
double PhaseCheck::wilson_shift(std::size_t k) noexcept {
  if (!std::isnan(shift_[k])) return shift_[k];
  if (ref_is_current_) return shift_[k] = 0.0;
  const double p = static_cast<double>(k) * ref_step_Pa;
  double T = ref_W_[k];
  bool ok = std::isfinite(T) && T > 0.0;
  for (int it = 0; it < 2 && ok; ++it) {
    double f = -1.0, df = 0.0;
    for (std::size_t a = 0; a < dn_; ++a) {
      const std::size_t i = dactive_[a];
      const double lk = ph::wilson_lnK(wilson_, i, T, p);
      const double inv = dx_[i] * std::exp(-std::min(50.0, std::max(-50.0, lk)));
      f += inv;
      df -= inv * 5.373 * (1.0 + wilson_.omega[i]) * wilson_.Tc[i] / (T * T);  // d(1/K)/dT = -(1/K) dlnK/dT
    }
    ok = df < 0.0 && std::isfinite(f);
    if (ok) T -= f / df;
    ok = ok && std::isfinite(T) && T > 0.0;
  }
  // Not computable: an infinite rise (the reference is not used).
  return shift_[k] = ok ? std::max(0.0, T - ref_W_[k]) : std::numeric_limits<double>::infinity();
}

bool PhaseCheck::settled_by_reference(double T_K, double p_Pa, double guard_K) noexcept {
  if (!ref_close_) return false;
  const double kf = p_Pa / ref_step_Pa;
  if (!(kf >= 0.0 && kf + 2.0 < static_cast<double>(n_ref))) return false;
  const auto k = static_cast<std::size_t>(kf);
  double bound = 0.0;
  if (k == 0) {
    // Below the first point: bounded by it where the dew line still rises beyond it.
    const double b = ref_node(1);
    if (!(b > 0.0)) return false;
    if (T_K <= b + ref_gap_K + guard_K) return false;  // not settled in any case: spare the second search
    const double c = ref_node(2);
    if (!(c > b)) return false;
    bound = b + ref_shift_factor * wilson_shift(1);
  } else {
    if (T_K <= std::min(ref_T_[k], ref_T_[k + 1]) + guard_K) return false;  // known values below the state: not settled
    const double a = ref_node(k), b = ref_node(k + 1);
    if (!(a > 0.0 && b > 0.0)) return false;
    if (std::abs(a - b) > ref_max_dT_dlnp_K * std::log(static_cast<double>(k + 1) / static_cast<double>(k))) return false;
    bound = std::max(a + ref_shift_factor * wilson_shift(k), b + ref_shift_factor * wilson_shift(k + 1));
  }
  return T_K > bound + ref_gap_K + guard_K;
}

const ph::Cricondentherm<double>* PhaseCheck::cricondentherm() noexcept {
  if (!ensure_dry()) return nullptr;
  if (!cct_tried_) {
    cct_ = ph::cricondentherm(dry_);
    cct_tried_ = true;
  }
  return cct_.status.ok() && cct_.found ? &cct_ : nullptr;
}

double PhaseCheck::node(std::size_t k, bool exact) noexcept {
  if (!std::isnan(node_T_[k]) && (node_exact_[k] || !exact)) return node_T_[k];
  node_exact_[k] = true;
  if (k == 0) return node_T_[k] = -1.0;  // p = 0: no condensed phase
  if (!ensure_dry()) return node_T_[k] = -2.0;
  const double p = static_cast<double>(k) * node_step_Pa;
  if (!exact && hints_ok_ && have_liquid_ && node_ref_[k] > 0.0) {
    // One warm liquid-like trial just above the previous analysis's dew temperature.
    const double Tb = node_ref_[k] + 1.0;
    const auto lt = ph::detail::liquid_trial(dry_, wilson_, Tb, p, &liquid_, ph::PhaseOptions{}, work_);
    if (lt.valid && lt.tpd > 1e-9 && !lt.feed_liquid) {
      liquid_ = lt.W;
      node_exact_[k] = false;  // a bound
      return node_T_[k] = Tb;
    }
  }
  // A full search, from above the dew temperature: the cricondentherm bounds it; a close
  // previous analysis gives it to a few kelvin; else the Wilson estimate of the search.
  double start = 0.0;
  const double* sp = nullptr;
  if (cct_tried_ && cct_.status.ok() && cct_.found) {
    start = cct_.T_K + 2.0;
    sp = &start;
  } else if (hints_ok_ && node_ref_[k] > 0.0) {
    start = node_ref_[k] + 10.0;
    sp = &start;
  }
  const auto d = ph::dew_temperature(dry_, p, ph::PhaseOptions{}, ph::DewOptions{}, sp);
  ++nodes_computed_;
  if (d.outcome == ph::DewOutcome::found) {
    node_ref_[k] = d.T_K;
    liquid_ = d.liquid;
    have_liquid_ = true;
    return node_T_[k] = d.T_K;
  }
  node_ref_[k] = std::numeric_limits<double>::quiet_NaN();
  return node_T_[k] = d.outcome == ph::DewOutcome::none_at_pressure ? -1.0 : -2.0;
}

void PhaseCheck::near_dew(PhaseCheckResult& r, double T_K, double p_Pa, double near_K) noexcept {
  const double kf = p_Pa / node_step_Pa;
  if (!(kf >= 0.0 && kf + 1.0 < static_cast<double>(n_nodes))) {
    r.near_dew = true;  // beyond the node grid: not known, the safe side
    return;
  }
  const auto k = static_cast<std::size_t>(kf);
  const double a = node(k, true), b = node(k + 1, true);
  if (a <= -2.0 || b <= -2.0) {
    r.near_dew = true;  // a dew temperature could not be computed: the safe side
    return;
  }
  if (a > 0.0 && b > 0.0) r.T_dew_K = a + (b - a) * (kf - static_cast<double>(k));
  else if (a > 0.0 || b > 0.0) r.T_dew_K = std::max(a, b);  // the cricondenbar lies between the nodes
  else return;                                               // above the cricondenbar: no dew point
  r.near_dew = T_K < r.T_dew_K + near_K;
}

PhaseCheckResult PhaseCheck::check(double T_K, double p_Pa, double near_K) noexcept {
  PhaseCheckResult r;
  if (!applies_) return r;
  if (!(near_K > 0.0) || !std::isfinite(near_K)) near_K = 0.0;
  if (!cct_tried_ && nodes_computed_ > nodes_before_cricondentherm) (void)cricondentherm();
  const bool have_cct = cct_tried_ && cct_.status.ok();
  if (have_cct && (!cct_.found || T_K > cct_.T_K + std::max(margin_K, near_K))) {
    // No dew point at any pressure, or hotter than the cricondentherm: single-phase.
    r.verdict = PhaseVerdict::single_phase;
    r.by_comparison = true;
    return r;
  }
  if (settled_by_reference(T_K, p_Pa, std::max(margin_K, near_K))) {
    r.verdict = PhaseVerdict::single_phase;
    r.by_comparison = true;
    return r;
  }
  if (near_K > 0.0 || full_tests_ >= states_before_nodes || hints_ok_) {
    // The dew temperatures at the pressure nodes around p.
    const double kf = p_Pa / node_step_Pa;
    if (kf >= 0.0 && kf + 1.0 < static_cast<double>(n_nodes)) {
      const auto k = static_cast<std::size_t>(kf);
      const double a = node(k), b = node(k + 1);
      // Both "none" (above the cricondenbar) settles only warm states: the search stops
      // where the feed turns liquid, and below that other splits are possible.
      const bool none_ok = have_cct && cct_.found && T_K > cct_.T_K - 30.0;
      if (a > -2.0 && b > -2.0 && T_K > std::max(a, b) + margin_K && (a > 0.0 || b > 0.0 || none_ok)) {
        r.verdict = PhaseVerdict::single_phase;
        r.by_comparison = true;
        if (near_K > 0.0 && T_K < std::max(a, b) + near_K) near_dew(r, T_K, p_Pa, near_K);
        return r;
      }
    }
  }
  if (!ensure_dry()) return r;  // (the dry basis could not be prepared: not applicable)
  ++full_tests_;
  const auto st = ph::stability(dry_, T_K, p_Pa, ph::PhaseOptions{}, true);
  r.tpd = st.tpd_min;
  if (st.unstable) r.verdict = PhaseVerdict::two_phase;
  else if (!st.status.ok()) r.verdict = PhaseVerdict::undecided;
  else r.verdict = PhaseVerdict::single_phase;
  if (r.verdict == PhaseVerdict::single_phase && near_K > 0.0) near_dew(r, T_K, p_Pa, near_K);
  return r;
}

}  // namespace zcorr
