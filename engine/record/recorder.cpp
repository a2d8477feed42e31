#include "record/recorder.hpp"

#include <limits>

#include <algorithm>
#include <cmath>

#include "eval/conversion.hpp"
#include "io/text.hpp"
#include "methods/iso6976.hpp"
#include "record/checked.hpp"
#include "record/timeutil.hpp"

namespace zcorr::record {
namespace {

std::string fmt(double v, int digits = 8) { return io::format_sig(v, digits); }

// a += b register by register, saturating; true when any saturated.
template <class R>
bool add_registers(R& a, const R& b) noexcept {
  bool o = sat_add(a.V_f, b.V_f);
  o |= sat_add(a.V_b, b.V_b);
  o |= sat_add(a.V_fault, b.V_fault);
  o |= sat_add(a.E, b.E);
  o |= sat_add(a.m, b.m);
  return o;
}

std::string analysis_columns() {
  std::string s;
  for (std::size_t i = 0; i < max_components; ++i) s += ", x_" + std::string(component_name(i));
  return s;
}

}  // namespace

Recorder::Recorder(Log& log, const PointConfig& cfg, LineMethod& method, const RecordOptions& opt)
    : log_(log), cfg_(cfg), method_(method), opt_(opt) {
  if (opt_.batch_intervals < 1) opt_.batch_intervals = 1;
  opt_.eval.dew_margin_K = cfg_.dew_margin_K;  // the point's own margin for near_dew_point
  load_state();
}

void Recorder::load_state() {
  sqlite3* db = log_.db();
  {  // the configuration in force
    const auto pc = log_.columns(Table::point_config);
    std::string sql = "SELECT ";
    for (std::size_t i = 0; i < pc.size(); ++i) sql += (i ? ", " : "") + std::string(pc[i]);
    Stmt s(db, sql + " FROM point_config WHERE point = ? AND corrects_seq IS NULL ORDER BY seq DESC LIMIT 1");
    s.bind(1, std::string_view(cfg_.point));
    if (s.step()) {
      std::vector<Value> v;
      for (std::size_t i = 0; i < pc.size(); ++i) v.push_back(s.value(static_cast<int>(i)));
      const PointConfig logged = config_from_values(v);
      config_seq_ = s.i64(0);
      config_changes_ = cfg_.differences(logged);
      config_pending_ = !config_changes_.empty();
    } else {
      config_pending_ = true;
    }
  }
  {  // the last interval and the register readings
    Stmt s(db, "SELECT end_utc_s FROM interval WHERE point = ? AND corrects_seq IS NULL ORDER BY seq DESC LIMIT 1");
    s.bind(1, std::string_view(cfg_.point));
    if (s.step()) {
      last_end_ = s.i64(0);
      prev_t_ = last_end_;
      stats_.last_end_utc_s = last_end_;
    }
    Stmt c(db, "SELECT coalesce(sum(V_f_um3), 0), coalesce(sum(V_b_um3), 0), coalesce(sum(V_fault_um3), 0), "
               "coalesce(sum(E_J), 0), coalesce(sum(mass_mg), 0) FROM interval WHERE point = ? AND corrects_seq IS NULL");
    c.bind(1, std::string_view(cfg_.point));
    c.step();
    cum_ = {c.i64(0), c.i64(1), c.i64(2), c.i64(3), c.i64(4)};
  }
  if (last_end_ != INT64_MIN && config_pending_ && last_end_ % cfg_.interval_s != 0)
    throw LogError(log_.file().string() + ": the last interval of point " + cfg_.point + " ends at " + format_time_utc(last_end_) +
                   ", which is not a boundary of the new interval length (" + std::to_string(cfg_.interval_s) + " s)");
  // The open hour and day: intervals after the last record of each.
  for (int k = 0; k < 2; ++k) {
    const bool hour = k == 0;
    Period& per = hour ? hour_ : day_;
    std::int64_t after_seq = 0, after_end = INT64_MIN;
    Stmt q(db, "SELECT seq, end_utc_s FROM qtr WHERE point = ? AND period = ? AND corrects_seq IS NULL ORDER BY seq DESC LIMIT 1");
    q.bind(1, std::string_view(cfg_.point)).bind(2, std::string_view(hour ? "hour" : "day"));
    if (q.step()) {
      after_seq = q.i64(0);
      after_end = q.i64(1);
    }
    if (hour) hour_floor_ = after_end;
    Stmt s(db, "SELECT start_utc_s, end_utc_s, flow_time_s, alarm_time_s, V_f_um3, V_b_um3, V_fault_um3, E_J, mass_mg, "
               "p_avg_Pa, T_avg_K, V_f_m3, flags FROM interval WHERE point = ? AND corrects_seq IS NULL AND seq > ? ORDER BY seq");
    s.bind(1, std::string_view(cfg_.point)).bind(2, after_seq);
    while (s.step()) {
      const std::int64_t start = s.i64(0);
      if (!per.open) {
        per.open = true;
        per.start = hour ? std::max(hour_start(start, cfg_.utc_offset_min), after_end)
                         : contract_day_start(start, cfg_.utc_offset_min, cfg_.contract_hour);
      }
      per.n++;
      per.flow_s += s.i64(2);
      per.alarm_s += s.i64(3);
      if (add_registers(per.sum, Registers{s.i64(4), s.i64(5), s.i64(6), s.i64(7), s.i64(8)})) per.flags |= iflag::overflow;
      per.flags |= s.i64(12);
      if (!s.is_null(9) && !s.is_null(10)) {
        const double w = s.f64(11);
        per.wp += w * s.f64(9); per.wT += w * s.f64(10); per.w += w;
        per.tp += s.f64(9); per.tT += s.f64(10); per.tw += 1;
      }
    }
  }
  {  // the analysis in force
    Stmt s(db, "SELECT seq, valid_from_utc_s, Hs_MJ_per_m3" + analysis_columns() +
                   " FROM gas_analysis WHERE point = ? AND corrects_seq IS NULL ORDER BY seq DESC LIMIT 1");
    s.bind(1, std::string_view(cfg_.point));
    if (s.step()) {
      Fractions<double> x{};
      for (std::size_t i = 0; i < max_components; ++i) x[i] = s.f64(static_cast<int>(3 + i));
      last_analysis_from_ = s.i64(1);
      set_gas(x, s.is_null(2) ? nan_v : s.f64(2), s.i64(0));
    }
  }
  {  // alarm states
    Stmt s(db, "SELECT kind FROM event WHERE point = ? AND kind IN ('alarm_begin', 'alarm_end') ORDER BY seq DESC LIMIT 1");
    s.bind(1, std::string_view(cfg_.point));
    alarm_ = s.step() && s.text(0) == "alarm_begin";
    Stmt c(db, "SELECT kind FROM event WHERE point = ? AND kind IN ('calc_failed', 'calc_ok') ORDER BY seq DESC LIMIT 1");
    c.bind(1, std::string_view(cfg_.point));
    calc_bad_ = c.step() && c.text(0) == "calc_failed";
    Stmt t(db, "SELECT kind FROM event WHERE point = ? AND kind IN ('two_phase', 'single_phase') ORDER BY seq DESC LIMIT 1");
    t.bind(1, std::string_view(cfg_.point));
    two_phase_ = t.step() && t.text(0) == "two_phase";
  }
}

void Recorder::set_gas(const Fractions<double>& x, double Hs, std::int64_t seq) {
  gas_x_ = x;
  have_gas_x_ = true;
  gas_ = prepare_gas(method_, x, Hs, seq, cfg_, opt_.eval);
}

void Recorder::add_analyses(const std::vector<AnalysisInput>& list) {
  for (const auto& a : list) {
    if (a.valid_from_utc_s <= last_analysis_from_) {
      Stmt s(log_.db(), "SELECT 1 FROM gas_analysis WHERE point = ? AND valid_from_utc_s = ?");
      s.bind(1, std::string_view(cfg_.point)).bind(2, a.valid_from_utc_s);
      if (!s.step())
        event(a.valid_from_utc_s, "analysis_refused", "warning",
              "analysis from " + a.source + " valid from " + format_time_utc(a.valid_from_utc_s) +
                  " is older than the analysis in force (valid from " + format_time_utc(last_analysis_from_) + "); not applied");
      continue;
    }
    if (!analyses_.empty() && a.valid_from_utc_s <= analyses_.back().valid_from_utc_s) continue;
    analyses_.push_back(a);
  }
}

void Recorder::add_bad_analysis(const BadRow& b) {
  event(b.t_utc_s.value_or(0), "bad_input", "warning",
        "analysis file line " + std::to_string(b.line) + ": " + b.why + "; row: " + b.text, b.line);
}

void Recorder::event(std::int64_t t, std::string kind, std::string severity, std::string detail, std::int64_t line,
                     std::int64_t ref_seq, double value, double limit) {
  pending_events_.push_back({Null{}, cfg_.point, t, std::move(kind), std::move(severity), std::move(detail),
                             line > 0 ? Value{line} : Value{Null{}}, ref_seq > 0 ? Value{ref_seq} : Value{Null{}}, real(value),
                             real(limit), Null{}});
}

void Recorder::flush_pending_events() {
  for (auto& e : pending_events_) {
    if (std::get<std::int64_t>(e[2]) == 0) e[2] = cur_start_;  // a row with no readable time before any sample
    log_.append(Table::event, e);
    ++stats_.events;
  }
  pending_events_.clear();
}

void Recorder::ensure_tx() {
  if (!log_.in_transaction()) log_.begin();
}

void Recorder::maybe_commit() {
  if (++since_commit_ >= opt_.batch_intervals) {
    log_.commit();
    ++stats_.commits;
    since_commit_ = 0;
  }
}

void Recorder::add_bad_row(const BadRow& b) {
  ++stats_.rows;
  if (skipping_ && (!b.t_utc_s || *b.t_utc_s <= last_end_) && last_end_ != INT64_MIN) {
    ++stats_.skipped;  // inside the part recorded (and logged) before
    return;
  }
  ++stats_.bad_rows;
  if (in_interval_) ++cur_rows_;
  cur_flags_ |= iflag::bad_input;
  const std::int64_t t = b.t_utc_s.value_or(prev_t_ == INT64_MIN ? 0 : prev_t_);  // 0: placed at the next interval
  event(t, "bad_input", "warning", "line " + std::to_string(b.line) + ": " + b.why + "; row: " + b.text, b.line);
}

void Recorder::add_sample(const RawSample& raw) {
  ++stats_.rows;
  if (raw.t_utc_s <= last_end_) {
    ++stats_.skipped;
    return;
  }
  skipping_ = false;
  if (raw.t_utc_s <= prev_t_) {
    --stats_.rows;
    add_bad_row(BadRow{raw.line, "time " + format_time_utc(raw.t_utc_s),
                       "the time does not increase (previous row " + format_time_utc(prev_t_) + "); its volume of " +
                           fmt(raw.V_ind_m3) + " m3 is not counted",
                       raw.t_utc_s});
    return;
  }
  const std::int64_t L = cfg_.interval_s;
  const std::int64_t start = floor_div(raw.t_utc_s - 1, L) * L;
  if (in_interval_ && start != cur_start_) close_interval();
  if (!in_interval_) open_interval(start);
  ++cur_rows_;

  Sample s;
  s.t_utc_s = raw.t_utc_s;
  s.p_Pa = raw.p_Pa;
  s.T_K = raw.T_K;
  s.V_ind_m3 = raw.V_ind_m3;
  s.pulses = raw.pulses;
  if (prev_t_ != INT64_MIN && prev_t_ < cur_start_) {
    s.flags |= iflag::gap;
    event(raw.t_utc_s, "gap", "warning",
          "no sample between " + format_time_utc(prev_t_) + " and " + format_time_utc(raw.t_utc_s) + ": line " + std::to_string(raw.line) +
              " covers " + std::to_string(raw.t_utc_s - prev_t_) + " s and its volume is counted in the interval from " +
              format_time_utc(cur_start_),
          raw.line);
  }
  // A volume no meter of this point can pass in the time the sample covers
  // (max_flow over the interval, or over the time since the previous sample
  // when that is longer: a gap) is impossible: an alarm of its interval, and
  // its volume enters no register.
  const double dV_m3 = (cfg_.pulses ? static_cast<double>(raw.pulses) / cfg_.k_factor_per_m3 : raw.V_ind_m3) * cfg_.meter_factor;
  const std::int64_t covered_s = std::max<std::int64_t>(cfg_.interval_s, prev_t_ == INT64_MIN ? 0 : raw.t_utc_s - prev_t_);
  const double dV_max_m3 = cfg_.max_flow_m3_per_h * static_cast<double>(covered_s) / 3600.0;
  if (!(dV_m3 <= dV_max_m3)) {
    ++stats_.bad_rows;
    cur_flags_ |= iflag::bad_input | iflag::alarm;
    event(raw.t_utc_s, "bad_input", "alarm",
          "line " + std::to_string(raw.line) + ": volume increment " + fmt(dV_m3) + " m3 above max_flow " + fmt(cfg_.max_flow_m3_per_h) +
              " m3/h over " + std::to_string(covered_s) + " s = " + fmt(dV_max_m3) + " m3; not counted",
          raw.line, 0, dV_m3, dV_max_m3);
    prev_t_ = raw.t_utc_s;
    if (raw.t_utc_s == cur_end_) close_interval();
    return;
  }
  s.dt_s = raw.t_utc_s - std::max(prev_t_, cur_start_);
  prev_t_ = raw.t_utc_s;

  // Input alarms (the conversion stops for this sample).
  std::string cause, kind;
  double value = nan_v, limit = nan_v;
  if (!raw.problem.empty()) {
    cause = "transmitter failure: " + raw.problem;
    if (std::isnan(raw.p_Pa)) s.flags |= iflag::p_out_of_range;
    if (std::isnan(raw.T_K)) s.flags |= iflag::T_out_of_range;
  } else if (raw.p_Pa < cfg_.p_min_Pa || raw.p_Pa > cfg_.p_max_Pa) {
    const bool low = raw.p_Pa < cfg_.p_min_Pa;
    value = raw.p_Pa;
    limit = low ? cfg_.p_min_Pa : cfg_.p_max_Pa;
    cause = "pressure " + fmt(raw.p_Pa / 1000.0) + " kPa " + (low ? "below p_min " : "above p_max ") + fmt(limit / 1000.0) + " kPa";
    s.flags |= iflag::p_out_of_range;
  } else if (raw.T_K < cfg_.T_min_K || raw.T_K > cfg_.T_max_K) {
    const bool low = raw.T_K < cfg_.T_min_K;
    value = raw.T_K;
    limit = low ? cfg_.T_min_K : cfg_.T_max_K;
    cause = "temperature " + fmt(raw.T_K) + " K " + (low ? "below T_min " : "above T_max ") + fmt(limit) + " K";
    s.flags |= iflag::T_out_of_range;
  }
  s.alarm = !cause.empty();
  if (s.alarm) s.flags |= iflag::alarm;
  if (s.alarm && (!alarm_ || cause.substr(0, 8) != alarm_cause_.substr(0, 8)))
    event(raw.t_utc_s, "alarm_begin", "alarm", cause + " (line " + std::to_string(raw.line) + "); converted register stopped", raw.line, 0,
          value, limit);
  else if (!s.alarm && alarm_)
    event(raw.t_utc_s, "alarm_end", "info", "inputs back in range (line " + std::to_string(raw.line) + "); converted register counting",
          raw.line);
  alarm_ = s.alarm;
  alarm_cause_ = cause;
  cur_.push_back(s);
  if (raw.t_utc_s == cur_end_) close_interval();
}

void Recorder::open_interval(std::int64_t start) {
  ensure_tx();
  if (!started_) {
    started_ = true;
    event(start, "recording_start", "info",
          std::string(engine_version()) + " recording " + opt_.input_name + " for point " + cfg_.point +
              (last_end_ == INT64_MIN ? std::string(" (first recording)") : " (resuming after " + format_time_utc(last_end_) + ")"));
  }
  close_periods_before(start);
  if (config_pending_) {
    if (hour_.open) write_period(true, start);  // an extra hourly record at the configuration change
    apply_config_ = true;
    config_pending_ = false;
    if (have_gas_x_) set_gas(gas_x_, gas_.Hs_MJ_per_m3, gas_.seq);  // Z_b at the (new) base conditions
  }
  cur_analyses_.clear();
  while (!analyses_.empty() && analyses_.front().valid_from_utc_s <= start) {
    cur_analyses_.push_back(analyses_.front());
    analyses_.pop_front();
  }
  if (!cur_analyses_.empty()) {
    const auto& a = cur_analyses_.back();
    set_gas(a.x, a.Hs_MJ_per_m3, 0);
    last_analysis_from_ = a.valid_from_utc_s;
  }
  in_interval_ = true;
  cur_start_ = start;
  cur_end_ = start + cfg_.interval_s;
  cur_.clear();
}

void Recorder::close_interval() {
  ensure_tx();
  IntervalResult r = compute_interval(cur_, cfg_, method_, gas_, opt_.eval);
  r.flags |= cur_flags_;

  if (apply_config_) {
    auto v = config_values(cfg_, cur_start_);
    config_seq_ = log_.append(Table::point_config, v);
    ++stats_.configs;
    std::string detail = config_changes_.empty() ? "first configuration of point " + cfg_.point : "settings changed:";
    for (const auto& c : config_changes_) detail += " " + c;
    detail += " (method " + cfg_.method + ", base " + cfg_.base_name + " " + fmt(cfg_.base_T_K) + " K " + fmt(cfg_.base_p_Pa) +
              " Pa, meter factor " + fmt(cfg_.meter_factor) + ")";
    std::vector<Value> e{Null{}, cfg_.point, cur_start_, std::string("config_change"), std::string("info"), detail, Null{},
                         config_seq_, Null{}, Null{}, Null{}};
    log_.append(Table::event, e);
    ++stats_.events;
    apply_config_ = false;
    config_changes_.clear();
  }
  for (const auto& a : cur_analyses_) {
    std::vector<Value> v{Null{}, cfg_.point, a.valid_from_utc_s, a.sampled_utc_s ? Value{*a.sampled_utc_s} : Value{Null{}}, a.source};
    for (std::size_t i = 0; i < max_components; ++i) v.push_back(real(a.x[i]));
    v.push_back(real(a.sum_as_given));
    v.push_back(std::int64_t{a.normalised ? 1 : 0});
    v.push_back(real(a.Hs_MJ_per_m3));
    v.push_back(a.hs_ref.empty() ? Value{Null{}} : Value{a.hs_ref});
    v.push_back(Null{});  // corrects_seq
    v.push_back(Null{});  // correction_reason
    v.push_back(Null{});  // canon_version (set by append)
    const auto seq = log_.append(Table::gas_analysis, v);
    ++stats_.analyses;
    gas_.seq = seq;
    std::string detail = "analysis from " + a.source + " in force from " + format_time_utc(cur_start_);
    if (a.valid_from_utc_s < cur_start_) detail += " (valid from " + format_time_utc(a.valid_from_utc_s) + ")";
    if (&a == &cur_analyses_.back() && !gas_.usable) detail += "; the method refuses it (" + gas_.status + "): conversion stopped";
    std::vector<Value> e{Null{}, cfg_.point, cur_start_, std::string("analysis_change"),
                         std::string(&a == &cur_analyses_.back() && !gas_.usable ? "alarm" : "info"), detail, Null{}, seq, Null{},
                         Null{}, Null{}};
    log_.append(Table::event, e);
    ++stats_.events;
  }
  cur_analyses_.clear();
  if (gas_.seq == 0 && !no_gas_reported_) {
    event(cur_start_, "no_analysis", "alarm", "no gas analysis in force: conversion stopped");
    no_gas_reported_ = true;
  }
  const bool calc_failed = (r.flags & iflag::calc_failed) != 0;
  if (calc_failed && !calc_bad_) event(cur_start_, "calc_failed", "alarm", "the method refused a state: " + r.calc_status);
  else if (!calc_failed && calc_bad_) event(cur_start_, "calc_ok", "info", "the method computes again");
  calc_bad_ = calc_failed;
  const bool two_phase = (r.flags & iflag::two_phase) != 0;
  if (two_phase && !two_phase_)
    event(cur_start_, "two_phase", "alarm",
          "line state two-phase by the GERG-2008 phase test (below the hydrocarbon dew point): conversion stopped for it (" +
              r.calc_status + ")");
  else if (!two_phase && two_phase_)
    event(cur_start_, "single_phase", "info", "line state single-phase again (GERG-2008 phase test)");
  two_phase_ = two_phase;
  const Registers reg{r.V_f_um3, r.V_b_um3, r.V_fault_um3, r.E_J, r.mass_mg};
  const auto at_limit = [](const Registers& x) {
    for (const std::int64_t v : {x.V_f, x.V_b, x.V_fault, x.E, x.m})
      if (v == std::numeric_limits<std::int64_t>::max() || v == std::numeric_limits<std::int64_t>::min()) return true;
    return false;
  };
  const bool was_saturated = at_limit(cum_);
  if (add_registers(cum_, reg)) {  // the register readings saturate: flagged, never wrapped
    r.flags |= iflag::overflow | iflag::alarm;
    if (!was_saturated)
      event(cur_start_, "register_overflow", "alarm",
            "a register reading reached the int64 limit: it stays there and every later interval is flagged overflow");
  }
  flush_pending_events();

  row_.assign({Null{},
               cfg_.point,
               config_seq_,
               gas_.seq > 0 ? Value{gas_.seq} : Value{Null{}},
               cur_start_,
               cur_end_,
               r.flow_time_s,
               r.alarm_time_s,
               r.samples,
               r.samples_used,
               std::string(averaging_name(cfg_.averaging)),
               std::string(integration_name(cfg_.integration)),
               real(r.p_avg_Pa),
               real(r.T_avg_K),
               cfg_.pulses ? Value{r.pulses} : Value{Null{}},
               real(r.V_ind_m3),
               real(r.V_f_m3),
               real(r.Z_f),
               real(r.Z_b),
               real(r.Fp),
               real(r.Ft),
               real(r.Fz),
               real(r.C),
               real(r.I_m3_Pa_per_K),
               real(r.V_b_m3),
               real(r.Hs_MJ_per_m3),
               real(r.E_MJ),
               real(r.rho_f_kg_per_m3),
               real(r.mass_kg),
               r.V_f_um3,
               r.V_b_um3,
               r.V_fault_um3,
               r.E_J,
               r.mass_mg,
               r.flags,
               r.calc_status,
               cfg_.method,
               std::string(engine_version()),
               Null{},
               Null{},
               Null{}});  // canon_version (set by append)
  log_.append(Table::interval, row_);
  ++stats_.intervals;
  add_to_periods(cur_start_, cur_end_, r.flow_time_s, r.alarm_time_s, reg, r.p_avg_Pa, r.T_avg_K, r.V_f_m3, r.flags);
  last_end_ = cur_end_;
  stats_.last_end_utc_s = last_end_;
  in_interval_ = false;
  cur_flags_ = 0;
  cur_rows_ = 0;
  cur_.clear();
  close_periods_before(cur_end_);
  maybe_commit();
}

void Recorder::add_to_periods(std::int64_t start, std::int64_t, std::int64_t flow_s, std::int64_t alarm_s, const Registers& r,
                              double p, double T, double V_f, std::int64_t flags) {
  for (int k = 0; k < 2; ++k) {
    const bool hour = k == 0;
    Period& per = hour ? hour_ : day_;
    if (!per.open) {
      per = Period{};
      per.open = true;
      per.start = hour ? std::max(hour_start(start, cfg_.utc_offset_min), hour_floor_)
                       : contract_day_start(start, cfg_.utc_offset_min, cfg_.contract_hour);
    }
    per.n++;
    per.flow_s += flow_s;
    per.alarm_s += alarm_s;
    per.flags |= flags;
    if (add_registers(per.sum, r)) per.flags |= iflag::overflow;
    if (std::isfinite(p) && std::isfinite(T)) {
      per.wp += V_f * p; per.wT += V_f * T; per.w += V_f;
      per.tp += p; per.tT += T; per.tw += 1;
    }
  }
}

void Recorder::close_periods_before(std::int64_t t) {
  if (hour_.open) {
    const std::int64_t end = hour_start(hour_.start, cfg_.utc_offset_min) + 3600;
    if (t >= end) write_period(true, end);
  }
  if (day_.open) {
    const std::int64_t end = contract_day_start(day_.start, cfg_.utc_offset_min, cfg_.contract_hour) + 86400;
    if (t >= end) write_period(false, end);
  }
}

void Recorder::write_period(bool hour, std::int64_t end) {
  ensure_tx();
  Period& p = hour ? hour_ : day_;
  const double p_avg = p.w > 0 ? p.wp / p.w : p.tw > 0 ? p.tp / p.tw : nan_v;
  const double T_avg = p.w > 0 ? p.wT / p.w : p.tw > 0 ? p.tT / p.tw : nan_v;
  const double hs = p.sum.V_b > 0 && (p.flags & iflag::energy_missing) == 0
                        ? static_cast<double>(p.sum.E) / static_cast<double>(p.sum.V_b)  // J / 1e-6 m3 = MJ/m3
                        : nan_v;
  const std::int64_t day0 = contract_day_start(p.start, cfg_.utc_offset_min, cfg_.contract_hour);
  std::vector<Value> v{Null{},
                       cfg_.point,
                       std::string(hour ? "hour" : "day"),
                       p.start,
                       end,
                       format_date(day0, cfg_.utc_offset_min),
                       config_seq_,
                       p.n,
                       p.flow_s,
                       p.alarm_s,
                       real(p_avg),
                       real(T_avg),
                       real(hs),
                       p.sum.V_f,
                       p.sum.V_b,
                       p.sum.V_fault,
                       p.sum.E,
                       p.sum.m,
                       cum_.V_f,
                       cum_.V_b,
                       cum_.V_fault,
                       cum_.E,
                       cum_.m,
                       p.flags,
                       Null{},
                       Null{},
                       Null{}};  // canon_version (set by append)
  log_.append(Table::qtr, v);
  if (hour) {
    ++stats_.hours;
    hour_floor_ = end;
  } else {
    ++stats_.days;
  }
  p = Period{};
}

void Recorder::finish() {
  if (in_interval_) stats_.rows_left = cur_rows_;
  pending_events_.clear();  // they belong to the incomplete interval, recorded with it next time
  if (log_.in_transaction()) {
    log_.commit();
    ++stats_.commits;
  }
  // What this run appended reads back as written (throws LogError otherwise).
  stats_.read_back = log_.recheck_appended();
}

void Recorder::feed(SampleReader& reader) {
  RawSample s;
  BadRow bad;
  for (;;) {
    const auto k = reader.next(s, bad);
    if (k == SampleReader::Next::end) break;
    if (k == SampleReader::Next::sample) add_sample(s);
    else add_bad_row(bad);
  }
}

}  // namespace zcorr::record
