// zcorr evaluation layer: the GERG-2008 phase check with a cached cricondentherm.
#include "eval/phase_check.hpp"

#include <cmath>
#include <limits>

namespace zcorr {

namespace ph = gerg2008::phase;

Status PhaseCheck::prepare(const Fractions<double>& x) noexcept {
  full_tests_ = 0;
  cct_tried_ = false;
  cct_ = {};
  node_T_.fill(std::numeric_limits<double>::quiet_NaN());
  applies_ = false;
  const Status s = ph::prepare_dry(x, dry_);
  if (!s.ok()) return s;
  // A pure fluid keeps the density solver's own two-phase rule; a mixture needs a hydrocarbon.
  applies_ = dry_.n_active >= 2 && ph::has_hydrocarbon_active(dry_.active, dry_.n_active);
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

double PhaseCheck::node(std::size_t k) noexcept {
  if (std::isnan(node_T_[k])) {
    if (k == 0) {
      node_T_[k] = -1.0;  // p = 0: no condensed phase
    } else {
      const double start = cct_.T_K + 2.0;
      const auto d = ph::dew_temperature(dry_, static_cast<double>(k) * node_step_Pa, ph::PhaseOptions{}, ph::DewOptions{},
                                         &start);
      node_T_[k] = d.outcome == ph::DewOutcome::found ? d.T_K : d.outcome == ph::DewOutcome::none_at_pressure ? -1.0 : -2.0;
    }
  }
  return node_T_[k];
}

PhaseCheckResult PhaseCheck::check(double T_K, double p_Pa) noexcept {
  PhaseCheckResult r;
  if (!applies_) return r;
  if (cct_tried_ || full_tests_ >= states_before_cache) {
    const auto* c = cricondentherm();
    if (cct_.status.ok() && (c == nullptr || T_K > c->T_K + margin_K)) {
      // No dew point at any pressure, or hotter than the cricondentherm: single-phase.
      r.verdict = PhaseVerdict::single_phase;
      r.by_comparison = true;
      return r;
    }
    // Below the cricondentherm: the dew temperatures at the pressure nodes around p.
    const double kf = p_Pa / node_step_Pa;
    if (c != nullptr && kf >= 0.0 && kf + 1.0 < static_cast<double>(n_nodes)) {
      const auto k = static_cast<std::size_t>(kf);
      const double a = node(k), b = node(k + 1);
      if (a > -2.0 && b > -2.0 && T_K > std::max(a, b) + margin_K && (a > 0.0 || b > 0.0 || T_K > c->T_K - 30.0)) {
        r.verdict = PhaseVerdict::single_phase;
        r.by_comparison = true;
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
  return r;
}

}  // namespace zcorr
