// zcorr interval processing: from the samples of one interval to its record.
//
// A sample row closes a sub-period (of dt_s seconds) with the line pressure
// and temperature read for it and the indicated volume (or pulses) counted
// in it. For each sample: V_f = V_ind * meter_factor.
//
// Samples in alarm (pressure or temperature unreadable or outside the
// configured range, or, with per_sample integration, a state the method
// refuses) stop the conversion for their volume: it counts in the
// unconverted register (V_f_um3) and in the fault register (V_fault_um3),
// never in the converted register (V_b_um3). This is how a conversion device
// under MID annex MI-002 / EN 12405-1 behaves (from memory, medium-high).
// A line state the GERG-2008 phase test finds two-phase (StateOutput::two_phase:
// gerg2008 refuses it with Code::two_phase, the other methods keep their code and Z)
// is an alarm condition in the same way: per_sample, the sample's volume goes to the
// fault register; average_then_correct, the interval's (nothing converted). Such an
// interval carries iflag::two_phase (with calc_failed where the method refused the
// state); a single-phase state within the dew margin above the dew point
// (EvalOptions::dew_margin_K) is converted and flagged iflag::near_dew_point.
//
// Averages (API MPMS 21.1 flow-dependent averaging, from memory, medium):
// over the samples with flow (V_f > 0) and no alarm, weighted by duration
// (time_*) or by V_f (flow_*); linear = mean of the value, formulaic = square
// of the mean of its square root. With no such sample the averages are the
// flow-independent time average of the in-range samples (flag no_flow).
//
// Integration (the choice is in the configuration and in every record):
//   per_sample:           Z_i at each sample's (p_i, T_i), then
//                         I = sum V_f,i p_i / (T_i Z_i)
//   average_then_correct: Z_f at the averages, I = V_conv p_avg / (T_avg Z_f)
// with V_conv the V_f of the samples not in alarm. In both:
//   V_b = I * T_b * Z_b / p_b,   C = V_b / V_conv,
//   Fp = p_avg/p_b, Ft = T_b/T_avg, Fz = Z_b/Z_f at the averages (for
//   average_then_correct C = Fp Ft Fz up to rounding; for per_sample C differs
//   from it by the covariance of the samples, a second-order effect).
// The integral value I does not depend on the base conditions, so a replay
// with other base conditions rescales it exactly.
// Energy E = V_b * Hs (Hs of the analysis in force, MJ/m3 at base conditions;
// when the analysis gives none, ISO 6976 computes it from the composition
// at the base conditions, and the interval records the value used);
// mass = sum rho_f,i V_f,i (per_sample) or rho_f(avg) V_conv.
// Registers: round(quantity / quantum), half away from zero, once per interval.
#pragma once

#include <cstdint>
#include <limits>
#include <optional>
#include <span>
#include <string>

#include "eval/line_method.hpp"
#include "methods/iso6976.hpp"
#include "record/config.hpp"

namespace zcorr::record {

inline constexpr double nan_v = std::numeric_limits<double>::quiet_NaN();

struct Sample {
  std::int64_t t_utc_s = 0;   // end of the sub-period the row covers, Unix s UTC
  std::int64_t dt_s = 0;      // duration of the sub-period, s
  double p_Pa = nan_v;        // absolute line pressure; NaN when unreadable
  double T_K = nan_v;         // line temperature; NaN when unreadable
  double V_ind_m3 = 0.0;      // indicated volume in the sub-period
  std::int64_t pulses = 0;    // pulse count (meter = pulses)
  bool alarm = false;         // conversion stopped for this sample (set by the recorder)
  std::int64_t flags = 0;     // iflag bits saying why
};

// The gas analysis in force and what follows from it at base conditions.
struct GasInForce {
  std::int64_t seq = 0;        // gas_analysis record, 0 = none
  bool usable = false;         // prepared and Z_b computed
  double Z_b = nan_v;
  double Hs_MJ_per_m3 = nan_v; // NaN when the analysis has none
  std::string status = "no_analysis";
};

struct IntervalResult {
  std::int64_t flow_time_s = 0, alarm_time_s = 0, samples = 0, samples_used = 0;
  double p_avg_Pa = nan_v, T_avg_K = nan_v;
  std::int64_t pulses = 0;
  double V_ind_m3 = 0, V_f_m3 = 0, V_conv_m3 = 0, V_fault_m3 = 0;
  double Z_f = nan_v, Z_b = nan_v, Fp = nan_v, Ft = nan_v, Fz = nan_v, C = nan_v, I_m3_Pa_per_K = nan_v;
  double V_b_m3 = 0, Hs_MJ_per_m3 = nan_v, E_MJ = nan_v, rho_f_kg_per_m3 = nan_v, mass_kg = nan_v;
  std::int64_t V_f_um3 = 0, V_b_um3 = 0, V_fault_um3 = 0, E_J = 0, mass_mg = 0;
  std::int64_t flags = 0;
  std::string calc_status = "ok";
};

// Rounds a quantity to its register resolution (half away from zero).
[[nodiscard]] std::int64_t to_register(double value, double quantum) noexcept;

// Prepares `method` for the analysis x and computes what every interval under
// it shares: Z_b at the configuration's base conditions and, when the analysis
// gives no Hs (NaN), Hs by ISO 6976 at the base conditions with the combustion
// reference usually paired with them (eval/conversion.hpp), or with
// `combustion` when given (a what-if that holds or changes the combustion
// reference). The recorder and the replay both use it, so a replay prepares
// the gas exactly as recorded.
[[nodiscard]] GasInForce prepare_gas(LineMethod& method, const Fractions<double>& x, double Hs_MJ_per_m3, std::int64_t seq,
                                     const PointConfig& cfg, const EvalOptions& eval,
                                     std::optional<iso6976::CombustionRef> combustion = std::nullopt);

[[nodiscard]] IntervalResult compute_interval(std::span<const Sample> samples, const PointConfig& cfg, const LineMethod& method,
                                              const GasInForce& gas, const EvalOptions& eval);

}  // namespace zcorr::record
