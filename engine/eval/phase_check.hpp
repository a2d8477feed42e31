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
//  * a reference analysis: the first analysis, and again each one that is not close to it.
//    Its dew temperatures on a coarser grid (every `ref_step_Pa`) are searched once (exact)
//    and kept; an analysis close
//    to it (the same components present, each fraction within `ref_close_rel` of the
//    reference's) settles a state with no trial phase at all when the state lies more than
//    `ref_gap_K` plus `ref_shift_factor` times the rise of the Wilson dew temperature (the
//    ideal-solution estimate sum z_i / K_i = 1, two Newton steps from the reference's) above
//    the reference's dew temperatures at both grid points around p (plus margin_K, or near_K
//    when larger; between points 0.5 MPa apart the dew line rises above both by at most its
//    curvature times (0.5 MPa)^2 / 8, some 0.1 K). Below the first point (0.5 MPa) the bound is
//    that point's dew temperature when the reference's dew line still rises from 0.5 to 1 MPa
//    (then 0.5 MPa lies below the cricondentherm's pressure, where the dew line rises with
//    pressure from zero). Not used where the reference's dew line is steep (its dew temperature rising by
//    more than `ref_max_dT_dlnp_K` per e-fold of pressure between the two nodes: near the
//    cricondenbar a small change of the gas moves the dew temperature far) or has no dew
//    point at a node. This is a bound by engineering
//    judgement, not a proof: the Wilson estimate follows the heavy end, which sets the dew
//    point, and the test Gerg2008LineState.ReferenceBoundHoldsForCloseAnalyses checks over
//    perturbed reference gases that the searched dew temperature stays below it with at
//    least half the gap to spare. Analyses from a chromatograph every 15 minutes then cost a
//    few exponentials each for states well inside the gas region. Preparing the same
//    analysis again keeps everything cached.
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
  double ref_gap_K = 10.0;
  double ref_shift_factor = 2.0;
  double ref_close_rel = 0.25;
  double ref_max_dT_dlnp_K = 60.0;
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
  // The analysis is the reference one, or close to it (see above).
  [[nodiscard]] bool is_reference() const noexcept { return ref_is_current_; }
  [[nodiscard]] bool close_to_reference() const noexcept { return ref_close_; }
  // The reference shortcut alone: whether (T, p) is settled by the reference analysis's dew
  // temperatures with guard_K added (check() uses max(margin_K, near_K)).
  [[nodiscard]] bool settled_by_reference(double T_K, double p_Pa, double guard_K) noexcept;

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
  // The reference analysis: its dry basis, its searched dew temperatures at the nodes (NaN
  // unknown, -1 none, -2 not computable) and Wilson dew temperatures there.
  gerg2008::Prepared<double> ref_dry_{};
  Fractions<double> ref_x_{};
  bool have_ref_ = false, ref_is_current_ = false, ref_close_ = false;
  static constexpr double ref_step_Pa = 0.5e6;
  static constexpr std::size_t n_ref = 80;  // up to 40 MPa
  std::array<double, n_ref> ref_T_{}, ref_W_{};
  std::array<double, n_ref> shift_{};  // this analysis: rise of the Wilson dew temperature at the node (NaN unknown)
  gerg2008::phase::WilsonData<double> all_wilson_{};  // every component's Wilson data, computed once
  bool have_all_wilson_ = false;
  Fractions<double> x_cur_{};
  Status status_cur_{};
  // The water-free fractions and their components (prepare); dry_ itself is prepared only
  // when a trial phase or a search needs it.
  Fractions<double> dx_{};
  std::array<std::uint8_t, max_components> dactive_{};
  std::size_t dn_ = 0;
  bool dry_ready_ = false;
  [[nodiscard]] bool ensure_dry() noexcept;
  [[nodiscard]] double ref_node(std::size_t k) noexcept;
  [[nodiscard]] double wilson_shift(std::size_t k) noexcept;

  // near_dew and T_dew_K of r for a single-phase state (T, p).
  void near_dew(PhaseCheckResult& r, double T_K, double p_Pa, double near_K) noexcept;
};

}  // namespace zcorr
