// GERG-2008 phase equilibrium speed (engine/methods/gerg2008_phase.hpp, eval/phase_check.hpp):
// the hydrocarbon dew temperature at one pressure of a 12-component gas (target <= 2 ms),
// the cricondentherm and cricondenbar, the stability test of one state, and the per-state
// phase check in the flow computer's path (LineMethod::state with and without the check;
// target <= 20 us median for a state well inside the gas region).
//   build/bench/phase_bench --benchmark_repetitions=5 --benchmark_report_aggregates_only=true
// Measured 2026-12-02, Release, on the 2-core project machine at load 1.4-2.0 (median of 3,
// CPU time; the invented 12-component gas of tests/support, water-free basis):
//   dew point at 5 MPa 1.33 ms, at 1 MPa 0.89 ms (target <= 2 ms);
//   cricondentherm alone 15.6 ms; cricondentherm + cricondenbar 158 ms;
//   one full stability test of a single-phase state 162 us;
//   line state through LineMethod, phase check on 2.56 us, off 2.56 us (the check is a
//   comparison with a cached dew temperature; target <= 20 us median);
//   line state below the cricondentherm, above its dew line 2.91 us;
//   a new (close) analysis and its first 15 states 0.34 ms (two warm trial phases confirm the
//   node dew temperatures; 17 ms when the cricondentherm was computed per analysis).
// Audit of the demo week (672 analyses, 10,080 intervals, zcorr audit): 0.22 s with the
// check, 0.05 s without (most of it the two trial phases per analysis). Under load 5 (other
// builds on both cores) the runs took 1.5-2x as long.
// Measured again 2026-12-02 22:20 UTC after the reference-analysis shortcut (eval/phase_check.hpp:
// close analyses settled by the reference's dew temperatures, no trial phase), Release, the same
// machine at load 0.2-0.4 (uptime before and after), median of 3, CPU time:
//   dew point at 5 MPa 1.29 ms, at 1 MPa 0.855 ms; cricondentherm 15.1 ms; cricondentherm +
//   cricondenbar 151 ms; full stability test of a single-phase state 158 us;
//   line state phase check on 2.50 us, off 2.49 us; below the cricondentherm 2.84 us;
//   a new (close) analysis and its first 15 states 0.034 ms (was 0.34 ms).
// zcorr audit of the demo week (scripts/demo.sh log, 5 runs at load 0.5): 0.04-0.05 s wall
// (was 0.22 s; 0.05 s without the check as measured before). The audit with and without the
// check: bench/audit_bench.cpp, BM_Audit_*_15min_analyses_*.
#include <benchmark/benchmark.h>

#include "eval/line_method.hpp"
#include "eval/phase_check.hpp"
#include "methods/gerg2008_phase.hpp"
#include "support/sample_gases.hpp"

using namespace zcorr;
namespace ph = zcorr::gerg2008::phase;

namespace {

gerg2008::Prepared<double> dry12() {
  gerg2008::Prepared<double> p;
  (void)ph::prepare_dry(samples::pipeline_gas_12(), p);
  return p;
}

void BM_DewPoint_12comp_5MPa(benchmark::State& st) {
  const auto p = dry12();
  for (auto _ : st) {
    auto d = ph::dew_temperature(p, 5e6);
    benchmark::DoNotOptimize(d);
  }
}
BENCHMARK(BM_DewPoint_12comp_5MPa)->Unit(benchmark::kMillisecond);

void BM_DewPoint_12comp_1MPa(benchmark::State& st) {
  const auto p = dry12();
  for (auto _ : st) {
    auto d = ph::dew_temperature(p, 1e6);
    benchmark::DoNotOptimize(d);
  }
}
BENCHMARK(BM_DewPoint_12comp_1MPa)->Unit(benchmark::kMillisecond);

void BM_Cricondentherm_12comp(benchmark::State& st) {
  const auto p = dry12();
  for (auto _ : st) {
    auto c = ph::cricondentherm(p);
    benchmark::DoNotOptimize(c);
  }
}
BENCHMARK(BM_Cricondentherm_12comp)->Unit(benchmark::kMillisecond);

void BM_EnvelopeBounds_12comp(benchmark::State& st) {
  const auto p = dry12();
  for (auto _ : st) {
    auto e = ph::envelope_bounds(p);
    benchmark::DoNotOptimize(e);
  }
}
BENCHMARK(BM_EnvelopeBounds_12comp)->Unit(benchmark::kMillisecond);

// One full stability test of a single-phase line state (no cache).
void BM_Stability_StableState(benchmark::State& st) {
  const auto p = dry12();
  for (auto _ : st) {
    auto s = ph::stability(p, 283.15, 4.15e6, ph::PhaseOptions{}, true);
    benchmark::DoNotOptimize(s);
  }
}
BENCHMARK(BM_Stability_StableState)->Unit(benchmark::kMicrosecond);

// Line states of a meter run (4.0-4.3 MPa, 278-290 K) through LineMethod, phase check on;
// the cricondentherm is cached after the first states, so this is the steady per-state cost.
constexpr double line[][2] = {{283.15, 4.15e6}, {281.0, 4.10e6}, {286.5, 4.22e6}, {279.2, 4.05e6},
                              {289.9, 4.28e6}, {284.4, 4.18e6}, {278.3, 4.00e6}, {287.7, 4.25e6}};
void run_line(benchmark::State& st, bool check) {
  auto m = make_line_method(MethodId::gerg2008);
  (void)m->prepare(samples::pipeline_gas_12());
  EvalOptions o;
  o.phase_check = check;
  for (int k = 0; k < 64; ++k) (void)m->state(line[k % 8][0], line[k % 8][1], o);  // warm: cache filled
  std::size_t k = 0;
  for (auto _ : st) {
    const auto& s = line[k++ % 8];
    auto out = m->state(s[0], s[1], o);
    benchmark::DoNotOptimize(out);
  }
}
void BM_LineState_PhaseCheckOn(benchmark::State& st) { run_line(st, true); }
void BM_LineState_PhaseCheckOff(benchmark::State& st) { run_line(st, false); }
BENCHMARK(BM_LineState_PhaseCheckOn)->Unit(benchmark::kMicrosecond);
BENCHMARK(BM_LineState_PhaseCheckOff)->Unit(benchmark::kMicrosecond);

// Line states below the cricondentherm (246.9 K at 3.87 MPa for this gas) but above the dew
// temperature at their pressure (234.5-236.8 K at 0.9-1.1 MPa): settled by the cached dew
// temperatures of the pressure nodes around them.
constexpr double cold[][2] = {{241.0, 0.95e6}, {243.5, 1.02e6}, {245.0, 1.08e6}, {242.2, 0.91e6},
                              {246.0, 1.05e6}, {244.1, 0.99e6}, {240.5, 0.93e6}, {245.7, 1.07e6}};
void BM_LineState_BelowCricondentherm(benchmark::State& st) {
  auto m = make_line_method(MethodId::gerg2008);
  (void)m->prepare(samples::pipeline_gas_12());
  EvalOptions o;
  for (int k = 0; k < 64; ++k) (void)m->state(cold[k % 8][0], cold[k % 8][1], o);
  std::size_t k = 0;
  for (auto _ : st) {
    const auto& s = cold[k++ % 8];
    auto out = m->state(s[0], s[1], o);
    benchmark::DoNotOptimize(out);
  }
}
BENCHMARK(BM_LineState_BelowCricondentherm)->Unit(benchmark::kMicrosecond);

// A new analysis and its first 15 line states (one analysis every 15 minutes, a state a minute).
void BM_NewAnalysisAnd15States(benchmark::State& st) {
  auto m = make_line_method(MethodId::gerg2008);
  EvalOptions o;
  auto x = samples::pipeline_gas_12();
  int k = 0;
  for (auto _ : st) {
    x[index(Component::ethane)] = 0.045 + 1e-6 * (k % 50);  // a slightly different analysis each time
    x[index(Component::methane)] = 0.9 - 1e-6 * (k % 50);
    ++k;
    (void)m->prepare(x);
    for (int i = 0; i < 15; ++i) {
      auto out = m->state(line[i % 8][0], line[i % 8][1], o);
      benchmark::DoNotOptimize(out);
    }
  }
}
BENCHMARK(BM_NewAnalysisAnd15States)->Unit(benchmark::kMillisecond);

}  // namespace
