// zcorr evaluation layer: the GERG-2008 phase check with a cached cricondentherm.
#include "eval/phase_check.hpp"

namespace zcorr {

namespace ph = gerg2008::phase;

Status PhaseCheck::prepare(const Fractions<double>& x) noexcept {
  full_tests_ = 0;
  cct_tried_ = false;
  cct_ = {};
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
