// Audit throughput: one year of 1-minute intervals for one point (525,600
// interval records, with hourly and daily records and the events), audited
// in full: the hash chain and totals checked by the verifier, every interval
// recomputed with the configuration and analysis it names, and every
// sequence, analysis-age, range and tolerance check. Target: <= 3 s wall
// time on the project's build machine, memory flat (the log is streamed).
//   build/bench/audit_bench
// The log is recorded once (detail method when built in, else GERG-2008) to
// a temporary file and kept between runs; the recording is not timed.
// Measured (Release, 2 cores, quiet machine): 1.88 s per audit with the
// detail method, 2.09 s with GERG-2008 (2.8-4.0 s while a compiler ran on
// both cores). The replay thread is the longer of the two (about half of it
// is the method's state at the averages); the chain check runs beside it.
// The phase check (BM_Audit_week/year_15min_analyses_PhaseOn/Off: GERG-2008, a new analysis
// every 15 minutes, target on <= 1.2 x off), measured 2026-12-02 22:19 UTC, Release, load
// 0.1-0.6 (uptime before and after): week (10,080 intervals, 673 analyses) 43.4 ms on,
// 37.1 ms off (1.17 x; on was 249 ms before the reference-analysis shortcut of
// eval/phase_check.hpp, with 40.8 ms off); year (525,600 intervals, 35,041 analyses) 1.91 s
// on, 1.86 s off (1.03 x). The rest of the week's extra is the reference's dew searches, once
// per audit (some 5 ms).
// Peak resident memory of `zcorr audit` on the year: 15 MB. A correction set
// over the year takes 8.1 s (verify first, then one transaction); the
// corrected log (1,051,200 interval records) audits in 4.3 s.
#include <benchmark/benchmark.h>

#include <chrono>
#include <cmath>
#include <filesystem>
#include <memory>
#include <vector>

#include "support/sample_gases.hpp"
#include "audit/audit.hpp"
#include "audit/correct.hpp"
#include "eval/line_method.hpp"
#include "bench_samples.hpp"
#include "record/log.hpp"
#include "record/recorder.hpp"
#include "record/timeutil.hpp"

using namespace zcorr;
using namespace zcorr::record;

namespace {

constexpr std::int64_t n_intervals = 525600;

AnalysisInput analysis(std::int64_t t0) {
  AnalysisInput a;  // the invented 12-component pipeline gas of tests/support
  a.valid_from_utc_s = t0;
  a.source = "bench";
  a.x = samples::pipeline_gas_12();
  a.Hs_MJ_per_m3 = 40.1;
  return a;
}

const char* method_name() { return make_line_method(MethodId::detail) ? "detail" : "gerg2008"; }

std::filesystem::path year_log(const char* method = method_name()) {
  const auto path = std::filesystem::temp_directory_path() / (std::string("zcorr_audit_bench_year_") + method + ".db");
  if (std::filesystem::exists(path)) {
    Log log(path, {OpenMode::read_only});
    Stmt s(log.db(), "SELECT count(*) FROM interval");
    if (s.step() && s.i64(0) == n_intervals) return path;
  }
  for (auto suffix : {"", "-wal", "-shm", "-writer.lock"}) std::filesystem::remove(path.string() + suffix);
  const std::int64_t t0 = *parse_time_utc("2026-01-01T00:00:00Z");
  PointConfig cfg;
  cfg.point = "YEAR-1";
  cfg.method = method;
  cfg.base_name = "iso15";
  cfg.p_min_Pa = 1e6;
  cfg.p_max_Pa = 10e6;
  cfg.T_min_K = 263.15;
  cfg.T_max_K = 323.15;
  auto line_method = make_line_method(*method_from_name(cfg.method));
  Log log(path, {OpenMode::writer});
  RecordOptions opt;
  opt.batch_intervals = 5000;
  Recorder rec(log, cfg, *line_method, opt);
  rec.add_analyses({analysis(t0)});
  for (std::int64_t i = 1; i <= n_intervals; ++i) rec.add_sample(zcorr::bench::minute_sample(t0, i));
  rec.finish();
  return path;
}

void audit_year(benchmark::State& st, const char* method) {
  const auto path = year_log(method);
  double wall_s = 0;
  std::int64_t findings = 0, replayed = 0;
  for (auto _ : st) {
    const auto w0 = std::chrono::steady_clock::now();
    Log log(path, {OpenMode::read_only});
    audit::AuditOptions o;
    o.max_analysis_age_h = 24.0 * 400;
    const auto r = audit::run_audit(log, o, audit::built_in_methods());
    findings = static_cast<std::int64_t>(r.findings.size());
    replayed = r.replay.replayed;
    benchmark::DoNotOptimize(r.V_b_um3);
    wall_s += std::chrono::duration<double>(std::chrono::steady_clock::now() - w0).count();
  }
  if (replayed != n_intervals) st.SkipWithError("not every interval was recomputed");
  st.SetItemsProcessed(st.iterations() * n_intervals);
  st.counters["wall_s_per_audit"] = wall_s / static_cast<double>(st.iterations());
  st.counters["findings"] = static_cast<double>(findings);
  st.SetLabel(method);
}

void BM_Audit_year(benchmark::State& st) { audit_year(st, method_name()); }
// The same year recorded with GERG-2008 (the reference equation; about six
// times the detail method's cost per state).
void BM_Audit_year_gerg2008(benchmark::State& st) { audit_year(st, "gerg2008"); }

// A correction set over the whole year (another base pressure): every
// interval recomputed and written as a correcting record, one transaction,
// synchronous = FULL. Then the audit of the corrected log (the corrections
// stand in for the originals; the chain check reads both).
void BM_Correct_year(benchmark::State& st) {
  const auto src = year_log();
  const auto copy = std::filesystem::temp_directory_path() / "zcorr_correct_bench.db";
  double wall_s = 0, audit_s = 0;
  std::int64_t written = 0;
  for (auto _ : st) {
    st.PauseTiming();
    for (auto suffix : {"", "-wal", "-shm", "-writer.lock"}) std::filesystem::remove(copy.string() + suffix);
    {
      Log log(src, {OpenMode::read_only});
      exec(log.db(), "VACUUM INTO '" + copy.string() + "'");
    }
    st.ResumeTiming();
    const auto w0 = std::chrono::steady_clock::now();
    audit::CorrectionRequest req;
    req.point = "YEAR-1";
    req.reason = "bench";
    req.change.base_p_Pa = 101560.0;
    const auto out = audit::write_correction_set(copy, req, audit::built_in_methods());
    written = out.set.intervals;
    const auto w1 = std::chrono::steady_clock::now();
    wall_s += std::chrono::duration<double>(w1 - w0).count();
    st.PauseTiming();
    {
      Log log(copy, {OpenMode::read_only});
      audit::AuditOptions o;
      o.max_analysis_age_h = 24.0 * 400;
      const auto r = audit::run_audit(log, o, audit::built_in_methods());
      if (!r.findings.empty() || r.corrections.size() != 1) st.SkipWithError("the corrected log does not audit clean");
    }
    audit_s += std::chrono::duration<double>(std::chrono::steady_clock::now() - w1).count();
    st.ResumeTiming();
  }
  if (written != n_intervals) st.SkipWithError("not every interval was corrected");
  st.SetItemsProcessed(st.iterations() * n_intervals);
  st.counters["wall_s_per_set"] = wall_s / static_cast<double>(st.iterations());
  st.counters["wall_s_audit_after"] = audit_s / static_cast<double>(st.iterations());
  st.SetLabel(method_name());
  for (auto suffix : {"", "-wal", "-shm", "-writer.lock"}) std::filesystem::remove(copy.string() + suffix);
}

// The phase check in the audit: a log with a new gas analysis every 15 minutes (invented
// analyses close to each other, as a chromatograph gives them: the demo's gas with ethane,
// propane, nitrogen and carbon dioxide swinging a little), recorded with GERG-2008, audited
// with the phase check on (as zcorr audit runs) and off (the methods wrapped so that every
// state is evaluated with EvalOptions::phase_check = false). Target: on <= 1.2 x off.
AnalysisInput analysis_15min(std::int64_t t0, std::int64_t k) {
  AnalysisInput a;
  a.valid_from_utc_s = t0 + k * 900;
  a.source = "bench";
  const double kk = static_cast<double>(k);
  a.x[index(Component::ethane)] = 0.045 + 0.002 * std::sin(kk / 7.0);
  a.x[index(Component::propane)] = 0.011 + 0.0005 * std::sin(kk / 11.0);
  a.x[index(Component::nitrogen)] = 0.0165 + 0.0015 * std::sin(kk / 5.0);
  a.x[index(Component::carbon_dioxide)] = 0.011 + 0.001 * std::cos(kk / 13.0);
  a.x[index(Component::isobutane)] = 0.0015;
  a.x[index(Component::n_butane)] = 0.0018;
  a.x[index(Component::isopentane)] = 0.0005;
  a.x[index(Component::n_pentane)] = 0.0004;
  a.x[index(Component::n_hexane)] = 0.0003;
  double rest = 1.0;
  for (double v : a.x) rest -= v;
  a.x[index(Component::methane)] = rest;
  a.Hs_MJ_per_m3 = 40.1;
  return a;
}

std::filesystem::path log_15min(std::int64_t intervals) {
  const auto path = std::filesystem::temp_directory_path() / ("zcorr_audit_bench_15min_" + std::to_string(intervals) + ".db");
  if (std::filesystem::exists(path)) {
    Log log(path, {OpenMode::read_only});
    Stmt s(log.db(), "SELECT count(*) FROM interval");
    if (s.step() && s.i64(0) == intervals) return path;
  }
  for (auto suffix : {"", "-wal", "-shm", "-writer.lock"}) std::filesystem::remove(path.string() + suffix);
  const std::int64_t t0 = *parse_time_utc("2026-01-01T00:00:00Z");
  PointConfig cfg;
  cfg.point = "GC-1";
  cfg.method = "gerg2008";
  cfg.base_name = "iso15";
  cfg.p_min_Pa = 1e6;
  cfg.p_max_Pa = 10e6;
  cfg.T_min_K = 263.15;
  cfg.T_max_K = 323.15;
  auto line_method = make_line_method(MethodId::gerg2008);
  Log log(path, {OpenMode::writer});
  RecordOptions opt;
  opt.batch_intervals = 5000;
  Recorder rec(log, cfg, *line_method, opt);
  std::vector<AnalysisInput> an;
  for (std::int64_t k = 0; k * 15 <= intervals; ++k) an.push_back(analysis_15min(t0, k));
  rec.add_analyses(an);
  for (std::int64_t i = 1; i <= intervals; ++i) rec.add_sample(zcorr::bench::minute_sample(t0, i));
  rec.finish();
  return path;
}

// A method evaluated without the phase check.
class WithoutPhaseCheck final : public LineMethod {
 public:
  explicit WithoutPhaseCheck(std::unique_ptr<LineMethod> m) : m_(std::move(m)) {}
  [[nodiscard]] MethodId id() const noexcept override { return m_->id(); }
  Status prepare(const Fractions<double>& x) noexcept override { return m_->prepare(x); }
  [[nodiscard]] StateOutput state(double T_K, double p_Pa, const EvalOptions& opt) const noexcept override {
    EvalOptions o = opt;
    o.phase_check = false;
    return m_->state(T_K, p_Pa, o);
  }

 private:
  std::unique_ptr<LineMethod> m_;
};

void audit_15min(benchmark::State& st, std::int64_t intervals, bool phase_check) {
  const auto path = log_15min(intervals);
  audit::MethodFactory methods = audit::built_in_methods();
  if (!phase_check)
    methods = [](const std::string& name) -> std::unique_ptr<LineMethod> {
      auto m = audit::built_in_methods()(name);
      return m ? std::make_unique<WithoutPhaseCheck>(std::move(m)) : nullptr;
    };
  double wall_s = 0;
  std::int64_t replayed = 0, findings = 0;
  for (auto _ : st) {
    const auto w0 = std::chrono::steady_clock::now();
    Log log(path, {OpenMode::read_only});
    audit::AuditOptions o;
    const auto r = audit::run_audit(log, o, methods);
    replayed = r.replay.replayed;
    findings = static_cast<std::int64_t>(r.findings.size());
    benchmark::DoNotOptimize(r.V_b_um3);
    wall_s += std::chrono::duration<double>(std::chrono::steady_clock::now() - w0).count();
  }
  if (replayed != intervals) st.SkipWithError("not every interval was recomputed");
  st.SetItemsProcessed(st.iterations() * intervals);
  st.counters["wall_s_per_audit"] = wall_s / static_cast<double>(st.iterations());
  st.counters["findings"] = static_cast<double>(findings);
}
constexpr std::int64_t week = 7 * 24 * 60;
void BM_Audit_week_15min_analyses_PhaseOn(benchmark::State& st) { audit_15min(st, week, true); }
void BM_Audit_week_15min_analyses_PhaseOff(benchmark::State& st) { audit_15min(st, week, false); }
void BM_Audit_year_15min_analyses_PhaseOn(benchmark::State& st) { audit_15min(st, n_intervals, true); }
void BM_Audit_year_15min_analyses_PhaseOff(benchmark::State& st) { audit_15min(st, n_intervals, false); }

}  // namespace

BENCHMARK(BM_Audit_week_15min_analyses_PhaseOn)->Unit(benchmark::kMillisecond)->Iterations(5);
BENCHMARK(BM_Audit_week_15min_analyses_PhaseOff)->Unit(benchmark::kMillisecond)->Iterations(5);
BENCHMARK(BM_Audit_year_15min_analyses_PhaseOn)->Unit(benchmark::kMillisecond)->Iterations(3);
BENCHMARK(BM_Audit_year_15min_analyses_PhaseOff)->Unit(benchmark::kMillisecond)->Iterations(3);
BENCHMARK(BM_Audit_year)->Unit(benchmark::kMillisecond)->Iterations(3);
BENCHMARK(BM_Audit_year_gerg2008)->Unit(benchmark::kMillisecond)->Iterations(3);
BENCHMARK(BM_Correct_year)->Unit(benchmark::kMillisecond)->Iterations(1);
