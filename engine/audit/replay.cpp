#include "audit/replay.hpp"

#include <algorithm>
#include <cmath>

#include "eval/conversion.hpp"
#include "methods/iso6976.hpp"
#include "record/sql.hpp"

namespace zcorr::audit {

MethodFactory built_in_methods() {
  return [](const std::string& name) -> std::unique_ptr<LineMethod> {
    const auto id = method_from_name(name);
    if (!id || *id == MethodId::iso6976) return nullptr;
    return make_line_method(*id);
  };
}

double IntervalReplay::worst_ppm() const noexcept {
  double w = 0;
  for (double d : {dZ_f_ppm, dZ_b_ppm, dC_ppm, dV_b_ppm, dE_ppm})
    if (std::isfinite(d)) w = std::max(w, std::fabs(d));
    else if (std::isinf(d)) return d > 0 ? d : -d;
  return w;
}

namespace {

// (recomputed - logged) / logged in ppm; both NaN (not computed either way)
// compares equal; one NaN, or a non-zero figure against zero, is infinite.
double ppm(double re, double logged) {
  const bool a = std::isfinite(re), b = std::isfinite(logged);
  if (!a && !b) return nan_v;
  if (a != b) return std::numeric_limits<double>::infinity();
  if (logged == 0) return re == 0 ? 0.0 : std::numeric_limits<double>::infinity();
  return (re - logged) / std::fabs(logged) * 1e6;
}

void track_max(double& m, double d) {
  if (!std::isnan(d)) m = std::max(m, std::fabs(d));
}

double opt(const record::Stmt& s, int c) { return s.is_null(c) ? nan_v : s.f64(c); }

}  // namespace

std::string logged_interval_columns() {
  return "seq, point, config_seq, analysis_seq, start_utc_s, end_utc_s, flow_time_s, alarm_time_s, samples, integration, "
         "p_avg_Pa, T_avg_K, V_ind_m3, V_f_m3, Z_f, Z_b, C, I_m3_Pa_per_K, V_b_m3, Hs_MJ_per_m3, E_MJ, V_f_um3, V_b_um3, "
         "V_fault_um3, E_J, flags, calc_status, method, corrects_seq, rho_f_kg_per_m3, mass_kg, engine_version";
}

void read_logged_interval(const record::Stmt& s, LoggedInterval& iv) {
  iv.seq = s.i64(0);
  iv.point = s.text(1);
  iv.config_seq = s.i64(2);
  iv.analysis_seq = s.is_null(3) ? 0 : s.i64(3);
  iv.start_utc_s = s.i64(4);
  iv.end_utc_s = s.i64(5);
  iv.flow_time_s = s.i64(6);
  iv.alarm_time_s = s.i64(7);
  iv.samples = s.i64(8);
  iv.integration = s.text(9);
  iv.p_avg_Pa = opt(s, 10);
  iv.T_avg_K = opt(s, 11);
  iv.V_ind_m3 = s.f64(12);
  iv.V_f_m3 = s.f64(13);
  iv.Z_f = opt(s, 14);
  iv.Z_b = opt(s, 15);
  iv.C = opt(s, 16);
  iv.I = opt(s, 17);
  iv.V_b_m3 = s.f64(18);
  iv.Hs = opt(s, 19);
  iv.E_MJ = opt(s, 20);
  iv.V_f_um3 = s.i64(21);
  iv.V_b_um3 = s.i64(22);
  iv.V_fault_um3 = s.i64(23);
  iv.E_J = s.i64(24);
  iv.flags = s.i64(25);
  iv.calc_status = s.text(26);
  iv.method = s.text(27);
  iv.corrects_seq = s.is_null(28) ? 0 : s.i64(28);
  iv.rho_f = opt(s, 29);
  iv.mass_kg = opt(s, 30);
  iv.engine_version = s.text(31);
}

Replayer::Replayer(const record::Log& log, MethodFactory methods, EvalOptions eval, WhatIf what_if)
    : log_(log), factory_(std::move(methods)), eval_(eval), what_if_(std::move(what_if)) {
  using record::Stmt;
  {
    const auto pc = log_.columns(record::Table::point_config);  // those of the log's schema version
    std::string sql = "SELECT ";
    for (std::size_t i = 0; i < pc.size(); ++i) sql += (i ? ", " : "") + std::string(pc[i]);
    Stmt s(log_.db(), sql + " FROM point_config ORDER BY seq");
    std::vector<record::Value> v(pc.size());
    while (s.step()) {
      for (std::size_t i = 0; i < v.size(); ++i) v[i] = s.value(static_cast<int>(i));
      configs_[s.i64(0)] = record::config_from_values(v);
    }
    Stmt c(log_.db(), "SELECT seq, corrects_seq FROM point_config WHERE corrects_seq IS NOT NULL ORDER BY seq");
    while (c.step()) {
      std::int64_t root = c.i64(1);
      if (auto it = config_root_.find(root); it != config_root_.end()) root = it->second;  // a correction of a correction
      config_root_[c.i64(0)] = root;
    }
  }
  {
    std::string sql = "SELECT seq, valid_from_utc_s, sampled_utc_s, Hs_MJ_per_m3";
    for (std::size_t i = 0; i < max_components; ++i) sql += ", x_" + std::string(component_name(i));
    Stmt s(log_.db(), sql + " FROM gas_analysis ORDER BY seq");
    while (s.step()) {
      GasRecord g;
      g.seq = s.i64(0);
      g.valid_from_utc_s = s.i64(1);
      g.sampled_utc_s = s.opt_i64(2);
      g.Hs = opt(s, 3);
      for (std::size_t i = 0; i < max_components; ++i) g.x[i] = s.f64(static_cast<int>(4 + i));
      analyses_[g.seq] = g;
    }
  }
}

LineMethod* Replayer::method_for(const std::string& name) {
  auto it = methods_.find(name);
  if (it == methods_.end()) it = methods_.emplace(name, factory_ ? factory_(name) : nullptr).first;
  return it->second.get();
}

IntervalReplay Replayer::replay(const LoggedInterval& iv) {
  IntervalReplay r;
  const auto cit = configs_.find(iv.config_seq);
  if (cit == configs_.end()) {
    r.why_not = "its configuration record seq " + std::to_string(iv.config_seq) + " is not in the log";
    return r;
  }
  record::PointConfig cfg = cit->second;
  if (what_if_.method) cfg.method = *what_if_.method;
  if (what_if_.base_T_K) cfg.base_T_K = *what_if_.base_T_K;
  if (what_if_.base_p_Pa) cfg.base_p_Pa = *what_if_.base_p_Pa;
  const std::int64_t analysis_seq = what_if_.analysis_seq.value_or(iv.analysis_seq);
  LineMethod* m = method_for(cfg.method);
  if (!m) {
    r.why_not = "method '" + cfg.method + "' is not available in this build";
    return r;
  }
  // The gas in force, prepared as the recorder prepares it (record::prepare_gas).
  if (gas_method_ != cfg.method || gas_config_ != iv.config_seq || gas_analysis_ != analysis_seq) {
    gas_ = record::GasInForce{};
    gas_method_ = cfg.method;
    gas_config_ = iv.config_seq;
    gas_analysis_ = analysis_seq;
    const auto ait = analysis_seq ? analyses_.find(analysis_seq) : analyses_.end();
    if (analysis_seq && ait == analyses_.end()) {
      gas_.status = "no_analysis";
    } else if (ait != analyses_.end()) {
      // The analysis' Hs is stated at the base conditions of the recorded configuration.
      const auto rit = config_root_.find(iv.config_seq);
      const auto root = configs_.find(rit == config_root_.end() ? iv.config_seq : rit->second);
      const bool rebase = std::isfinite(ait->second.Hs) && root != configs_.end() &&
                          (root->second.base_T_K != cfg.base_T_K || root->second.base_p_Pa != cfg.base_p_Pa);
      double Z_b_stated = nan_v;
      if (rebase) Z_b_stated = record::prepare_gas(*m, ait->second.x, ait->second.Hs, ait->second.seq, root->second, eval_).Z_b;
      gas_ = record::prepare_gas(*m, ait->second.x, ait->second.Hs, ait->second.seq, cfg, eval_);
      if (rebase && gas_.usable)
        gas_.Hs_MJ_per_m3 = ait->second.Hs * (cfg.base_p_Pa / root->second.base_p_Pa) * (root->second.base_T_K / cfg.base_T_K) *
                            (Z_b_stated / gas_.Z_b);
    }
  }

  // The interval as one sample at the logged averages carrying the converted volume.
  record::PointConfig one = cfg;
  one.integration = record::Integration::average_then_correct;
  one.averaging = record::Averaging::time_linear;
  const double V_fault = static_cast<double>(iv.V_fault_um3) * record::volume_quantum_m3;
  const double V_ind_f = iv.V_ind_m3 * cfg.meter_factor;
  double V_conv = V_ind_f - V_fault;
  if (iv.V_fault_um3 == 0) V_conv = V_ind_f;
  if (V_conv < 0) V_conv = 0;
  record::Sample s;
  s.t_utc_s = iv.end_utc_s;
  s.dt_s = std::max<std::int64_t>(1, iv.end_utc_s - iv.start_utc_s - iv.alarm_time_s);
  s.p_Pa = iv.p_avg_Pa;
  s.T_K = iv.T_avg_K;
  s.V_ind_m3 = cfg.meter_factor != 0 ? V_conv / cfg.meter_factor : 0.0;
  const bool have_state = std::isfinite(iv.p_avg_Pa) && std::isfinite(iv.T_avg_K);
  if (!have_state) s.V_ind_m3 = 0;
  const record::IntervalResult c = compute_interval(std::span<const record::Sample>(&s, have_state ? 1u : 0u), one, *m, gas_, eval_);

  r.replayed = true;
  r.calc_status = c.calc_status;
  r.Z_f = c.Z_f;
  r.Z_b = c.Z_b;
  r.flags = c.flags;
  // With part of the interval in alarm, V_conv is known only to the fault
  // register's resolution (1e-6 m3), which for a nearly all-alarm interval
  // can be many ppm of V_conv: then the base volume comes from the logged
  // integral value as for per_sample, and C is not compared.
  const bool via_integral = iv.integration == "per_sample" || iv.V_fault_um3 != 0;
  r.Fp = c.Fp;
  r.Ft = c.Ft;
  r.Fz = c.Fz;
  r.Hs = c.Hs_MJ_per_m3;
  r.rho_f = c.rho_f_kg_per_m3;
  if (via_integral && gas_.usable) {
    if (!std::isfinite(iv.I) && V_conv > record::volume_quantum_m3) {
      // Converted volume without its integral value: nothing to rescale.
      IntervalReplay none;
      none.why_not = "it has converted volume but no integral value (I_m3_Pa_per_K)";
      return none;
    }
    double I = std::isfinite(iv.I) ? iv.I : 0.0;
    double mass = iv.mass_kg;
    const bool z_f_changes = what_if_.method || what_if_.analysis_seq;
    if (z_f_changes && std::isfinite(iv.Z_f) && std::isfinite(c.Z_f) && c.Z_f != 0) I *= iv.Z_f / c.Z_f;
    // mass = sum rho_i V_i = (M / R) I, and M / R = rho Z T / p at any state
    // of the gas (the method's own rho, Z): so the new mass follows from the
    // new I and the new method's density at the averages.
    if (z_f_changes)
      mass = std::isfinite(c.rho_f_kg_per_m3) && std::isfinite(c.Z_f) && iv.p_avg_Pa > 0
                 ? I * c.rho_f_kg_per_m3 * c.Z_f * iv.T_avg_K / iv.p_avg_Pa
                 : nan_v;
    // The recorder stores mass / V_conv as the line density of a per_sample interval.
    if (iv.integration == "per_sample" && V_conv > 0 && std::isfinite(mass)) r.rho_f = mass / V_conv;
    r.I = std::isfinite(iv.I) ? I : nan_v;
    r.V_b_m3 = I * (cfg.base_T_K * c.Z_b / cfg.base_p_Pa);
    r.C = V_conv > 0 && I > 0 ? r.V_b_m3 / V_conv : c.C;
    r.E_MJ = std::isfinite(gas_.Hs_MJ_per_m3) ? r.V_b_m3 * gas_.Hs_MJ_per_m3 : nan_v;
    r.mass_kg = mass;
  } else {
    r.I = c.I_m3_Pa_per_K;
    r.V_b_m3 = c.V_b_m3;
    r.C = c.C;
    r.E_MJ = c.E_MJ;
    r.mass_kg = c.mass_kg;
  }
  r.mass_mg = record::to_register(r.mass_kg, record::mass_quantum_kg);
  if (!gas_.usable) r.E_MJ = iv.E_MJ == 0 ? 0.0 : nan_v;  // nothing converted
  r.V_b_um3 = record::to_register(r.V_b_m3, record::volume_quantum_m3);
  r.E_J = record::to_register(r.E_MJ, 1e-6);
  r.dZ_f_ppm = ppm(r.Z_f, iv.Z_f);
  r.dZ_b_ppm = ppm(r.Z_b, iv.Z_b);
  r.dC_ppm = iv.V_fault_um3 != 0 && r.V_b_m3 != 0 ? nan_v : ppm(r.C, iv.C);
  r.dV_b_ppm = ppm(r.V_b_m3, iv.V_b_m3);
  r.dE_ppm = std::isfinite(iv.E_MJ) || std::isfinite(r.E_MJ) ? ppm(r.E_MJ, iv.E_MJ) : nan_v;
  // A register of zero both ways is agreement whatever the factors say.
  if (iv.V_b_m3 == 0 && r.V_b_m3 == 0) r.dV_b_ppm = 0;
  return r;
}

void add_to_totals(ReplayTotals& t, const LoggedInterval& iv, const IntervalReplay& r) noexcept {
  ++t.intervals;
  if (!r.replayed) {
    ++t.not_replayed;
    return;
  }
  ++t.replayed;
  t.V_b_um3_logged += iv.V_b_um3;
  t.V_b_um3_replayed += r.V_b_um3;
  t.E_J_logged += iv.E_J;
  t.E_J_replayed += r.E_J;
  track_max(t.max_dZ_f_ppm, r.dZ_f_ppm);
  track_max(t.max_dZ_b_ppm, r.dZ_b_ppm);
  track_max(t.max_dC_ppm, r.dC_ppm);
  track_max(t.max_dV_b_ppm, r.dV_b_ppm);
  track_max(t.max_dE_ppm, r.dE_ppm);
  if (r.worst_ppm() > recalculation_bar_ppm) ++t.over_bar;
}

void Replayer::run(const Selection& sel, const std::function<void(const LoggedInterval&, const IntervalReplay&)>& visit,
                   const std::set<std::int64_t>* replaced) {
  IntervalReplay skipped;
  skipped.why_not = "replaced by a correction";
  record::Stmt s(log_.db(), "SELECT " + logged_interval_columns() +
                                " FROM interval WHERE (?1 IS NULL OR point = ?1) AND end_utc_s > ?2 AND start_utc_s < ?3"
                                " ORDER BY point, start_utc_s, seq");
  if (sel.point) s.bind(1, std::string_view(*sel.point));
  s.bind(2, sel.from_utc_s.value_or(std::numeric_limits<std::int64_t>::min()));
  s.bind(3, sel.to_utc_s.value_or(std::numeric_limits<std::int64_t>::max()));
  LoggedInterval iv;
  while (s.step()) {
    read_logged_interval(s, iv);
    if (replaced && replaced->count(iv.seq)) {
      visit(iv, skipped);
      continue;
    }
    const IntervalReplay r = replay(iv);
    add_to_totals(totals_, iv, r);
    visit(iv, r);
  }
}

}  // namespace zcorr::audit
