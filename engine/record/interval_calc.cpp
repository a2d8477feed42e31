#include "record/interval_calc.hpp"
#include "record/checked.hpp"

#include <cmath>

#include "eval/conversion.hpp"
#include "record/log.hpp"

namespace zcorr::record {

std::int64_t to_register(double value, double quantum) noexcept {
  if (std::isnan(value)) return 0;
  if (register_out_of_range(value, quantum))  // saturate, never an out-of-range conversion
    return value > 0 ? static_cast<std::int64_t>(register_limit) : -static_cast<std::int64_t>(register_limit);
  return static_cast<std::int64_t>(std::llround(value / quantum));
}

namespace {

std::string status_string(const Status& s) {
  std::string out = code_name(s.code);
  if (s.range == RangeClass::expanded || s.range == RangeClass::outside) out += std::string(";range=") + range_name(s.range);
  if (s.has(flag::extrapolated)) out += ";extrapolated";
  if (s.has(flag::near_dew_point)) out += ";near_dew_point";
  return out;
}
std::string status_string(const StateOutput& st) {
  std::string out = status_string(st.status);
  if (st.two_phase && st.status.code != Code::two_phase) out += ";two_phase";  // a method that keeps its own code
  return out;
}

std::int64_t range_flags(const Status& s) {
  std::int64_t f = 0;
  if (s.has(flag::extrapolated)) f |= iflag::extrapolated;
  if (s.range == RangeClass::expanded) f |= iflag::expanded_range;
  if (s.has(flag::near_dew_point)) f |= iflag::near_dew_point;
  return f;
}

struct Avg {
  double w = 0, p = 0, T = 0;
  bool formulaic = false;
  void add(double weight, double p_Pa, double T_K) {
    w += weight;
    p += weight * (formulaic ? std::sqrt(p_Pa) : p_Pa);
    T += weight * (formulaic ? std::sqrt(T_K) : T_K);
  }
  [[nodiscard]] double p_avg() const { const double m = p / w; return formulaic ? m * m : m; }
  [[nodiscard]] double T_avg() const { const double m = T / w; return formulaic ? m * m : m; }
};

}  // namespace

GasInForce prepare_gas(LineMethod& method, const Fractions<double>& x, double Hs_MJ_per_m3, std::int64_t seq,
                       const PointConfig& cfg, const EvalOptions& eval, std::optional<iso6976::CombustionRef> combustion) {
  GasInForce gas;
  gas.seq = seq;
  gas.Hs_MJ_per_m3 = Hs_MJ_per_m3;
  const Status ps = method.prepare(x);
  if (!ps.ok()) {
    gas.status = std::string("analysis_refused;") + code_name(ps.code);
    return gas;
  }
  const StateOutput b = method.state(cfg.base_T_K, cfg.base_p_Pa, eval);
  if (!b.status.ok()) {
    gas.status = std::string("base_state_refused;") + code_name(b.status.code);
    return gas;
  }
  gas.Z_b = b[Quantity::Z];
  gas.usable = true;
  gas.status = "ok";
  if (std::isnan(Hs_MJ_per_m3)) {
    if (const auto mref = metering_ref_for(cfg.base_T_K)) {
      const auto props = iso6976::properties(x, combustion.value_or(default_combustion_for(cfg.base_T_K)), *mref, cfg.base_p_Pa);
      if (props.status.ok()) gas.Hs_MJ_per_m3 = props.Hs_MJ_per_m3;
    }
  }
  return gas;
}

IntervalResult compute_interval(std::span<const Sample> samples, const PointConfig& cfg, const LineMethod& method,
                                const GasInForce& gas, const EvalOptions& eval) {
  IntervalResult r;
  r.samples = static_cast<std::int64_t>(samples.size());
  r.Z_b = gas.usable ? gas.Z_b : nan_v;
  r.Hs_MJ_per_m3 = gas.Hs_MJ_per_m3;
  const bool flow_weighted = cfg.averaging == Averaging::flow_linear || cfg.averaging == Averaging::flow_formulaic;
  const bool formulaic = cfg.averaging == Averaging::time_formulaic || cfg.averaging == Averaging::flow_formulaic;
  const bool per_sample = cfg.integration == Integration::per_sample;

  // Per-sample pass: volumes, alarm, and with per_sample integration the
  // states themselves.
  Avg flowing{0, 0, 0, formulaic}, any{0, 0, 0, false};
  double I = 0, mass = 0;
  bool mass_ok = true;
  StateOutput first_bad{};
  bool have_bad = false;
  StateOutput single;  // the state of the only used sample (per_sample)
  for (const auto& s : samples) {
    const double V_f = s.V_ind_m3 * cfg.meter_factor;
    r.V_ind_m3 += s.V_ind_m3;
    r.V_f_m3 += V_f;
    r.pulses += s.pulses;
    r.flags |= s.flags;
    if (V_f > 0) r.flow_time_s += s.dt_s;
    bool alarm = s.alarm || !gas.usable;
    if (!gas.usable) r.flags |= iflag::no_analysis;
    if (!s.alarm) any.add(static_cast<double>(s.dt_s), s.p_Pa, s.T_K);
    if (!alarm && V_f > 0 && per_sample) {
      const StateOutput st = method.state(s.T_K, s.p_Pa, eval);
      if (st.two_phase) r.flags |= iflag::two_phase;
      if (!st.status.ok() || st.two_phase) {
        // Refused, or two-phase by the phase test (a method that keeps its code): an alarm.
        alarm = true;
        if (!st.status.ok()) r.flags |= iflag::calc_failed;
        if (!have_bad) { first_bad = st; have_bad = true; }
      } else {
        r.flags |= range_flags(st.status);
        I += V_f * s.p_Pa / (s.T_K * st[Quantity::Z]);
        if (st.has(Quantity::rho_kg_per_m3)) mass += st[Quantity::rho_kg_per_m3] * V_f;
        else mass_ok = false;
        single = st;
      }
    }
    if (alarm) {
      r.alarm_time_s += s.dt_s;
      r.V_fault_m3 += V_f;
      r.flags |= iflag::alarm;
      continue;
    }
    r.V_conv_m3 += V_f;
    if (V_f > 0) {
      ++r.samples_used;
      flowing.add(flow_weighted ? V_f : static_cast<double>(s.dt_s), s.p_Pa, s.T_K);
    }
  }

  // Averages: flow-dependent, else flow-independent time average.
  if (flowing.w > 0) {
    r.p_avg_Pa = flowing.p_avg();
    r.T_avg_K = flowing.T_avg();
  } else {
    r.flags |= iflag::no_flow;
    if (any.w > 0) {
      r.p_avg_Pa = any.p_avg();
      r.T_avg_K = any.T_avg();
    }
  }

  // The state at the averages (reported in every mode; the basis of
  // average_then_correct).
  StateOutput at_avg;
  bool avg_ok = false;
  if (gas.usable && std::isfinite(r.p_avg_Pa) && std::isfinite(r.T_avg_K)) {
    if (per_sample && r.samples_used == 1) at_avg = single;
    else at_avg = method.state(r.T_avg_K, r.p_avg_Pa, eval);
    avg_ok = at_avg.status.ok();
    if (at_avg.two_phase) r.flags |= iflag::two_phase;
    if (avg_ok) {
      r.Z_f = at_avg[Quantity::Z];
      r.Fp = r.p_avg_Pa / cfg.base_p_Pa;
      r.Ft = cfg.base_T_K / r.T_avg_K;
      r.Fz = r.Z_b / r.Z_f;
      r.flags |= range_flags(at_avg.status);
      if (at_avg.has(Quantity::rho_kg_per_m3)) r.rho_f_kg_per_m3 = at_avg[Quantity::rho_kg_per_m3];
    }
    r.calc_status = status_string(at_avg);
  } else if (!gas.usable) {
    r.calc_status = gas.status;
  } else {
    r.calc_status = "no_valid_sample";
  }

  if (!per_sample && r.V_conv_m3 > 0) {
    if (avg_ok && !at_avg.two_phase) {
      I = r.V_conv_m3 * r.p_avg_Pa / (r.T_avg_K * r.Z_f);
      if (at_avg.has(Quantity::rho_kg_per_m3)) mass = at_avg[Quantity::rho_kg_per_m3] * r.V_conv_m3;
      else mass_ok = false;
    } else {  // the method refused the averaged state, or it is two-phase: nothing converted
      r.flags |= (avg_ok ? 0 : iflag::calc_failed) | iflag::alarm;
      r.V_fault_m3 += r.V_conv_m3;
      r.V_conv_m3 = 0;
      r.alarm_time_s = r.flow_time_s;
    }
  }
  if (per_sample && have_bad) r.calc_status = status_string(first_bad);

  if (gas.usable && r.V_conv_m3 > 0) {
    r.I_m3_Pa_per_K = I;
    r.V_b_m3 = I * (cfg.base_T_K * r.Z_b / cfg.base_p_Pa);
    r.C = r.V_b_m3 / r.V_conv_m3;
    if (mass_ok) {
      r.mass_kg = mass;
      if (per_sample) r.rho_f_kg_per_m3 = mass / r.V_conv_m3;
    } else {
      r.flags |= iflag::mass_missing;
    }
  } else if (avg_ok) {
    r.C = r.Fp * r.Ft * r.Fz;  // no converted volume: the factor at the averages, for information
    r.I_m3_Pa_per_K = 0;
    r.mass_kg = 0;
  }
  if (std::isfinite(r.Hs_MJ_per_m3)) r.E_MJ = r.V_b_m3 * r.Hs_MJ_per_m3;
  else r.flags |= iflag::energy_missing;

  for (const auto& [v, q] : {std::pair{r.V_f_m3, volume_quantum_m3}, std::pair{r.V_b_m3, volume_quantum_m3},
                             std::pair{r.V_fault_m3, volume_quantum_m3}, std::pair{r.E_MJ, 1e-6}, std::pair{r.mass_kg, mass_quantum_kg}})
    if (!std::isnan(v) && register_out_of_range(v, q)) r.flags |= iflag::overflow | iflag::alarm;
  r.V_f_um3 = to_register(r.V_f_m3, volume_quantum_m3);
  r.V_b_um3 = to_register(r.V_b_m3, volume_quantum_m3);
  r.V_fault_um3 = to_register(r.V_fault_m3, volume_quantum_m3);
  if (r.V_fault_um3 > r.V_f_um3) r.V_fault_um3 = r.V_f_um3;
  r.E_J = to_register(r.E_MJ, 1e-6);
  r.mass_mg = to_register(r.mass_kg, mass_quantum_kg);
  return r;
}

}  // namespace zcorr::record
