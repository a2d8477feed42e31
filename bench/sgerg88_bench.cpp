// SGERG-88 and AGA8 gross methods: Z(T, p) from prepared gross inputs.
// Target: <= 0.3 us median per state (issue: virial methods from gross
// characterization). Run: build/bench/sgerg88_bench --benchmark_repetitions=10
//   --benchmark_report_aggregates_only=true
#include <benchmark/benchmark.h>

#include <array>

#include "eval/line_method.hpp"
#include "methods/aga8_gross.hpp"
#include "methods/sgerg88.hpp"

namespace {

using namespace zcorr;

// A spread of states inside the range (265-335 K, 0.1-12 MPa).
struct States {
  std::array<double, 64> T{}, p{};
  States() {
    for (std::size_t i = 0; i < T.size(); ++i) {
      T[i] = 265.0 + 70.0 * static_cast<double>((i * 37) % 64) / 63.0;
      p[i] = 1e5 + 11.9e6 * static_cast<double>((i * 11) % 64) / 63.0;
    }
  }
};
const States states;

void BM_sgerg88_z_templated(benchmark::State& st) {
  const auto m = sgerg88::prepare(sgerg88::GrossInput<double>{40.66, 0.581, 0.006, 0.0});
  std::size_t i = 0;
  for (auto _ : st) {
    const auto r = sgerg88::z_factor(m, states.T[i], states.p[i]);
    benchmark::DoNotOptimize(r.Z);
    i = (i + 1) & 63u;
  }
}
BENCHMARK(BM_sgerg88_z_templated);

void BM_sgerg88_z_line_method(benchmark::State& st) {
  auto lm = make_line_method(MethodId::sgerg88);
  GrossInputs g;
  g.Hs_MJ_per_m3 = 40.66;
  g.d = 0.581;
  g.x_CO2 = 0.006;
  if (!lm->prepare_gross(g).ok()) st.SkipWithError("prepare failed");
  const EvalOptions opt{};
  std::size_t i = 0;
  for (auto _ : st) {
    const auto r = lm->state(states.T[i], states.p[i], opt);
    benchmark::DoNotOptimize(r.q[0]);
    i = (i + 1) & 63u;
  }
}
BENCHMARK(BM_sgerg88_z_line_method);

void BM_gross2_z_templated(benchmark::State& st) {
  const auto m = aga8_gross::prepare_method2(aga8_gross::Method2Input<double>{0.6, 0.02, 0.01, 0.0});
  std::size_t i = 0;
  for (auto _ : st) {
    // Gross range: 273-327 K, <= 8.27 MPa.
    const auto r = aga8_gross::z_factor(m, 273.15 + 0.75 * (states.T[i] - 265.0), 0.69 * states.p[i]);
    benchmark::DoNotOptimize(r.Z);
    i = (i + 1) & 63u;
  }
}
BENCHMARK(BM_gross2_z_templated);

void BM_sgerg88_prepare(benchmark::State& st) {
  double Hs = 40.0;
  for (auto _ : st) {
    const auto m = sgerg88::prepare(sgerg88::GrossInput<double>{Hs, 0.6, 0.01, 0.0});
    benchmark::DoNotOptimize(m.H_CH_MJ_per_kmol);
    Hs = Hs < 41.0 ? Hs + 0.001 : 40.0;
  }
}
BENCHMARK(BM_sgerg88_prepare);

}  // namespace
