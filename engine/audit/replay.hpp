// zcorr replay: recompute the intervals of a log with the configuration and
// the gas analysis each one names (config_seq, analysis_seq), and compare
// with what was logged.
//
// What can be recomputed. The log keeps each interval's averages, volumes
// and integral value, not the raw samples. The replay therefore rebuilds the
// interval from what the log holds and runs it through the recorder's own
// interval computation (record::compute_interval):
//  * the gas in force: the analysis is prepared again, Z_b computed again at
//    the configuration's base conditions, Hs taken from the analysis (or from
//    ISO 6976 at the base conditions when it has none), exactly as the
//    recorder does it;
//  * the interval as one sample at the logged averages (p_avg, T_avg) with
//    the converted line volume V_conv = V_ind * meter_factor - V_fault, so
//    Z_f, Fp, Ft, Fz and, for average_then_correct, V_b and E are the
//    recorder's figures again;
//  * per_sample integration: the samples behind the integral value I are not
//    kept in the log, so I is estimated from the averages: the logged I
//    rescaled by Z_f(logged) / Z_f(recomputed) at the averages, with Z_f
//    (logged) the one of the logged Z_f and Z_b / Fz that the recomputation
//    confirms (a record with one altered factor keeps the other), and then
//    V_b = I * T_b * Z_b / p_b with Z_b recomputed. The estimate is exact
//    when the difference lies in the logged figures (a logged Z_f, Fz, I or
//    V_b that does not follow from the inputs); for a change of gas or
//    method it is first order, its error at most about |difference| times
//    the relative spread of the line pressure within the interval. Such a
//    replay is marked `estimated`.
//  * an interval partly in alarm (V_fault > 0): V_conv = V_ind * meter_factor
//    - V_fault is known from the registers to 1e-6 m3; the logged I of an
//    average_then_correct interval pins it exactly (V_conv = I T_avg Z_f /
//    p_avg) when the two agree within that resolution, and the registers'
//    V_conv is used when they do not.
// The comparison is relative, in ppm of the logged value. The industry's
// recalculation bar is 50 ppm of the logged quantity (API MPMS 21.1, as
// summarised in the project's standards notes).
//
// Streamed: one interval at a time in (point, start) order; configurations
// and analyses (few records) are cached by seq.
#pragma once

#include <cstdint>
#include <functional>
#include <limits>
#include <map>
#include <memory>
#include <optional>
#include <set>
#include <string>

#include "eval/line_method.hpp"
#include "methods/iso6976.hpp"
#include "record/config.hpp"
#include "record/interval_calc.hpp"
#include "record/log.hpp"
#include "record/sql.hpp"

namespace zcorr::audit {

inline constexpr double nan_v = std::numeric_limits<double>::quiet_NaN();
inline constexpr double recalculation_bar_ppm = 50.0;  // API MPMS 21.1 (standards notes)

// Makes the line method a configuration names; nullptr when unknown.
using MethodFactory = std::function<std::unique_ptr<LineMethod>(const std::string& name)>;
// The methods of this build (eval/registry).
[[nodiscard]] MethodFactory built_in_methods();

struct Selection {
  std::optional<std::string> point;
  std::optional<std::int64_t> from_utc_s;  // intervals ending after
  std::optional<std::int64_t> to_utc_s;    // intervals starting before
};

// One interval as logged (the columns the audit needs).
struct LoggedInterval {
  std::int64_t seq = 0, config_seq = 0, analysis_seq = 0;  // analysis_seq 0 = NULL
  std::string point;
  std::int64_t start_utc_s = 0, end_utc_s = 0, flow_time_s = 0, alarm_time_s = 0, samples = 0;
  std::string integration;
  double p_avg_Pa = nan_v, T_avg_K = nan_v, V_ind_m3 = 0, V_f_m3 = 0;
  double Z_f = nan_v, Z_b = nan_v, Fp = nan_v, Ft = nan_v, Fz = nan_v, C = nan_v, I = nan_v, V_b_m3 = 0, Hs = nan_v, E_MJ = nan_v;
  std::int64_t V_f_um3 = 0, V_b_um3 = 0, V_fault_um3 = 0, E_J = 0, flags = 0;
  std::string calc_status, method;
  std::int64_t corrects_seq = 0;  // 0 = not a correction
  double rho_f = nan_v, mass_kg = nan_v;
  std::string engine_version;  // as logged (record::describe_engine_version states it)
};

struct GasRecord {
  std::int64_t seq = 0, valid_from_utc_s = 0;
  std::optional<std::int64_t> sampled_utc_s;
  Fractions<double> x{};
  double Hs = nan_v;
};

// The recomputed figures of one interval and their deviations (ppm of the
// logged value; NaN when not comparable).
struct IntervalReplay {
  bool replayed = false;
  std::string why_not;  // when not replayed
  // The base volume, energy and mass are an estimate from the averages (a
  // per_sample interval, see above), not a recomputation from the samples.
  bool estimated = false;
  double Z_f = nan_v, Z_b = nan_v, C = nan_v, V_b_m3 = 0, E_MJ = nan_v;
  std::int64_t V_b_um3 = 0, E_J = 0;
  // What a correcting record needs besides: the integral value (rescaled
  // when Z_f changes), the factors at the averages, the calorific value
  // used, line density and mass.
  double I = nan_v, Fp = nan_v, Ft = nan_v, Fz = nan_v, Hs = nan_v, rho_f = nan_v, mass_kg = nan_v;
  std::int64_t mass_mg = 0;
  std::int64_t flags = 0;  // record::iflag bits of the recomputation (expanded_range, extrapolated, calc_failed, ...)
  std::string calc_status; // the method's status at the averages ('ok', 'out_of_range', 'ok;range=expanded', ...)
  double dZ_f_ppm = nan_v, dZ_b_ppm = nan_v, dC_ppm = nan_v, dV_b_ppm = nan_v, dE_ppm = nan_v;
  [[nodiscard]] double worst_ppm() const noexcept;  // largest |deviation|
};

struct ReplayTotals {
  std::int64_t intervals = 0, replayed = 0, not_replayed = 0, over_bar = 0;
  std::int64_t V_b_um3_logged = 0, V_b_um3_replayed = 0, E_J_logged = 0, E_J_replayed = 0;
  double max_dZ_f_ppm = 0, max_dZ_b_ppm = 0, max_dC_ppm = 0, max_dV_b_ppm = 0, max_dE_ppm = 0;
};

// What-if recomputation: the same intervals with another method, base
// condition or analysis. The integral value I is rescaled by Z_f(logged) /
// Z_f(what-if) at the averages when the method or the analysis changes
// (exact for average_then_correct, first order for per_sample); it does not
// depend on the base conditions. Energy is the what-if base volume times the
// calorific value per base volume: an analysis' Hs is stated at the base
// conditions of the configuration it was recorded under (the uncorrected
// configuration), so at other base conditions it is re-based by the ratio of
// the gas's molar densities, p_b / (Z_b T_b), both by the line method; the
// energy then does not depend on the base conditions (only the volume
// does). The combustion reference (t1 of ISO 6976) is a reference of its
// own, and a what-if states which one it uses:
//  * by default (combustion unset, combustion_hold false) a stated Hs keeps
//    the reference it was stated at, and an analysis without Hs gets it from
//    ISO 6976 at the new base conditions with the combustion reference
//    usually paired with the new base temperature (15 degC -> 15 degC,
//    60 degF -> 60 degF, 0 degC -> 25 degC), as the recorder does;
//  * combustion_hold: every Hs at the combustion reference of the recorded
//    configuration (the pairing of its base temperature);
//  * combustion: every Hs at that reference; a stated Hs is converted from
//    the recorded configuration's reference by the ratio of the molar
//    calorific values of the analysis (ISO 6976).
// zcorr correct writes the result as a correction set.
struct WhatIf {
  std::optional<std::string> method;
  std::optional<double> base_T_K, base_p_Pa;
  std::optional<std::int64_t> analysis_seq;  // use this gas_analysis record for every interval
  std::optional<iso6976::CombustionRef> combustion;
  bool combustion_hold = false;
  [[nodiscard]] bool any() const noexcept {
    return method || base_T_K || base_p_Pa || analysis_seq || combustion || combustion_hold;
  }
};
// Which combustion reference a what-if uses, in words, for a log recorded at
// the base temperature `recorded_base_T_K`.
[[nodiscard]] std::string combustion_used(const WhatIf& w, double recorded_base_T_K);

// Adds one replayed interval to running totals.
void add_to_totals(ReplayTotals& t, const LoggedInterval& iv, const IntervalReplay& r) noexcept;

// Reads a log's configurations and analyses once, then replays intervals.
class Replayer {
 public:
  // Only the records up to head_seq are read (an audit's snapshot of a log a writer may be appending to).
  Replayer(const record::Log& log, MethodFactory methods, EvalOptions eval = {}, WhatIf what_if = {},
           std::int64_t head_seq = std::numeric_limits<std::int64_t>::max());
  Replayer(const Replayer&) = delete;
  Replayer& operator=(const Replayer&) = delete;

  // Every interval of the selection in (point, start, seq) order. Corrected
  // originals are included (LoggedInterval::corrects_seq marks corrections);
  // `visit` decides what to count.
  // Intervals in `replaced` (records a later correction replaces) are
  // visited without being recomputed or counted (why_not says so).
  void run(const Selection& sel, const std::function<void(const LoggedInterval&, const IntervalReplay&)>& visit,
           const std::set<std::int64_t>* replaced = nullptr);
  // Replays one logged interval.
  [[nodiscard]] IntervalReplay replay(const LoggedInterval& iv);

  [[nodiscard]] const std::map<std::int64_t, record::PointConfig>& configs() const noexcept { return configs_; }
  [[nodiscard]] const std::map<std::int64_t, GasRecord>& analyses() const noexcept { return analyses_; }
  [[nodiscard]] const ReplayTotals& totals() const noexcept { return totals_; }
  // The near_dew_point margin (EvalOptions::dew_margin_K) of the states of one point; the
  // others keep the one of the EvalOptions given.
  void set_dew_margin(const std::string& point, double margin_K) { dew_margin_by_point_[point] = margin_K; }
  // The margin of each interval's own point configuration (dew_margin_K, 5 K
  // in one written before schema 7) where no margin was set for its point.
  void use_configured_dew_margin(bool on) { dew_margin_from_config_ = on; }

 private:
  LineMethod* method_for(const std::string& name);

  const record::Log& log_;
  MethodFactory factory_;
  EvalOptions eval_;
  WhatIf what_if_;
  std::int64_t head_seq_;
  std::map<std::int64_t, record::PointConfig> configs_;
  std::map<std::int64_t, std::int64_t> config_root_;  // a correcting configuration -> the recorded one it goes back to
  std::map<std::int64_t, GasRecord> analyses_;
  std::map<std::string, std::unique_ptr<LineMethod>> methods_;
  // The prepared gas: (method, config, analysis) it belongs to.
  std::string gas_method_;
  std::int64_t gas_config_ = -1, gas_analysis_ = -1;
  record::GasInForce gas_;
  ReplayTotals totals_;
  std::map<std::string, double> dew_margin_by_point_;
  double dew_margin_default_K_ = EvalOptions::default_dew_margin_K;
  bool dew_margin_from_config_ = false;
};

// The columns of a LoggedInterval, in the order read_logged_interval() reads them.
[[nodiscard]] std::string logged_interval_columns();
// Reads a row selected with logged_interval_columns() first.
void read_logged_interval(const record::Stmt& s, LoggedInterval& iv);

}  // namespace zcorr::audit
