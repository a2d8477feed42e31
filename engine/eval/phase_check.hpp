// zcorr evaluation layer: the GERG-2008 phase check of a prepared gas analysis, in
// double, with the cricondentherm cached per analysis (engine/methods/gerg2008_phase.hpp).
//
// check(T, p) says whether a state is single-phase gas by the tangent-plane stability test
// on the water-free gas (the hydrocarbon dew point; water is not assessed). Most states of
// a meter run are settled by one comparison with a cached dew temperature:
//  * the dew temperature on a pressure grid (nodes every `node_step_Pa`), computed at the
//    two nodes around a state's pressure once `states_before_nodes` states of the analysis
//    needed the full test: a state more than `margin_K` above the higher of the two is
//    single-phase (between nodes 0.1 MPa apart the dew temperature rises above both by far
//    less than the margin: its curvature is of order 1 K/MPa^2 or less, and near the
//    cricondenbar it falls with pressure). When the previous analysis was close (every
//    fraction within 10 %) and had its dew temperature T_prev at the node, one warm
//    liquid-like trial phase at T_prev + 1 K stands in for the search: a positive
//    tangent-plane distance there puts the new dew temperature below it (on an isobar the
//    liquid-like trial's distance is negative only between the lower and the upper dew
//    temperature), and T_prev + 1 K is kept as the node's bound; otherwise the node is
//    searched afresh. A new analysis every 15 minutes then costs two trial phases;
//  * the cricondentherm, once more than `nodes_before_cricondentherm` nodes were needed
//    (states spread over pressures): a state more than `margin_K` above it is single-phase
//    (no two-phase state of the gas lies above its cricondentherm).
// Near the dew point (check with near_K > 0): a single-phase state less than near_K above
// the dew temperature at its pressure is reported near_dew. The dew temperature at p is the
// linear interpolation of the searched dew temperatures at the two nodes around p (a node
// known only as a bound is searched when the state lies within near_K of it; the
// interpolation error is of order the curvature times (0.05 MPa)^2, a few mK); above the
// cricondenbar at both nodes there is none (not near); where it cannot be computed the
// state is reported near_dew (the safe side). With near_K > 0 the nodes are used from the
// first state (a one-off state pays two dew searches instead of one stability test).
// Preparing an analysis stays cheap and a one-off state pays only its own test.
// Not thread-safe (the cache is per object). Does not allocate, does not throw.
#pragma once

#include <array>
#include <cstdint>
#include <limits>

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
  bool by_comparison = false;  // settled by comparison with a cached dew temperature
  double tpd = 0.0;            // smallest tangent-plane distance found (when the test ran)
  bool near_dew = false;       // single-phase, within near_K of the dew temperature at p
  double T_dew_K = std::numeric_limits<double>::quiet_NaN();  // dew temperature at p, when it was needed
};

class PhaseCheck {
 public:
  double margin_K = 0.5;
  int states_before_nodes = 2;
  int nodes_before_cricondentherm = 8;
  static constexpr double node_step_Pa = 0.1e6;
  static constexpr std::size_t n_nodes = 400;  // up to 40 MPa

  // Returns the status of the water-free basis (not ok: the check does not apply).
  Status prepare(const Fractions<double>& x) noexcept;
  // near_K: also say whether a single-phase state lies within near_K above the dew
  // temperature at p (0: not asked).
  [[nodiscard]] PhaseCheckResult check(double T_K, double p_Pa, double near_K = 0.0) noexcept;
  // The cricondentherm, computed now if not yet known; nullptr when it does not exist.
  [[nodiscard]] const gerg2008::phase::Cricondentherm<double>* cricondentherm() noexcept;
  [[nodiscard]] bool applies() const noexcept { return applies_; }

 private:
  gerg2008::Prepared<double> dry_{};
  bool applies_ = false;
  int full_tests_ = 0;
  int nodes_computed_ = 0;
  Fractions<double> x_prev_{};  // the previous analysis (hints are used when it is close)
  bool hints_ok_ = false;
  bool initialised_ = false;
  bool cct_tried_ = false;
  gerg2008::phase::Cricondentherm<double> cct_{};
  // Dew temperature at node k (p = k node_step_Pa): NaN unknown, -1 none at that pressure,
  // -2 not computable (the full test is used there).
  std::array<double, n_nodes> node_T_{};
  std::array<bool, n_nodes> node_exact_{};  // node_T_ is a searched dew temperature, not a bound
  // Dew temperature of the node's last full search (kept across close analyses), and the
  // incipient liquid of the last search, the warm start of the trial phases.
  std::array<double, n_nodes> node_ref_{};
  Fractions<double> liquid_{};
  bool have_liquid_ = false;
  gerg2008::phase::WilsonData<double> wilson_{};
  gerg2008::phase::PhaseState<double> work_{};
  [[nodiscard]] double node(std::size_t k, bool exact = false) noexcept;
  // near_dew and T_dew_K of r for a single-phase state (T, p).
  void near_dew(PhaseCheckResult& r, double T_K, double p_Pa, double near_K) noexcept;
};

}  // namespace zcorr
