// zcorr evaluation layer: the GERG-2008 phase check with a cached cricondentherm.
#include "eval/phase_check.hpp"

#include <cmath>
#include <limits>

namespace zcorr {

namespace ph = gerg2008::phase;

Status PhaseCheck::prepare(const Fractions<double>& x) noexcept {
  if (!initialised_) {
    node_ref_.fill(std::numeric_limits<double>::quiet_NaN());
    initialised_ = true;
  }
  // Hints for the node searches: the previous analysis's dew temperatures, if it was close.
  bool close = applies_;
  for (std::size_t i = 0; i < max_components && close; ++i)
    close = std::abs(x[i] - x_prev_[i]) <= 0.1 * std::max(x[i], x_prev_[i]) + 1e-6;
  hints_ok_ = close;
  if (!close) {
    node_ref_.fill(std::numeric_limits<double>::quiet_NaN());
    have_liquid_ = false;
  }
  x_prev_ = x;
  full_tests_ = 0;
  nodes_computed_ = 0;
  cct_tried_ = false;
  cct_ = {};
  node_T_.fill(std::numeric_limits<double>::quiet_NaN());
  node_exact_.fill(false);
  applies_ = false;
  const Status s = ph::prepare_dry(x, dry_);
  if (!s.ok()) return s;
  // A pure fluid keeps the density solver's own two-phase rule; a mixture needs a hydrocarbon.
  applies_ = dry_.n_active >= 2 && ph::has_hydrocarbon_active(dry_.active, dry_.n_active);
  if (applies_) wilson_ = ph::wilson_data(dry_);
  return s;
}

const ph::Cricondentherm<double>* PhaseCheck::cricondentherm() noexcept {
  if (!applies_) return nullptr;
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
