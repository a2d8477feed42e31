// Recording throughput: intervals per second (per CPU second of the process,
// and per wall second as a counter) appended to an interval log in
// batched transactions (1000 intervals each, synchronous = NORMAL, WAL), one
// sample row per 60-s interval, Z_f by the line method at every interval,
// SHA-256 chain, hourly and daily records. Target: >= 100,000 intervals/s
// with the detail method. Also reports the file size per interval.
//   build/bench/record_bench --benchmark_repetitions=3
// The series: detail (when built in), gerg2008, and the invented test-double
// gas (the log's own cost with a near-free Z).
#include <benchmark/benchmark.h>

#include <chrono>
#include <cmath>
#include <filesystem>
#include <memory>
#include <vector>

#include "support/sample_gases.hpp"
#include "eval/line_method.hpp"
#include "bench_samples.hpp"
#include "record/log.hpp"
#include "record/recorder.hpp"
#include "record/timeutil.hpp"
#include "support/virial_test_gas.hpp"

using namespace zcorr;
using namespace zcorr::record;

namespace {

constexpr std::int64_t n_intervals = 50000;

std::vector<RawSample> samples(std::int64_t t0) {
  std::vector<RawSample> v;
  v.reserve(n_intervals);
  for (std::int64_t i = 1; i <= n_intervals; ++i) v.push_back(zcorr::bench::minute_sample(t0, i));
  return v;
}

AnalysisInput analysis(std::int64_t t0) {
  AnalysisInput a;
  a.valid_from_utc_s = t0;
  a.source = "bench";
  a.x = samples::pipeline_gas_12();
  a.Hs_MJ_per_m3 = 40.1;
  return a;
}

void record_bench(benchmark::State& st, std::unique_ptr<LineMethod> method, const char* method_name) {
  if (!method) {
    st.SkipWithError("method not built in");
    return;
  }
  const std::int64_t t0 = *parse_time_utc("2026-01-05T06:00:00Z");
  const auto rows = samples(t0);
  const auto path = std::filesystem::temp_directory_path() / "zcorr_record_bench.db";
  PointConfig cfg;
  cfg.point = "BENCH-1";
  cfg.method = method_name;
  cfg.base_name = "iso15";
  cfg.p_min_Pa = 1e6;
  cfg.p_max_Pa = 10e6;
  cfg.T_min_K = 263.15;
  cfg.T_max_K = 323.15;
  std::uintmax_t bytes = 0;
  double wall_s = 0;
  for (auto _ : st) {
    const auto w0 = std::chrono::steady_clock::now();
    st.PauseTiming();
    for (auto suffix : {"", "-wal", "-shm", "-writer.lock"}) std::filesystem::remove(path.string() + suffix);
    st.ResumeTiming();
    {
      Log log(path, {OpenMode::writer});
      RecordOptions opt;
      opt.batch_intervals = 1000;
      Recorder rec(log, cfg, *method, opt);
      rec.add_analyses({analysis(t0)});
      for (const auto& s : rows) rec.add_sample(s);
      rec.finish();
      if (rec.stats().intervals != n_intervals) st.SkipWithError("not every interval was recorded");
    }
    st.PauseTiming();
    wall_s += std::chrono::duration<double>(std::chrono::steady_clock::now() - w0).count();
    bytes = std::filesystem::file_size(path);  // closing the last connection checkpointed the WAL
    st.ResumeTiming();
  }
  st.SetItemsProcessed(st.iterations() * n_intervals);
  st.counters["bytes_per_interval"] = static_cast<double>(bytes) / static_cast<double>(n_intervals);
  // items_per_second is per CPU second of this process; this one is per wall
  // second (it includes waiting for the disk and, on a shared machine, for a core).
  st.counters["wall_intervals_per_s"] = static_cast<double>(st.iterations() * n_intervals) / wall_s;
  st.SetLabel(method_name);
}

void BM_Record_detail(benchmark::State& st) { record_bench(st, make_line_method(MethodId::detail), "detail"); }
void BM_Record_gerg2008(benchmark::State& st) { record_bench(st, make_line_method(MethodId::gerg2008), "gerg2008"); }
void BM_Record_test_double(benchmark::State& st) {
  record_bench(st, std::make_unique<zcorr::testing::VirialTestGas>(), "virial_test_gas");
}

}  // namespace

BENCHMARK(BM_Record_detail)->Unit(benchmark::kMillisecond)->Iterations(3);
BENCHMARK(BM_Record_gerg2008)->Unit(benchmark::kMillisecond)->Iterations(3);
BENCHMARK(BM_Record_test_double)->Unit(benchmark::kMillisecond)->Iterations(3);
