// GERG-2008 speed: Z(T, p) of a prepared 12-component pipeline gas (target
// <= 5 us median on the project machine), Z with all derived properties, and
// prepare() (target <= 50 us). Run: build/bench/gerg2008_bench
//   --benchmark_repetitions=10 --benchmark_report_aggregates_only=true
// Measured 2026-12-02 on the 2-core project machine (shared with other builds, load
// 9-12): median CPU time Z 1.7 us, Z + derived 2.3-2.4 us, prepare 1.0 us (12 comp.),
// 1.7-2.3 us (21 comp.); wall time 2.3 us for Z at the lowest load seen, more under load.
#include <benchmark/benchmark.h>

#include "eval/line_method.hpp"
#include "methods/gerg2008.hpp"
#include "support/sample_gases.hpp"

using namespace zcorr;

namespace {
Fractions<double> gas12() { return samples::pipeline_gas_12(); }

// A spread of line states (260-340 K, 0.1-12 MPa) so that no single easy state is timed.
constexpr double states[][2] = {{260.0, 101325.0}, {273.15, 2e6}, {288.15, 5e6}, {300.0, 8e6}, {320.0, 12e6}, {340.0, 0.5e6},
                                {283.15, 7e6}, {293.15, 4e6}};
constexpr std::size_t n_states = sizeof(states) / sizeof(states[0]);

void BM_Gerg2008_Z(benchmark::State& st) {
  static gerg2008::Prepared<double> p;
  (void)gerg2008::prepare(gas12(), p);
  std::size_t k = 0;
  for (auto _ : st) {
    const auto& s = states[k++ % n_states];
    auto z = gerg2008::z_factor(p, s[0], s[1]);
    benchmark::DoNotOptimize(z);
  }
}
BENCHMARK(BM_Gerg2008_Z);

void BM_Gerg2008_Z_and_derived(benchmark::State& st) {
  static gerg2008::Prepared<double> p;
  (void)gerg2008::prepare(gas12(), p);
  std::size_t k = 0;
  for (auto _ : st) {
    const auto& s = states[k++ % n_states];
    auto r = gerg2008::state(p, s[0], s[1]);
    benchmark::DoNotOptimize(r);
  }
}
BENCHMARK(BM_Gerg2008_Z_and_derived);

void BM_Gerg2008_LineMethod_derived(benchmark::State& st) {
  auto m = make_line_method(MethodId::gerg2008);
  (void)m->prepare(gas12());
  EvalOptions opt;
  opt.derived = true;
  std::size_t k = 0;
  for (auto _ : st) {
    const auto& s = states[k++ % n_states];
    auto r = m->state(s[0], s[1], opt);
    benchmark::DoNotOptimize(r);
  }
}
BENCHMARK(BM_Gerg2008_LineMethod_derived);

void BM_Gerg2008_prepare(benchmark::State& st) {
  static gerg2008::Prepared<double> p;
  const auto x = gas12();
  for (auto _ : st) {
    auto s = gerg2008::prepare(x, p);
    benchmark::DoNotOptimize(s);
    benchmark::DoNotOptimize(p.Tr_K);
  }
}
BENCHMARK(BM_Gerg2008_prepare);

void BM_Gerg2008_prepare_21(benchmark::State& st) {
  static gerg2008::Prepared<double> p;
  Fractions<double> x{};
  for (auto& v : x) v = 1.0 / 21.0;
  for (auto _ : st) {
    auto s = gerg2008::prepare(x, p);
    benchmark::DoNotOptimize(s);
    benchmark::DoNotOptimize(p.Tr_K);
  }
}
BENCHMARK(BM_Gerg2008_prepare_21);
}  // namespace
