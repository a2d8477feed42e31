#include "audit/replay.hpp"

#include "record/checked.hpp"

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

std::string combustion_used(const WhatIf& w, double recorded_base_T_K) {
  const std::string recorded(combustion_ref_name(default_combustion_for(recorded_base_T_K)));
  if (w.combustion) return "combustion reference " + std::string(combustion_ref_name(*w.combustion)) + " for every Hs (changed; recorded " + recorded + ")";
  if (w.combustion_hold) return "combustion reference " + recorded + " for every Hs (held as recorded)";
  if (!w.base_T_K) return "combustion reference " + recorded + " (unchanged)";
  const std::string usual(combustion_ref_name(default_combustion_for(*w.base_T_K)));
  if (usual == recorded) return "combustion reference " + recorded + " (unchanged)";
  return "combustion reference " + usual + " for analyses without a stated Hs (ISO 6976, the pairing usual with the new base "
         "temperature), stated Hs at their own " + recorded + " (--what-if-combustion-ref holds or sets one reference)";
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
         "V_fault_um3, E_J, flags, calc_status, method, corrects_seq, rho_f_kg_per_m3, mass_kg, Fp, Ft, Fz, engine_version";
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
  iv.Fp = opt(s, 31);
  iv.Ft = opt(s, 32);
  iv.Fz = opt(s, 33);
  iv.engine_version = s.text(34);
}

Replayer::Replayer(const record::Log& log, MethodFactory methods, EvalOptions eval, WhatIf what_if, std::int64_t head_seq)
    : log_(log), factory_(std::move(methods)), eval_(eval), what_if_(std::move(what_if)), head_seq_(head_seq) {
  using record::Stmt;
  dew_margin_default_K_ = eval_.dew_margin_K;
  {
    const auto pc = log_.columns(record::Table::point_config);  // those of the log's schema version
    std::string sql = "SELECT ";
    for (std::size_t i = 0; i < pc.size(); ++i) sql += (i ? ", " : "") + std::string(pc[i]);
    Stmt s(log_.db(), sql + " FROM point_config WHERE seq <= ?1 ORDER BY seq");
    s.bind(1, head_seq_);
    std::vector<record::Value> v(pc.size());
    while (s.step()) {
      for (std::size_t i = 0; i < v.size(); ++i) v[i] = s.value(static_cast<int>(i));
      configs_[s.i64(0)] = record::config_from_values(v);
    }
    Stmt c(log_.db(), "SELECT seq, corrects_seq FROM point_config WHERE corrects_seq IS NOT NULL AND seq <= ?1 ORDER BY seq");
    c.bind(1, head_seq_);
    while (c.step()) {
      std::int64_t root = c.i64(1);
      if (auto it = config_root_.find(root); it != config_root_.end()) root = it->second;  // a correction of a correction
      config_root_[c.i64(0)] = root;
    }
  }
  {
    std::string sql = "SELECT seq, valid_from_utc_s, sampled_utc_s, Hs_MJ_per_m3";
    for (std::size_t i = 0; i < max_components; ++i) sql += ", x_" + std::string(component_name(i));
    Stmt s(log_.db(), sql + " FROM gas_analysis WHERE seq <= ?1 ORDER BY seq");
    s.bind(1, head_seq_);
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
  if (!dew_margin_by_point_.empty() || dew_margin_from_config_) {
    const auto mit = dew_margin_by_point_.find(iv.point);
    eval_.dew_margin_K = mit != dew_margin_by_point_.end() ? mit->second
                         : dew_margin_from_config_       ? cfg.dew_margin_K
                                                         : dew_margin_default_K_;
  }
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
      gas_analysis_ = -1;
      r.why_not = "its gas analysis record seq " + std::to_string(analysis_seq) + " is not in the log";
      return r;
    } else if (ait != analyses_.end()) {
      // The analysis' Hs is stated at the base conditions (and the usual
      // combustion reference) of the recorded configuration.
      const auto rit = config_root_.find(iv.config_seq);
      const auto root = configs_.find(rit == config_root_.end() ? iv.config_seq : rit->second);
      const GasRecord& g = ait->second;
      std::optional<iso6976::CombustionRef> comb = what_if_.combustion;
      if (!comb && what_if_.combustion_hold && root != configs_.end()) comb = default_combustion_for(root->second.base_T_K);
      double Hs_stated = g.Hs;
      if (std::isfinite(Hs_stated) && comb && root != configs_.end()) {
        const auto stated_ref = default_combustion_for(root->second.base_T_K);
        if (*comb != stated_ref) {  // the molar calorific values at the two references, any metering reference
          const auto mref = metering_ref_for(root->second.base_T_K).value_or(iso6976::MeteringRef::t15C);
          const auto a = iso6976::properties(g.x, *comb, mref), b = iso6976::properties(g.x, stated_ref, mref);
          Hs_stated = a.status.ok() && b.status.ok() ? g.Hs * (a.Hs_MJ_per_m3 / b.Hs_MJ_per_m3) : nan_v;
        }
      }
      const bool rebase = std::isfinite(Hs_stated) && root != configs_.end() &&
                          (root->second.base_T_K != cfg.base_T_K || root->second.base_p_Pa != cfg.base_p_Pa);
      double Z_b_stated = nan_v;
      if (rebase) Z_b_stated = record::prepare_gas(*m, g.x, Hs_stated, g.seq, root->second, eval_).Z_b;
      gas_ = record::prepare_gas(*m, g.x, Hs_stated, g.seq, cfg, eval_, comb);
      if (std::isfinite(g.Hs) && !std::isfinite(Hs_stated)) gas_.Hs_MJ_per_m3 = nan_v;
      if (rebase && gas_.usable)
        gas_.Hs_MJ_per_m3 = Hs_stated * (cfg.base_p_Pa / root->second.base_p_Pa) * (root->second.base_T_K / cfg.base_T_K) *
                            (Z_b_stated / gas_.Z_b);
    }
  }

  // The interval as one sample at the logged averages carrying the converted volume.
  record::PointConfig one = cfg;
  one.integration = record::Integration::average_then_correct;
  one.averaging = record::Averaging::time_linear;
  const bool per_sample = iv.integration == "per_sample";
  const bool have_state = std::isfinite(iv.p_avg_Pa) && std::isfinite(iv.T_avg_K);
  const bool logged_I = std::isfinite(iv.I) && iv.I > 0;
  double V_conv = iv.V_ind_m3 * cfg.meter_factor;
  if (iv.V_fault_um3 != 0) {
    // Known from the registers to their resolution; an average_then_correct
    // interval's own I pins it when the two agree within it.
    V_conv = std::max(0.0, V_conv - static_cast<double>(iv.V_fault_um3) * record::volume_quantum_m3);
    if (!per_sample && have_state && logged_I && std::isfinite(iv.Z_f) && iv.p_avg_Pa > 0) {
      const double from_I = iv.I * iv.T_avg_K * iv.Z_f / iv.p_avg_Pa;
      if (std::fabs(from_I - V_conv) <= 0.5 * record::volume_quantum_m3 * (1 + 1e-9) + 1e-12 * V_conv) V_conv = from_I;
    }
    if (V_conv <= record::volume_quantum_m3 && !logged_I) V_conv = 0;  // nothing converted, as logged
  }
  record::Sample s;
  s.t_utc_s = iv.end_utc_s;
  s.dt_s = std::max<std::int64_t>(1, iv.end_utc_s - iv.start_utc_s - iv.alarm_time_s);
  s.p_Pa = iv.p_avg_Pa;
  s.T_K = iv.T_avg_K;
  s.V_ind_m3 = cfg.meter_factor != 0 ? V_conv / cfg.meter_factor : 0.0;
  if (!have_state) s.V_ind_m3 = 0;
  const record::IntervalResult c = compute_interval(std::span<const record::Sample>(&s, have_state ? 1u : 0u), one, *m, gas_, eval_);

  r.replayed = true;
  r.calc_status = c.calc_status;
  r.Z_f = c.Z_f;
  r.Z_b = c.Z_b;
  r.flags = c.flags;
  r.Fp = c.Fp;
  r.Ft = c.Ft;
  r.Fz = c.Fz;
  r.Hs = c.Hs_MJ_per_m3;
  r.rho_f = c.rho_f_kg_per_m3;
  if (per_sample && gas_.usable) {
    if (!std::isfinite(iv.I) && V_conv > record::volume_quantum_m3) {
      IntervalReplay none;
      none.why_not = "it has converted volume but no integral value (I_m3_Pa_per_K): its base volume, energy and mass cannot be recomputed";
      return none;
    }
    // The logged integral rescaled to the recomputed Z_f at the averages. The
    // Z_f behind the logged I is the logged Z_f, or Z_b / Fz as logged where
    // that one is the one the recomputation confirms (one altered factor).
    double I = std::isfinite(iv.I) ? iv.I : 0.0;
    double Z_f_logged = iv.Z_f;
    const double Z_f_from_Fz = std::isfinite(iv.Fz) && iv.Fz > 0 && std::isfinite(iv.Z_b) ? iv.Z_b / iv.Fz : nan_v;
    if (std::isfinite(Z_f_from_Fz) && std::isfinite(c.Z_f) &&
        (!std::isfinite(Z_f_logged) || std::fabs(Z_f_from_Fz - c.Z_f) < std::fabs(Z_f_logged - c.Z_f)))
      Z_f_logged = Z_f_from_Fz;
    // Agreement to the density solvers' own noise (about 1e-14) is no
    // difference: the logged I stands as it is, so a replay by the same
    // engine reproduces the registers to the last digit.
    if (std::isfinite(Z_f_logged) && Z_f_logged > 0 && std::isfinite(c.Z_f) && c.Z_f > 0 &&
        std::fabs(Z_f_logged - c.Z_f) > 1e-12 * c.Z_f)
      I *= Z_f_logged / c.Z_f;
    r.estimated = true;
    // mass = sum rho_i V_i = (M / R) I, and M / R = rho Z T / p at any state
    // of the gas (the method's own rho, Z): the mass follows from I and the
    // method's density at the averages.
    const double mass = std::isfinite(c.rho_f_kg_per_m3) && std::isfinite(c.Z_f) && iv.p_avg_Pa > 0
                            ? I * c.rho_f_kg_per_m3 * c.Z_f * iv.T_avg_K / iv.p_avg_Pa
                            : (I == 0 ? 0.0 : nan_v);
    // The recorder stores mass / V_conv as the line density of a per_sample interval.
    if (V_conv > 0 && std::isfinite(mass)) r.rho_f = mass / V_conv;
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
  // A per_sample interval partly in alarm: V_conv only to the fault register's resolution.
  r.dC_ppm = per_sample && iv.V_fault_um3 != 0 && r.V_b_m3 != 0 ? nan_v : ppm(r.C, iv.C);
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
  // Saturating sums (record/checked.hpp): a log of impossible registers never overflows the totals.
  (void)(record::sat_add(t.V_b_um3_logged, iv.V_b_um3) | record::sat_add(t.V_b_um3_replayed, r.V_b_um3) |
         record::sat_add(t.E_J_logged, iv.E_J) | record::sat_add(t.E_J_replayed, r.E_J));
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
                                " FROM interval WHERE (?1 IS NULL OR point = ?1) AND end_utc_s > ?2 AND start_utc_s < ?3 AND seq <= ?4"
                                " ORDER BY point, start_utc_s, seq");
  s.bind(4, head_seq_);
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
