#include "audit/audit.hpp"

#include "audit/correct.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <fstream>
#include <limits>
#include <set>
#include <sstream>
#include <thread>

#include "io/input_error.hpp"
#include "io/units_parse.hpp"
#include "record/sql.hpp"
#include "record/timeutil.hpp"
#include "record/verify.hpp"

namespace zcorr::audit {

std::string_view kind_name(Kind k) noexcept {
  switch (k) {
    case Kind::broken_chain: return "broken_chain";
    case Kind::totals_mismatch: return "totals_mismatch";
    case Kind::gap: return "gap";
    case Kind::overlap: return "overlap";
    case Kind::duplicate: return "duplicate";
    case Kind::stale_analysis: return "stale_analysis";
    case Kind::contract_mismatch: return "contract_mismatch";
    case Kind::outside_method_range: return "outside_method_range";
    case Kind::calc_difference: return "calc_difference";
    case Kind::config_without_event: return "config_without_event";
    case Kind::not_replayed: return "not_replayed";
    case Kind::alarm: return "alarm";
    case Kind::two_phase: return "two_phase";
    case Kind::near_dew_point: return "near_dew_point";
  }
  return "?";
}

std::string_view severity_name(Severity s) noexcept {
  switch (s) {
    case Severity::notice: return "notice";
    case Severity::warning: return "warning";
    case Severity::critical: return "critical";
  }
  return "?";
}

namespace {

std::string trim(std::string_view s) {
  const auto b = s.find_first_not_of(" \t\r");
  if (b == std::string_view::npos) return {};
  const auto e = s.find_last_not_of(" \t\r");
  return std::string(s.substr(b, e - b + 1));
}

bool differs(double a, double b, double tol_ppm) { return std::fabs(a - b) > std::fabs(b) * tol_ppm * 1e-6; }

std::string num(double v) {
  std::ostringstream s;
  s.precision(10);
  s << v;
  return s.str();
}

// The two figures a finding adds per interval.
struct Figures {
  double V_affected = 0, E_affected = 0;
  double V_difference = nan_v, E_difference = nan_v;
  bool estimated = false;
  std::string basis;
};

// Consecutive intervals of one point with the same kind and cause, as one finding.
class Runs {
 public:
  explicit Runs(std::vector<AuditFinding>& out) : out_(out) {}
  AuditFinding& add(Kind k, Severity sev, const std::string& key, const LoggedInterval& iv, const Figures& fig, double ppm,
                    const std::string& detail) {
    Open& o = open_[static_cast<std::size_t>(k)];
    if (o.active && (o.key != key || o.f.point != iv.point || o.f.to_utc_s != iv.start_utc_s)) close(o);
    if (!o.active) {
      o.active = true;
      o.key = key;
      o.f = AuditFinding{};
      o.f.kind = k;
      o.f.severity = sev;
      o.f.point = iv.point;
      o.f.from_utc_s = iv.start_utc_s;
      o.f.first_seq = iv.seq;
      o.f.detail = detail;
      o.f.V_b_difference_m3 = o.f.E_difference_MJ = 0;
      o.f.difference_basis = fig.basis;
    }
    o.f.to_utc_s = iv.end_utc_s;
    o.f.last_seq = iv.seq;
    ++o.f.intervals;
    o.f.V_b_affected_m3 += fig.V_affected;
    o.f.E_affected_MJ += fig.E_affected;
    o.f.V_b_difference_m3 += fig.V_difference;  // NaN once not known for one interval
    o.f.E_difference_MJ += fig.E_difference;
    o.f.difference_estimated = o.f.difference_estimated || fig.estimated;
    if (std::fabs(ppm) > std::fabs(o.f.worst_ppm)) o.f.worst_ppm = ppm;
    if (sev > o.f.severity) o.f.severity = sev;
    return o.f;
  }
  void close_all() {
    for (auto& o : open_) close(o);
  }

 private:
  struct Open {
    bool active = false;
    std::string key;
    AuditFinding f;
  };
  void close(Open& o) {
    if (!o.active) return;
    out_.push_back(o.f);
    o.active = false;
  }
  std::vector<AuditFinding>& out_;
  std::array<Open, kind_count> open_{};
};

double fin(double v) { return std::isfinite(v) ? v : 0.0; }

constexpr const char* estimate_from_averages =
    "per_sample intervals estimated from their averages (the logged integral rescaled to the recomputed Z_f): exact where "
    "logged figures were altered, otherwise first order, its error at most about the difference times the relative spread "
    "of the line pressure within an interval";

}  // namespace

double AuditFinding::V_b_difference_ppm() const noexcept {
  return std::isfinite(V_b_difference_m3) && V_b_affected_m3 != 0 ? V_b_difference_m3 / std::fabs(V_b_affected_m3) * 1e6 : nan_v;
}
double AuditFinding::E_difference_ppm() const noexcept {
  return std::isfinite(E_difference_MJ) && E_affected_MJ != 0 ? E_difference_MJ / std::fabs(E_affected_MJ) * 1e6 : nan_v;
}
std::size_t AuditResult::counting() const noexcept {
  return static_cast<std::size_t>(std::count_if(findings.begin(), findings.end(), [](const AuditFinding& f) { return f.counts(); }));
}

Contract parse_contract(std::string_view text, std::string_view source) {
  Contract c;
  std::istringstream in{std::string(text)};
  std::string line;
  int n = 0;
  while (std::getline(in, line)) {
    ++n;
    if (const auto h = line.find('#'); h != std::string::npos) line.erase(h);
    const std::string t = trim(line);
    if (t.empty()) continue;
    const auto eq = t.find('=');
    const std::string where = std::string(source) + ":" + std::to_string(n);
    if (eq == std::string::npos) throw io::InputError(where, t, "expected key = value");
    const std::string key = trim(t.substr(0, eq)), value = trim(t.substr(eq + 1));
    const std::string field = where + " " + key;
    if (key == "point") c.point = value;
    else if (key == "method") c.method = value;
    else if (key == "base_T") {
      c.base_T_K = io::parse_temperature_K(value, field);
      io::check_base_T(*c.base_T_K, field);
    } else if (key == "base_p") {
      c.base_p_Pa = io::parse_pressure_Pa(value, field);
      io::check_base_p(*c.base_p_Pa, field);
    }
    else if (key == "tolerance_ppm") {
      char* end = nullptr;
      const double v = std::strtod(value.c_str(), &end);
      if (end == value.c_str() || *end != '\0' || !(v >= 0) || !std::isfinite(v))
        throw io::InputError(field, value, "a number of ppm >= 0");
      c.tolerance_ppm = v;
    } else if (key == "dew_margin_K") {
      char* end = nullptr;
      const double v = std::strtod(value.c_str(), &end);
      if (end == value.c_str() || *end != '\0' || !(v >= 0 && v <= 50))
        throw io::InputError(field, value, "a temperature difference from 0 to 50 (kelvin)");
      c.dew_margin_K = v;
    } else {
      throw io::InputError(where, key, "known keys: point, method, base_T, base_p, tolerance_ppm, dew_margin_K");
    }
  }
  return c;
}

Contract load_contract(const std::string& path) {
  std::ifstream f(path, std::ios::binary);
  if (!f) throw io::InputError("--contract", path, "the file cannot be opened");
  std::ostringstream s;
  s << f.rdbuf();
  return parse_contract(s.str(), path);
}

bool written_by_another_engine(const AuditResult& r) {
  const std::string running = record::describe_engine_version(record::engine_version());
  return std::any_of(r.engine_versions.begin(), r.engine_versions.end(), [&](const auto& e) { return e.first != running; });
}

AuditResult run_audit(const record::Log& log, const AuditOptions& opt, MethodFactory methods) {
  using record::Stmt;
  AuditResult res;
  sqlite3* db = log.db();

  // 0. A what-if asks for something this log and build can do, at base
  // conditions a contract can name (our own bounds, wide around the usual
  // 0-20 degC / 60 degF and 101-102 kPa: common practice).
  if (opt.what_if.base_T_K) io::check_base_T(*opt.what_if.base_T_K, "what-if base temperature");
  if (opt.what_if.base_p_Pa) io::check_base_p(*opt.what_if.base_p_Pa, "what-if base pressure");
  if (opt.what_if.method && !(methods ? methods(*opt.what_if.method) : nullptr))
    throw io::InputError("what-if method", *opt.what_if.method, "a line method of this build (gerg2008, detail, sgerg88, ...)");
  if (opt.what_if.analysis_seq) {
    const std::string seq = std::to_string(*opt.what_if.analysis_seq);
    Stmt a(db, "SELECT point FROM gas_analysis WHERE seq = ?");
    a.bind(1, *opt.what_if.analysis_seq);
    if (!a.step()) throw io::InputError("what-if analysis", seq, "the seq of a gas_analysis record of the log");
    const std::string apoint = a.text(0);
    if (opt.selection.point && *opt.selection.point != apoint)
      throw io::InputError("what-if analysis", seq, "an analysis of point " + *opt.selection.point + " (this one is of point " + apoint + ")");
    if (!opt.selection.point) {
      Stmt o(db, "SELECT point FROM interval WHERE point <> ? LIMIT 1");
      o.bind(1, std::string_view(apoint));
      if (o.step())
        throw io::InputError("what-if analysis", seq,
                             "an analysis of the point selected with --point (this one is of point " + apoint + "; the log also has point " +
                                 o.text(0) + ")");
    }
  }

  // The snapshot: every read below is bounded by the head the log has now.
  // The log is append-only, so the records up to it are one consistent
  // prefix on every connection, whatever a writer appends meanwhile.
  const std::int64_t head = record::head_seq(log);
  res.head_seq = head;

  // 1. The chain and the totals (the verifier), on a second connection in a
  // second thread while this one replays (both only read the file).
  record::VerifyResult v;
  std::exception_ptr verify_error;
  std::thread verifier;
  auto verify = [&] {
    try {
      record::Log vlog(log.file(), {record::OpenMode::read_only});
      v = record::verify_log(vlog, opt.max_chain_findings, head, opt.expected_head, opt.seal_key);
    } catch (...) {
      verify_error = std::current_exception();
    }
  };
  if (opt.parallel) verifier = std::thread(verify);
  else verify();
  struct Join {
    std::thread& t;
    ~Join() { if (t.joinable()) t.join(); }
  } join{verifier};

  // 2. Configurations without their event.
  {
    Stmt s(db,
           "SELECT c.seq, c.point, c.valid_from_utc_s FROM point_config c WHERE NOT EXISTS (SELECT 1 FROM event e WHERE "
           "e.kind = 'config_change' AND e.ref_seq = c.seq AND e.seq <= ?2) AND (?1 IS NULL OR c.point = ?1) AND c.seq <= ?2 ORDER BY c.seq");
    if (opt.selection.point) s.bind(1, std::string_view(*opt.selection.point));
    s.bind(2, head);
    while (s.step()) {
      AuditFinding a;
      a.kind = Kind::config_without_event;
      a.severity = Severity::warning;
      a.point = s.text(1);
      a.first_seq = a.last_seq = s.i64(0);
      a.from_utc_s = a.to_utc_s = s.i64(2);
      Stmt q(db, "SELECT count(*), min(start_utc_s), max(end_utc_s), total(V_b_um3), total(E_J), min(seq), max(seq) FROM interval WHERE config_seq = ?1 AND seq <= ?2");
      q.bind(2, head);
      q.bind(1, a.first_seq);
      if (q.step() && q.i64(0) > 0) {
        a.intervals = q.i64(0);
        a.from_utc_s = q.i64(1);
        a.to_utc_s = q.i64(2);
        a.V_b_affected_m3 = q.f64(3) * record::volume_quantum_m3;
        a.E_affected_MJ = q.f64(4) * 1e-6;
        a.first_seq = q.i64(5);
        a.last_seq = q.i64(6);
      }
      a.difference_basis = "not a calculation finding: the intervals follow the configuration as logged (calc_difference says where they do not)";
      a.detail = "configuration record seq " + std::to_string(s.i64(0)) + " (in force from " + record::format_time_utc(s.i64(2)) +
                 ") has no config_change event naming it";
      res.findings.push_back(a);
    }
  }

  // 3. One pass over the intervals: sequence, analysis age, contract, range, replay.
  std::set<std::int64_t> corrected;
  {
    Stmt s(db, "SELECT corrects_seq FROM interval WHERE corrects_seq IS NOT NULL AND seq <= ?1");
    s.bind(1, head);
    while (s.step()) corrected.insert(s.i64(0));
  }
  const MethodFactory what_if_methods = methods;
  // The near_dew_point margin: the option, else the contract's (for its point, or every
  // point), else the default.
  EvalOptions replay_eval;
  std::optional<std::pair<std::string, double>> contract_point_margin;
  if (opt.dew_margin_K) {
    if (!(*opt.dew_margin_K >= 0 && *opt.dew_margin_K <= 50))
      throw io::InputError("dew margin", num(*opt.dew_margin_K) + " K", "a temperature difference from 0 K to 50 K");
    replay_eval.dew_margin_K = *opt.dew_margin_K;
    res.dew_margin_source = "option";
  } else if (opt.contract && opt.contract->dew_margin_K) {
    if (opt.contract->point) contract_point_margin.emplace(*opt.contract->point, *opt.contract->dew_margin_K);
    else replay_eval.dew_margin_K = *opt.contract->dew_margin_K;
    res.dew_margin_source = opt.contract->point ? "contract (point " + *opt.contract->point + "; others the default)" : "contract";
  }
  res.dew_margin_K = contract_point_margin ? contract_point_margin->second : replay_eval.dew_margin_K;
  Replayer rp(log, std::move(methods), replay_eval, {}, head);
  if (contract_point_margin) rp.set_dew_margin(contract_point_margin->first, contract_point_margin->second);
  if (!opt.dew_margin_K && !(opt.contract && opt.contract->dew_margin_K && !opt.contract->point)) {
    rp.use_configured_dew_margin(true);  // each point's configured margin (the recorder's)
    if (!contract_point_margin) res.dew_margin_source = "point configuration (5 K where it states none)";
  }
  std::map<std::int64_t, std::string> contract_diff;  // config seq -> differences ("" = none)
  auto contract_check = [&](std::int64_t config_seq, const std::string& point) -> const std::string& {
    auto it = contract_diff.find(config_seq);
    if (it != contract_diff.end()) return it->second;
    std::string d;
    const auto cit = rp.configs().find(config_seq);
    const Contract& c = *opt.contract;
    if (cit != rp.configs().end() && (!c.point || *c.point == point)) {
      const auto& cfg = cit->second;
      if (c.method && *c.method != cfg.method) d += "method " + cfg.method + " (contract " + *c.method + "); ";
      if (c.base_T_K && differs(cfg.base_T_K, *c.base_T_K, c.tolerance_ppm))
        d += "base_T " + num(cfg.base_T_K) + " K (contract " + num(*c.base_T_K) + " K); ";
      if (c.base_p_Pa && differs(cfg.base_p_Pa, *c.base_p_Pa, c.tolerance_ppm))
        d += "base_p " + num(cfg.base_p_Pa) + " Pa (contract " + num(*c.base_p_Pa) + " Pa); ";
    }
    if (d.size() >= 2) d.resize(d.size() - 2);
    return contract_diff.emplace(config_seq, d).first->second;
  };

  // The contract's method and base conditions, for the difference of the intervals that miss them.
  std::unique_ptr<Replayer> contract_rp;
  if (opt.contract && (opt.contract->method || opt.contract->base_T_K || opt.contract->base_p_Pa)) {
    WhatIf w;
    w.method = opt.contract->method;
    w.base_T_K = opt.contract->base_T_K;
    w.base_p_Pa = opt.contract->base_p_Pa;
    contract_rp = std::make_unique<Replayer>(log, what_if_methods, EvalOptions{}, w, head);
  }

  Runs runs(res.findings);
  std::string cur_point;
  bool have_prev = false;
  std::int64_t prev_start = 0, prev_end = 0, prev_seq = 0;
  double prev_rate_Vb = 0, prev_rate_E = 0;  // per second, for a gap estimate
  double sub_C = nan_v, sub_Hs = nan_v;      // the last converting interval's factor and Hs, for a substitution
  const double max_age_s = opt.max_analysis_age_h * 3600.0;

  std::int64_t progress_total = 0, progress_done = 0;
  if (opt.progress) {
    Stmt s(db, "SELECT count(*) FROM interval WHERE (?1 IS NULL OR point = ?1) AND end_utc_s > ?2 AND start_utc_s < ?3 AND seq <= ?4");
    s.bind(4, head);
    if (opt.selection.point) s.bind(1, std::string_view(*opt.selection.point));
    s.bind(2, opt.selection.from_utc_s.value_or(std::numeric_limits<std::int64_t>::min()));
    s.bind(3, opt.selection.to_utc_s.value_or(std::numeric_limits<std::int64_t>::max()));
    if (s.step()) progress_total = s.i64(0);
    opt.progress(0, progress_total);
  }

  struct LoggedVersion {
    std::string text;  // engine_version as logged
    std::int64_t intervals = 0, first_seq = 0;
  };
  std::vector<LoggedVersion> logged_versions;  // the one of the interval before last
  rp.run(opt.selection, [&](const LoggedInterval& iv, const IntervalReplay& r) {
    if (logged_versions.empty() || logged_versions.back().text != iv.engine_version) {
      auto it = std::find_if(logged_versions.begin(), logged_versions.end(), [&](const auto& e) { return e.text == iv.engine_version; });
      if (it == logged_versions.end()) logged_versions.push_back({iv.engine_version, 0, iv.seq});
      else std::rotate(it, it + 1, logged_versions.end());
    }
    ++logged_versions.back().intervals;
    logged_versions.back().first_seq = std::min(logged_versions.back().first_seq, iv.seq);
    const bool is_corrected = corrected.count(iv.seq) != 0;
    if (opt.observe) opt.observe(iv, r, !is_corrected);
    if (opt.progress && (++progress_done & 4095) == 0) opt.progress(progress_done, std::max(progress_total, progress_done));
    const double Vb = static_cast<double>(iv.V_b_um3) * record::volume_quantum_m3;
    const double E = static_cast<double>(iv.E_J) * 1e-6;
    if (iv.corrects_seq == 0) {
      res.V_b_um3_as_recorded += iv.V_b_um3;
      res.E_J_as_recorded += iv.E_J;
    }
    // A replaced record is checked by the chain only; its correction stands in for it.
    if (is_corrected) return;
    res.V_b_um3 += iv.V_b_um3;
    res.E_J += iv.E_J;
    add_to_totals(res.replay, iv, r);
    if (iv.point != cur_point) {
      cur_point = iv.point;
      have_prev = false;
      sub_C = sub_Hs = nan_v;
    }
    auto unknown = [&](std::string basis) {
      Figures f;
      f.V_affected = Vb;
      f.E_affected = E;
      f.basis = std::move(basis);
      return f;
    };
    const double len = static_cast<double>(std::max<std::int64_t>(1, iv.end_utc_s - iv.start_utc_s));
    // Sequence of the point's intervals (corrections replace their originals).
    bool gap_reported = false;
    {
      if (have_prev && iv.start_utc_s > prev_end) {
        AuditFinding a;
        a.kind = Kind::gap;
        a.severity = Severity::warning;
        a.point = iv.point;
        a.from_utc_s = prev_end;
        a.to_utc_s = iv.start_utc_s;
        a.first_seq = prev_seq;
        a.last_seq = iv.seq;
        const double dt = static_cast<double>(iv.start_utc_s - prev_end);
        a.detail = "no interval recorded from " + record::format_time_utc(prev_end) + " to " + record::format_time_utc(iv.start_utc_s) +
                   " (" + num(dt) + " s, between seq " + std::to_string(prev_seq) + " and seq " + std::to_string(iv.seq) + ")";
        if (iv.flags & record::iflag::gap) {
          // The recorder's own gap: the meter reading after it covers the
          // missing time, so its volume is in the next interval.
          a.intervals = 1;
          a.V_b_affected_m3 = Vb;
          a.E_affected_MJ = E;
          a.V_b_difference_m3 = a.E_difference_MJ = 0;
          a.difference_basis = "the meter reading after the gap covers it: its volume is counted in interval seq " + std::to_string(iv.seq) +
                               " and converted at that interval's line state";
          a.detail += "; the samples resume at seq " + std::to_string(iv.seq) + ", which carries the volume of the missing time";
          gap_reported = true;
        } else {
          a.V_b_difference_m3 = 0.5 * (prev_rate_Vb + Vb / len) * dt;
          a.E_difference_MJ = 0.5 * (prev_rate_E + E / len) * dt;
          a.difference_estimated = true;
          a.difference_basis = "estimate: the mean base-volume and energy rate of the intervals on either side times the missing time";
        }
        res.findings.push_back(a);
      } else if (have_prev && iv.start_utc_s == prev_start && iv.end_utc_s == prev_end) {
        AuditFinding a;
        a.kind = Kind::duplicate;
        a.severity = Severity::critical;
        a.point = iv.point;
        a.from_utc_s = iv.start_utc_s;
        a.to_utc_s = iv.end_utc_s;
        a.intervals = 1;
        a.first_seq = prev_seq;
        a.last_seq = iv.seq;
        a.V_b_affected_m3 = Vb;
        a.E_affected_MJ = E;
        a.V_b_difference_m3 = -Vb;
        a.E_difference_MJ = -E;
        a.difference_basis = "the duplicate's own volume and energy, counted twice in any sum over the intervals";
        a.detail = "interval seq " + std::to_string(iv.seq) + " repeats seq " + std::to_string(prev_seq) +
                   " (its volume is counted twice in any sum over the intervals)";
        res.findings.push_back(a);
      } else if (have_prev && iv.start_utc_s < prev_end) {
        AuditFinding a;
        a.kind = Kind::overlap;
        a.severity = Severity::critical;
        a.point = iv.point;
        a.from_utc_s = iv.start_utc_s;
        a.to_utc_s = std::min(prev_end, iv.end_utc_s);
        a.intervals = 2;
        a.first_seq = prev_seq;
        a.last_seq = iv.seq;
        const double ilen = static_cast<double>(iv.end_utc_s - iv.start_utc_s);
        const double share = ilen > 0 ? static_cast<double>(a.to_utc_s - a.from_utc_s) / ilen : 1.0;
        a.V_b_affected_m3 = Vb;
        a.E_affected_MJ = E;
        a.V_b_difference_m3 = -Vb * share;
        a.E_difference_MJ = -E * share;
        a.difference_estimated = share < 1.0;
        a.difference_basis = "minus the later interval's volume and energy in the overlapping time (by its share of the interval's time)";
        a.detail = "interval seq " + std::to_string(iv.seq) + " starts before seq " + std::to_string(prev_seq) + " ended";
        res.findings.push_back(a);
      }
      if ((iv.flags & record::iflag::gap) && !gap_reported) {
        Figures f = unknown("the volume is in this interval (the meter reading covers the missing time); its conversion used the line state at the reading");
        f.V_difference = f.E_difference = 0;
        runs.add(Kind::gap, Severity::warning, "flag", iv, f, 0, "the recorder found missing data (a sample covered more than its interval)");
      }
      // The recorder's gap interval carries the volume of the missing time: not a rate.
      if (!(iv.flags & record::iflag::gap)) {
        prev_rate_Vb = Vb / len;
        prev_rate_E = E / len;
      }
      if (!have_prev || iv.end_utc_s > prev_end) prev_end = iv.end_utc_s;
      prev_start = iv.start_utc_s;
      prev_seq = iv.seq;
      have_prev = true;
    }

    const double sub_C_before = sub_C, sub_Hs_before = sub_Hs;
    // Alarms: the conversion stopped for part or all of the interval.
    if (iv.flags & record::iflag::alarm) {
      const double V_fault = static_cast<double>(iv.V_fault_um3) * record::volume_quantum_m3;
      std::string cause;
      Severity sev = Severity::notice;  // the registers did what the configuration says
      if (iv.flags & record::iflag::no_analysis) {
        cause = "no usable gas analysis in force";
        sev = Severity::warning;
      } else if (iv.flags & (record::iflag::p_out_of_range | record::iflag::T_out_of_range | record::iflag::bad_input)) {
        cause = std::string("an input out of its configured range or unreadable (") +
                ((iv.flags & record::iflag::p_out_of_range) ? "pressure" : "") +
                ((iv.flags & record::iflag::p_out_of_range) && (iv.flags & record::iflag::T_out_of_range) ? ", " : "") +
                ((iv.flags & record::iflag::T_out_of_range) ? "temperature" : "") +
                ((iv.flags & record::iflag::bad_input) ? " bad input row" : "") + ")";
      } else if (iv.flags & record::iflag::two_phase) {
        cause = "a two-phase line state (GERG-2008 phase test)";
      } else if (iv.flags & record::iflag::calc_failed) {
        cause = "a line state the method refused";
      } else {
        cause = "conversion stopped";
      }
      Figures f;
      f.V_affected = Vb;
      f.E_affected = E;
      const double C_sub = std::isfinite(sub_C) ? sub_C : nan_v;
      const double Hs_sub = std::isfinite(sub_Hs) ? sub_Hs : r.Hs;
      f.V_difference = V_fault > 0 ? V_fault * C_sub : 0.0;
      f.E_difference = V_fault > 0 ? f.V_difference * Hs_sub : 0.0;
      f.estimated = V_fault > 0;
      f.basis = std::isfinite(C_sub) || V_fault == 0
                    ? "the base volume a substitution would give: the fault volume times the conversion factor C (and Hs) of the last "
                      "converting interval before the alarm"
                    : "no converting interval before the alarm to take a substitution factor from";
      AuditFinding& a = runs.add(Kind::alarm, sev, cause, iv, f, 0,
                                 "conversion stopped: " + cause + "; the unconverted volume counted in the fault register");
      a.alarm_time_s += iv.alarm_time_s;
      a.V_fault_m3 += V_fault;
    } else if (iv.V_b_um3 > 0 && std::isfinite(iv.C)) {
      sub_C = iv.C;
      sub_Hs = iv.Hs;
    }

    // The analysis in force and its age.
    if (iv.analysis_seq) {
      const auto ait = rp.analyses().find(iv.analysis_seq);
      if (ait != rp.analyses().end()) {
        const std::int64_t taken = ait->second.sampled_utc_s.value_or(ait->second.valid_from_utc_s);
        const double age = static_cast<double>(iv.start_utc_s - taken);
        if (age > max_age_s)
          runs.add(Kind::stale_analysis, Severity::warning, std::to_string(iv.analysis_seq), iv,
                   unknown("not known without an analysis for the period (--what-if-analysis recomputes with another one)"), 0,
                   "gas analysis seq " + std::to_string(iv.analysis_seq) + " (taken " + record::format_time_utc(taken) +
                       ") is older than " + num(opt.max_analysis_age_h) + " h");
      }
    }
    // The contract.
    if (opt.contract) {
      const std::string& d = contract_check(iv.config_seq, iv.point);
      if (!d.empty()) {
        Figures f = unknown("the contract names no method or base condition to recompute with");
        if (contract_rp) {
          const IntervalReplay c = contract_rp->replay(iv);
          if (c.replayed) {
            f.V_difference = c.V_b_m3 - iv.V_b_m3;
            f.E_difference = fin(c.E_MJ) - fin(iv.E_MJ);
            f.estimated = c.estimated;
            f.basis = std::string("recomputed with the contract's method and base conditions, minus logged") +
                      (c.estimated ? std::string("; ") + estimate_from_averages : std::string());
          } else {
            f.basis = "not recomputed at the contract's conditions: " + c.why_not;
          }
        }
        runs.add(Kind::contract_mismatch, Severity::critical, std::to_string(iv.config_seq), iv, f, 0,
                 "configuration seq " + std::to_string(iv.config_seq) + " differs from the contract: " + d);
      }
    }
    if (!r.replayed) {
      runs.add(Kind::not_replayed, Severity::warning, r.why_not, iv, unknown("not recomputed: " + r.why_not), 0,
               "not recomputed: " + r.why_not);
      return;
    }
    // The method's range at the averaged state.
    {
      std::string why;
      Severity sev = Severity::warning;
      const bool have_state = std::isfinite(iv.p_avg_Pa) && std::isfinite(iv.T_avg_K);
      if (have_state && (r.calc_status.rfind("out_of_range", 0) == 0 || r.calc_status.find("range=outside") != std::string::npos ||
                         (r.flags & record::iflag::extrapolated))) {
        why = "outside the method's range";
        sev = Severity::critical;
      } else if (have_state && (r.flags & record::iflag::expanded_range)) {
        why = "in the method's expanded range only";
      }
      if (!why.empty())
        runs.add(Kind::outside_method_range, sev, why, iv,
                 unknown("not known: no validated result of the method to compare with there (another method: --what-if-method)"), 0,
                 "the averaged state (p " + num(iv.p_avg_Pa) + " Pa, T " + num(iv.T_avg_K) + " K) is " + why + " (" +
                     r.calc_status + ")");
    }
    // The phase of the line state: two-phase (as the recorder logged it, or found again at
    // the averaged state) or, recomputed with the audit's margin, near the dew point.
    if ((iv.flags | r.flags) & record::iflag::two_phase) {
      const double V_fault = static_cast<double>(iv.V_fault_um3) * record::volume_quantum_m3;
      Figures f;
      f.V_affected = Vb;
      f.E_affected = E;
      f.V_difference = V_fault > 0 ? V_fault * sub_C_before : 0.0;
      f.E_difference = V_fault > 0 ? f.V_difference * (std::isfinite(sub_Hs_before) ? sub_Hs_before : r.Hs) : 0.0;
      f.estimated = V_fault > 0;
      f.basis = std::isfinite(sub_C_before) || V_fault == 0
                    ? "the base volume a substitution would give for the fault volume (the conversion factor C and Hs of the last "
                      "converting interval before); the volume converted at a two-phase state has no recomputation to compare with"
                    : "no converting interval before it to take a substitution factor from";
      const bool logged = (iv.flags & record::iflag::two_phase) != 0;
      AuditFinding& a = runs.add(Kind::two_phase, Severity::critical, logged ? "logged" : "replay", iv, f, 0,
                                 std::string(logged ? "the recorder found a line state two-phase" : "the averaged line state is two-phase") +
                                     " by the GERG-2008 phase test (below the hydrocarbon dew point of the analysis in force, water left "
                                     "out): liquid in the line, the metered volume is not that of the gas (" + r.calc_status + ")");
      a.V_fault_m3 += V_fault;
      a.alarm_time_s += iv.alarm_time_s;
    } else if (r.flags & record::iflag::near_dew_point) {
      Figures f;
      f.V_affected = Vb;
      f.E_affected = E;
      f.V_difference = f.E_difference = 0;
      f.basis = "converted as logged: the state is single-phase; the affected figures are what a colder line would put at stake";
      runs.add(Kind::near_dew_point, Severity::warning, "near", iv, f, 0,
               "the averaged line state (p " + num(iv.p_avg_Pa) + " Pa, T " + num(iv.T_avg_K) + " K) lies less than " +
                   num(contract_point_margin && iv.point != contract_point_margin->first ? EvalOptions::default_dew_margin_K
                                                                                         : res.dew_margin_K) + " K above the hydrocarbon dew temperature at its pressure (GERG-2008 phase test of the "
                   "analysis in force, water left out)");
    }
    // The recalculation.
    const double worst = r.worst_ppm();
    if (worst > opt.tolerance_ppm) {
      if (res.over_bar.size() < 100) res.over_bar.emplace_back(iv, r);
      ++res.over_bar_total;
      Figures f;
      f.V_affected = Vb;
      f.E_affected = E;
      f.V_difference = fin(r.V_b_m3) - iv.V_b_m3;
      f.E_difference = fin(r.E_MJ) - fin(iv.E_MJ);
      f.estimated = r.estimated;
      f.basis = r.estimated ? std::string(estimate_from_averages) : std::string("recomputed from the logged measured inputs, minus logged");
      runs.add(Kind::calc_difference, Severity::critical, "calc", iv, f,
               std::isfinite(worst) ? std::max({std::fabs(fin(r.dZ_f_ppm)), std::fabs(fin(r.dZ_b_ppm)), std::fabs(fin(r.dC_ppm)),
                                                std::fabs(fin(r.dV_b_ppm)), std::fabs(fin(r.dE_ppm))})
                                    : 1e300,
               "the recomputed Z_f, Z_b, C, base volume or energy differs from the log by more than " + num(opt.tolerance_ppm) + " ppm");
    }
  }, &corrected);
  runs.close_all();
  if (opt.progress) opt.progress(progress_done, progress_done);
  if (opt.what_if.any()) {
    // The changes one after the other, so that each one's share of the
    // change of the totals shows: method, analysis, base conditions (the
    // combustion reference held), then the combustion reference.
    const WhatIf& w = opt.what_if;
    std::vector<std::pair<std::string, WhatIf>> steps;
    WhatIf acc;
    if (w.method) { acc.method = w.method; steps.emplace_back("method " + *w.method, acc); }
    if (w.analysis_seq) { acc.analysis_seq = w.analysis_seq; steps.emplace_back("analysis seq " + std::to_string(*w.analysis_seq), acc); }
    if (w.base_T_K || w.base_p_Pa) {
      acc.base_T_K = w.base_T_K;
      acc.base_p_Pa = w.base_p_Pa;
      acc.combustion_hold = true;
      steps.emplace_back("base conditions (combustion reference held)", acc);
    }
    acc.combustion = w.combustion;
    acc.combustion_hold = w.combustion_hold;
    if (steps.empty() || w.combustion || (!w.combustion_hold && (w.base_T_K || w.base_p_Pa)))
      steps.emplace_back("combustion reference", acc);
    std::int64_t V_before = 0, E_before = 0;
    for (std::size_t k = 0; k < steps.size(); ++k) {
      ReplayTotals t;
      Replayer wr(log, what_if_methods, {}, steps[k].second, head);
      wr.run(opt.selection, [&](const LoggedInterval& iv, const IntervalReplay& r) {
        if (!corrected.count(iv.seq)) add_to_totals(t, iv, r);
      }, &corrected);
      if (k == 0) {
        V_before = t.V_b_um3_logged;
        E_before = t.E_J_logged;
      }
      res.what_if_steps.push_back({steps[k].first, t.V_b_um3_replayed - V_before, t.E_J_replayed - E_before});
      V_before = t.V_b_um3_replayed;
      E_before = t.E_J_replayed;
      if (k + 1 == steps.size()) res.what_if = t;
    }
    // A step that changes nothing (the combustion reference where no Hs depends on it) is left out of the split.
    if (res.what_if_steps.size() > 1)
      res.what_if_steps.erase(std::remove_if(res.what_if_steps.begin(), res.what_if_steps.end(),
                                             [](const WhatIfStep& st) { return st.cause == "combustion reference" && st.V_b_um3 == 0 && st.E_J == 0; }),
                              res.what_if_steps.end());
    const auto first = rp.configs().begin();
    res.what_if_combustion = combustion_used(w, first != rp.configs().end() ? first->second.base_T_K : 288.15);
    res.what_if_run = true;
  }

  // The correction sets, with the totals of their intervals in the selection.
  if (record::has_table(log.schema_version(), record::Table::correction_set)) {
    const auto lo = opt.selection.from_utc_s.value_or(std::numeric_limits<std::int64_t>::min());
    const auto hi = opt.selection.to_utc_s.value_or(std::numeric_limits<std::int64_t>::max());
    Stmt s(db,
           "SELECT seq, point, created_utc_s, reason, method, base_T_K, base_p_Pa, analysis_seq, first_seq, last_seq FROM correction_set "
           "WHERE (?1 IS NULL OR point = ?1) AND to_utc_s > ?2 AND from_utc_s < ?3 AND seq <= ?4 ORDER BY seq");
    if (opt.selection.point) s.bind(1, std::string_view(*opt.selection.point));
    s.bind(2, lo).bind(3, hi).bind(4, head);
    Stmt q(db,
           "SELECT count(*), coalesce(sum(c.V_b_um3), 0), coalesce(sum(c.E_J), 0), coalesce(sum(o.V_b_um3), 0), coalesce(sum(o.E_J), 0), "
           "min(c.start_utc_s), max(c.end_utc_s) FROM interval c LEFT JOIN interval o ON o.seq = c.corrects_seq "
           "WHERE c.seq BETWEEN ?1 AND ?2 AND c.corrects_seq IS NOT NULL AND c.end_utc_s > ?3 AND c.start_utc_s < ?4");
    while (s.step()) {
      CorrectionSetSummary c;
      c.seq = s.i64(0);
      c.point = s.text(1);
      c.created_utc_s = s.i64(2);
      c.reason = s.text(3);
      WhatIf w;
      if (!s.is_null(4)) w.method = s.text(4);
      if (!s.is_null(5)) w.base_T_K = s.f64(5);
      if (!s.is_null(6)) w.base_p_Pa = s.f64(6);
      if (!s.is_null(7)) w.analysis_seq = s.i64(7);
      c.change = describe_change(w);
      q.bind(1, s.i64(8)).bind(2, s.i64(9)).bind(3, lo).bind(4, hi);
      if (q.step()) {
        c.intervals = q.i64(0);
        c.V_b_um3_corrected = q.i64(1);
        c.E_J_corrected = q.i64(2);
        c.V_b_um3_replaced = q.i64(3);
        c.E_J_replaced = q.i64(4);
        if (c.intervals) {
          c.from_utc_s = q.i64(5);
          c.to_utc_s = q.i64(6);
        }
      }
      q.reset();
      res.corrections.push_back(c);
    }
  }

  // The verifier's findings.
  if (verifier.joinable()) verifier.join();
  if (verify_error) std::rethrow_exception(verify_error);
  res.records = v.records;
  res.log_id = v.log_id;
  res.head_hash_hex = record::to_hex(v.head_hash);
  std::map<std::string, std::size_t> cum_open;
  std::map<std::string, std::int64_t> cum_count;
  std::map<std::string, std::string> first_cum_detail;
  for (const auto& f : v.findings) {
    AuditFinding a;
    const bool totals = f.kind == "register_mismatch" || f.kind == "total_mismatch";
    a.kind = totals ? Kind::totals_mismatch : Kind::broken_chain;
    a.severity = Severity::critical;
    a.first_seq = a.last_seq = f.seq;
    a.from_utc_s = a.to_utc_s = f.time_utc_s;
    a.detail = f.kind + ": " + f.table + " seq " + std::to_string(f.seq) + ": " + f.detail;
    if (f.V_b_um3_difference) {
      a.V_b_difference_m3 = static_cast<double>(*f.V_b_um3_difference) * record::volume_quantum_m3;
      a.E_difference_MJ = static_cast<double>(f.E_J_difference.value_or(0)) * 1e-6;
      a.difference_basis = f.table == "interval" ? "the interval's own quantity minus its register"
                                                 : "the sum of the intervals minus the record's total";
    } else {
      a.difference_basis = totals ? "not a base-volume or energy total"
                                  : "not known: the record's original content is not in the log (compare with a copy kept elsewhere)";
    }
    if (f.table == "interval" || f.table == "qtr") {
      Stmt s(db, "SELECT point, start_utc_s, end_utc_s, V_b_um3, E_J FROM " + f.table + " WHERE seq = ?");
      s.bind(1, f.seq);
      if (s.step()) {
        a.point = s.text(0);
        a.from_utc_s = s.i64(1);
        a.to_utc_s = s.i64(2);
        a.V_b_affected_m3 = static_cast<double>(s.i64(3)) * record::volume_quantum_m3;
        a.E_affected_MJ = static_cast<double>(s.i64(4)) * 1e-6;
        a.intervals = f.table == "interval" ? 1 : 0;
      }
    }
    if (opt.selection.point && !a.point.empty() && a.point != *opt.selection.point) continue;
    // One changed interval puts every later register reading of its point
    // out: those follow-on readings are one finding.
    const bool cum = f.kind == "total_mismatch" && f.detail.find("register readings") != std::string::npos;
    if (cum) {
      if (auto it = cum_open.find(a.point); it != cum_open.end()) {
        AuditFinding& o = res.findings[it->second];
        o.from_utc_s = std::min(o.from_utc_s, a.from_utc_s);
        o.to_utc_s = std::max(o.to_utc_s, a.to_utc_s);
        o.last_seq = a.last_seq;
        ++cum_count[a.point];
        o.detail = first_cum_detail[a.point] + " (and " + std::to_string(cum_count[a.point]) +
                   " later quantity records of the point, whose register readings carry the same difference)";
        continue;
      }
      cum_open[a.point] = res.findings.size();
      first_cum_detail[a.point] = a.detail;
    }
    res.findings.push_back(a);
  }
  if (v.findings_total > static_cast<std::int64_t>(v.findings.size())) {
    AuditFinding a;
    a.kind = Kind::broken_chain;
    a.severity = Severity::critical;
    a.detail = std::to_string(v.findings_total - static_cast<std::int64_t>(v.findings.size())) +
               " more chain or totals findings not listed";
    a.difference_basis = "not listed";
    res.findings.push_back(a);
  }


  // The engine versions that wrote the intervals; a calculation difference
  // on intervals another version wrote may be the change of version itself.
  {
    const std::string running = record::describe_engine_version(record::engine_version());
    std::sort(logged_versions.begin(), logged_versions.end(), [](const auto& a, const auto& b) { return a.first_seq < b.first_seq; });
    for (const auto& lv : logged_versions) {  // in the order they first appear in the log
      const std::string ver = record::describe_engine_version(lv.text);
      auto it = std::find_if(res.engine_versions.begin(), res.engine_versions.end(), [&](const auto& e) { return e.first == ver; });
      if (it == res.engine_versions.end()) res.engine_versions.emplace_back(ver, lv.intervals);
      else it->second += lv.intervals;
    }
    Stmt q(db, "SELECT seq, engine_version FROM interval WHERE point = ?1 AND start_utc_s >= ?2 AND end_utc_s <= ?3 AND seq <= ?4");
    q.bind(4, head);
    for (auto& f : res.findings) {
      if (f.kind != Kind::calc_difference) continue;
      std::vector<std::pair<std::string, std::int64_t>> other;
      std::int64_t n = 0, n_other = 0;
      std::string logged, ver;
      q.bind(1, std::string_view(f.point)).bind(2, f.from_utc_s).bind(3, f.to_utc_s);
      while (q.step()) {
        if (corrected.count(q.i64(0))) continue;  // replaced: not part of the finding
        ++n;
        if (n == 1 || q.text(1) != logged) {
          logged = q.text(1);
          ver = record::describe_engine_version(logged);
        }
        if (ver == running) continue;
        ++n_other;
        auto it = std::find_if(other.begin(), other.end(), [&](const auto& e) { return e.first == ver; });
        if (it == other.end()) other.emplace_back(ver, 1);
        else ++it->second;
      }
      q.reset();
      if (other.empty()) continue;
      std::string who;
      for (const auto& [name, c] : other) who += (who.empty() ? "" : ", ") + name + (other.size() > 1 ? " (" + std::to_string(c) + ")" : "");
      f.detail += "; " + (n_other == n ? std::string("the intervals were") : std::to_string(n_other) + " of its " + std::to_string(n) + " intervals were") +
                  " written by " + who + ", not by this " + running +
                  ": the difference may be due to the change of engine version or revision (e.g. a corrected coefficient)";
    }
  }

  std::stable_sort(res.findings.begin(), res.findings.end(), [](const AuditFinding& a, const AuditFinding& b) {
    if (a.point != b.point) return a.point < b.point;
    if (a.from_utc_s != b.from_utc_s) return a.from_utc_s < b.from_utc_s;
    return a.kind < b.kind;
  });
  return res;
}

}  // namespace zcorr::audit
