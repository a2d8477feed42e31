// zcorr evaluation layer: the GERG-2008 phase check of a prepared gas analysis, in
// double, with the cricondentherm cached per analysis (engine/methods/gerg2008_phase.hpp).
//
// check(T, p) says whether a state is single-phase gas by the tangent-plane stability test
// on the water-free gas (the hydrocarbon dew point; water is not assessed). Most states of
// a meter run are settled by one comparison: once the cricondentherm of the analysis is
// known, a state more than `margin_K` above it is single-phase (no two-phase state of the
// gas lies above its cricondentherm). The cricondentherm is computed lazily, after
// `states_before_cache` states of the same analysis needed the full test, so that
// preparing an analysis stays cheap and a one-off state pays only its own test.
// Below the cricondentherm, the dew temperature is cached the same way on a pressure grid
// (nodes every `node_step_Pa`), computed at the two nodes around a state's pressure once a
// state falls there: a state more than `margin_K` above the higher of the two is
// single-phase (between nodes 0.1 MPa apart the dew temperature rises above both by far
// less than the margin: its curvature is of order 1 K/MPa^2 or less away from the
// cricondenbar, where it falls with pressure).
// Not thread-safe (the cache is per object). Does not allocate, does not throw.
#pragma once

#include <array>
#include <cstdint>

#include "core/composition.hpp"
#include "core/status.hpp"
#include "methods/gerg2008_phase.hpp"

namespace zcorr {

enum class PhaseVerdict : std::uint8_t {
  not_applicable,  // a pure fluid, or no hydrocarbon: the check does not apply
  single_phase,    // proven stable (test or comparison with the cricondentherm)
  two_phase,       // proven unstable: a negative tangent-plane distance was found
  undecided,       // the test did not converge (treat as "may be below the dew point")
};

struct PhaseCheckResult {
  PhaseVerdict verdict = PhaseVerdict::not_applicable;
  bool by_comparison = false;  // settled by T > cricondentherm + margin
  double tpd = 0.0;            // smallest tangent-plane distance found (when the test ran)
};

class PhaseCheck {
 public:
  double margin_K = 0.5;
  int states_before_cache = 8;
  static constexpr double node_step_Pa = 0.1e6;
  static constexpr std::size_t n_nodes = 400;  // up to 40 MPa

  // Returns the status of the water-free basis (not ok: the check does not apply).
  Status prepare(const Fractions<double>& x) noexcept;
  [[nodiscard]] PhaseCheckResult check(double T_K, double p_Pa) noexcept;
  // The cricondentherm, computed now if not yet known; nullptr when it does not exist.
  [[nodiscard]] const gerg2008::phase::Cricondentherm<double>* cricondentherm() noexcept;
  [[nodiscard]] bool applies() const noexcept { return applies_; }

 private:
  gerg2008::Prepared<double> dry_{};
  bool applies_ = false;
  int full_tests_ = 0;
  bool cct_tried_ = false;
  gerg2008::phase::Cricondentherm<double> cct_{};
  // Dew temperature at node k (p = k node_step_Pa): NaN unknown, -1 none at that pressure,
  // -2 not computable (the full test is used there).
  std::array<double, n_nodes> node_T_{};
  [[nodiscard]] double node(std::size_t k) noexcept;
};

}  // namespace zcorr
